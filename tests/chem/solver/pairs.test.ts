import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { alkalinityFromHDic, alkalinityParts } from '../../../src/chem/solver/alkalinity';
import { bufferFactors, revelleFactor } from '../../../src/chem/solver/buffer';
import { type Param, solvePair, stateFromHDic } from '../../../src/chem/solver/pairs';
import type { CarbonateState, ConstantSet, MinorTotals } from '../../../src/chem/types';
import { freshLike25, seawater25 } from './seawater-constants.fixture';

const PARAMS: Param[] = ['ta', 'dic', 'ph', 'co2', 'hco3', 'co3'];
const PAIRS: [Param, Param][] = PARAMS.flatMap((a, i) =>
  PARAMS.slice(i + 1).map((b) => [a, b] as [Param, Param]),
);

const paramValue = (s: CarbonateState, p: Param): number => (p === 'ph' ? -Math.log10(s.h) : s[p]);
const FIELDS = ['h', 'ta', 'dic', 'co2', 'hco3', 'co3', 'fco2', 'pco2'] as const;

function relErr(a: number, b: number): number {
  return Math.abs(a - b) / Math.max(Math.abs(a), Math.abs(b), 1e-300);
}

/** Largest relative difference over all fields, with TA compared on an absolute 1e-15 mol/kg floor near zero. */
function distance(a: CarbonateState, b: CarbonateState): number {
  let d = 0;
  for (const f of FIELDS) {
    const floor = f === 'ta' ? Math.abs(a.dic) : 0;
    d = Math.max(d, Math.abs(a[f] - b[f]) / Math.max(Math.abs(a[f]), Math.abs(b[f]), floor, 1e-300));
  }
  return d;
}

const minor: MinorTotals = { phosphate: 2e-6, silicate: 30e-6, ammonia: 1e-6, sulfide: 0.5e-6 };
const none: MinorTotals = { phosphate: 0, silicate: 0, ammonia: 0, sulfide: 0 };

describe.each([
  ['seawater-like', seawater25, minor],
  ['fresh-like', freshLike25, none],
] as [string, ConstantSet, MinorTotals][])('pair solver, %s constants', (_name, k, t) => {
  it.each(PAIRS)('%s–%s recovers a random water to 1e-9 relative', (a, b) => {
    fc.assert(
      fc.property(
        fc.double({ min: 4, max: 11, noNaN: true }),
        fc.double({ min: 100e-6, max: 5000e-6, noNaN: true }),
        (ph, dic) => {
          const truth = stateFromHDic(10 ** -ph, dic, k, t);
          const roots = solvePair(a, paramValue(truth, a), b, paramValue(truth, b), k, t);
          const best = Math.min(...roots.map((r) => distance(r, truth)));
          expect(best).toBeLessThan(1e-9);
          // The residual of the balance that defines TA is checked, not only the answer.
          for (const r of roots) {
            expect(Math.abs(alkalinityFromHDic(r.h, r.dic, k, t) - r.ta)).toBeLessThan(1e-15 + 1e-12 * r.dic);
          }
        },
      ),
      { numRuns: Number(process.env.TUFA_RUNS ?? 400) },
    );
  });
});

describe('two-root pairs', () => {
  it('DIC–HCO3 returns both roots, high pH first', () => {
    const truth = stateFromHDic(10 ** -8.1, 2000e-6, seawater25, none);
    const roots = solvePair('dic', truth.dic, 'hco3', truth.hco3, seawater25, none);
    expect(roots).toHaveLength(2);
    expect(roots[0]!.h).toBeLessThan(roots[1]!.h);
    for (const r of roots) expect(relErr(r.hco3, truth.hco3)).toBeLessThan(1e-12);
  });
  it('TA–CO3 can have two roots (TA has a minimum in h at fixed carbonate)', () => {
    const truth = stateFromHDic(10 ** -8.1, 2000e-6, seawater25, none);
    const roots = solvePair('ta', truth.ta, 'co3', truth.co3, seawater25, none);
    expect(roots.length).toBeGreaterThanOrEqual(1);
    expect(roots.some((r) => distance(r, truth) < 1e-9)).toBe(true);
  });
});

describe('impossible pairs are errors, not NaN', () => {
  it.each([
    ['dic', 1000e-6, 'co2', 2000e-6],
    ['dic', 1000e-6, 'hco3', 1500e-6],
    ['dic', 1000e-6, 'co3', 1200e-6],
  ] as [Param, number, Param, number][])('%s %d with %s %d', (a, va, b, vb) => {
    expect(() => solvePair(a, va, b, vb, seawater25, none)).toThrowError(/No water/);
  });
});

describe('alkalinity and buffer factor', () => {
  it('the parts add up to TA', () => {
    const h = 10 ** -8;
    const p = alkalinityParts(h, 2000e-6, seawater25, minor);
    const sum =
      p.carbonate +
      p.borate +
      p.hydroxide +
      p.phosphate +
      p.silicate +
      p.ammonia +
      p.sulfide -
      p.hFree -
      p.bisulfate -
      p.hydrogenFluoride;
    expect(relErr(sum, alkalinityFromHDic(h, 2000e-6, seawater25, minor))).toBeLessThan(1e-14);
  });
  it('the analytic Revelle factor equals a finite difference of the solver', () => {
    const s = stateFromHDic(10 ** -8.05, 2050e-6, seawater25, minor);
    const d = 1e-7 * s.dic;
    const up = solvePair('ta', s.ta, 'dic', s.dic + d, seawater25, minor)[0]!;
    const dn = solvePair('ta', s.ta, 'dic', s.dic - d, seawater25, minor)[0]!;
    const numeric = (Math.log(up.pco2) - Math.log(dn.pco2)) / (Math.log(s.dic + d) - Math.log(s.dic - d));
    expect(relErr(revelleFactor(s, seawater25, minor), numeric)).toBeLessThan(1e-6);
    // Typical surface seawater has R between 8 and 15 (Sabine et al. 2004, Science 305, 367).
    expect(revelleFactor(s, seawater25, minor)).toBeGreaterThan(8);
    expect(revelleFactor(s, seawater25, minor)).toBeLessThan(15);
  });
});

describe('Egleston et al. (2010) buffer factors', () => {
  it('equal finite differences of the solver, and γDIC = DIC / Revelle factor', () => {
    const s = stateFromHDic(10 ** -8.05, 2050e-6, seawater25, minor);
    const b = bufferFactors(s, seawater25, minor);
    const d = 1e-7 * s.dic;
    const co3 = (x: { co3: number }) => x.co3;
    const at = (ta: number, dic: number) => solvePair('ta', ta, 'dic', dic, seawater25, minor)[0]!;
    const inv = (
      f: (x: ReturnType<typeof at>) => number,
      up: ReturnType<typeof at>,
      dn: ReturnType<typeof at>,
    ) => (2 * d) / (Math.log(f(up)) - Math.log(f(dn)));
    const dicUp = at(s.ta, s.dic + d);
    const dicDn = at(s.ta, s.dic - d);
    const taUp = at(s.ta + d, s.dic);
    const taDn = at(s.ta - d, s.dic);
    expect(
      relErr(
        b.gammaDic,
        inv((x) => x.co2, dicUp, dicDn),
      ),
    ).toBeLessThan(1e-5);
    expect(
      relErr(
        b.betaDic,
        inv((x) => x.h, dicUp, dicDn),
      ),
    ).toBeLessThan(1e-5);
    expect(relErr(b.omegaDic, inv(co3, dicUp, dicDn))).toBeLessThan(1e-5);
    expect(
      relErr(
        b.gammaTa,
        inv((x) => x.co2, taUp, taDn),
      ),
    ).toBeLessThan(1e-5);
    expect(
      relErr(
        b.betaTa,
        inv((x) => x.h, taUp, taDn),
      ),
    ).toBeLessThan(1e-5);
    expect(relErr(b.omegaTa, inv(co3, taUp, taDn))).toBeLessThan(1e-5);
    expect(relErr(b.gammaDic, s.dic / revelleFactor(s, seawater25, minor))).toBeLessThan(1e-12);
    // Surface-ocean magnitudes in Egleston et al. (2010), fig. 2: γ and β of order 0.1–0.3 mmol/kg.
    expect(b.gammaDic * 1e3).toBeGreaterThan(0.1);
    expect(b.gammaDic * 1e3).toBeLessThan(0.4);
    expect(b.betaDic).toBeGreaterThan(0);
    expect(b.omegaDic).toBeLessThan(0);
    expect(b.gammaTa).toBeLessThan(0);
  });
});
