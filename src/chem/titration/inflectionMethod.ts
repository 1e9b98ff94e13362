/**
 * Inflection-point titration: the equivalence volume is where the pH falls fastest, i.e. the
 * maximum of −dpH/dV. The derivative comes from a local quadratic least-squares fit over a moving
 * window (a Savitzky–Golay filter generalised to unevenly spaced volumes; Savitzky & Golay 1964,
 * Analytical Chemistry 36, 1627), and the peak is refined by a parabola through the three largest
 * neighbouring derivatives, so it is not tied to the volumes actually read.
 */

import { fail, type Issue, warning } from '../errors';
import type { MethodResult } from './methodResult';
import type { TitrationCurve } from './types';

/** Half-width of the smoothing window in points (window = 2·w + 1). */
export const INFLECTION_HALF_WINDOW = 2;
/**
 * The total-alkalinity equivalence point of natural waters lies between about pH 4 and 5.5 (common
 * practice); the search window is wider so that very soft waters and carbonate-free bases (pH 7)
 * still find it, and it excludes the carbonate inflection near pH 8.3.
 */
export const INFLECTION_PH_RANGE: readonly [number, number] = [3.5, 7.5];

/** Fit y = a + b·(x − x0) + c·(x − x0)² over the window and return [a, b]: value and slope at x0. */
function localQuadratic(
  xs: Float64Array,
  ys: Float64Array,
  lo: number,
  hi: number,
  x0: number,
): [number, number] {
  // Normal equations of a 3-parameter fit, solved by Cramer's rule (3×3, centred for conditioning).
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  let s3 = 0;
  let s4 = 0;
  let t0 = 0;
  let t1 = 0;
  let t2 = 0;
  for (let i = lo; i <= hi; i++) {
    const d = xs[i]! - x0;
    const d2 = d * d;
    const y = ys[i]!;
    s0 += 1;
    s1 += d;
    s2 += d2;
    s3 += d2 * d;
    s4 += d2 * d2;
    t0 += y;
    t1 += d * y;
    t2 += d2 * y;
  }
  const det = s0 * (s2 * s4 - s3 * s3) - s1 * (s1 * s4 - s3 * s2) + s2 * (s1 * s3 - s2 * s2);
  if (Math.abs(det) < 1e-300) {
    const b = (ys[hi]! - ys[lo]!) / (xs[hi]! - xs[lo]!);
    return [t0 / s0, b];
  }
  const a = (t0 * (s2 * s4 - s3 * s3) - s1 * (t1 * s4 - s3 * t2) + s2 * (t1 * s3 - s2 * t2)) / det;
  const b = (s0 * (t1 * s4 - t2 * s3) - t0 * (s1 * s4 - s3 * s2) + s2 * (s1 * t2 - t1 * s2)) / det;
  return [a, b];
}

/** Smoothed pH and dpH/dV at every point (window shrinks at the ends, never below 3 points). */
export function smoothedDerivative(curve: TitrationCurve, halfWindow = INFLECTION_HALF_WINDOW) {
  const n = curve.ph.length;
  const smooth = new Float64Array(n);
  const slope = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const lo = Math.max(0, i - halfWindow);
    const hi = Math.min(n - 1, i + halfWindow);
    const [a, b] = localQuadratic(curve.volumeMl, curve.ph, lo, hi, curve.volumeMl[i]!);
    smooth[i] = a;
    slope[i] = b;
  }
  return { smooth, slope };
}

export function reduceInflection(curve: TitrationCurve): MethodResult {
  const warnings: Issue[] = [];
  const n = curve.ph.length;
  const { smooth, slope } = smoothedDerivative(curve);
  const [phLo, phHi] = INFLECTION_PH_RANGE;
  // The steepest *interior* peak: a soft water can fall faster at its very first readings (little
  // buffering above pK1) than at the equivalence point, and that edge is no inflection.
  let best = -1;
  for (let i = 1; i < n - 1; i++) {
    const p = smooth[i]!;
    if (p < phLo || p > phHi) continue;
    const isPeak = slope[i]! <= slope[i - 1]! && slope[i]! <= slope[i + 1]! && slope[i]! < 0;
    if (isPeak && (best < 0 || slope[i]! < slope[best]!)) best = i;
  }
  if (best < 0) {
    fail(
      'inflection-not-found',
      `No peak of −dpH/dV between pH ${phLo} and ${phHi} inside the readings: ` +
        'titrate further past the endpoint, in smaller steps.',
      'points',
    );
  }
  // Vertex of the parabola through the three derivative values around the steepest point.
  const x0 = curve.volumeMl[best - 1]!;
  const x1 = curve.volumeMl[best]!;
  const x2 = curve.volumeMl[best + 1]!;
  const y0 = slope[best - 1]!;
  const y1 = slope[best]!;
  const y2 = slope[best + 1]!;
  const denom = (x0 - x1) * (x0 - x2) * (x1 - x2);
  const A = (x2 * (y1 - y0) + x1 * (y0 - y2) + x0 * (y2 - y1)) / denom;
  const B = (x2 * x2 * (y0 - y1) + x1 * x1 * (y2 - y0) + x0 * x0 * (y1 - y2)) / denom;
  let ve = A > 0 ? -B / (2 * A) : x1;
  if (!(ve >= x0 && ve <= x2)) ve = x1;

  const pointsUsed: number[] = [];
  for (
    let i = Math.max(0, best - INFLECTION_HALF_WINDOW - 1);
    i <= Math.min(n - 1, best + INFLECTION_HALF_WINDOW + 1);
    i++
  ) {
    pointsUsed.push(i);
  }
  const residuals = pointsUsed.map((i) => curve.ph[i]! - smooth[i]!);
  let mean = 0;
  for (const i of pointsUsed) mean += curve.ph[i]!;
  mean /= pointsUsed.length;
  let sst = 0;
  let sse = 0;
  for (const [j, i] of pointsUsed.entries()) {
    sst += (curve.ph[i]! - mean) ** 2;
    sse += residuals[j]! ** 2;
  }
  const pointsBelow = curve.ph.filter((p) => p < smooth[best]!).length;
  if (pointsBelow < INFLECTION_HALF_WINDOW + 1) {
    warnings.push(
      warning(
        'inflection-few-points-past',
        `Only ${pointsBelow} readings lie past the steepest point: the peak of dpH/dV is poorly defined.`,
        'points',
      ),
    );
  }
  if (curve.ph[best - 1]! - curve.ph[best + 1]! > 1) {
    warnings.push(
      warning(
        'inflection-coarse-steps',
        'The pH falls more than one unit across three readings at the inflection: add acid in smaller steps there.',
        'points',
      ),
    );
  }
  return {
    equivalenceVolumeMl: ve,
    fit: {
      r2: sst > 0 ? 1 - sse / sst : 1,
      residuals,
      rms: Math.sqrt(sse / pointsUsed.length),
      points_used: pointsUsed,
      details: { max_dph_dv: -y1, ph_at_inflection: smooth[best]!, half_window: INFLECTION_HALF_WINDOW },
    },
    warnings,
  };
}
