/** Least-squares straight line y = intercept + slope·x (optionally weighted), with r² and residuals. */

export interface LineFit {
  slope: number;
  intercept: number;
  /** Weighted coefficient of determination (the plain one when unweighted). */
  r2: number;
  /** y − fitted, unweighted, in the unit of y. */
  residuals: number[];
  /** Standard errors of slope and intercept (n > 2), from the residual variance. */
  slopeSe: number;
  interceptSe: number;
  /**
   * Standard error of the x-intercept −intercept/slope, first order:
   * (s/|b|)·√(1/Σw + (x0 − x̄)²/Sxx), the usual result for reading x from a fitted line
   * (e.g. Miller & Miller, Statistics and Chemometrics for Analytical Chemistry, ch. 5, *memory*).
   */
  xInterceptSe: number;
}

/**
 * Needs at least two distinct x values; the caller guarantees that (volumes strictly increase).
 * `weights` are 1/σ² up to a common factor (default all 1).
 */
export function fitLine(xs: ArrayLike<number>, ys: ArrayLike<number>, weights?: ArrayLike<number>): LineFit {
  const n = xs.length;
  const w = (i: number) => (weights === undefined ? 1 : weights[i]!);
  let sw = 0;
  let sx = 0;
  let sy = 0;
  for (let i = 0; i < n; i++) {
    sw += w(i);
    sx += w(i) * xs[i]!;
    sy += w(i) * ys[i]!;
  }
  const mx = sx / sw;
  const my = sy / sw;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let i = 0; i < n; i++) {
    const dx = xs[i]! - mx;
    const dy = ys[i]! - my;
    sxx += w(i) * dx * dx;
    sxy += w(i) * dx * dy;
    syy += w(i) * dy * dy;
  }
  const slope = sxy / sxx;
  const intercept = my - slope * mx;
  const residuals: number[] = [];
  let sse = 0;
  for (let i = 0; i < n; i++) {
    const r = ys[i]! - (intercept + slope * xs[i]!);
    residuals.push(r);
    sse += w(i) * r * r;
  }
  const r2 = syy > 0 ? 1 - sse / syy : 1;
  const s2 = n > 2 ? sse / (n - 2) : 0;
  const slopeSe = Math.sqrt(s2 / sxx);
  const interceptSe = Math.sqrt(s2 * (1 / sw + (mx * mx) / sxx));
  const x0 = -intercept / slope;
  const xInterceptSe = (Math.sqrt(s2) / Math.abs(slope)) * Math.sqrt(1 / sw + ((x0 - mx) * (x0 - mx)) / sxx);
  return { slope, intercept, r2, residuals, slopeSe, interceptSe, xInterceptSe };
}

export function rms(values: readonly number[]): number {
  if (values.length === 0) return 0;
  let s = 0;
  for (const v of values) s += v * v;
  return Math.sqrt(s / values.length);
}
