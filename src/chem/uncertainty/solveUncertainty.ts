/**
 * Uncertainty of every output of a solve, from standard uncertainties of its inputs and,
 * optionally, of the constants, by derivatives of the solver (./propagate.ts).
 *
 * Request shape (the `uncertainty` key of a solve input): input key → standard uncertainty in the
 * unit of that key (e.g. `"ph": 0.01`, `"alkalinity_umol_kg": 2`), plus `"constants": true` for the
 * standard uncertainties of Orr et al. (2018), Marine Chemistry 207, 84–107, Table 1, as listed in
 * chemistry.md *(memory)*; any of those can also be given one by one to override them.
 * They were assessed for seawater formulations; for the fresh-water model they are applied as
 * they are, which is a stated assumption, not a published assessment.
 */

import { fail } from '../errors';
import type { ConstantShifts } from '../models';
import {
  type Evaluate,
  numericOutputs,
  type OutputUncertainty,
  propagateUncertainty,
  type UncertainInput,
} from './propagate';

/** The solver as seen from here: a plain solve (no `uncertainty` key) with optional shifts. */
export type SolveFn = (input: Record<string, unknown>, options: { shifts?: ConstantShifts }) => unknown;

/** Standard uncertainties of the constants, Orr et al. (2018) *(memory, via chemistry.md)*. */
export const CONSTANT_UNCERTAINTIES = {
  pk0: 0.002,
  pk1: 0.0075,
  pk2: 0.015,
  pkb: 0.01,
  pkw: 0.01,
  pksp_calcite: 0.02,
  pksp_aragonite: 0.02,
  /** Relative (fraction of the total). */
  total_boron: 0.02,
} as const;
type ConstantKey = keyof typeof CONSTANT_UNCERTAINTIES;
const CONSTANT_KEYS = Object.keys(CONSTANT_UNCERTAINTIES) as ConstantKey[];

function shiftFor(key: ConstantKey, delta: number): ConstantShifts {
  switch (key) {
    case 'pk0':
      return { pk0: delta };
    case 'pk1':
      return { pk1: delta };
    case 'pk2':
      return { pk2: delta };
    case 'pkb':
      return { pkb: delta };
    case 'pkw':
      return { pkw: delta };
    case 'pksp_calcite':
      return { pkspCalcite: delta };
    case 'pksp_aragonite':
      return { pkspAragonite: delta };
    case 'total_boron':
      return { totalBoronFactor: 1 + delta };
  }
}

const isConstantKey = (k: string): k is ConstantKey => (CONSTANT_KEYS as string[]).includes(k);

/** Reads the `uncertainty` request against the input it belongs to; bad requests throw with a code. */
export function uncertainInputs(input: Record<string, unknown>, spec: unknown): UncertainInput[] {
  if (typeof spec !== 'object' || spec === null || Array.isArray(spec)) {
    fail(
      'uncertainty-invalid',
      'uncertainty must be an object of input names and standard uncertainties.',
      'uncertainty',
    );
  }
  const list: UncertainInput[] = [];
  const given = spec as Record<string, unknown>;
  if (given.constants !== undefined && typeof given.constants !== 'boolean') {
    fail('uncertainty-invalid', 'uncertainty.constants must be true or false.', 'uncertainty');
  }
  for (const [key, u] of Object.entries(given)) {
    if (key === 'constants') continue;
    if (typeof u !== 'number' || !Number.isFinite(u) || u < 0) {
      fail('uncertainty-invalid', `The uncertainty of ${key} must be a non-negative number.`, 'uncertainty');
    }
    if (isConstantKey(key)) continue;
    if (key === 'uncertainty' || !(key in input)) {
      fail(
        'uncertainty-input-missing',
        `An uncertainty is given for ${key}, but the input has no ${key}.`,
        'uncertainty',
      );
    }
    if (typeof input[key] !== 'number') {
      fail(
        'uncertainty-input-not-numeric',
        `${key} is not a number, so it has no uncertainty to propagate.`,
        'uncertainty',
      );
    }
    list.push({ name: key, u });
  }
  for (const key of CONSTANT_KEYS) {
    const own = given[key];
    if (typeof own === 'number') list.push({ name: key, u: own });
    else if (given.constants === true) list.push({ name: key, u: CONSTANT_UNCERTAINTIES[key] });
  }
  return list;
}

/** A failed perturbed solve throws, so the propagator can step the other way. */
function checked(result: unknown): Record<string, unknown> {
  if (typeof result !== 'object' || result === null || 'error' in result) {
    const issue = (result as { error?: { code?: string; message?: string } } | null)?.error;
    fail(issue?.code ?? 'uncertainty-derivative-failed', issue?.message ?? 'A perturbed solve failed.');
  }
  return result as Record<string, unknown>;
}

/**
 * `plainInput` must not carry `uncertainty`; `baseResult` is its solve (reused, not repeated).
 * Costs one solve per uncertain input or constant.
 */
export function solveUncertainty(
  plainInput: Record<string, unknown>,
  spec: unknown,
  baseResult: unknown,
  solveFn: SolveFn,
): Record<string, OutputUncertainty> {
  const inputs = uncertainInputs(plainInput, spec);
  const base = numericOutputs(checked(baseResult));
  // Read only the outputs the base has: walking every key of each result costs a fifth of a solve.
  const keys = Object.keys(base);
  const outputsOf = (result: unknown): Record<string, number> => {
    const r = checked(result);
    const out: Record<string, number> = {};
    for (const key of keys) out[key] = r[key] as number;
    return out;
  };
  const evaluate: Evaluate = (p) => {
    if (p === null) return base;
    if (isConstantKey(p.name)) return outputsOf(solveFn(plainInput, { shifts: shiftFor(p.name, p.delta) }));
    return outputsOf(solveFn({ ...plainInput, [p.name]: (plainInput[p.name] as number) + p.delta }, {}));
  };
  return propagateUncertainty(evaluate, inputs, base);
}
