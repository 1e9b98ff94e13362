import { describe, expect, it } from 'vitest';
import { freshConstants } from '../../../src/chem/fresh/constants';
import {
  phAtAirEquilibrium,
  phSaturationCalcite,
  precipitationPotentialCalcite,
  saturationIndex,
} from '../../../src/chem/fresh/indices';
import { solvePair, stateFromHDic } from '../../../src/chem/solver/pairs';

const t = { phosphate: 0, silicate: 0, ammonia: 0, sulfide: 0 };
const k = freshConstants({ temperatureC: 25, salinity: 0, pressureDbar: 0 }, { ionicStrength: 0.0125 });
// An invented hard well water: TA 3 meq/kg, Ca 2 mmol/kg, pH 7.5.
const ta = 3e-3;
const ca = 2e-3;
const s = solvePair('ph', 7.5, 'ta', ta, k, t)[0]!;

describe('pHs and the Langelier index', () => {
  const phs = phSaturationCalcite(ta, ca, k, t)!;
  it('at pHs the fixed-TA water is exactly saturated with calcite (residual < 1e-9 in SI)', () => {
    const atPhs = solvePair('ph', phs, 'ta', ta, k, t)[0]!;
    expect(Math.abs(saturationIndex(ca * atPhs.co3, k.kspCalcite))).toBeLessThan(1e-9);
  });
  it('agrees with Langelier (1936) pHs = pK2′ − pKsp′ + p[Ca] + p[HCO3-] where HCO3- carries the alkalinity', () => {
    const classic = -Math.log10(k.k2) + Math.log10(k.kspCalcite) - Math.log10(ca) - Math.log10(s.hco3);
    expect(Math.abs(phs - classic)).toBeLessThan(0.005);
  });
  it('agrees within 0.2 with the simplified formula pHs = 9.3 + A + B − C − D printed in water-treatment texts (common practice, memory)', () => {
    // A = (log TDS − 1)/10, B = −13.12 log T(K) + 34.55, C = log Ca(as CaCO3) − 0.4, D = log alk(as CaCO3)
    const tds = 500;
    const simplified =
      9.3 +
      (Math.log10(tds) - 1) / 10 +
      (-13.12 * Math.log10(298.15) + 34.55) -
      (Math.log10(200.17) - 0.4) -
      Math.log10(150.13);
    const kT = freshConstants(
      { temperatureC: 25, salinity: 0, pressureDbar: 0 },
      { ionicStrength: 2.5e-5 * tds },
    );
    expect(Math.abs(phSaturationCalcite(ta, ca, kT, t)! - simplified)).toBeLessThan(0.2);
  });
  it('has no pHs when there is too little calcium for saturation at any pH', () => {
    expect(phSaturationCalcite(50e-6, 1e-7, k, t)).toBeUndefined();
  });
  it('LSI and SI have the same sign and LSI ≈ SI when CO3 is a small part of TA', () => {
    const si = saturationIndex(ca * s.co3, k.kspCalcite);
    expect(Math.sign(7.5 - phs)).toBe(Math.sign(si));
    expect(Math.abs(7.5 - phs - si)).toBeLessThan(0.01);
  });
});

describe('calcium carbonate precipitation potential (solved)', () => {
  it('leaves the water exactly saturated, conserving Ca − DIC and TA − 2 Ca', () => {
    const p = precipitationPotentialCalcite(s.ta, s.dic, ca, s.h, k, t);
    expect(p.molKg).toBeGreaterThan(0);
    const after = stateFromHDic(10 ** -p.phAfter, s.dic - p.molKg, k, t);
    expect(after.ta).toBeCloseTo(s.ta - 2 * p.molKg, 12);
    expect(Math.abs(saturationIndex((ca - p.molKg) * after.co3, k.kspCalcite))).toBeLessThan(1e-8);
    expect(p.phAfter).toBeLessThan(7.5);
  });
  it('is negative (dissolving) for an aggressive soft water', () => {
    const soft = solvePair('ph', 6.8, 'ta', 0.4e-3, k, t)[0]!;
    const p = precipitationPotentialCalcite(soft.ta, soft.dic, 0.3e-3, soft.h, k, t);
    expect(p.molKg).toBeLessThan(0);
    expect(p.phAfter).toBeGreaterThan(6.8);
  });
  it('is zero for a water already at saturation', () => {
    const phs = phSaturationCalcite(ta, ca, k, t)!;
    const sat = solvePair('ph', phs, 'ta', ta, k, t)[0]!;
    expect(Math.abs(precipitationPotentialCalcite(sat.ta, sat.dic, ca, sat.h, k, t).molKg)).toBeLessThan(
      1e-10,
    );
  });
});

describe('CO2 exchange with air', () => {
  it('the equilibrium water has the pCO2 of the air and the same TA', () => {
    const a = phAtAirEquilibrium(ta, 420e-6, k, t);
    const eq = stateFromHDic(a.h, a.dic, k, t);
    expect(eq.pco2 * 1e6).toBeCloseTo(420, 6);
    expect(eq.ta).toBeCloseTo(ta, 12);
  });
  it('a CO2-rich spring water (pCO2 > air) rises in pH when it degasses', () => {
    const spring = solvePair('ph', 6.9, 'ta', 4e-3, k, t)[0]!;
    expect(spring.pco2).toBeGreaterThan(420e-6);
    expect(-Math.log10(phAtAirEquilibrium(4e-3, 420e-6, k, t).h)).toBeGreaterThan(6.9);
  });
  it('rejects a non-positive air pCO2 with a code', () => {
    expect(() => phAtAirEquilibrium(ta, 0, k, t)).toThrow(/pCO2 of the air/);
  });
});
