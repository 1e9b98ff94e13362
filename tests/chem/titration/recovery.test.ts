import { describe, expect, it } from 'vitest';
import { reduceTitration } from '../../../src/chem/titration/reduceTitration';
import type { TitrationMethod } from '../../../src/chem/titration/types';
import { constantsAt25 } from './constantsFixture';
import { syntheticTitration } from './syntheticTitration';

const k = constantsAt25();
const make = () => k;

/**
 * Tolerances (relative, on alkalinity) we promise for a 50-point titration to pH 3 with 0.005 pH
 * of reading noise. The fixed endpoint at pH 4.5 is tested separately: its bias at low alkalinity
 * is real chemistry (the equivalence pH rises as alkalinity falls).
 */
const TOLERANCE: Record<Exclude<TitrationMethod, 'endpoint'>, number> = {
  gran: 0.01,
  inflection: 0.04,
  curve_fit: 0.003,
};

const waters = [
  { name: 'soft upland stream', ta: 0.2e-3, c: 0.02 },
  { name: 'lowland pond', ta: 0.5e-3, c: 0.02 },
  { name: 'limestone spring', ta: 2e-3, c: 0.1 },
  { name: 'hard well water', ta: 5e-3, c: 0.1 },
];
const systems = ['closed', 'open'] as const;
const cases = waters.flatMap((w) => systems.map((system) => ({ ...w, system })));

function titration(w: (typeof cases)[number], seed: number, noise = 0.005) {
  const sample =
    w.system === 'open' ? { alkalinity: w.ta, pco2Atm: 420e-6 } : { alkalinity: w.ta, dic: w.ta * 1.15 };
  return syntheticTitration(
    { sample, sampleVolumeMl: 100, titrantEqL: w.c, points: 50, finalPh: 3.0, phNoise: noise, seed },
    k,
  );
}

describe('synthetic titrations are recovered by every method', () => {
  it.each(cases)('$name ($system): gran, inflection, curve fit', (w) => {
    for (const seed of [1, 2, 3]) {
      const input = titration(w, seed);
      for (const method of ['gran', 'inflection', 'curve_fit'] as const) {
        const r = reduceTitration({ ...input, method, system: w.system }, make);
        const rel = r.alkalinity_meq_l / (w.ta * 1e3) - 1;
        expect(Math.abs(rel), `${method} seed ${seed}: ${(rel * 100).toFixed(2)} %`).toBeLessThan(
          TOLERANCE[method],
        );
        expect(r.equivalence_volume_ml).toBeCloseTo((r.alkalinity_meq_l * 1e-3 * 100) / w.c, 10);
      }
    }
  });

  it.each(cases)('$name ($system): curve fit returns DIC', (w) => {
    const r = reduceTitration({ ...titration(w, 4), method: 'curve_fit', system: w.system }, make);
    // Open system: the sample started in equilibrium with 420 µatm, so its DIC follows from TA and pCO2.
    const dic = w.system === 'closed' ? w.ta * 1.15 * 1e6 : undefined;
    expect(r.dic_umol_kg).toBeDefined();
    if (dic !== undefined) expect(Math.abs(r.dic_umol_kg! / dic - 1)).toBeLessThan(0.01);
    else expect(r.fit.details.air_pco2_uatm! / 420 - 1).toBeLessThan(0.05);
    // Residuals match the noise put in (0.005 pH), neither hiding it nor adding misfit.
    expect(r.fit.rms).toBeGreaterThan(0.003);
    expect(r.fit.rms).toBeLessThan(0.007);
  });

  it.each(cases)('$name ($system): fixed endpoint at the true equivalence pH', (w) => {
    const input = titration(w, 5, 0);
    // The pH the forward model gives at the exact equivalence volume is the ideal endpoint.
    const exact = reduceTitration({ ...input, method: 'curve_fit', system: w.system }, make);
    const ve = (w.ta * 100) / w.c;
    const i = input.points.findIndex((p) => p.volume_ml! > ve);
    const a = input.points[i - 1]!;
    const b = input.points[i]!;
    const eqPh = a.ph + ((ve - a.volume_ml!) / (b.volume_ml! - a.volume_ml!)) * (b.ph - a.ph);
    const r = reduceTitration({ ...input, method: 'endpoint', endpoint_ph: eqPh }, make);
    // Linear interpolation across the steep part: within 2 % for 50 evenly spaced points.
    expect(Math.abs(r.alkalinity_meq_l / (w.ta * 1e3) - 1)).toBeLessThan(0.02);
    expect(exact.fit.rms).toBeLessThan(1e-4);
  });

  it('the pH 4.5 endpoint overestimates soft water and is close for hard water', () => {
    const soft = reduceTitration({ ...titration(cases[0]!, 6, 0), method: 'endpoint' }, make);
    const hard = reduceTitration({ ...titration(cases[6]!, 6, 0), method: 'endpoint' }, make);
    expect(soft.alkalinity_meq_l).toBeGreaterThan(0.2 * 1.05);
    expect(Math.abs(hard.alkalinity_meq_l / 5 - 1)).toBeLessThan(0.02);
  });

  it('without noise the curve fit reproduces the model to its tolerance', () => {
    const w = cases[4]!;
    const r = reduceTitration({ ...titration(w, 1, 0), method: 'curve_fit' }, make);
    // The points were rounded to 1e-4 pH and 1e-4 mL when written, so that is the floor.
    expect(r.fit.rms).toBeLessThan(1e-4);
    expect(Math.abs(r.alkalinity_meq_l / 2 - 1)).toBeLessThan(1e-4);
    expect(Math.abs(r.dic_umol_kg! / 2300 - 1)).toBeLessThan(1e-3);
    expect(r.fit.details.iterations).toBeLessThan(100);
  });

  it('reports the split of the alkalinity at the first pH', () => {
    const input = titration(cases[6]!, 1, 0);
    const r = reduceTitration({ ...input, method: 'gran' }, make);
    const freeH = 1e3 * 10 ** -input.points[0]!.ph;
    const sum = r.species.hco3_mmol_l + 2 * r.species.co3_mmol_l + r.species.oh_mmol_l - freeH;
    expect(sum).toBeCloseTo(r.alkalinity_meq_l, 8);
    expect(r.species.hco3_mmol_l).toBeGreaterThan(r.species.co3_mmol_l);
  });
});
