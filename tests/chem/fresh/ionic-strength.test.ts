import { describe, expect, it } from 'vitest';
import {
  chargeBalanceErrorPercent,
  ionicStrengthFromConductance,
  ionicStrengthFromIons,
  ionicStrengthFromTds,
  majorIonsToMolKg,
} from '../../../src/chem/fresh/ionic-strength';

describe('ionic strength', () => {
  it('is exact for a 0.01 mol/kg CaCl2 solution: I = 0.03 (definition)', () => {
    const m = majorIonsToMolKg({ calcium: 0.01 * 40.078 * 1000, chloride: 0.02 * 35.453 * 1000 }, 1);
    expect(ionicStrengthFromIons(m, { hco3: 0, co3: 0, oh: 0, hFree: 0 })).toBeCloseTo(0.03, 12);
    expect(chargeBalanceErrorPercent(m, { hco3: 0, co3: 0, oh: 0, hFree: 0 })).toBeCloseTo(0, 10);
  });
  it('uses the published linear factors', () => {
    expect(ionicStrengthFromConductance(1000, 'russell-1976')).toBeCloseTo(0.016, 12);
    expect(ionicStrengthFromConductance(1000, 'griffin-jurinak-1973')).toBeCloseTo(0.013, 12);
    expect(ionicStrengthFromTds(400)).toBeCloseTo(0.01, 12);
  });
  it('rejects negative ion concentrations with a code', () => {
    expect(() => majorIonsToMolKg({ sodium: -3 }, 1)).toThrow(/sodium/);
  });
  it('charge balance error is positive when cations exceed anions', () => {
    const m = majorIonsToMolKg({ sodium: 46, chloride: 35.453 }, 1);
    expect(chargeBalanceErrorPercent(m, { hco3: 0, co3: 0, oh: 0, hFree: 0 })).toBeGreaterThan(0);
  });
});
