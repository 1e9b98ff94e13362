import { describe, expect, it } from 'vitest';
import {
  activityCoefficients,
  debyeHuckelAB,
  dielectricWaterMalmbergMaryott1956,
  logGammaDavies,
  logGammaDebyeHuckel,
  logGammaTruesdellJones,
} from '../../../src/chem/fresh/activity';
import { DEBYE_HUCKEL_AB_ROWS, KIELLAND_1937_ROWS } from '../../fixtures/kielland-1937';

describe('Debye–Hückel constants', () => {
  it('permittivity of water is 78.30 at 25 °C (Malmberg & Maryott 1956, memory)', () => {
    expect(dielectricWaterMalmbergMaryott1956(25)).toBeCloseTo(78.3, 1);
  });
  it.each(DEBYE_HUCKEL_AB_ROWS)('A and B at $tC °C', (row) => {
    const ab = debyeHuckelAB(row.tC);
    expect(Math.abs(ab.a - row.a)).toBeLessThan(row.tolA);
    if (row.b !== undefined) expect(Math.abs(ab.b - row.b)).toBeLessThan(row.tolB);
  });
  it('A and B grow with temperature', () => {
    expect(debyeHuckelAB(40).a).toBeGreaterThan(debyeHuckelAB(10).a);
    expect(debyeHuckelAB(40).b).toBeGreaterThan(debyeHuckelAB(10).b);
  });
});

describe('extended Debye–Hückel against Kielland (1937) Table I', () => {
  const ab = debyeHuckelAB(25);
  it.each(KIELLAND_1937_ROWS)('$ion (å $sizeA, z $z) at I $I: γ $gamma', (row) => {
    const g = 10 ** logGammaDebyeHuckel(row.z, row.I, ab.a, ab.b, row.sizeA);
    expect(Math.abs(g - row.gamma)).toBeLessThan(row.tol);
  });
});

describe('Davies and Truesdell–Jones', () => {
  const { a, b } = debyeHuckelAB(25);
  it('Davies at I = 0.1, z = 1 gives γ ≈ 0.78 (Stumm & Morgan 1996, Aquatic Chemistry, Table 3.3, memory)', () => {
    expect(10 ** logGammaDavies(1, 0.1, a)).toBeCloseTo(0.78, 2);
  });
  it('all three agree with the limiting law as I → 0', () => {
    // Relative departure from −A z² √I shrinks like √I.
    const I = 1e-10;
    const limiting = -a * 4 * Math.sqrt(I);
    expect(Math.abs(logGammaDavies(2, I, a) / limiting - 1)).toBeLessThan(1e-4);
    expect(Math.abs(logGammaDebyeHuckel(2, I, a, b, 6) / limiting - 1)).toBeLessThan(1e-4);
    expect(Math.abs(logGammaTruesdellJones(2, I, a, b, 5, 0.165) / limiting - 1)).toBeLessThan(1e-4);
  });
  it('Davies turns upward past its minimum near I ≈ 0.5 (published shape of the equation)', () => {
    expect(logGammaDavies(2, 1.5, a)).toBeGreaterThan(logGammaDavies(2, 0.5, a));
  });
  it('γ = 1 for every species at I = 0, and falls with I for charged ones', () => {
    for (const model of ['davies', 'debye-huckel', 'truesdell-jones'] as const) {
      const g0 = activityCoefficients(25, 0, model, true);
      for (const v of Object.values(g0)) expect(v).toBe(1);
      const g = activityCoefficients(25, 0.01, model, true);
      expect(g.Ca).toBeLessThan(g.Na);
      expect(g.Ca).toBeLessThan(1);
      expect(g.neutral).toBeGreaterThan(1);
    }
  });
});
