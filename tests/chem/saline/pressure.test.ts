import { describe, expect, it } from 'vitest';
import { T0_K } from '../../../src/chem/physical';
import { k0PressureFactorWeiss1974 } from '../../../src/chem/saline/co2-solubility';
import { salineConstants } from '../../../src/chem/saline/constants';
import {
  lnCarbonicPressureFactorMillero2010,
  lnPressureFactorMillero1995,
  PRESSURE_TERMS_MILLERO1995,
} from '../../../src/chem/saline/pressure';
import type { ConstantSet } from '../../../src/chem/types';

const ACIDS = ['k1', 'k2', 'kb', 'kw', 'ks', 'kf', 'k1p', 'k2p', 'k3p', 'ksi', 'knh4', 'kh2s'] as const;
const SOLIDS = ['kspCalcite', 'kspAragonite'] as const;

describe('Millero 1995 pressure terms', () => {
  it.each(Object.entries(PRESSURE_TERMS_MILLERO1995))('%s: no correction at the surface', (_k, terms) => {
    expect(lnPressureFactorMillero1995(terms, 10, 0)).toBe(0);
  });

  it('K1 at 1000 bar, 25 °C: ln factor 0.883, worked by hand from the table coefficients', () => {
    // ΔV = −25.5 + 0.1271·25 = −22.3225; Δκ = (−3.08 + 0.0877·25)e−3 = −0.8875e−3;
    // ln = (22.3225 − 0.5·0.8875e−3·1000)·1000 / (83.1446·298.15) = 0.8826 (hand calculation).
    expect(lnPressureFactorMillero1995(PRESSURE_TERMS_MILLERO1995.k1, 25, 1000)).toBeCloseTo(0.8826, 3);
  });

  it('Millero 2010 K1/K2 terms equal the Millero 1995 ones at S 34.8', () => {
    for (const [step, terms] of [
      [1, PRESSURE_TERMS_MILLERO1995.k1],
      [2, PRESSURE_TERMS_MILLERO1995.k2],
    ] as const) {
      for (const [t, p] of [
        [2, 400],
        [25, 1000],
      ]) {
        expect(lnCarbonicPressureFactorMillero2010(step, 34.8, t!, p!)).toBeCloseTo(
          lnPressureFactorMillero1995(terms, t!, p!),
          12,
        );
      }
    }
  });
});

describe('pressure in salineConstants', () => {
  const at = (p: number, t = 10, s = 35, carbonic: 'lueker2000' | 'millero2010' = 'lueker2000') =>
    salineConstants({ temperatureC: t, salinity: s, pressureDbar: p }, { carbonic });

  it.each([0, 10, 25])(
    'every acid constant and Ksp grows with depth at %i °C (dissociation shrinks volume)',
    (t) => {
      let prev: ConstantSet = at(0, t);
      for (const p of [500, 1000, 2000, 4000, 6000]) {
        const next = at(p, t);
        for (const k of [...ACIDS, ...SOLIDS]) expect(next[k], `${k} at ${p} dbar`).toBeGreaterThan(prev[k]);
        expect(next.k0, 'K0 falls with pressure (CO2 partial molar volume > 0)').toBeLessThan(prev.k0);
        prev = next;
      }
    },
  );

  it('calcite solubility about doubles from the surface to 4000 dbar at 2 °C (common practice: "roughly twofold")', () => {
    const ratio = at(4000, 2).kspCalcite / at(0, 2).kspCalcite;
    expect(ratio).toBeGreaterThan(1.8);
    expect(ratio).toBeLessThan(2.6);
  });

  it('applies the acid terms on the seawater scale: the seawater-scale K1 changes by exactly the table factor', () => {
    for (const s of [0, 20, 35]) {
      const p = 3000;
      const surface = at(0, 5, s);
      const deep = at(p, 5, s);
      for (const [k, terms] of [
        ['k1', PRESSURE_TERMS_MILLERO1995.k1],
        ['kb', PRESSURE_TERMS_MILLERO1995.kb],
        ['kw', PRESSURE_TERMS_MILLERO1995.kw],
      ] as const) {
        const swsRatio = (deep[k] * deep.scaleFactor.seawater) / (surface[k] * surface.scaleFactor.seawater);
        expect(Math.log(swsRatio)).toBeCloseTo(lnPressureFactorMillero1995(terms, 5, p / 10), 12);
      }
      // KS and KF are on the free scale and corrected there.
      expect(Math.log(deep.ks / surface.ks)).toBeCloseTo(
        lnPressureFactorMillero1995(PRESSURE_TERMS_MILLERO1995.ks, 5, p / 10),
        12,
      );
    }
  });

  it('the Millero 2010 option uses its own salinity-dependent terms', () => {
    const s = 10;
    const ratio =
      (at(3000, 5, s, 'millero2010').k1 * at(3000, 5, s, 'millero2010').scaleFactor.seawater) /
      (at(0, 5, s, 'millero2010').k1 * at(0, 5, s, 'millero2010').scaleFactor.seawater);
    expect(Math.log(ratio)).toBeCloseTo(lnCarbonicPressureFactorMillero2010(1, s, 5, 300), 12);
  });

  // Issue 12 §4: the Millero 2010 salinity terms shrink |ΔV| toward S 0 (physically backwards, as
  // printed in the paper as far as we recall). These pin the consequence the doc comment states.
  it('Millero 2010 terms at S 0: ΔV2 = −4.6 cm3/mol; Δlog K2 at 1000 dbar, 10 °C is 0.010 against 0.030', () => {
    const dlog = (step: 1 | 2, s: number) =>
      lnCarbonicPressureFactorMillero2010(step, s, 10, 100) / Math.LN10;
    expect(dlog(2, 0)).toBeCloseTo(0.01, 3);
    expect(dlog(2, 5)).toBeCloseTo(0.0128, 3);
    expect(dlog(1, 0)).toBeCloseTo(0.0367, 3);
    expect(dlog(2, 34.8)).toBeCloseTo(
      lnPressureFactorMillero1995(PRESSURE_TERMS_MILLERO1995.k2, 10, 100) / Math.LN10,
      12,
    );
  });

  it('K0 carries the Weiss 1974 partial molar volume term', () => {
    const f = at(1000, 25).k0 / at(0, 25).k0;
    expect(f).toBeCloseTo(k0PressureFactorWeiss1974(25 + T0_K, 100), 14);
    expect(f).toBeCloseTo(Math.exp((-32.3 * 100) / (83.1446 * 298.15)), 5);
  });

  it('is continuous at the surface: a millimetre of water changes nothing visible', () => {
    const a = at(0);
    const b = at(1e-6);
    for (const k of [...ACIDS, ...SOLIDS, 'k0'] as const) expect(b[k] / a[k]).toBeCloseTo(1, 8);
  });

  it('the fugacity factor stays at its 1 atm value at depth (our stated choice)', () => {
    expect(at(5000).fugacityFactor).toBe(at(0).fugacityFactor);
  });
});
