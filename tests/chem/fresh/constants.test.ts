import { describe, expect, it } from 'vitest';
import { freshConstants } from '../../../src/chem/fresh/constants';
import {
  logK1PlummerBusenberg1982,
  logK2PlummerBusenberg1982,
  logKhPlummerBusenberg1982,
  logKspCalcitePlummerBusenberg1982,
  logKwHarnedOwen1958,
} from '../../../src/chem/fresh/thermo';
import type { ConstantSet } from '../../../src/chem/types';

const cond = (t: number, p = 0) => ({ temperatureC: t, salinity: 0, pressureDbar: p });

describe('freshConstants', () => {
  it('at I = 0 equals the plain thermodynamic constants', () => {
    for (const t of [0, 12, 25, 40]) {
      const c = freshConstants(cond(t), { ionicStrength: 0 });
      const tK = t + 273.15;
      expect(Math.log10(c.k1)).toBeCloseTo(logK1PlummerBusenberg1982(tK), 12);
      expect(Math.log10(c.k2)).toBeCloseTo(logK2PlummerBusenberg1982(tK), 12);
      expect(Math.log10(c.k0)).toBeCloseTo(logKhPlummerBusenberg1982(tK), 12);
      expect(Math.log10(c.kw)).toBeCloseTo(logKwHarnedOwen1958(tK), 12);
      expect(Math.log10(c.kspCalcite)).toBeCloseTo(logKspCalcitePlummerBusenberg1982(tK), 12);
      expect(c.freeHFactor).toBe(1);
      expect(c.scaleFactor).toEqual({ nbs: 1, free: 1, total: 1, seawater: 1 });
    }
  });

  it('fills every numeric field of the ConstantSet with a finite value', () => {
    const c: ConstantSet = freshConstants(cond(15), { ionicStrength: 0.01, activity: 'truesdell-jones' });
    for (const [k, v] of Object.entries(c)) {
      if (typeof v === 'number') expect(Number.isFinite(v), k).toBe(true);
    }
    expect(c.model).toBe('fresh');
    expect(c.formulations.k1).toBe('Plummer & Busenberg 1982');
  });

  it('moves in the published direction as I rises: conditional pK2 and pKsp fall', () => {
    // Stumm & Morgan (1996) §3.4: ionic strength raises the apparent dissociation constants.
    const lo = freshConstants(cond(25), { ionicStrength: 0.001 });
    const hi = freshConstants(cond(25), { ionicStrength: 0.05 });
    expect(hi.k2).toBeGreaterThan(lo.k2);
    expect(hi.k1).toBeGreaterThan(lo.k1);
    expect(hi.kspCalcite).toBeGreaterThan(lo.kspCalcite);
    expect(hi.kw).toBeGreaterThan(lo.kw);
  });

  it('uses the stated mixed-constant definitions', () => {
    const c = freshConstants(cond(25), { ionicStrength: 0.02, activity: 'debye-huckel' });
    const g = c.gamma;
    expect(c.k2).toBeCloseTo((10 ** c.thermodynamic.k2 * g.HCO3) / g.CO3, 20);
    expect(c.k1).toBeCloseTo((10 ** c.thermodynamic.k1 * g.neutral) / g.HCO3, 15);
    expect(c.k0).toBeCloseTo(10 ** c.thermodynamic.k0 / g.neutral, 15);
    expect(c.kspCalcite / (10 ** c.thermodynamic.kspCalcite / (g.Ca * g.CO3))).toBeCloseTo(1, 12);
    expect(c.freeHFactor).toBeCloseTo(1 / g.H, 15);
  });

  it('total and seawater scales follow sulfate and fluoride when given', () => {
    const c = freshConstants(cond(25), { ionicStrength: 0.02, totalSulfate: 0.002, totalFluoride: 1e-4 });
    expect(c.scaleFactor.total).toBeCloseTo(c.scaleFactor.free * (1 + 0.002 / c.ks), 14);
    expect(c.scaleFactor.seawater).toBeGreaterThan(c.scaleFactor.total);
  });

  it('warns outside validity ranges but still computes', () => {
    const c = freshConstants(cond(95), { ionicStrength: 0.2, activity: 'debye-huckel' });
    const codes = c.warnings.map((w) => w.code);
    expect(codes.filter((x) => x === 'formulation-out-of-range').length).toBeGreaterThanOrEqual(3);
    expect(Number.isFinite(c.k1)).toBe(true);
    expect(freshConstants(cond(25), { ionicStrength: 0.01 }).warnings).toEqual([]);
    expect(freshConstants(cond(25, 100), { ionicStrength: 0.01 }).warnings.map((w) => w.code)).toContain(
      'fresh-pressure-ignored',
    );
  });

  it('rejects bad input with a code instead of returning NaN', () => {
    expect(() => freshConstants(cond(25), { ionicStrength: -1 })).toThrow(/Ionic strength/);
    expect(() => freshConstants(cond(Number.NaN), { ionicStrength: 0 })).toThrow(/Temperature/);
  });
});
