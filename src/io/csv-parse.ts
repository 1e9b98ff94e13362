/**
 * RFC 4180 CSV reading, plus the quirks of files that come out of loggers and spreadsheets: a
 * leading UTF-8 byte-order mark, `;` or tab as delimiter (spreadsheets in locales whose decimal
 * mark is a comma), CRLF or LF line ends, and a missing final line break.
 */

import { CsvSplitter, type Delimiter } from './csv-records';
import { type IoCode, type RowIssue, rowIssue } from './io-issues';

export type { Delimiter };

export const DELIMITERS: readonly Delimiter[] = [',', ';', '\t', '|'];

export interface CsvTable {
  header: string[];
  /** Data rows, each as long as the header (ragged rows are reported, not silently padded). */
  rows: string[][];
  /** 1-based file line where each data row starts (quoted fields may span lines). */
  lines: number[];
}

export interface CsvParseResult {
  table: CsvTable;
  issues: RowIssue[];
}

const BOM = '\uFEFF';

export function stripBom(text: string): { text: string; hadBom: boolean } {
  return text.startsWith(BOM) ? { text: text.slice(1), hadBom: true } : { text, hadBom: false };
}

/** Splits a whole text into records of fields (see `CsvSplitter` for the rules). */
export function splitRecords(
  text: string,
  delimiter: Delimiter,
): { records: string[][]; lines: number[]; issues: RowIssue[] } {
  const records: string[][] = [];
  const lines: number[] = [];
  const issues: RowIssue[] = [];
  const splitter = new CsvSplitter(delimiter, {
    record(fields, line) {
      records.push(fields);
      lines.push(line);
    },
    issue(i) {
      issues.push(i);
    },
  });
  splitter.push(text);
  splitter.end();
  return { records, lines, issues };
}

/**
 * Guesses the delimiter from the first lines: the candidate that gives the same number (> 1) of
 * fields on most lines wins; ties go to the one with more fields.
 */
export function detectDelimiter(text: string): Delimiter {
  const sample = text.slice(0, 64 * 1024);
  const sampleLines = sample
    .split(/\r?\n/)
    .filter((l) => l.trim() !== '')
    .slice(0, 20);
  let best: Delimiter = ',';
  let bestScore = -1;
  for (const d of DELIMITERS) {
    const { records } = splitRecords(sampleLines.join('\n'), d);
    const counts = new Map<number, number>();
    for (const r of records) counts.set(r.length, (counts.get(r.length) ?? 0) + 1);
    let modeCount = 0;
    let modeFields = 1;
    for (const [fields, count] of counts) {
      if (count > modeCount || (count === modeCount && fields > modeFields)) {
        modeCount = count;
        modeFields = fields;
      }
    }
    if (modeFields < 2) continue;
    const score = modeCount * 1000 + modeFields;
    if (score > bestScore) {
      bestScore = score;
      best = d;
    }
  }
  return best;
}

/**
 * Decimal comma when numbers written like `7,85` appear and none like `7.85`; decided over the
 * data fields only, after the delimiter is known (with `,` as delimiter it cannot be a comma).
 */
export function detectDecimalComma(rows: readonly string[][], delimiter: Delimiter): boolean {
  if (delimiter === ',') return false;
  let comma = 0;
  let point = 0;
  for (const row of rows.slice(0, 200)) {
    for (const f of row) {
      const t = f.trim();
      if (/^[-+]?\d+,\d+$/.test(t)) comma++;
      else if (/^[-+]?\d+\.\d+$/.test(t) && !/^\d{1,2}\.\d{1,2}\.\d{2,4}/.test(t)) point++;
    }
  }
  return comma > 0 && comma >= point;
}

export interface CsvSniff {
  hadBom: boolean;
  delimiter: Delimiter;
  decimalComma: boolean;
}

export interface ParsedCsv extends CsvParseResult {
  sniff: CsvSniff;
}

export interface ParseOptions {
  delimiter?: Delimiter;
  decimalComma?: boolean;
}

/** Reads a whole CSV text: BOM, delimiter and decimal mark are detected unless given. */
export function parseCsv(input: string, options: ParseOptions = {}): ParsedCsv {
  const { text, hadBom } = stripBom(input);
  const delimiter = options.delimiter ?? detectDelimiter(text);
  const { records, lines, issues } = splitRecords(text, delimiter);
  const header = (records[0] ?? []).map((h) => h.trim());
  const rows: string[][] = [];
  const rowLines: number[] = [];
  if (records.length === 0 || header.every((h) => h === '')) {
    issues.push(rowIssue(1, 'csv-empty', 'The file has no header row.'));
  }
  const seen = new Set<string>();
  for (const h of header) {
    if (h !== '' && seen.has(h.toLowerCase())) {
      issues.push(
        rowIssue(1, 'csv-duplicate-header', `The column name "${h}" appears twice in the header.`, h),
      );
    }
    seen.add(h.toLowerCase());
  }
  for (let r = 1; r < records.length; r++) {
    const rec = records[r]!;
    const line = lines[r]!;
    if (rec.length !== header.length) {
      const code: IoCode = 'csv-ragged-row';
      issues.push(
        rowIssue(line, code, `This row has ${rec.length} fields but the header has ${header.length}.`),
      );
      continue;
    }
    rows.push(rec);
    rowLines.push(line);
  }
  const decimalComma = options.decimalComma ?? detectDecimalComma(rows, delimiter);
  return { table: { header, rows, lines: rowLines }, issues, sniff: { hadBom, delimiter, decimalComma } };
}
