/**
 * First-order propagation of standard uncertainties through any computation, by derivatives taken
 * with forward finite differences (GUM, JCGM 100:2008, eq. 10, inputs uncorrelated):
 *   u(y)² = Σ_i (∂y/∂x_i · u(x_i))²
 * An input may have several independent components (e.g. the pH reading of every titration point);
 * their contributions add in quadrature under the input's one name.
 *
 * Cost: one base evaluation plus one per component. The step is STEP_FRACTION × u, small enough
 * that curvature over the step is negligible and large enough that the solvers' own tolerance
 * (1e-12 in pH) stays far below the difference taken.
 */

import type { OutputUncertainty } from '../api';
import { fail } from '../errors';

export const STEP_FRACTION = 1e-3;

export interface UncertainInput {
  name: string;
  /** Standard uncertainty, in the unit of the input. */
  u: number;
  /** Independent components sharing this uncertainty (default 1). */
  components?: number;
}

/** Evaluates the outputs with input `name` (component `index`) moved by `delta`; null = unperturbed. */
export type Evaluate = (
  perturb: { name: string; index: number; delta: number } | null,
) => Record<string, number>;

export type { OutputUncertainty };

/** Numeric, finite outputs only: names, flags and nested objects carry no uncertainty. */
export function numericOutputs(result: Record<string, unknown>): Record<string, number> {
  const out: Record<string, number> = {};
  for (const [key, value] of Object.entries(result)) {
    if (typeof value === 'number' && Number.isFinite(value)) out[key] = value;
  }
  return out;
}

/** `base` = the unperturbed outputs when the caller already has them (saves one evaluation). */
export function propagateUncertainty(
  evaluate: Evaluate,
  inputs: readonly UncertainInput[],
  base: Record<string, number> = evaluate(null),
): Record<string, OutputUncertainty> {
  const names = Object.keys(base);
  const variance = new Map<string, Map<string, number>>(); // output -> input -> variance
  for (const key of names) variance.set(key, new Map());

  for (const input of inputs) {
    if (!(input.u >= 0) || !Number.isFinite(input.u)) {
      fail(
        'uncertainty-invalid',
        `The uncertainty of ${input.name} must be a non-negative number.`,
        input.name,
      );
    }
    const count = input.components ?? 1;
    for (let index = 0; index < count; index++) {
      if (input.u === 0) continue;
      const delta = STEP_FRACTION * input.u;
      let moved: Record<string, number>;
      let step = delta;
      try {
        moved = evaluate({ name: input.name, index, delta });
      } catch {
        // At the edge of a domain (e.g. a pH bracket) the backward step may still be defined.
        step = -delta;
        moved = evaluate({ name: input.name, index, delta: step });
      }
      for (const key of names) {
        const m = moved[key];
        if (m === undefined || !Number.isFinite(m)) continue;
        const part = ((m - base[key]!) / step) * input.u;
        const byInput = variance.get(key)!;
        byInput.set(input.name, (byInput.get(input.name) ?? 0) + part * part);
      }
    }
  }

  const result: Record<string, OutputUncertainty> = {};
  for (const key of names) {
    const byInput = variance.get(key)!;
    result[key] = combineVariances(inputs, (name) => byInput.get(name) ?? 0);
  }
  return result;
}

/**
 * One output's uncertainty from the variance each input contributes (uncorrelated inputs): the
 * root of the sum, each contribution as a standard uncertainty, and the input that dominates.
 */
export function combineVariances(
  inputs: readonly { name: string }[],
  varianceOf: (name: string) => number,
): OutputUncertainty {
  let total = 0;
  let dominant = '';
  let largest = -1;
  const contributions: Record<string, number> = {};
  for (const { name } of inputs) {
    const v = varianceOf(name);
    contributions[name] = Math.sqrt(v);
    total += v;
    if (v > largest) {
      largest = v;
      dominant = name;
    }
  }
  // An output no input moves (e.g. a setting echoed back) has no dominant input.
  return {
    standard_uncertainty: Math.sqrt(total),
    dominant_input: total > 0 ? dominant : 'none',
    contributions,
  };
}
