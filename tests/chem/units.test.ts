import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  ALKALINITY_UNITS,
  alkalinityToEqKg,
  CONCENTRATION_UNITS,
  convertAlkalinity,
  convertConcentration,
  densityKgL,
  SPECIES,
} from '../../src/chem/units';

describe('alkalinity units', () => {
  it('1 dKH = 0.3566 meq/L = 17.85 mg/L as CaCO3 (common practice figures)', () => {
    expect(convertAlkalinity(1, 'dkh', 'meq_l', 1)).toBeCloseTo(0.3566, 4);
    expect(convertAlkalinity(1, 'dkh', 'mg_l_caco3', 1)).toBeCloseTo(17.85, 2);
  });
  it('mg/L as CaCO3 = 50.04 × meq/L and mg/L as HCO3- = 61.02 × meq/L (common practice)', () => {
    expect(convertAlkalinity(2, 'meq_l', 'mg_l_caco3', 1.02)).toBeCloseTo(100.087, 3);
    expect(convertAlkalinity(2, 'meq_l', 'mg_l_hco3', 1.02)).toBeCloseTo(122.034, 3);
  });
  it('uses density between per-kg and per-litre units, and only there', () => {
    const rho = densityKgL(35, 25);
    expect(rho).toBeCloseTo(1.023343, 5);
    // 2300 µmol/kg in seawater is 2.3535 mmol/L, not 2.3.
    expect(convertAlkalinity(2300, 'umol_kg', 'mmol_l', rho)).toBeCloseTo(2.3 * rho, 10);
    // ppm (mass/mass) needs no density; mg/L does.
    expect(convertAlkalinity(2300, 'umol_kg', 'ppm_caco3', rho)).toBeCloseTo(
      convertAlkalinity(2300, 'umol_kg', 'ppm_caco3', 1),
      12,
    );
    expect(convertAlkalinity(100, 'ppm_caco3', 'mg_l_caco3', rho)).toBeCloseTo(100 * rho, 10);
  });
  it('round-trips between every pair of units (relative error < 1e-14)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -5000, max: 1e5, noNaN: true }),
        fc.constantFrom(...ALKALINITY_UNITS),
        fc.constantFrom(...ALKALINITY_UNITS),
        fc.double({ min: 0.99, max: 1.05, noNaN: true }),
        (v, a, b, rho) => {
          const back = convertAlkalinity(convertAlkalinity(v, a, b, rho), b, a, rho);
          return Math.abs(back - v) <= 1e-14 * Math.abs(v) + 1e-290;
        },
      ),
    );
  });
  it('rejects NaN, unknown-looking densities and keeps codes', () => {
    expect(() => alkalinityToEqKg(Number.NaN, 'dkh', 1)).toThrow(/finite/);
    expect(() => alkalinityToEqKg(1, 'dkh', 1000)).toThrow(/kg\/L/);
  });
});

describe('concentration units', () => {
  it('40.078 mg/L Ca in water of 1 kg/L is 1 mmol/kg, 2 meq/L and 100.09 mg/L as CaCO3', () => {
    expect(convertConcentration(40.078, 'mg_l', 'mmol_kg', SPECIES.calcium, 1)).toBeCloseTo(1, 12);
    expect(convertConcentration(40.078, 'mg_l', 'meq_l', SPECIES.calcium, 1)).toBeCloseTo(2, 12);
    expect(convertConcentration(40.078, 'mg_l', 'mg_l_caco3', SPECIES.calcium, 1)).toBeCloseTo(100.0869, 4);
  });
  it('1 dGH = 7.14 mg/L Ca (10 mg/L CaO, common practice)', () => {
    expect(convertConcentration(1, 'dgh', 'mg_l', SPECIES.calcium, 1)).toBeCloseTo(7.147, 3);
  });
  it('round-trips between every pair of units for every charged species', () => {
    const charged = Object.values(SPECIES).filter((s) => s.charge !== 0);
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 1e5, noNaN: true }),
        fc.constantFrom(...CONCENTRATION_UNITS),
        fc.constantFrom(...CONCENTRATION_UNITS),
        fc.constantFrom(...charged.filter((s) => Math.abs(s.charge) === 2)),
        (v, a, b, sp) => {
          const back = convertConcentration(convertConcentration(v, a, b, sp, 1.01), b, a, sp, 1.01);
          return Math.abs(back - v) <= 1e-14 * Math.abs(v) + 1e-290;
        },
      ),
    );
  });
  it('refuses equivalents for neutral species and dGH for monovalent ions', () => {
    expect(() => convertConcentration(1, 'mg_l', 'meq_l', SPECIES.co2, 1)).toThrow(/neutral/);
    expect(() => convertConcentration(1, 'mg_l', 'dgh', SPECIES.sodium, 1)).toThrow(/divalent/);
  });
});
