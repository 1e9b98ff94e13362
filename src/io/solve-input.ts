/**
 * A reading's typed values under engine keys, for the value columns of an export. The engine's
 * request of a reading is made by `src/reading/request.ts` only; nothing here computes.
 * A value whose quantity or unit this catalogue does not know is reported, not guessed.
 */

import type { SolveInput, SolveResult } from '../chem/api';
import { unitOf } from '../quantities';
import type { ReadingDoc } from './docs';

export type Solver = (input: SolveInput) => SolveResult;

/** Engine keys and numbers of a reading's values, plus the options their units imply. */
export function engineValues(reading: Pick<ReadingDoc, 'values'>): {
  values: Record<string, number>;
  options: Record<string, string>;
  unknown: string[];
} {
  const values: Record<string, number> = {};
  const options: Record<string, string> = {};
  const unknown: string[] = [];
  for (const v of reading.values) {
    if (v.source !== undefined) continue; // a titration's carried result has its own column
    const unit = unitOf(v.quantity, v.unit);
    if (!unit) {
      unknown.push(`${v.quantity} [${v.unit}]`);
      continue;
    }
    values[unit.key] = unit.toKey(v.value);
    Object.assign(options, unit.options);
  }
  return { values, options, unknown };
}
