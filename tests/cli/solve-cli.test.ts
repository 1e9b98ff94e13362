import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { tufa } from './run-tufa';

const ok = { temperature_c: 25, salinity: 35, alkalinity_umol_kg: 2300, dic_umol_kg: 2000 };

/** One line per error code: the engine's whole vocabulary of refusals, exercised through the CLI. */
const BAD: [string, unknown][] = [
  ['input-not-object', [1, 2]],
  ['not-a-number', { ...ok, dic_umol_kg: 'lots' }],
  ['missing-temperature', { salinity: 35, alkalinity_umol_kg: 2300, dic_umol_kg: 2000 }],
  ['temperature-out-of-range', { ...ok, temperature_c: 150 }],
  ['salinity-out-of-range', { ...ok, salinity: 80 }],
  ['pressure-out-of-range', { ...ok, pressure_dbar: -5 }],
  ['ph-out-of-range', { temperature_c: 25, salinity: 35, ph: 15, alkalinity_umol_kg: 2300 }],
  ['negative-alkalinity', { ...ok, alkalinity_umol_kg: -10 }],
  ['non-positive-value', { ...ok, dic_umol_kg: 0 }],
  ['negative-value', { ...ok, phosphate_umol_kg: -1 }],
  ['unknown-option', { ...ok, ph_scale: 'kelvin' }],
  ['too-few-parameters', { temperature_c: 25, salinity: 35, alkalinity_umol_kg: 2300 }],
  ['pair-same-family', { temperature_c: 25, salinity: 35, pco2_uatm: 400, fco2_uatm: 398 }],
  ['pair-not-given', { ...ok, pair: 'ph+dic_umol_kg' }],
  ['pair-not-independent', { ...ok, pair: ['dic_umol_kg', 'dic_umol_kg'] }],
  ['no-solution', { temperature_c: 25, salinity: 35, dic_umol_kg: 1000, co2_umol_kg: 2000 }],
  ['missing-salinity', { temperature_c: 25, model: 'saline', alkalinity_umol_kg: 2300, dic_umol_kg: 2000 }],
  ['measurements-disagree', { temperature_c: 25, salinity: 35, ph: 12, alkalinity_umol_kg: 2500 }],
];

describe('tufa solve (JSON Lines)', { timeout: 60_000 }, () => {
  it('answers every line in order, keeps going after bad lines, exits 1 when any failed', () => {
    const lines = [
      JSON.stringify(ok),
      ...BAD.map(([, v]) => JSON.stringify(v)),
      '{not json',
      JSON.stringify(ok),
    ];
    const r = tufa(['solve'], `${lines.join('\n')}\n`);
    expect(r.status).toBe(1);
    const out = r.stdout
      .trim()
      .split('\n')
      .map((l) => JSON.parse(l));
    expect(out).toHaveLength(lines.length);
    expect(out[0].ph_total).toBeGreaterThan(7);
    BAD.forEach(([code], i) => {
      expect(out[i + 1].error?.code, JSON.stringify(BAD[i]![1])).toBe(code);
      expect(out[i + 1].error.message.length).toBeGreaterThan(10);
    });
    expect(out[BAD.length + 1].error.code).toBe('invalid-json');
    expect(out[BAD.length + 2].dic_umol_kg).toBeCloseTo(2000, 9);
  });

  it('exits 0 when every line solved, 2 for unusable arguments, and has help', () => {
    expect(tufa(['solve'], `${JSON.stringify(ok)}\n`).status).toBe(0);
    expect(tufa(['solve', '--bogus']).status).toBe(2);
    expect(tufa(['solve', '--csv']).status).toBe(2);
    expect(tufa(['frobnicate']).status).toBe(2);
    const help = tufa(['solve', '--help']);
    expect(help.status).toBe(0);
    expect(help.stdout).toContain('alkalinity_umol_kg');
  });

  it('--csv reads a CSV with the same names and writes CSV', () => {
    const dir = mkdtempSync(join(tmpdir(), 'tufa-'));
    const file = join(dir, 'waters.csv');
    writeFileSync(
      file,
      '\ufeffid,temperature_c,salinity,alkalinity_umol_kg,dic_umol_kg,ph_scale\r\nA,25,35,2300,2000,total\r\nB,25,35,-1,2000,\r\n',
    );
    const r = tufa(['solve', '--csv', file]);
    expect(r.status).toBe(1);
    const [header, a, b] = r.stdout.trim().split(/\r?\n/);
    const cols = header!.split(',');
    expect(cols).toContain('ph_total');
    const rowA = a!.split(',');
    expect(rowA[0]).toBe('A');
    expect(Number(rowA[cols.indexOf('dic_umol_kg')])).toBeCloseTo(2000, 6);
    expect(b!.split(',')[cols.indexOf('error_code')]).toBe('negative-alkalinity');
  });
});
