/**
 * Validity checks shared by the fresh-water formulations: a formulation outside its published
 * range is still evaluated (extrapolated), but the caller gets a warning naming the range.
 */

import { type Issue, warning } from '../errors';

/** A published validity interval, inclusive, in the unit of the argument it bounds. */
export interface Range {
  min: number;
  max: number;
}

/**
 * Returns a warning when `value` lies outside `range`, else `undefined`.
 * The code is stable (`formulation-out-of-range`); the message names the formulation and the range.
 */
export function rangeWarning(
  formulation: string,
  quantity: string,
  value: number,
  range: Range,
  unit: string,
  field?: string,
): Issue | undefined {
  if (value >= range.min && value <= range.max) return undefined;
  return warning(
    'formulation-out-of-range',
    `${formulation} is published for ${quantity} ${range.min}–${range.max} ${unit}; ` +
      `${value} ${unit} is outside, so the value is extrapolated.`,
    field,
  );
}

/** Pushes the warning into `out` when there is one; returns `out` for chaining. */
export function pushRange(
  out: Issue[],
  formulation: string,
  quantity: string,
  value: number,
  range: Range,
  unit: string,
  field?: string,
): Issue[] {
  const w = rangeWarning(formulation, quantity, value, range, unit, field);
  if (w !== undefined) out.push(w);
  return out;
}
