/**
 * Builds the engine input of a stored reading: the site's defaults first (model, salinity,
 * constants, pH scale), then the reading's measured values converted to engine keys, which win.
 * A value whose quantity or unit this catalogue does not know is reported, not guessed.
 */

import type { SolveInput, SolveResult } from '../chem/api';
import type { ReadingDoc, SiteDoc } from './docs';
import { unitOf } from './quantities';

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

export function solveInputOf(reading: ReadingDoc, site: SiteDoc | undefined): SolveInput {
  const { units: _units, ...defaults } = site?.defaults ?? {};
  const { values, options } = engineValues(reading);
  return { ...defaults, ...options, ...values };
}
