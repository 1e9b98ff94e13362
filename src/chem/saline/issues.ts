/**
 * Issue codes raised by the saline water model, and the one validity check every formulation uses.
 *
 * Codes (stable once released):
 * - `outside-validity` (warning): a formulation was evaluated outside the temperature, salinity or
 *   pressure range of the data it was fitted to; the value is an extrapolation.
 * - `condition-not-finite` (error): temperature, salinity or pressure is missing or not a number.
 * - `condition-out-of-range` (error): a condition no formulation can be evaluated at (negative
 *   salinity, frozen or boiling water, negative gauge pressure, ...).
 * - `calcium-invalid` (error): a measured calcium concentration that is not a finite number ≥ 0.
 * - `option-unknown` (error): a formulation choice the saline model does not have.
 */

import type { Issue } from '../errors';

export const OUTSIDE_VALIDITY = 'outside-validity';
export const CONDITION_NOT_FINITE = 'condition-not-finite';
export const CONDITION_OUT_OF_RANGE = 'condition-out-of-range';
export const CALCIUM_INVALID = 'calcium-invalid';
export const OPTION_UNKNOWN = 'option-unknown';

/** Input keys of the solve contract that the conditions map to (see `api.ts`). */
export const FIELD_TEMPERATURE = 'temperature_c';
export const FIELD_SALINITY = 'salinity';
export const FIELD_PRESSURE = 'pressure_dbar';

/** The range of the data a formulation was fitted to. Bounds are inclusive; omitted = unbounded. */
export interface ValidityRange {
  /** Who and what, as a person reads it, e.g. `K1 and K2 (Lueker et al. 2000)`. */
  readonly label: string;
  readonly temperatureC?: readonly [number, number];
  readonly salinity?: readonly [number, number];
  readonly pressureDbar?: readonly [number, number];
}

function outside(range: readonly [number, number] | undefined, x: number): boolean {
  return range !== undefined && (x < range[0] || x > range[1]);
}

function describe(
  v: ValidityRange,
  what: string,
  unit: string,
  range: readonly [number, number],
  x: number,
  field: string,
): Issue {
  // Six significant digits: a temperature read from a form can arrive as 0.30000000000000004.
  const shown = Number(x.toPrecision(6));
  return {
    code: OUTSIDE_VALIDITY,
    message: `${v.label}: fitted for ${what} ${range[0]}–${range[1]}${unit}; at ${shown}${unit} the value is extrapolated.`,
    field,
  };
}

/**
 * Appends one warning per condition that lies outside `v` to `out` and returns `out`.
 * Allocates nothing when every condition is inside the range (the entry point relies on that).
 */
export function checkValidity(
  v: ValidityRange,
  temperatureC: number,
  salinity: number,
  pressureDbar: number,
  out: Issue[] = [],
): Issue[] {
  if (outside(v.temperatureC, temperatureC))
    out.push(describe(v, 'temperature', ' °C', v.temperatureC!, temperatureC, FIELD_TEMPERATURE));
  if (outside(v.salinity, salinity))
    out.push(describe(v, 'salinity', '', v.salinity!, salinity, FIELD_SALINITY));
  if (outside(v.pressureDbar, pressureDbar))
    out.push(describe(v, 'pressure', ' dbar', v.pressureDbar!, pressureDbar, FIELD_PRESSURE));
  return out;
}

/** True when all conditions are inside `v`: the cheap test the hot path runs first. */
export function isInside(
  v: ValidityRange,
  temperatureC: number,
  salinity: number,
  pressureDbar: number,
): boolean {
  return (
    !outside(v.temperatureC, temperatureC) &&
    !outside(v.salinity, salinity) &&
    !outside(v.pressureDbar, pressureDbar)
  );
}
