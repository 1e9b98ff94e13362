/**
 * The batch contract of the JSON commands (`solve`, `titrate`, `plan`): every input line gets
 * exactly one output line, in order, and every output line is JSON whose numbers are all finite.
 *
 * - A blank line gets `{"skipped": {"code": "blank-line", "line": N, ...}}`: a marker, not an
 *   error (it does not change the exit status), so outputs still line up with inputs.
 * - Every error carries the input line: `{"error": {"code", "message", "line"}}`.
 * - A value nested deeper than MAX_DEPTH is refused (`input-too-deep`) before anything walks it.
 * - A number that overflowed to ±Infinity or NaN is left out of the output and named in
 *   `warnings` with the code `value-not-finite` (JSON would otherwise print it as null).
 */

import type { Issue } from '../chem/errors';
import { type InputLine, MAX_LINE_CHARS } from './io';

/** Deepest nesting accepted in an input (requests need 3: request → uncertainty → key). */
export const MAX_DEPTH = 32;

export type LineIssue = Issue & { line?: number };

export function lineError(code: string, message: string, line?: number): { error: LineIssue } {
  return { error: line === undefined ? { code, message } : { code, message, line } };
}

/** An input line as a JSON value, or the coded reason it is not one. */
export function parseInputLine(
  l: InputLine,
  /** Code of a line that is not JSON: solve and plan say invalid-json, titrate input-not-json (codes stay). */
  notJson = 'invalid-json',
): { value: unknown } | { error: LineIssue } | { skipped: LineIssue } {
  if (l.tooLong) {
    return lineError('line-too-long', `Line ${l.line} is longer than ${MAX_LINE_CHARS} characters.`, l.line);
  }
  if (l.text.trim() === '') {
    return {
      skipped: { code: 'blank-line', message: `Line ${l.line} is blank; nothing to do.`, line: l.line },
    };
  }
  let value: unknown;
  try {
    value = JSON.parse(l.text);
  } catch (e) {
    return lineError(notJson, `Line ${l.line} is not JSON: ${(e as Error).message}`, l.line);
  }
  if (deeperThan(value, MAX_DEPTH)) {
    return lineError(
      'input-too-deep',
      `Line ${l.line} nests values more than ${MAX_DEPTH} levels deep; no request needs that.`,
      l.line,
    );
  }
  return { value };
}

/** True when objects or arrays nest more than `max` levels (checked without recursion). */
export function deeperThan(value: unknown, max: number): boolean {
  if (typeof value !== 'object' || value === null) return false;
  const stack: [object, number][] = [[value, 1]];
  while (stack.length > 0) {
    const [v, depth] = stack.pop()!;
    if (depth > max) return true;
    for (const child of Array.isArray(v) ? v : Object.values(v)) {
      if (typeof child === 'object' && child !== null) stack.push([child, depth + 1]);
    }
  }
  return false;
}

/**
 * Removes every non-finite number from an output (in place) and names each in a
 * `value-not-finite` warning on the top-level `warnings` list. Array elements become null, with
 * the same warning, since an array cannot leave a place out.
 */
export function keepFinite(result: Record<string, unknown>): Record<string, unknown> {
  const found: string[] = [];
  const stack: [Record<string, unknown> | unknown[], string][] = [[result, '']];
  while (stack.length > 0) {
    const [v, path] = stack.pop()!;
    if (Array.isArray(v)) {
      for (let i = 0; i < v.length; i++) {
        const x = v[i];
        if (typeof x === 'number') {
          if (!Number.isFinite(x)) {
            v[i] = null;
            found.push(`${path}[${i}]`);
          }
        } else if (typeof x === 'object' && x !== null)
          stack.push([x as Record<string, unknown>, `${path}[${i}]`]);
      }
      continue;
    }
    for (const k in v) {
      const x = v[k];
      if (typeof x === 'number') {
        if (!Number.isFinite(x)) {
          delete v[k];
          found.push(path === '' ? k : `${path}.${k}`);
        }
      } else if (typeof x === 'object' && x !== null)
        stack.push([x as Record<string, unknown>, path === '' ? k : `${path}.${k}`]);
    }
  }
  if (found.length > 0) {
    if (!Array.isArray(result.warnings)) result.warnings = [];
    const warnings = result.warnings as Issue[];
    for (const field of found) {
      warnings.push({
        code: 'value-not-finite',
        message: `${field} could not be computed as a finite number (an input is too large or too small) and is left out.`,
        field,
      });
    }
  }
  return result;
}

/** `--fields a,b,c.d`: names of top-level outputs, or dotted paths into nested ones. */
export function parseFields(text: string | undefined): string[][] | string {
  if (text === undefined || text.trim() === '')
    return '--fields needs a comma-separated list of output names';
  const fields = text.split(',').map((f) => f.trim());
  const bad = fields.find((f) => !/^[A-Za-z0-9_]+(\.[A-Za-z0-9_]+)*$/.test(f));
  if (bad !== undefined) return `--fields: "${bad}" is not an output name`;
  return fields.map((f) => f.split('.'));
}

/**
 * The chosen outputs of one result, under their own (dotted) names; `line` is the input line.
 * A field the result does not have is left out.
 */
export function pickFields(
  result: Record<string, unknown>,
  fields: readonly string[][],
  line: number,
  seen: Set<string>,
): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const path of fields) {
    const name = path.join('.');
    if (name === 'line') {
      out.line = line;
      seen.add(name);
      continue;
    }
    let v: unknown = result;
    for (const p of path)
      v = typeof v === 'object' && v !== null ? (v as Record<string, unknown>)[p] : undefined;
    if (v !== undefined) {
      out[name] = v;
      seen.add(name);
    }
  }
  return out;
}
