/**
 * The alkalinity equation of field practice, as given in the USGS National Field Manual,
 * chapter A6.6 (Rounds 2012) *(memory)*:
 *   alkalinity (mg/L as CaCO3) = B · C_B · CF · 50 044 / V_s
 * with B the titrant volume to the equivalence point (mL), C_B its normality (eq/L), CF its
 * correction factor and V_s the sample volume (mL). The numbers below are an invented sample,
 * not the manual's worked example: this checks our units against the equation, not a reading.
 */

import { describe, expect, it } from 'vitest';
import { reduceTitration } from '../../../src/chem/titration/reduceTitration';
import { constantsAt25 } from './constantsFixture';
import { syntheticTitration } from './syntheticTitration';

describe('alkalinity from the field-practice equation', () => {
  it('mg/L as CaCO3 = B·CB·CF·50044/Vs for the equivalence volume found', () => {
    const k = constantsAt25();
    const input = {
      ...syntheticTitration(
        {
          sample: { alkalinity: 1.7e-3, dic: 1.9e-3 },
          sampleVolumeMl: 50,
          titrantEqL: 0.1,
          points: 40,
          finalPh: 3.0,
          phNoise: 0,
          seed: 1,
        },
        k,
      ),
      titrant_normality: 0.0998 / 0.98,
      titrant_correction_factor: 0.98,
    };
    const r = reduceTitration({ ...input, method: 'gran' }, () => k);
    const fromEquation = (r.equivalence_volume_ml * (0.0998 / 0.98) * 0.98 * 50044) / 50;
    // 50 044 (the manual's rounding of 100.087/2 × 1000) against our 100.0869/2 × 1000: 1e-5 apart.
    expect(Math.abs(r.alkalinity_mg_l_caco3 / fromEquation - 1)).toBeLessThan(2e-5);
    expect(r.titrant_eq_l).toBeCloseTo(0.0998, 12);
  });
});
