import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import { describe, expect, it } from 'vitest';
import { solve } from '../../src/chem/solve';
import { runRecompute } from '../../src/cli/recompute';
import { parseCsv } from '../../src/io/csv-parse';

async function run(args: string[]) {
  let out = '';
  let err = '';
  const code = await runRecompute(args, {
    stdin: Readable.from([]),
    stdout: { write: (s: string) => (out += s) },
    stderr: { write: (s: string) => (err += s) },
  });
  return { code, out, err };
}

const dir = mkdtempSync(join(tmpdir(), 'tufa-recompute-'));
const file = join(dir, 'harbour.csv');
// Invented logger file: BOM, `;`, decimal commas, local times, one bad temperature.
writeFileSync(
  file,
  '\uFEFFDate/Time;Temp (°C);Salinity;pH;Alkalinity (µmol/kg)\r\n' +
    '03.06.2026 09:15;25;35;8,05;2300\r\n' +
    '03.06.2026 10:15;abc;35;8,1;2310\r\n',
);

describe('tufa recompute --csv', () => {
  it('computes each good row with the engine and reports each bad one by line and column', async () => {
    const { code, out, err } = await run([
      '--csv',
      file,
      '--tz',
      'Europe/Lisbon',
      '--site',
      'Harbour buoy',
      '--map',
      'pH=ph:total',
    ]);
    expect(code).toBe(1);
    const table = parseCsv(out, { delimiter: ',' }).table;
    expect(table.rows.length).toBe(1);
    const row = Object.fromEntries(table.header.map((h, i) => [h, table.rows[0]![i]]));
    expect(row).toMatchObject({
      line: '2',
      site: 'Harbour buoy',
      taken_at: '2026-06-03T09:15:00+01:00',
      ph_scale: 'total',
    });
    // The same answer as the engine called directly with the converted inputs.
    const direct = solve({
      temperature_c: 25,
      salinity: 35,
      ph: 8.05,
      ph_scale: 'total',
      alkalinity_umol_kg: 2300,
    });
    expect('error' in direct).toBe(false);
    // CSV carries 12 significant digits.
    expect(Number(row.computed_dic_umol_kg)).toBe(
      Number((direct as { dic_umol_kg: number }).dic_umol_kg.toPrecision(12)),
    );
    expect(err).toContain('line 3, column "Temp (°C)": value-not-a-number');
  });
  it('exits 2 with help for unusable options', async () => {
    expect((await run([])).code).toBe(2);
    expect((await run(['--csv', file, '--tz', 'Mars/Olympus'])).err).toMatch(/not a time zone/);
    expect((await run(['--csv', file, '--map', 'pH=acidity:x'])).code).toBe(2);
    expect((await run(['--help'])).out).toContain('recompute --csv FILE');
  });
});
