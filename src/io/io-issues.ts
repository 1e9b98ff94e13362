/**
 * Error and warning codes of data import, export, backup and restore. Codes are stable once
 * released; messages may be improved. They use the engine's `Issue` shape so the UI and the CLI
 * show them the same way as solver errors.
 */

import type { Issue } from '../chem/errors';

export type IoCode =
  | 'csv-empty'
  | 'csv-unterminated-quote'
  | 'csv-stray-quote'
  | 'csv-ragged-row'
  | 'csv-duplicate-header'
  | 'csv-not-utf8'
  | 'map-no-timestamp'
  | 'map-no-site'
  | 'map-column-twice'
  | 'map-unknown-column'
  | 'map-unknown-quantity'
  | 'value-not-a-number'
  | 'value-out-of-range'
  | 'time-missing'
  | 'time-unreadable'
  | 'time-zone-unknown'
  | 'site-missing'
  | 'row-no-values'
  | 'row-duplicate'
  | 'reading-id-invalid'
  | 'row-solve-failed'
  | 'backup-not-json'
  | 'backup-wrong-format'
  | 'backup-newer-version'
  | 'backup-bad-doc'
  | 'store-write-failed'
  | 'store-quota-exceeded';

export function ioIssue(code: IoCode, message: string, field?: string): Issue {
  return field === undefined ? { code, message } : { code, message, field };
}

/** One problem in one row of an imported file; `row` is the 1-based line of the file (header = 1). */
export interface RowIssue extends Issue {
  row: number;
  /** Header text of the column concerned, when there is one. */
  column?: string;
}

export function rowIssue(row: number, code: IoCode, message: string, column?: string): RowIssue {
  return column === undefined ? { row, code, message } : { row, code, message, column };
}
