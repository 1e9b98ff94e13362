import { describe, expect, it } from 'vitest';
import { isPlanError, plan } from '../../../src/chem/plan/plan';
import {
  compareRows,
  DEFAULT_FORM,
  FieldError,
  parseDecimal,
  planRequest,
  speciation,
} from '../../../src/ui/plan/plan-model';
import { REEF } from './helpers';

describe('planning panel model', () => {
  it('reads decimal commas and refuses text with the field named', () => {
    expect(parseDecimal('7,5', 'volumeL', 'Volume')).toBe(7.5);
    expect(parseDecimal(' ', 'volumeL', 'Volume')).toBeUndefined();
    expect(() => parseDecimal('7,5,1', 'volumeL', 'Volume')).toThrow(FieldError);
    expect(() => planRequest(REEF, { ...DEFAULT_FORM, volumeL: 'lots' })).toThrow(/not a number/);
  });

  it('builds a request the engine plans, and rows for every numeric output', () => {
    const req = planRequest(REEF, { ...DEFAULT_FORM, volumeL: '250', targetValue: '9,5' });
    const r = plan(req);
    if (isPlanError(r)) throw new Error(r.error.message);
    const rows = compareRows(r.before, r.after);
    const numeric = Object.values(r.after).filter((x) => typeof x === 'number').length;
    expect(rows.length).toBe(numeric + 4); // plus the four totals
    // The app's output order (src/ui/outputs.ts) comes first, with its labels and units.
    expect(rows[0]!.key).toBe('dic_umol_kg');
    expect(rows.find((x) => x.key === 'calcium_total_umol_kg')?.label).toBe('Calcium (µmol/kg)');
    expect(rows.every((x) => x.before === undefined || Number.isFinite(x.before))).toBe(true);
    const f = speciation(r.after);
    expect(f.co2 + f.hco3 + f.co3).toBeCloseTo(1, 12);
  });

  it('mix and CO2 exchange forms become the engine actions', () => {
    const mix = planRequest(REEF, {
      ...DEFAULT_FORM,
      action: 'mix',
      mixTemperatureC: '24',
      mixSalinity: '34',
      mixAlkalinity: '2300',
      mixPh: '8,1',
    });
    expect(isPlanError(plan(mix))).toBe(false);
    const air = planRequest(REEF, { ...DEFAULT_FORM, action: 'equilibrate', fractionPercent: '50' });
    expect((air.actions as { fraction: number }[])[0]!.fraction).toBe(0.5);
  });
});
