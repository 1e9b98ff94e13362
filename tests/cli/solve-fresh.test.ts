import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { tufa } from './run-tufa';

describe('tufa solve and convert for fresh water', { timeout: 60_000 }, () => {
  it('solves a CSV of invented wells and streams, fresh columns filled where the data allow', () => {
    const dir = mkdtempSync(join(tmpdir(), 'tufa-fresh-'));
    const file = join(dir, 'wells.csv');
    writeFileSync(
      file,
      [
        'id,temperature_c,ph,alkalinity_mg_l_caco3,calcium_mg_l,magnesium_mg_l,sodium_mg_l,potassium_mg_l,chloride_mg_l,sulfate_mg_l,specific_conductance_us_cm,activity_model',
        'Birchmoor well 2,11.5,7.05,265,96,12,8,1.4,14,22,,truesdell-jones',
        'Otter Lane stream,8.2,7.6,62,,,,,,,180,',
      ].join('\n'),
    );
    const r = tufa(['solve', '--csv', file]);
    expect(r.status).toBe(0);
    const [header, well, stream] = r.stdout.trim().split(/\r?\n/);
    const cols = header!.split(',');
    const at = (row: string, key: string) => row.split(',')[cols.indexOf(key)];
    expect(at(well!, 'model')).toBe('fresh');
    expect(at(well!, 'ionic_strength_method')).toBe('major-ions');
    expect(Number(at(well!, 'langelier_index'))).toBeLessThan(1);
    expect(at(well!, 'ccpp_mg_l_caco3')).not.toBe('');
    expect(at(stream!, 'ionic_strength_method')).toBe('conductance-russell-1976');
    expect(at(stream!, 'saturation_index_calcite')).toBe('');
    expect(at(stream!, 'omega_calcite')).toBe('');
  });

  it('lists convert in the main help and converts from the command line', () => {
    expect(tufa(['--help']).stdout).toContain('convert');
    const r = tufa(['convert', '2.5', 'meq_l', 'mg_l_caco3']);
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/= 125\.1\d* mg_l_caco3/);
    expect(tufa(['convert', '--help']).stdout).toContain('--sg-ref');
  });
});
