/**
 * The command line against its own limits, measured in the same run (issue 13):
 * - `tufa solve`, 20 000 JSON lines end to end (process start, stdin, stdout) against the same
 *   parse + solve() + stringify loop in this process; also with --fields.
 * - `tufa recompute --csv` on a generated logger file (40 stations, 15-minute rows, semicolons and
 *   decimal commas) against parse + solve() of the same rows and the same engine request in this
 *   process (and, for comparison, of the measured values alone); and its peak memory
 *   on two file sizes, to show that memory does not grow with the file.
 * Run bundled (tests/bench/run-bundled.ts) so both sides run compiled JavaScript.
 */

import { spawn } from 'node:child_process';
import { mkdtempSync, openSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { solve } from '../../src/chem/solve';
import { splitRecords } from '../../src/io/csv-parse';
import { parseNumber } from '../../src/io/numbers';
import { readingRequest } from '../../src/reading/request';

const dir = mkdtempSync(join(tmpdir(), 'tufa-bench-cli-'));
const REPORT =
  'data:text/javascript,process.on("exit",()=>process.stderr.write("maxrss="+process.resourceUsage().maxRSS+"\\n"))';

/** Runs `node bin/tufa.mjs ARGS < file > /dev/null`; wall time and the child's peak RSS. */
function cli(
  args: string[],
  stdinFile?: string,
): Promise<{ seconds: number; maxRssMb: number; status: number | null }> {
  const t0 = performance.now();
  const child = spawn(process.execPath, ['--import', REPORT, 'bin/tufa.mjs', ...args], {
    stdio: [stdinFile ? openSync(stdinFile, 'r') : 'ignore', 'ignore', 'pipe'],
  });
  let err = '';
  child.stderr!.on('data', (b: Buffer) => {
    err += b.toString();
  });
  return new Promise((resolve) =>
    child.on('close', (status) => {
      const m = /maxrss=(\d+)/.exec(err);
      resolve({ seconds: (performance.now() - t0) / 1000, maxRssMb: Number(m?.[1]) / 1024, status });
    }),
  );
}

const best = async <T extends { seconds: number }>(n: number, f: () => Promise<T>): Promise<T> => {
  let b: T | undefined;
  for (let i = 0; i < n; i++) {
    const r = await f();
    if (!b || r.seconds < b.seconds) b = r;
  }
  return b!;
};
/**
 * Seconds for the in-process loop: the first (cold) pass, as a fresh process runs it, and the
 * best of two (warm, after the JIT has compiled the engine). Ratios are printed against both.
 */
const inProcess = (f: () => void) => {
  const times: number[] = [];
  for (let i = 0; i < 2; i++) {
    const t0 = performance.now();
    f();
    times.push((performance.now() - t0) / 1000);
  }
  return { cold: times[0]!, warm: Math.min(...times) };
};
const ratio = (loop: { cold: number; warm: number }, seconds: number) =>
  `ratio ${(loop.warm / seconds).toFixed(2)} of the warm loop, ${(loop.cold / seconds).toFixed(2)} of the cold one`;
const fmt = (x: number) => Math.round(x).toLocaleString('en-US');

console.log('\n## Command line: tufa solve and tufa recompute --csv');

// --- solve, JSON Lines
const N = 20_000;
const lines: string[] = [];
for (let i = 0; i < N; i++) {
  lines.push(
    JSON.stringify({
      temperature_c: 5 + (i % 25),
      salinity: 30 + (i % 7),
      alkalinity_umol_kg: 2100 + (i % 300),
      dic_umol_kg: 1900 + (i % 200),
    }),
  );
}
const jsonl = join(dir, 'waters.jsonl');
writeFileSync(jsonl, `${lines.join('\n')}\n`);
const start = await best(3, () => cli(['--help']));
console.log(`start-up (tufa --help, node bin/tufa.mjs): ${(start.seconds * 1000).toFixed(0)} ms`);
const fields = ['ph_total', 'pco2_uatm', 'omega_aragonite'];
const loopFull = inProcess(() => {
  let n = 0;
  for (const l of lines) n += JSON.stringify(solve(JSON.parse(l))).length;
  if (n === 0) throw new Error('no output');
});
const loopFields = inProcess(() => {
  let n = 0;
  for (const l of lines) {
    const r = solve(JSON.parse(l)) as unknown as Record<string, unknown>;
    n += JSON.stringify({
      ph_total: r.ph_total,
      pco2_uatm: r.pco2_uatm,
      omega_aragonite: r.omega_aragonite,
    }).length;
  }
  if (n === 0) throw new Error('no output');
});
const full = await best(2, () => cli(['solve'], jsonl));
const narrow = await best(2, () => cli(['solve', '--fields', fields.join(',')], jsonl));
console.log(
  `solve, ${fmt(N)} lines, all outputs: in-process ${fmt(N / loopFull.warm)} lines/s warm, tufa ${fmt(N / full.seconds)} lines/s end to end → ${ratio(loopFull, full.seconds)} (goal ≥ 0.5, aim 0.8)`,
);
console.log(
  `solve, ${fmt(N)} lines, --fields ${fields.join(',')}: in-process ${fmt(N / loopFields.warm)} lines/s warm, tufa ${fmt(N / narrow.seconds)} lines/s → ${ratio(loopFields, narrow.seconds)}`,
);

// --- recompute --csv, a logger file
function loggerFile(rows: number, file: string): number {
  const parts: string[] = ['Date/Time;Station;Temp (°C);Salinity;pH;Alkalinity (µmol/kg)\r\n'];
  const t0 = Date.UTC(2025, 0, 1);
  for (let i = 0; i < rows; i++) {
    const station = (i % 40) + 1;
    const d = new Date(t0 + Math.floor(i / 40) * 15 * 60_000).toISOString();
    const temp = (8 + ((i * 7) % 150) / 10).toFixed(1).replace('.', ',');
    const sal = (31 + ((i * 3) % 50) / 10).toFixed(1).replace('.', ',');
    const ph = (7.85 + ((i * 11) % 30) / 100).toFixed(2).replace('.', ',');
    parts.push(
      `${d.slice(0, 10)} ${d.slice(11, 16)};Station ${String(station).padStart(2, '0')};${temp};${sal};${ph};${2150 + (i % 250)}\r\n`,
    );
  }
  writeFileSync(file, parts.join(''));
  return statSync(file).size;
}
const ROWS = Number(process.env.TUFA_BENCH_ROWS ?? 250_000);
const big = join(dir, 'logger-big.csv');
const small = join(dir, 'logger-small.csv');
const bigBytes = loggerFile(ROWS, big);
loggerFile(Math.round(ROWS / 4), small);
const text = readFileSync(big, 'utf8');
// The limit of this path: split the same text and solve the same engine request the command
// sends (the app's request function adds the settings' choices and the air's pCO2, which the
// engine then also answers for). The bare loop (measured values only) is printed beside it.
const base = readingRequest({ values: [] }, undefined).input;
const csvLoop = (withSettings: boolean) => () => {
  const { records } = splitRecords(text, ';');
  let n = 0;
  for (let r = 1; r < records.length; r++) {
    const c = records[r]!;
    // Copied key by key: an object spread here would slow solve() threefold (measured), not a limit.
    const input: Record<string, unknown> = {};
    if (withSettings) for (const k in base) input[k] = base[k];
    input.temperature_c = parseNumber(c[2]!, true);
    input.salinity = parseNumber(c[3]!, true);
    input.ph = parseNumber(c[4]!, true);
    input.ph_scale = 'total';
    input.alkalinity_umol_kg = parseNumber(c[5]!, true);
    const res = solve(input);
    if (!('error' in res)) n++;
  }
  if (n === 0) throw new Error('nothing solved');
};
const loopCsv = inProcess(csvLoop(true));
const loopBare = inProcess(csvLoop(false));
const args = (f: string) => ['recompute', '--csv', f, '--map', 'pH=ph:total'];
const rBig = await best(1, () => cli(args(big)));
const rSmall = await best(1, () => cli(args(small)));
console.log(
  `recompute --csv, ${fmt(ROWS)} rows (${(bigBytes / 1e6).toFixed(1)} MB): in-process parse + solve ${fmt(ROWS / loopCsv.warm)} rows/s warm, tufa ${fmt(ROWS / rBig.seconds)} rows/s → ${ratio(loopCsv, rBig.seconds)} (goal ≥ 0.5)`,
);
console.log(
  `  against parse + solve() of the measured values alone (no settings, no air): ${fmt(ROWS / loopBare.warm)} rows/s warm → ${ratio(loopBare, rBig.seconds)}`,
);
console.log(
  `recompute --csv peak memory: ${rSmall.maxRssMb.toFixed(0)} MB for ${fmt(ROWS / 4)} rows, ${rBig.maxRssMb.toFixed(0)} MB for ${fmt(ROWS)} rows (flat: independent of file size)`,
);
if ([full, narrow, rBig, rSmall].some((r) => r.status !== 0))
  console.log('note: a run exited with a non-zero status');
rmSync(dir, { recursive: true, force: true });
