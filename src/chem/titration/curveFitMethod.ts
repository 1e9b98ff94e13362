/**
 * Nonlinear least-squares fit of the whole titration curve with the carbonate model
 * (./titrationModel.ts): finds the alkalinity and DIC (closed vessel) or the alkalinity and the
 * CO2 partial pressure of the air (open vessel) whose modelled pH best matches every reading.
 *
 * Optionally a third parameter, a pH offset common to every reading, absorbs a meter calibration
 * error (to which a two-parameter fit is sensitive: about 0.75 % of alkalinity per 0.05 pH at
 * 2 meq/L in our tests, while Gran is not).
 *
 * Levenberg–Marquardt (./levenbergMarquardt.ts). Stops when a step changes every parameter by less
 * than FIT_TOLERANCE (relative) or after FIT_MAX_ITERATIONS; a fit that hits the cap is reported
 * with a warning, never silently.
 */

import { type Issue, warning } from '../errors';
import type { ConstantSet } from '../types';
import { levenbergMarquardt } from './levenbergMarquardt';
import type { MethodResult } from './methodResult';
import { invertSmall, type PointSensitivity, parameterSensitivities } from './pointSensitivity';
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
  start?: CurveFitParameters;
  /** Also fit a pH offset common to all readings (a meter calibration error). */
  fitPhOffset?: boolean;
}

/**
 * The fitted parameters in the form `start` takes: [TA eq/L, DIC mol/L] or [TA eq/L, log10 pCO2
 * atm], then the pH offset when it is fitted.
 */
export type CurveFitParameters = readonly number[];

/** Parameters: closed [TA eq/L, DIC mol/L]; open [TA eq/L, log10 pCO2 atm]. */
function sampleOf(p: readonly number[], system: TitrationSystem): TitrationSample {
  return system === 'open' ? { alkalinity: p[0]!, pco2Atm: 10 ** p[1]! } : { alkalinity: p[0]!, dic: p[1]! };
}

export function reduceCurveFit(curve: TitrationCurve, k: ConstantSet, opts: CurveFitOptions): MethodResult {
  const warnings: Issue[] = [];
  const n = curve.ph.length;
  const { sampleVolumeMl, titrantEqL, system } = opts;
  const fitOffset = opts.fitPhOffset === true;
  // The optional third parameter is a pH offset of the meter: observed = model + offset.
  const model = (p: readonly number[], out: Float64Array) => {
    const s = sampleOf(p, system);
    const offset = fitOffset ? p[2]! : 0;
    // Newton starts from the reading itself, which the modelled pH is close to.
    for (let i = 0; i < n; i++)
      out[i] =
        phAfterAcid(s, k, sampleVolumeMl, titrantEqL, curve.volumeMl[i]!, curve.ph[i]! - offset) + offset;
  };
  const ta0 = opts.alkalinityGuess;
  const start: number[] = opts.start
    ? [opts.start[0]!, opts.start[1]!]
    : system === 'open'
      ? [ta0, Math.log10(opts.pco2GuessAtm)]
      : [ta0, Math.max(dicFromAlkalinityPh(ta0, curve.ph[0]!, k), 0.5 * ta0, 1e-6)];
  if (fitOffset) start.push(opts.start?.[2] ?? 0);
  const lm = levenbergMarquardt(
    {
      y: curve.ph,
      model,
      step: (p, j) => (j === 0 || (j === 1 && system === 'closed') ? Math.abs(p[j]!) * 1e-6 + 1e-12 : 1e-6),
      scale: [1e-9, system === 'closed' ? 1e-9 : 1, 1e-3],
      // DIC cannot be negative: a step that crosses zero is cut to half the current value.
      constrain: (q, cur) => {
        if (system === 'closed' && q[1]! <= 0) q[1] = cur[1]! / 2;
      },
      tolerance: FIT_TOLERANCE,
      maxIterations: FIT_MAX_ITERATIONS,
    },
    start,
  );
  const p = lm.p;
  const pred = lm.fitted;
  const cost = lm.cost;
  const { iterations, converged, lambda } = lm;
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
        `The model misses the readings by ${rmsValue.toFixed(3)} pH (rms): the water may hold other bases, the vessel was ${
          system === 'closed' ? 'open to air' : 'closed'
        }${fitOffset ? '' : ', or the meter is offset (try curve_fit_ph_offset)'}.`,
      ),
    );
  }
  const alkalinity = p[0]!;
  const initialPh = pred[0]! - (fitOffset ? p[2]! : 0);
  const dic = system === 'open' ? dicOpen(initialPh, 10 ** p[1]!, k) : p[1]!;
  const details: Record<string, number> = { iterations, cost, lambda };
  if (system === 'open') details.air_pco2_uatm = 10 ** p[1]! * 1e6;
  if (fitOffset) details.ph_offset = p[2]!;
  // Standard errors from the scatter of the readings about the fitted curve alone.
  const cov = lm.covariance;
  if (cov !== null) {
    details.alkalinity_se_meq_l = Math.sqrt(Math.max(cov[0]![0]!, 0)) * 1e3;
    if (system === 'closed') details.dic_se_mmol_l = Math.sqrt(Math.max(cov[1]![1]!, 0)) * 1e3;
    if (fitOffset) details.ph_offset_se = Math.sqrt(Math.max(cov[2]![2]!, 0));
  }
  const dicOf = (q: readonly number[]) => {
    if (system !== 'open') return q[1]!;
    const s0 = sampleOf(q, system);
    return dicOpen(phAfterAcid(s0, k, sampleVolumeMl, titrantEqL, curve.volumeMl[0]!), 10 ** q[1]!, k);
  };
  const sensitivity = curveFitSensitivity(
    p,
    pred,
    model,
    (j) => (j === 0 || (j === 1 && system === 'closed') ? Math.abs(p[j]!) * 1e-6 + 1e-12 : 1e-6),
    dicOf,
    (out, dv) => {
      const s0 = sampleOf(p, system);
      const offset = fitOffset ? p[2]! : 0;
      for (let i = 0; i < n; i++)
        out[i] =
          phAfterAcid(s0, k, sampleVolumeMl, titrantEqL, curve.volumeMl[i]! + dv, curve.ph[i]! - offset) +
          offset;
    },
  );
  return {
    ...(sensitivity ? { sensitivity } : {}),
    parameters: fitOffset ? [p[0]!, p[1]!, p[2]!] : [p[0]!, p[1]!],
    equivalenceVolumeMl: (alkalinity * sampleVolumeMl) / titrantEqL,
    alkalinityEqL: alkalinity,
    dicMolL: dic,
    initialPh,
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

/**
 * Per-reading sensitivities of the fitted alkalinity and DIC (./pointSensitivity.ts) with the
 * residual rᵢ = pHᵢ − fᵢ(p): ∂rᵢ/∂pHᵢ = 1 and ∂rᵢ/∂Vᵢ = −∂fᵢ/∂Vᵢ, the latter for every reading
 * from one model evaluation with every volume moved (fᵢ depends on Vᵢ alone). The Jacobian is
 * taken afresh at the solution. Cost: a few model evaluations, linear in the number of readings.
 */
function curveFitSensitivity(
  p: readonly number[],
  fitted: Float64Array,
  model: (q: readonly number[], out: Float64Array) => void,
  step: (j: number) => number,
  dicOf: (q: readonly number[]) => number,
  movedVolumes: (out: Float64Array, dv: number) => void,
): PointSensitivity | null {
  const n = fitted.length;
  const np = p.length;
  const jac: Float64Array[] = [];
  const trial = new Float64Array(n);
  const gDic: number[] = [];
  const dic0 = dicOf(p);
  for (let j = 0; j < np; j++) {
    const h = step(j);
    const q = [...p];
    q[j] = p[j]! + h;
    model(q, trial);
    const col = new Float64Array(n);
    for (let i = 0; i < n; i++) col[i] = -(trial[i]! - fitted[i]!) / h;
    jac.push(col);
    gDic.push((dicOf(q) - dic0) / h);
  }
  const a: number[][] = Array.from({ length: np }, () => new Array<number>(np).fill(0));
  for (let j = 0; j < np; j++)
    for (let l = j; l < np; l++) {
      let s = 0;
      for (let i = 0; i < n; i++) s += jac[j]![i]! * jac[l]![i]!;
      a[j]![l] = s;
      a[l]![j] = s;
    }
  const inv = invertSmall(a);
  if (inv === null) return null;
  const dv = 1e-7;
  movedVolumes(trial, dv);
  const drV = new Float64Array(n);
  for (let i = 0; i < n; i++) drV[i] = -(trial[i]! - fitted[i]!) / dv;
  const drPh = new Float64Array(n).fill(1);
  const toOutputs = (dr: Float64Array) => {
    const byParam = parameterSensitivities(inv, jac, null, dr);
    const dic = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      let s = 0;
      for (let j = 0; j < np; j++) s += gDic[j]! * byParam[j]![i]!;
      dic[i] = s;
    }
    return { alkalinity: byParam[0]!, dic };
  };
  return { ph: toOutputs(drPh), volume_ml: toOutputs(drV) };
}
