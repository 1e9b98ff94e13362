import { describe, expect, it } from 'vitest';
import { runConvert } from '../../src/cli/convert';

async function run(args: string[], stdin = ''): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const io = {
    stdin: (async function* () {
      yield stdin;
    })(),
    stdout: { write: (s: string) => (out += s) },
    stderr: { write: (s: string) => (err += s) },
  };
  const code = await runConvert(args, io);
  return { code, out, err };
}

describe('tufa convert', () => {
  it('prints help with every option it parses', async () => {
    const r = await run(['--help']);
    expect(r.code).toBe(0);
    for (const opt of ['--temp', '--sal', '--density', '--ion', '--sg-ref', '--comp', '--alpha', '--json']) {
      expect(r.out).toContain(opt);
    }
  });
  it('converts alkalinity and says which density it used', async () => {
    const r = await run(['2300', 'umol_kg', 'meq_l', '--sal', '35', '--json']);
    const row = JSON.parse(r.out) as { result: number; note: string };
    expect(row.result).toBeCloseTo(2.3 * 1.023343, 4);
    expect(row.note).toContain('EOS-80');
  });
  it('converts ion concentrations with --ion', async () => {
    const r = await run(['40.078', 'mg_l', 'meq_l', '--ion', 'calcium', '--density', '1000', '--json']);
    expect((JSON.parse(r.out) as { result: number }).result).toBeCloseTo(2, 10);
  });
  it('salinity ↔ conductance ↔ SG', async () => {
    const r = await run(['35', 'salinity', 'sg', '--json']);
    expect((JSON.parse(r.out) as { result: number }).result).toBeCloseTo(1.0264, 4);
    const back = await run(['53071.03', 'sc25_us_cm', 'salinity', '--json']);
    expect((JSON.parse(back.out) as { result: number }).result).toBeCloseTo(35, 4);
  });
  it('converts a column from stdin and accepts decimal commas', async () => {
    const r = await run(['-', 'dkh', 'meq_l'], '1\n2\n3,5\n');
    expect(r.out.trim().split('\n')).toHaveLength(3);
  });
  it('bad values get a coded error and exit 1; bad usage exits 2', async () => {
    const bad = await run(['abc', 'dkh', 'meq_l']);
    expect(bad.code).toBe(1);
    expect(bad.err).toMatch(/error \[bad-number\]/);
    expect((await run(['1', 'dkh', 'parsecs'])).code).toBe(2);
    expect((await run(['1', 'dkh'])).code).toBe(2);
    expect((await run(['1', 'salinity', 'dkh'])).code).toBe(2);
  });
  it('warns outside a formulation range and still answers', async () => {
    const r = await run(['1', 'salinity', 'density_kg_m3', '--temp', '45']);
    expect(r.code).toBe(0);
    expect(r.err).toMatch(/warning \[formulation-out-of-range\].*EOS-80/);
  });
});
