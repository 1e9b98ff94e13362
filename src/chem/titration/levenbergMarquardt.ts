/**
 * Levenberg–Marquardt least squares for a few parameters (Marquardt 1963, J. Soc. Indust. Appl.
 * Math. 11, 431–441): minimises Σ (y_i − f_i(p))², Jacobian by forward differences, damping
 * scaled by diag(JᵀJ), the damped normal equations solved by Gaussian elimination with partial
 * pivoting (n ≤ 3 here, so no factorisation library is needed).
 *
 * Stops when an accepted step moves every parameter by less than `tolerance` relative to its size
 * (absolute below `scale`), when no damping lowers the cost (the minimum to machine precision),
 * or after `maxIterations` (reported as not converged).
 */

export interface LmProblem {
  /** Observations. */
  y: Float64Array;
  /** Writes f(p) into `out`. Must not keep `p`. */
  model: (p: readonly number[], out: Float64Array) => void;
  /** Forward-difference step per parameter. */
  step: (p: readonly number[], j: number) => number;
  /** Size below which a parameter's step is judged absolutely. */
  scale: readonly number[];
  /** May pull a trial point back inside the domain (e.g. keep DIC positive). */
  constrain?: (trial: number[], current: readonly number[]) => void;
  tolerance: number;
  maxIterations: number;
}

export interface LmResult {
  p: number[];
  fitted: Float64Array;
  cost: number;
  iterations: number;
  converged: boolean;
  lambda: number;
  /**
   * s²·(JᵀJ)⁻¹ with s² = cost/(m − n): the parameter covariance from the scatter of the residuals
   * (first order, Jacobian of the last iteration); null when JᵀJ is singular or m ≤ n.
   */
  covariance: number[][] | null;
}

/** Solves A x = b in place for a small dense system; returns null when A is singular. */
function solveSmall(a: number[][], b: number[]): number[] | null {
  const n = b.length;
  for (let c = 0; c < n; c++) {
    let piv = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(a[r]![c]!) > Math.abs(a[piv]![c]!)) piv = r;
    if (!(Math.abs(a[piv]![c]!) > 0)) return null;
    [a[c], a[piv]] = [a[piv]!, a[c]!];
    [b[c], b[piv]] = [b[piv]!, b[c]!];
    for (let r = c + 1; r < n; r++) {
      const f = a[r]![c]! / a[c]![c]!;
      for (let k = c; k < n; k++) a[r]![k]! -= f * a[c]![k]!;
      b[r]! -= f * b[c]!;
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    let s = b[r]!;
    for (let k = r + 1; k < n; k++) s -= a[r]![k]! * x[k]!;
    x[r] = s / a[r]![r]!;
  }
  return x;
}

export function levenbergMarquardt(problem: LmProblem, start: readonly number[]): LmResult {
  const { y, model, tolerance, maxIterations } = problem;
  const m = y.length;
  const n = start.length;
  let p = [...start];
  const fitted = new Float64Array(m);
  const trial = new Float64Array(m);
  const jac = Array.from({ length: n }, () => new Float64Array(m));
  const costOf = (f: Float64Array) => {
    let c = 0;
    for (let i = 0; i < m; i++) c += (y[i]! - f[i]!) ** 2;
    return c;
  };
  model(p, fitted);
  let cost = costOf(fitted);
  let lambda = 1e-3;
  let iterations = 0;
  let converged = false;
  let normal: number[][] | null = null;
  while (iterations < maxIterations) {
    iterations++;
    for (let j = 0; j < n; j++) {
      const h = problem.step(p, j);
      const q = [...p];
      q[j] = p[j]! + h;
      model(q, trial);
      const col = jac[j]!;
      for (let i = 0; i < m; i++) col[i] = (trial[i]! - fitted[i]!) / h;
    }
    const a: number[][] = Array.from({ length: n }, () => new Array<number>(n).fill(0));
    const g = new Array<number>(n).fill(0);
    for (let j = 0; j < n; j++) {
      const cj = jac[j]!;
      for (let i = 0; i < m; i++) g[j]! += cj[i]! * (y[i]! - fitted[i]!);
      for (let k = j; k < n; k++) {
        const ck = jac[k]!;
        let s = 0;
        for (let i = 0; i < m; i++) s += cj[i]! * ck[i]!;
        a[j]![k] = s;
        a[k]![j] = s;
      }
    }
    normal = a;
    let accepted = false;
    for (let tries = 0; tries < 30; tries++) {
      const damped = a.map((row, j) => row.map((v, k) => (j === k ? v * (1 + lambda) : v)));
      const d = solveSmall(damped, [...g]);
      if (d === null) {
        lambda *= 10;
        continue;
      }
      const q = p.map((v, j) => v + d[j]!);
      problem.constrain?.(q, p);
      model(q, trial);
      const c = costOf(trial);
      if (c <= cost) {
        const small = d.every(
          (dj, j) => Math.abs(dj) <= tolerance * Math.max(Math.abs(p[j]!), problem.scale[j]!),
        );
        p = q;
        cost = c;
        fitted.set(trial);
        lambda = Math.max(lambda / 3, 1e-12);
        accepted = true;
        if (small) converged = true;
        break;
      }
      lambda *= 4;
    }
    // No damping lowers the cost any more: the minimum is reached to machine precision.
    if (converged || !accepted) {
      converged = true;
      break;
    }
  }
  return { p, fitted, cost, iterations, converged, lambda, covariance: covarianceOf(normal, cost, m) };
}

function covarianceOf(a: number[][] | null, cost: number, m: number): number[][] | null {
  if (a === null) return null;
  const n = a.length;
  if (m <= n) return null;
  const s2 = cost / (m - n);
  const columns: number[][] = [];
  for (let j = 0; j < n; j++) {
    const e = new Array<number>(n).fill(0);
    e[j] = 1;
    const col = solveSmall(
      a.map((row) => [...row]),
      e,
    );
    if (col === null) return null;
    columns.push(col.map((v) => v * s2));
  }
  // columns[j][i] = (A⁻¹)[i][j]; A is symmetric, so this is the covariance matrix.
  return columns;
}
