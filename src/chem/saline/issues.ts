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

type Condition = 'temperatureC' | 'salinity' | 'pressureDbar';
const CONDITIONS: readonly (readonly [Condition, string, string, string])[] = [
  ['temperatureC', 'temperature', ' °C', FIELD_TEMPERATURE],
  ['salinity', 'salinity', '', FIELD_SALINITY],
  ['pressureDbar', 'pressure', ' dbar', FIELD_PRESSURE],
];

/**
 * The six possible warnings of a range (three conditions, below or above), built once and frozen.
 * Messages name the range and the side but not the value: building a string per row cost about
 * 300 ns per warning in batch runs of cold deep water, where every row warns; the value is in the
 * input next to the field the warning points at.
 */
const issueCache = new WeakMap<ValidityRange, readonly (Issue | undefined)[]>();

function issuesOf(v: ValidityRange): readonly (Issue | undefined)[] {
  const cached = issueCache.get(v);
  if (cached !== undefined) return cached;
  const made: (Issue | undefined)[] = [];
  for (const [key, what, unit, field] of CONDITIONS) {
    const r = v[key];
    for (const side of ['below', 'above'] as const) {
      made.push(
        r === undefined
          ? undefined
          : Object.freeze({
              code: OUTSIDE_VALIDITY,
              message: `${v.label}: fitted for ${what} ${r[0]}–${r[1]}${unit}; ${side} that range the value is extrapolated.`,
              field,
            }),
      );
    }
  }
  issueCache.set(v, made);
  return made;
}

/**
 * Appends one warning per condition that lies outside `v` to `out` and returns `out`. The warnings
 * are shared frozen objects, one per range, condition and side.
 */
export function checkValidity(
  v: ValidityRange,
  temperatureC: number,
  salinity: number,
  pressureDbar: number,
  out: Issue[] = [],
): Issue[] {
  const values = [temperatureC, salinity, pressureDbar];
  for (let i = 0; i < 3; i++) {
    const r = v[CONDITIONS[i]![0]];
    const x = values[i]!;
    if (r !== undefined && (x < r[0] || x > r[1])) out.push(issuesOf(v)[2 * i + (x < r[0] ? 0 : 1)]!);
  }
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
