/**
 * Reading typed values out of a JSON request: shared by every request parser of the engine so
 * that absent, null and empty values and refusals mean the same everywhere.
 */

import { fail } from './errors';

/** A number under `key`, or undefined when absent (null and '' count as absent); refuses non-numbers. */
export function numberAt(raw: Readonly<Record<string, unknown>>, key: string): number | undefined {
  const v = raw[key];
  if (v === undefined || v === null || v === '') return undefined;
  if (typeof v !== 'number' || !Number.isFinite(v)) {
    fail('not-a-number', `${key} must be a finite number, got ${JSON.stringify(v)}.`, key);
  }
  return v;
}

/** One of `allowed` under `key`, or `fallback` when absent; refuses anything else. */
export function optionAt<T extends string>(
  raw: Readonly<Record<string, unknown>>,
  key: string,
  allowed: readonly T[],
  fallback: T,
): T {
  const v = raw[key];
  if (v === undefined || v === null || v === '') return fallback;
  if (typeof v !== 'string' || !(allowed as readonly string[]).includes(v)) {
    fail('unknown-option', `${key} must be one of ${allowed.join(', ')}; got ${JSON.stringify(v)}.`, key);
  }
  return v as T;
}
