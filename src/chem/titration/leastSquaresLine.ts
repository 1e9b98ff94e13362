/** Ordinary least-squares straight line y = intercept + slope·x, with r² and residuals. */

export interface LineFit {
  slope: number;
  intercept: number;
  r2: number;
  residuals: number[];
  /** Standard errors of slope and intercept (n > 2), from the residual variance. */
  slopeSe: number;
  interceptSe: number;
}

/** Needs at least two distinct x values; the caller guarantees that (volumes strictly increase). */
export function fitLine(xs: ArrayLike<number>, ys: ArrayLike<number>): LineFit {
  const n = xs.length;
  let sx = 0;
  let sy = 0;
  for (let i = 0; i < n; i++) {
    sx += xs[i]!;
    sy += ys[i]!;
  }
  const mx = sx / n;
  const my = sy / n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let i = 0; i < n; i++) {
    const dx = xs[i]! - mx;
    const dy = ys[i]! - my;
    sxx += dx * dx;
    sxy += dx * dy;
    syy += dy * dy;
  }
  const slope = sxy / sxx;
  const intercept = my - slope * mx;
  const residuals: number[] = [];
  let sse = 0;
  for (let i = 0; i < n; i++) {
    const r = ys[i]! - (intercept + slope * xs[i]!);
    residuals.push(r);
    sse += r * r;
  }
  const r2 = syy > 0 ? 1 - sse / syy : 1;
  const s2 = n > 2 ? sse / (n - 2) : 0;
  const slopeSe = Math.sqrt(s2 / sxx);
  const interceptSe = Math.sqrt(s2 * (1 / n + (mx * mx) / sxx));
  return { slope, intercept, r2, residuals, slopeSe, interceptSe };
}

export function rms(values: readonly number[]): number {
  if (values.length === 0) return 0;
  let s = 0;
  for (const v of values) s += v * v;
  return Math.sqrt(s / values.length);
}
