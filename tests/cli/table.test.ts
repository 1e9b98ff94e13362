import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import { describe, expect, it } from 'vitest';
import { solve } from '../../src/chem/solve';
import type { CliIo } from '../../src/cli/io';
import { runRecompute } from '../../src/cli/recompute';
import { runSolve } from '../../src/cli/solve';
import { parseCsv } from '../../src/io/csv-parse';

async function run(cmd: (a: string[], io: CliIo) => Promise<number>, args: string[]) {
  let out = '';
  let err = '';
  const code = await cmd(args, {
    stdin: Readable.from([]),
    stdout: { write: (s: string) => (out += s) },
    stderr: { write: (s: string) => (err += s) },
  });
  const t = parseCsv(out, { delimiter: ',' }).table;
  const rows = t.rows.map((r) => Object.fromEntries(t.header.map((h, i) => [h, r[i]!])));
  return { code, rows, err };
}

const dir = mkdtempSync(join(tmpdir(), 'tufa-table-'));
// An invented lab sheet from our Westbecken ponds: semicolons, decimal commas, no times, no sites.
const SHEET = [
  'Sample;Temp (°C);Salinity;pH;Alkalinity (µmol/kg)',
  'WB-1;18,5;34,2;8,02;2280',
  'WB-2;19,1;34,0;7,95;2265',
  'WB-3;19,4;34,1;7,99;2270',
].join('\r\n');
const direct = [
  { temperature_c: 18.5, salinity: 34.2, ph: 8.02, alkalinity_umol_kg: 2280 },
  { temperature_c: 19.1, salinity: 34.0, ph: 7.95, alkalinity_umol_kg: 2265 },
  { temperature_c: 19.4, salinity: 34.1, ph: 7.99, alkalinity_umol_kg: 2270 },
].map((x) => solve({ ...x, ph_scale: 'total' }) as { pco2_uatm: number; dic_umol_kg: number });

describe('one table reader for solve --csv and recompute --csv', () => {
  it('a semicolon, decimal-comma lab sheet without times gives the engine’s results through both', async () => {
    const file = join(dir, 'lab.csv');
    writeFileSync(file, `\uFEFF${SHEET}\r\n`);
    const s = await run(runSolve, [
      '--csv',
      file,
      '--fields',
      'pco2_uatm,dic_umol_kg',
      '--set',
      'ph_scale=total',
    ]);
    expect(s.code).toBe(0);
    expect(s.rows.map((r) => Number(r.pco2_uatm))).toEqual(direct.map((d) => d.pco2_uatm));
    expect(s.rows.map((r) => r.line)).toEqual(['2', '3', '4']);
    const r = await run(runRecompute, ['--csv', file, '--map', 'pH=ph:total']);
    expect(r.code).toBe(0);
    expect(r.rows.map((x) => Number(x.computed_dic_umol_kg))).toEqual(
      direct.map((d) => Number(d.dic_umol_kg.toPrecision(12))),
    );
    expect(r.rows[0]).toMatchObject({ taken_at: '', site: 'lab.csv', temperature_c: '18.5' });
  });

  it('reads a Windows-1252 file with a warning', async () => {
    const file = join(dir, 'latin.csv');
    writeFileSync(file, Buffer.from(SHEET.replace('Sample', 'Probe Nr.').replace('°', '\u00b0'), 'latin1'));
    const s = await run(runSolve, ['--csv', file, '--fields', 'pco2_uatm', '--set', 'ph_scale=total']);
    expect(s.err).toMatch(/csv-not-utf8.*Windows-1252/);
    expect(s.rows.map((r) => Number(r.pco2_uatm))).toEqual(direct.map((d) => d.pco2_uatm));
  });

  it('an unclosed quote is reported with its line; the rows after it are still computed', async () => {
    const file = join(dir, 'quote.csv');
    writeFileSync(file, SHEET.replace('19,1;34,0', '19,1;"34,0'));
    const r = await run(runRecompute, ['--csv', file, '--map', 'pH=ph:total']);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/line 3: csv-unterminated-quote/);
    expect(r.err).toMatch(/2 of 3 rows computed/);
    expect(r.rows.map((x) => x.line)).toEqual(['2', '4']);
    const s = await run(runSolve, ['--csv', file, '--set', 'ph_scale=total']);
    expect(s.code).toBe(1);
    expect(s.rows.map((x) => x.line)).toEqual(['2', '4']);
  });

  it('solve --csv keeps engine column names and the engine’s own refusal codes', async () => {
    const file = join(dir, 'engine.csv');
    writeFileSync(
      file,
      'id,temperature_c,salinity,alkalinity_umol_kg,dic_umol_kg,carbonic_constants\nA,25,35,2300,2000,millero2010\nB,25,35,-1,2000,\n',
    );
    const s = await run(runSolve, ['--csv', file]);
    expect(s.rows[0]!.id).toBe('A');
    expect(Number(s.rows[0]!.ph_total)).toBe(
      (
        solve({
          temperature_c: 25,
          salinity: 35,
          alkalinity_umol_kg: 2300,
          dic_umol_kg: 2000,
          carbonic_constants: 'millero2010',
        }) as { ph_total: number }
      ).ph_total,
    );
    expect(s.rows[1]).toMatchObject({ id: 'B', line: '3', error_code: 'negative-alkalinity' });
  });
});

describe('recompute output rows', () => {
  it('every row has the header’s fields, and the issues cell follows the warnings as they change', async () => {
    // Invented: a cold sample (outside a constant's fitted range) between two warm ones.
    const file = join(dir, 'warnings.csv');
    writeFileSync(
      file,
      [
        'Temp (°C);Salinity;pH;Alkalinity (µmol/kg)',
        '20,0;35,0;8,05;2300',
        '4,0;35,0;8,00;2300',
        '4,0;35,0;8,00;2300',
        '25,0;35,0;8,00;2300',
      ].join('\n'),
    );
    let out = '';
    const code = await runRecompute(['--csv', file, '--map', 'pH=ph:total'], {
      stdin: Readable.from([]),
      stdout: {
        write: (s: string | Uint8Array) => (out += typeof s === 'string' ? s : Buffer.from(s).toString()),
      },
      stderr: { write: () => true },
    });
    expect(code).toBe(0);
    const t = parseCsv(out, { delimiter: ',' }).table;
    expect(t.rows).toHaveLength(4);
    for (const r of t.rows) expect(r).toHaveLength(t.header.length);
    const issues = t.rows.map((r) => r[t.header.indexOf('computed_issues')]!);
    const expected = [20, 4, 4, 25].map((temperature_c) => {
      const res = solve({
        temperature_c,
        salinity: 35,
        ph: temperature_c === 20 ? 8.05 : 8,
        ph_scale: 'total',
        alkalinity_umol_kg: 2300,
        air_pco2_uatm: 420,
        model: 'auto',
        carbonic_constants: 'auto',
        boron_total: 'lee2010',
      });
      return 'error' in res ? 'error' : res.warnings.map((w) => `${w.code}: ${w.message}`).join(' | ');
    });
    expect(issues).toEqual(expected);
    expect(issues[1]).not.toBe('');
    expect(issues[0]).toBe(issues[3]);
  });
});
