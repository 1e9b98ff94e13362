/**
 * The standard errors a fit reports from its own residuals should match the spread of results
 * over many titrations of the same water that differ only in reading noise.
 */

import { describe, expect, it } from 'vitest';
import { fitLine } from '../../../src/chem/titration/leastSquaresLine';
import { reduceTitration } from '../../../src/chem/titration/reduceTitration';
import { constantsAt25 } from './constantsFixture';
import { normalDeviates, seededRandom, syntheticTitration } from './syntheticTitration';

const sd = (xs: number[]) => {
  const m = xs.reduce((s, x) => s + x, 0) / xs.length;
  return Math.sqrt(xs.reduce((s, x) => s + (x - m) ** 2, 0) / (xs.length - 1));
};
const mean = (xs: number[]) => xs.reduce((s, x) => s + x, 0) / xs.length;

describe('standard errors from the residuals', { timeout: 60_000 }, () => {
  it('x-intercept of a straight line', () => {
    const gauss = normalDeviates(seededRandom(5));
    const xs = [4, 4.5, 5, 5.5, 6, 6.5, 7];
    const intercepts: number[] = [];
    const ses: number[] = [];
    for (let run = 0; run < 3000; run++) {
      const fit = fitLine(
        xs,
        xs.map((x) => 2 * (x - 3) + 0.05 * gauss()),
      );
      intercepts.push(-fit.intercept / fit.slope);
      ses.push(fit.xInterceptSe);
    }
    // The mean of s is biased low by c4(n−2 = 5) ≈ 0.95, so allow 10 %.
    expect(Math.abs(mean(ses) / sd(intercepts) - 1)).toBeLessThan(0.1);
  });

  it.each(['gran', 'curve_fit'] as const)('%s over 200 noisy titrations of one water', (method) => {
    const k = constantsAt25();
    const values: number[] = [];
    const ses: number[] = [];
    for (let seed = 1; seed <= 200; seed++) {
      const input = syntheticTitration(
        {
          sample: { alkalinity: 1e-3, dic: 1.1e-3 },
          sampleVolumeMl: 100,
          titrantEqL: 0.05,
          points: 30,
          finalPh: 3.0,
          phNoise: 0.01,
          seed,
        },
        k,
      );
      const r = reduceTitration({ ...input, method }, () => k);
      values.push(method === 'gran' ? r.equivalence_volume_ml : r.alkalinity_meq_l);
      ses.push(
        method === 'gran' ? r.fit.details.equivalence_volume_se_ml! : r.fit.details.alkalinity_se_meq_l!,
      );
    }
    // 200 runs: the spread itself is known to about 5 %; the automatic Gran point choice adds a little.
    expect(Math.abs(mean(ses) / sd(values) - 1)).toBeLessThan(0.2);
  });
});
