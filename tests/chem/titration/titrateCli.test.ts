import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import { describe, expect, it } from 'vitest';
import { runTitrate } from '../../../src/cli/titrate';

async function run(args: string[], stdin: string) {
  let out = '';
  let err = '';
  const code = await runTitrate(args, {
    stdin: Readable.from([stdin]),
    stdout: { write: (s: string) => (out += s) },
    stderr: { write: (s: string) => (err += s) },
  });
  return { code, out, err, lines: out.trim() === '' ? [] : out.trim().split('\n') };
}

const spring = readFileSync(new URL('./kestrel-hollow-spring.json', import.meta.url), 'utf8');

describe('tufa titrate', () => {
  it('reduces a pretty-printed titration file with the modified Gran by default', async () => {
    const { code, lines } = await run([], spring);
    expect(code).toBe(0);
    expect(lines).toHaveLength(1);
    const r = JSON.parse(lines[0]!);
    expect(r.method).toBe('modified_gran');
    expect(r.confidence.level).toBe('high');
    expect(r.dic_umol_kg).toBeGreaterThan(0);
    for (const key of [
      'alkalinity_meq_l',
      'alkalinity_mg_l_caco3',
      'equivalence_volume_ml',
      'fit',
      'warnings',
    ]) {
      expect(r).toHaveProperty(key);
    }
    // The demo spring was generated with 3.9 meq/L (invented data).
    expect(Math.abs(r.alkalinity_meq_l / 3.9 - 1)).toBeLessThan(0.02);
    expect(r.fit.points_used.length).toBeGreaterThanOrEqual(4);
  });

  it('reads JSON Lines and keeps going past a bad line', async () => {
    const one = JSON.stringify(JSON.parse(spring));
    const { code, lines } = await run(['--method', 'curve_fit'], `${one}\nnot json\n${one}\n`);
    expect(code).toBe(1);
    expect(lines).toHaveLength(3);
    expect(JSON.parse(lines[0]!).dic_umol_kg).toBeGreaterThan(0);
    expect(JSON.parse(lines[1]!).error.code).toBe('input-not-json');
  });

  it('reads a JSON array of titrations', async () => {
    const one = JSON.parse(spring);
    const { code, lines } = await run([], JSON.stringify([one, { ...one, method: 'endpoint' }]));
    expect(code).toBe(0);
    expect(lines.map((l) => JSON.parse(l).method)).toEqual(['modified_gran', 'endpoint']);
  });

  it('--points-csv takes the readings from a spreadsheet export', async () => {
    const record = JSON.parse(spring);
    const csv = `volume_ml;ph\n${record.points.map((p: { volume_ml: number; ph: number }) => `${String(p.volume_ml).replace('.', ',')};${String(p.ph).replace('.', ',')}`).join('\n')}\n`;
    const file = join(mkdtempSync(join(tmpdir(), 'tufa-')), 'points.csv');
    writeFileSync(file, `\uFEFF${csv}`);
    const fromJson = JSON.parse((await run([], spring)).lines[0]!);
    const fromCsv = JSON.parse(
      (await run(['--points-csv', file], JSON.stringify({ ...record, points: [] }))).lines[0]!,
    );
    expect(fromCsv.alkalinity_meq_l).toBeCloseTo(fromJson.alkalinity_meq_l, 12);
    expect((await run(['--points-csv', join(tmpdir(), 'no-such-file.csv')], spring)).code).toBe(2);
  });

  it('--every-method writes one line per method', async () => {
    const { lines } = await run(['--every-method'], spring);
    expect(lines.map((l) => JSON.parse(l).method)).toEqual([
      'modified_gran',
      'gran',
      'inflection',
      'endpoint',
      'two_endpoint',
      'curve_fit',
    ]);
  });

  it('propagates uncertainties given in the record', async () => {
    const withU = { ...JSON.parse(spring), uncertainty: { titrant_normality: 0.002, ph: 0.01 } };
    const r = JSON.parse((await run([], JSON.stringify(withU))).lines[0]!);
    expect(r.uncertainty.alkalinity_meq_l.dominant_input).toBe('titrant_normality');
  });

  it('bad input is an error value, not NaN', async () => {
    const { code, lines } = await run(
      [],
      JSON.stringify({ ...JSON.parse(spring), titrant_normality: 'strong' }),
    );
    expect(code).toBe(1);
    expect(lines[0]).not.toMatch(/NaN|null/);
    expect(JSON.parse(lines[0]!).error.code).toBe('titration-value-invalid');
  });

  it('help mentions acid handling cautions; a bad option exits 2', async () => {
    const help = await run(['--help'], '');
    expect(help.out).toMatch(/eyewear/);
    expect(help.out).toMatch(/gloves/);
    expect(help.out).toMatch(/safety rules/);
    expect((await run(['--colour'], spring)).code).toBe(2);
  });
});
