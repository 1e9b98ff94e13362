/**
 * How a reduction's alkalinity and DIC move when one reading moves, for every reading at once, so
 * that per-point uncertainties propagate in time linear in the number of points (instead of one
 * full reduction per reading).
 *
 * For a weighted least-squares estimate p minimising Σ wᵢ rᵢ(p, θᵢ)², where reading θᵢ enters only
 * its own residual, the implicit-function theorem gives to first order
 *   ∂p/∂θᵢ = −(JᵀWJ)⁻¹ Jᵢᵀ wᵢ ∂rᵢ/∂θᵢ,   Jᵢ = ∂rᵢ/∂p
 * (the terms in rᵢ·∂²rᵢ/∂p∂θᵢ are dropped: they vanish with the residuals, as in the usual
 * Gauss–Newton covariance).
 */

/** Per reading: ∂alkalinity/∂θᵢ (eq/L per unit) and ∂DIC/∂θᵢ (mol/L per unit), 0 for unused points. */
export interface PerPointDerivatives {
  alkalinity: Float64Array;
  dic?: Float64Array;
}

/** Sensitivities of the result to every pH reading (per pH unit) and volume reading (per mL). */
export interface PointSensitivity {
  ph: PerPointDerivatives;
  volume_ml: PerPointDerivatives;
}

/** Inverts a small symmetric positive definite matrix (n ≤ 3) by Gauss–Jordan; null if singular. */
export function invertSmall(a: readonly (readonly number[])[]): number[][] | null {
  const n = a.length;
  const m = a.map((row, i) => [...row, ...Array.from({ length: n }, (_, j) => (i === j ? 1 : 0))]);
  for (let c = 0; c < n; c++) {
    let piv = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(m[r]![c]!) > Math.abs(m[piv]![c]!)) piv = r;
    const pv = m[piv]![c]!;
    if (!(Math.abs(pv) > 0)) return null;
    [m[c], m[piv]] = [m[piv]!, m[c]!];
    const row = m[c]!;
    for (let k = 0; k < 2 * n; k++) row[k]! /= pv;
    for (let r = 0; r < n; r++) {
      if (r === c) continue;
      const f = m[r]![c]!;
      if (f === 0) continue;
      for (let k = 0; k < 2 * n; k++) m[r]![k]! -= f * row[k]!;
    }
  }
  return m.map((row) => row.slice(n));
}

/**
 * ∂p/∂θᵢ for every point i: `jac[j][i]` = ∂rᵢ/∂p_j, `weights[i]` = wᵢ, `dr[i]` = ∂rᵢ/∂θᵢ,
 * `inverse` = (JᵀWJ)⁻¹. Returns one array per parameter.
 */
export function parameterSensitivities(
  inverse: readonly (readonly number[])[],
  jac: readonly Float64Array[],
  weights: Float64Array | null,
  dr: Float64Array,
): Float64Array[] {
  const n = inverse.length;
  const m = dr.length;
  const out = Array.from({ length: n }, () => new Float64Array(m));
  for (let i = 0; i < m; i++) {
    const wd = (weights === null ? 1 : weights[i]!) * dr[i]!;
    if (wd === 0) continue;
    for (let a = 0; a < n; a++) {
      let s = 0;
      for (let b = 0; b < n; b++) s += inverse[a]![b]! * jac[b]![i]!;
      out[a]![i] = -s * wd;
    }
  }
  return out;
}
