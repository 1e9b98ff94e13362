/**
 * Nonlinear least-squares fit of the whole titration curve with the carbonate model
 * (./titrationModel.ts): finds the alkalinity and DIC (closed vessel) or the alkalinity and the
 * CO2 partial pressure of the air (open vessel) whose modelled pH best matches every reading.
 *
 * Levenberg–Marquardt (Marquardt 1963, J. Soc. Indust. Appl. Math. 11, 431) on two parameters,
 * Jacobian by forward differences, damping scaled by diag(JᵀJ). Stops when a step changes every
 * parameter by less than FIT_TOLERANCE (relative) or after FIT_MAX_ITERATIONS; a fit that hits the
 * cap is reported with a warning, never silently.
 */

import { type Issue, warning } from '../errors';
import type { ConstantSet } from '../types';
import type { MethodResult } from './methodResult';
import { dicFromAlkalinityPh, dicOpen, phAfterAcid, type TitrationSample } from './titrationModel';
import type { TitrationCurve, TitrationSystem } from './types';

export const FIT_TOLERANCE = 1e-9;
export const FIT_MAX_ITERATIONS = 100;

export interface CurveFitOptions {
  sampleVolumeMl: number;
  titrantEqL: number;
  system: TitrationSystem;
  /** Starting alkalinity, eq/L (from a Gran or endpoint reduction). */
  alkalinityGuess: number;
  /** Open system: starting air pCO2, atm. */
  pco2GuessAtm: number;
  /**
   * Start from these parameters instead (a previous fit of nearly the same curve, as in
   * uncertainty propagation); the result is the same minimum, reached in fewer iterations.
   */
  start?: readonly [number, number];
}

/** The fitted parameters in the form `start` takes: [TA eq/L, DIC mol/L] or [TA eq/L, log10 pCO2 atm]. */
export type CurveFitParameters = readonly [number, number];

/** Parameters: closed [TA eq/L, DIC mol/L]; open [TA eq/L, log10 pCO2 atm]. */
function sampleOf(p: readonly number[], system: TitrationSystem): TitrationSample {
  return system === 'open' ? { alkalinity: p[0]!, pco2Atm: 10 ** p[1]! } : { alkalinity: p[0]!, dic: p[1]! };
}

export function reduceCurveFit(curve: TitrationCurve, k: ConstantSet, opts: CurveFitOptions): MethodResult {
  const warnings: Issue[] = [];
  const n = curve.ph.length;
  const { sampleVolumeMl, titrantEqL, system } = opts;
  const model = (p: readonly number[], out: Float64Array) => {
    const s = sampleOf(p, system);
    for (let i = 0; i < n; i++) out[i] = phAfterAcid(s, k, sampleVolumeMl, titrantEqL, curve.volumeMl[i]!);
  };
  const ta0 = opts.alkalinityGuess;
  let p: number[] = opts.start
    ? [opts.start[0], opts.start[1]]
    : system === 'open'
      ? [ta0, Math.log10(opts.pco2GuessAtm)]
      : [ta0, Math.max(dicFromAlkalinityPh(ta0, curve.ph[0]!, k), 0.5 * ta0, 1e-6)];

  const pred = new Float64Array(n);
  const trialPred = new Float64Array(n);
  const r = new Float64Array(n);
  const jac = [new Float64Array(n), new Float64Array(n)];
  const costOf = (y: Float64Array) => {
    let c = 0;
    for (let i = 0; i < n; i++) c += (curve.ph[i]! - y[i]!) ** 2;
    return c;
  };
  model(p, pred);
  let cost = costOf(pred);
  let lambda = 1e-3;
  let iterations = 0;
  let converged = false;
  while (iterations < FIT_MAX_ITERATIONS) {
    iterations++;
    for (let i = 0; i < n; i++) r[i] = curve.ph[i]! - pred[i]!;
    for (let j = 0; j < 2; j++) {
      const step = system === 'open' && j === 1 ? 1e-6 : Math.abs(p[j]!) * 1e-6 + 1e-12;
      const q = p.slice();
      q[j] = p[j]! + step;
      model(q, trialPred);
      const col = jac[j]!;
      for (let i = 0; i < n; i++) col[i] = (trialPred[i]! - pred[i]!) / step;
    }
    let a00 = 0;
    let a01 = 0;
    let a11 = 0;
    let g0 = 0;
    let g1 = 0;
    const j0 = jac[0]!;
    const j1 = jac[1]!;
    for (let i = 0; i < n; i++) {
      a00 += j0[i]! * j0[i]!;
      a01 += j0[i]! * j1[i]!;
      a11 += j1[i]! * j1[i]!;
      g0 += j0[i]! * r[i]!;
      g1 += j1[i]! * r[i]!;
    }
    let accepted = false;
    for (let tries = 0; tries < 30; tries++) {
      const b00 = a00 * (1 + lambda);
      const b11 = a11 * (1 + lambda);
      const det = b00 * b11 - a01 * a01;
      if (!(Math.abs(det) > 0)) {
        lambda *= 10;
        continue;
      }
      const d0 = (g0 * b11 - g1 * a01) / det;
      const d1 = (b00 * g1 - a01 * g0) / det;
      const q = [p[0]! + d0, p[1]! + d1];
      // Alkalinity may be slightly negative in principle, DIC may not: halve steps that cross zero.
      if (system === 'closed' && q[1]! <= 0) q[1] = p[1]! / 2;
      model(q, trialPred);
      const c = costOf(trialPred);
      if (c <= cost) {
        const small =
          Math.abs(d0) <= FIT_TOLERANCE * (Math.abs(p[0]!) + 1e-9) &&
          Math.abs(d1) <= FIT_TOLERANCE * (Math.abs(p[1]!) + 1e-9);
        p = q;
        cost = c;
        pred.set(trialPred);
        lambda = Math.max(lambda / 3, 1e-12);
        accepted = true;
        if (small) converged = true;
        break;
      }
      lambda *= 4;
    }
    if (converged || !accepted) {
      // No step lowers the cost any more: we are at the minimum to machine precision.
      converged = true;
      break;
    }
  }
  if (!converged) {
    warnings.push(
      warning(
        'curve-fit-not-converged',
        `The curve fit stopped after ${FIT_MAX_ITERATIONS} iterations without settling; treat its result with care.`,
      ),
    );
  }
  const residuals: number[] = [];
  let mean = 0;
  for (let i = 0; i < n; i++) mean += curve.ph[i]!;
  mean /= n;
  let sst = 0;
  for (let i = 0; i < n; i++) {
    residuals.push(curve.ph[i]! - pred[i]!);
    sst += (curve.ph[i]! - mean) ** 2;
  }
  const rmsValue = Math.sqrt(cost / n);
  if (rmsValue > 0.05) {
    warnings.push(
      warning(
        'curve-fit-poor',
        `The model misses the readings by ${rmsValue.toFixed(3)} pH (rms): the water may hold other bases, or the vessel was ${
          system === 'closed' ? 'open to air' : 'closed'
        }.`,
      ),
    );
  }
  const alkalinity = p[0]!;
  const dic = system === 'open' ? dicOpen(pred[0]!, 10 ** p[1]!, k) : p[1]!;
  const details: Record<string, number> = { iterations, cost, lambda };
  if (system === 'open') details.air_pco2_uatm = 10 ** p[1]! * 1e6;
  return {
    parameters: [p[0]!, p[1]!],
    equivalenceVolumeMl: (alkalinity * sampleVolumeMl) / titrantEqL,
    alkalinityEqL: alkalinity,
    dicMolL: dic,
    fit: {
      r2: sst > 0 ? 1 - cost / sst : 1,
      residuals,
      rms: rmsValue,
      points_used: Array.from({ length: n }, (_, i) => i),
      details,
    },
    warnings,
  };
}
