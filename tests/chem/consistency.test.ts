/**
 * Issue 10, defect 5: measurements that cannot coexist are a coded error of the engine, never a
 * negative concentration or an absurd partial pressure shown as a result; tested at the
 * boundaries, and the same through the import check (the CLI case is in tests/cli/solve-cli).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { SolveInput, SolveOutput } from '../../src/chem/api';
import { PCO2_REFUSED_ABOVE_UATM } from '../../src/chem/consistency';
import { solve } from '../../src/chem/solve';
import { computeWarnings } from '../../src/io/import-commit';
import type { ImportPlan } from '../../src/io/import-plan';
import type { ReadingDoc } from '../../src/store/schema';

const SEA = { temperature_c: 25, salinity: 35 };
const FRESH = { temperature_c: 12, salinity: 0, model: 'fresh' };

function ok(input: SolveInput): SolveOutput {
  const r = solve(input);
  if ('error' in r) throw new Error(`${r.error.code}: ${r.error.message}`);
  return r;
}
function code(input: SolveInput): string | undefined {
  const r = solve(input);
  return 'error' in r ? r.error.code : undefined;
}

/** The pH where `solve` stops giving a result, between a pH that solves and one that does not. */
function boundary(make: (ph: number) => SolveInput, good: number, bad: number): number {
  expect(code(make(good))).toBeUndefined();
  expect(code(make(bad))).toBe('measurements-disagree');
  for (let i = 0; i < 60; i++) {
    const mid = (good + bad) / 2;
    if (code(make(mid)) === undefined) good = mid;
    else bad = mid;
  }
  return good;
}

describe('impossible pairs are coded errors that name the measurements', () => {
  it('pH 12 with alkalinity 2 500 µmol/kg (sea and fresh water) would need negative DIC', () => {
    for (const water of [SEA, FRESH]) {
      const r = solve({ ...water, ph: 12, alkalinity_umol_kg: 2500 });
      expect('error' in r && r.error).toMatchObject({ code: 'measurements-disagree', field: 'ph' });
      const message = 'error' in r ? r.error.message : '';
      expect(message).toContain('pH 12');
      expect(message).toContain('alkalinity 2500 µmol/kg');
      expect(message).toContain('negative DIC');
    }
  });

  it('pH 2 with alkalinity 2 500 µmol/kg would need thousands of atmospheres of CO2', () => {
    const r = solve({ ...SEA, ph: 2, alkalinity_umol_kg: 2500 });
    expect('error' in r && r.error.code).toBe('measurements-disagree');
    expect('error' in r && r.error.message).toMatch(/pCO2 of .* atm/);
  });

  it('at the high-pH boundary DIC falls continuously to zero, and one step past it is refused', () => {
    for (const water of [SEA, FRESH]) {
      const make = (ph: number) => ({ ...water, ph, alkalinity_umol_kg: 2500 });
      const edge = boundary(make, 9, 12);
      const at = ok(make(edge));
      expect(at.dic_umol_kg).toBeGreaterThanOrEqual(0);
      expect(at.dic_umol_kg).toBeLessThan(1e-3); // µmol/kg: the edge is where carbonate alkalinity ends
      expect(at.co3_umol_kg).toBeGreaterThanOrEqual(0);
      expect(code(make(edge + 1e-9))).toBe('measurements-disagree');
    }
  });

  it('at the low-pH boundary pCO2 reaches the stated limit (10 atm), with a warning above 1 atm', () => {
    const make = (ph: number) => ({ ...SEA, ph, alkalinity_umol_kg: 2500 });
    const edge = boundary(make, 5, 2);
    const at = ok(make(edge));
    expect(at.pco2_uatm / PCO2_REFUSED_ABOVE_UATM).toBeCloseTo(1, 6);
    expect(at.warnings.map((w) => w.code)).toContain('pco2-above-one-atmosphere');
    expect(ok(make(7)).warnings.map((w) => w.code)).not.toContain('pco2-above-one-atmosphere');
  });

  it('whatever pH and alkalinity are given, a result never holds a negative or absurd value', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.5, max: 13.5, noNaN: true }),
        fc.double({ min: 1, max: 20000, noNaN: true }),
        fc.constantFrom(0, 5, 35),
        (ph, alk, salinity) => {
          const r = solve({ temperature_c: 20, salinity, ph, alkalinity_umol_kg: alk });
          if ('error' in r) {
            expect(r.error.code).toBe('measurements-disagree');
            return;
          }
          for (const k of ['dic_umol_kg', 'co2_umol_kg', 'hco3_umol_kg', 'co3_umol_kg', 'pco2_uatm'] as const)
            expect(r[k], k).toBeGreaterThanOrEqual(0);
          expect(r.pco2_uatm).toBeLessThanOrEqual(PCO2_REFUSED_ABOVE_UATM);
        },
      ),
      { numRuns: 150 },
    );
  });

  it('the import check reports the same coded error for such a row', () => {
    const reading: ReadingDoc = {
      id: 'r1',
      type: 'reading',
      siteId: 's1',
      takenAt: '2026-06-03T10:00:00.000Z',
      timeZone: 'UTC',
      values: [
        { quantity: 'temperature', value: 25, unit: 'c' },
        { quantity: 'salinity', value: 35, unit: 'pss' },
        { quantity: 'ph', value: 12, unit: 'total' },
        { quantity: 'alkalinity', value: 2500, unit: 'umol_kg' },
      ],
      notes: '',
      updatedAt: '2026-06-03T10:00:00.000Z',
      deleted: false,
    };
    const plan: ImportPlan = {
      readings: [reading],
      readingLines: [2],
      updatedAtGiven: [false],
      newSites: [],
      errors: [],
      duplicateRows: [],
      rowCount: 1,
    };
    const [w] = computeWarnings(plan, [], solve);
    expect(w).toMatchObject({ row: 2, code: 'row-solve-failed', column: 'ph' });
    expect(w!.message).toContain('(measurements-disagree)');
  });
});
