import { spawn } from 'node:child_process';
import { describe, expect, it } from 'vitest';

/** Peak resident memory (kB) of `tufa solve` over `lines` generated JSON lines, and how many lines came out. */
async function peakRss(
  lines: number,
): Promise<{ maxRssKb: number; outLines: number; status: number | null }> {
  // The child reports its own peak RSS as it exits; nothing in the command knows about the test.
  const report =
    'data:text/javascript,process.on("exit",()=>process.stderr.write("maxrss="+process.resourceUsage().maxRSS+"\\n"))';
  const child = spawn(
    process.execPath,
    ['--import', report, 'bin/tufa.mjs', 'solve', '--fields', 'line,ph_total'],
    {
      stdio: ['pipe', 'pipe', 'pipe'],
    },
  );
  let outLines = 0;
  child.stdout.on('data', (b: Buffer) => {
    for (let i = b.indexOf(10); i >= 0; i = b.indexOf(10, i + 1)) outLines++;
  });
  let err = '';
  child.stderr.on('data', (b: Buffer) => {
    err += b.toString();
  });
  const done = new Promise<number | null>((resolve) => child.on('close', resolve));
  // Written with back-pressure, in chunks of 1000 lines: the input never sits whole in memory here.
  for (let i = 0; i < lines; i += 1000) {
    let chunk = '';
    for (let j = i; j < Math.min(lines, i + 1000); j++) {
      chunk += `{"temperature_c":${15 + (j % 10)},"salinity":35,"alkalinity_umol_kg":2300,"dic_umol_kg":${1900 + (j % 200)}}\n`;
    }
    if (!child.stdin.write(chunk)) await new Promise((r) => child.stdin.once('drain', r));
  }
  child.stdin.end();
  const status = await done;
  const m = /maxrss=(\d+)/.exec(err);
  return { maxRssKb: Number(m?.[1]), outLines, status };
}

describe('tufa solve on a long stream', { timeout: 180_000 }, () => {
  it('keeps memory flat: 1 000 000 lines peak within a few MB of 100 000 lines', async () => {
    const small = await peakRss(100_000);
    const large = await peakRss(1_000_000);
    expect(small.status).toBe(0);
    expect(small.outLines).toBe(100_000);
    expect(large.status).toBe(0);
    expect(large.outLines).toBe(1_000_000);
    // Ten times the input may not cost more than 32 MB more (garbage-collector slack); holding
    // the lines or the results would cost hundreds of MB.
    console.log(`peak RSS: 100k lines ${small.maxRssKb} kB, 1M lines ${large.maxRssKb} kB`);
    expect(large.maxRssKb - small.maxRssKb).toBeLessThan(32 * 1024);
  });
});
