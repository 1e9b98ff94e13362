/**
 * Issue 15 §3: no plan hangs. The probe's case ("reach" on fresh water with volume_l 5e-324 ran
 * for 26 minutes) is now a coded error at once, amounts of water are range-checked, and every
 * search ends within its bound on hostile numbers (fast-check; CI seed from tests/setup.ts).
 */

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CHEMICALS } from '../../../src/chem/plan/chemicals';
import { amountForm, doseToTarget, TARGET_QUANTITIES } from '../../../src/chem/plan/inverse';
import { isPlanError, plan } from '../../../src/chem/plan/plan';
import { PLANTED, plantedWater, REEF } from './helpers';

function timed<T>(f: () => T): { value: T; ms: number } {
  const t0 = performance.now();
  const value = f();
  return { value, ms: performance.now() - t0 };
}

describe('bounded planner', () => {
  it('refuses volume_l 5e-324 with a code instead of searching forever', () => {
    const { value: r, ms } = timed(() =>
      plan({
        water: PLANTED,
        volume_l: 5e-324,
        actions: [{ action: 'reach', chemical: 'sodium_bicarbonate', target: { alkalinity_dkh: 6 } }],
      }),
    );
    expect(isPlanError(r) && r.error.code).toBe('volume-out-of-range');
    expect(ms).toBeLessThan(5000);
  }, 10000);

  it.each([
    [5e-324, 'volume-out-of-range'],
    [1e-9, 'volume-out-of-range'],
    [1e300, 'volume-out-of-range'],
    [-1, 'bad-volume'],
  ])('volume_l %s is %s', (v, code) => {
    const r = plan({ water: REEF, volume_l: v, actions: [{ action: 'equilibrate' }] });
    expect(isPlanError(r) && r.error.code).toBe(code);
  });

  it('gives up with plan-search-gave-up on a water the scan cannot grow on', () => {
    const w = { ...plantedWater(1), basisKg: 5e-324 };
    const chem = CHEMICALS.sodium_bicarbonate;
    expect(() => doseToTarget(w, chem, amountForm({}, chem), 'alkalinity_dkh', 6)).toThrow(
      expect.objectContaining({ code: 'plan-search-gave-up' }),
    );
  });

  it('ends every reach within its bound on hostile volumes and targets', () => {
    const chemIds = Object.keys(CHEMICALS);
    fc.assert(
      fc.property(
        fc.constantFrom(...chemIds),
        fc.constantFrom(...TARGET_QUANTITIES),
        fc.oneof(fc.double({ noNaN: false }), fc.constantFrom(5e-324, 1e-6, 1e10, 0, -0)),
        fc.oneof(fc.double(), fc.constantFrom(1e308, -1e308, 5e-324, 0)),
        (chemical, q, volume, target) => {
          const { value: r, ms } = timed(() =>
            plan({
              water: PLANTED,
              volume_l: volume,
              actions: [{ action: 'reach', chemical, target: { [q]: target } }],
            }),
          );
          expect(ms).toBeLessThan(3000);
          if (isPlanError(r)) expect(r.error.code).toMatch(/^[a-z0-9-]+$/);
          else expect(Array.isArray(r.steps)).toBe(true);
        },
      ),
      { numRuns: 60 },
    );
  }, 120000);
});
