/**
 * Root finding on pH for the carbonate system. All residuals are functions of x = pH on the
 * model's internal scale, h = 10^-x.
 *
 * Accuracy: roots are refined until the pH step is below {@link PH_TOLERANCE} (1e-12 pH units,
 * i.e. a relative error in h of ~2.3e-12; Newton stops after a step below 1e-9, whose square
 * bounds the remaining error) or the residual is exactly zero, with at most
 * {@link MAX_ITERATIONS} iterations. Bracketing guarantees convergence; Newton gives speed.
 */

export const PH_TOLERANCE = 1e-12;
export const MAX_ITERATIONS = 100;
/** The pH window searched for roots: the physically meaningful range of natural waters. */
export const PH_SEARCH_MIN = 0;
export const PH_SEARCH_MAX = 14;
/** A Newton step this small ends the iteration (the next error would be ~its square). */
const NEWTON_DONE = 1e-9;
/** Largest Newton step, pH units. */
const MAX_STEP = 1;
/** Scan step for pairs whose residual may have several roots. */
const SCAN_STEP = 0.05;

/** f(x) and df/dx, written into `out` to keep the hot loop allocation-free. */
export type ResidualWithSlope = (x: number, out: Float64Array) => void;
export type Residual = (x: number) => number;

/**
 * Safeguarded Newton (Newton step inside a shrinking bracket, bisection when Newton leaves it) for a residual f(x) that is increasing across [lo, hi] with f(lo) ≤ 0 ≤ f(hi) assumed.
 * Returns the root and the number of iterations used.
 */
export function newtonBracketed(
  f: ResidualWithSlope,
  x0: number,
  lo: number,
  hi: number,
  scratch: Float64Array,
): { x: number; iterations: number } {
  let x = x0 < lo || x0 > hi ? 0.5 * (lo + hi) : x0;
  for (let i = 1; i <= MAX_ITERATIONS; i++) {
    f(x, scratch);
    const fx = scratch[0]!;
    const dfx = scratch[1]!;
    if (fx === 0) return { x, iterations: i };
    if (fx < 0) lo = x;
    else hi = x;
    // Newton, limited to one pH unit per step; bisection when it would leave the bracket.
    let dx = dfx > 0 ? fx / dfx : Number.POSITIVE_INFINITY;
    if (dx > MAX_STEP) dx = MAX_STEP;
    else if (dx < -MAX_STEP) dx = -MAX_STEP;
    // Near the root Newton converges quadratically: after a step of 1e-9 the error is ~1e-17.
    if (Math.abs(dx) < NEWTON_DONE) return { x: x - dx, iterations: i };
    let next = x - dx;
    if (!(next > lo && next < hi)) {
      next = 0.5 * (lo + hi);
      dx = x - next;
    }
    x = next;
    if (Math.abs(dx) < PH_TOLERANCE || hi - lo < PH_TOLERANCE) return { x, iterations: i };
  }
  return { x, iterations: MAX_ITERATIONS };
}

/** Bisection refined by the secant (Illinois variant of regula falsi) on a bracket with a sign change. */
export function refineBracket(f: Residual, a: number, b: number, fa: number, fb: number): number {
  let side = 0;
  for (let i = 0; i < MAX_ITERATIONS; i++) {
    const c = (a * fb - b * fa) / (fb - fa);
    const fc = f(c);
    if (fc === 0 || Math.abs(b - a) < PH_TOLERANCE) return c;
    if (fc * fb > 0) {
      b = c;
      fb = fc;
      if (side === -1) fa /= 2;
      side = -1;
    } else {
      a = c;
      fa = fc;
      if (side === 1) fb /= 2;
      side = 1;
    }
    if (Math.abs(b - a) < PH_TOLERANCE) return 0.5 * (a + b);
  }
  return 0.5 * (a + b);
}

/** Golden-section search for the extremum of f inside [a, b]; returns its abscissa. */
function extremum(f: Residual, a: number, b: number, minimize: boolean): number {
  const g = (Math.sqrt(5) - 1) / 2;
  const sign = minimize ? 1 : -1;
  let c = b - g * (b - a);
  let d = a + g * (b - a);
  let fc = sign * f(c);
  let fd = sign * f(d);
  for (let i = 0; i < MAX_ITERATIONS && Math.abs(b - a) > PH_TOLERANCE; i++) {
    if (fc < fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - g * (b - a);
      fc = sign * f(c);
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + g * (b - a);
      fd = sign * f(d);
    }
  }
  return 0.5 * (a + b);
}

/**
 * Every root of f in [PH_SEARCH_MIN, PH_SEARCH_MAX], found by scanning for sign changes and
 * refining each. Used for pairs whose residual is not monotonic (e.g. TA–CO3--). Where the scan
 * passes a local extremum without a sign change, the extremum is located: if it crosses zero
 * there are two close roots, and if it touches zero within `touch` there is a double root.
 * Roots are returned from the highest pH to the lowest.
 */
export function allRoots(f: Residual, touch: number): number[] {
  const n = Math.round((PH_SEARCH_MAX - PH_SEARCH_MIN) / SCAN_STEP);
  const xs = new Float64Array(n + 1);
  const fs = new Float64Array(n + 1);
  for (let i = 0; i <= n; i++) {
    xs[i] = PH_SEARCH_MAX - i * SCAN_STEP;
    fs[i] = f(xs[i]!);
  }
  const roots: number[] = [];
  for (let i = 0; i <= n; i++) {
    const xi = xs[i]!;
    const fi = fs[i]!;
    if (fi === 0) {
      roots.push(xi);
      continue;
    }
    if (i < n) {
      const fn = fs[i + 1]!;
      if (fn !== 0 && fi * fn < 0) roots.push(refineBracket(f, xs[i + 1]!, xi, fn, fi));
    }
    // A local extremum at i with no sign change on either side may hide two roots.
    if (i > 0 && i < n) {
      const fp = fs[i - 1]!;
      const fn = fs[i + 1]!;
      const isExtremum = (fi - fp) * (fn - fi) < 0;
      if (isExtremum && fp * fi > 0 && fi * fn > 0) {
        const minimize = fi < fp;
        const xe = extremum(f, xs[i + 1]!, xs[i - 1]!, minimize);
        const fe = f(xe);
        if (Math.abs(fe) <= touch) roots.push(xe);
        else if (fe * fi < 0) {
          roots.push(refineBracket(f, xe, xs[i - 1]!, fe, fp));
          roots.push(refineBracket(f, xs[i + 1]!, xe, fn, fe));
        }
      }
    }
  }
  return roots.sort((a, b) => b - a);
}
