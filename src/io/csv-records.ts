/**
 * RFC 4180 records from text that arrives in pieces (a file stream) or whole: the one record
 * splitter behind `splitRecords`, the app's import and the command line's table reader.
 *
 * Lines end at CRLF, LF or a lone CR. A field that starts with `"` runs to the next lone `"`
 * (`""` is one quote) and may span lines. A quote that is not closed within MAX_QUOTED_LINES lines
 * (or by the end of the file) is reported on the line where it opened, that one line is dropped,
 * and the lines after it are read again as rows: one stray quote costs one row, never the rest of
 * the file. Memory is bounded by one record, whatever the size of the file.
 */

import { type RowIssue, rowIssue } from './io-issues';

export type Delimiter = ',' | ';' | '\t' | '|';

/** How many lines one quoted field may span before its quote counts as never closed. */
export const MAX_QUOTED_LINES = 100;

export interface RecordSink {
  record(fields: string[], line: number): void;
  issue(issue: RowIssue): void;
}

/** The fields of one record's text, or undefined while a quoted field is still open at its end. */
function parseRecord(text: string, d: Delimiter): { fields: string[]; stray: boolean } | undefined {
  const fields: string[] = [];
  const n = text.length;
  let stray = false;
  let i = 0;
  for (;;) {
    if (text.charCodeAt(i) === 34) {
      let field = '';
      i++;
      for (;;) {
        const q = text.indexOf('"', i);
        if (q < 0) return undefined;
        field += text.slice(i, q);
        if (text.charCodeAt(q + 1) === 34) {
          field += '"';
          i = q + 2;
          continue;
        }
        i = q + 1;
        break;
      }
      // After a closing quote only a delimiter or the line end may follow.
      if (i < n && text[i] !== d) {
        stray = true;
        const e = text.indexOf(d, i);
        const end = e < 0 ? n : e;
        field += text.slice(i, end);
        i = end;
      }
      fields.push(field);
    } else {
      const e = text.indexOf(d, i);
      const end = e < 0 ? n : e;
      fields.push(text.slice(i, end));
      i = end;
    }
    if (i >= n) return { fields, stray };
    i++;
    if (i === n) {
      fields.push('');
      return { fields, stray };
    }
  }
}

export class CsvSplitter {
  private carry = '';
  /** A line that ended in CR at the end of a chunk: CRLF or a lone CR is known with the next chunk. */
  private crLine: string | undefined;
  private lineNo = 0;
  /** Lines (with their line ends, kept inside quoted fields) of a record whose quote is still open. */
  private open: { text: string; end: string }[] = [];
  private openLine = 0;

  constructor(
    private readonly delimiter: Delimiter,
    private readonly sink: RecordSink,
  ) {}

  push(chunk: string): void {
    if (chunk === '') return;
    let start = 0;
    if (this.crLine !== undefined) {
      const crlf = chunk.charCodeAt(0) === 10;
      if (crlf) start = 1;
      const text = this.crLine;
      this.crLine = undefined;
      this.line(text, crlf ? '\r\n' : '\r', ++this.lineNo);
    }
    for (let i = start; i < chunk.length; i++) {
      const c = chunk.charCodeAt(i);
      if (c !== 10 && c !== 13) continue;
      const text = this.carry === '' ? chunk.slice(start, i) : this.carry + chunk.slice(start, i);
      this.carry = '';
      start = i + 1;
      if (c === 13 && i + 1 === chunk.length) {
        this.crLine = text;
        return;
      }
      let end = '\n';
      if (c === 13) {
        end = chunk.charCodeAt(i + 1) === 10 ? '\r\n' : '\r';
        if (end === '\r\n') start = ++i + 1;
      }
      this.line(text, end, ++this.lineNo);
    }
    if (start < chunk.length) this.carry += chunk.slice(start);
  }

  end(): void {
    if (this.crLine !== undefined) this.line(this.crLine, '\r', ++this.lineNo);
    this.crLine = undefined;
    if (this.carry !== '') this.line(this.carry, '', ++this.lineNo);
    this.carry = '';
    while (this.open.length > 0) this.giveUp('the file ends inside it');
  }

  private line(text: string, end: string, line: number): void {
    if (this.open.length === 0) {
      if (text === '') return; // a blank line is no record: spreadsheets often leave them at the end
      const r = parseRecord(text, this.delimiter);
      if (r) this.emit(r, line, line);
      else {
        this.open = [{ text, end }];
        this.openLine = line;
      }
      return;
    }
    this.open.push({ text, end });
    let joined = '';
    for (let k = 0; k < this.open.length; k++) {
      const l = this.open[k]!;
      joined += k + 1 < this.open.length ? l.text + l.end : l.text;
    }
    const r = parseRecord(joined, this.delimiter);
    if (r) {
      const from = this.openLine;
      this.open = [];
      this.emit(r, from, line);
    } else if (this.open.length > MAX_QUOTED_LINES) {
      this.giveUp(`it is still open ${MAX_QUOTED_LINES} lines later`);
    }
  }

  private emit(r: { fields: string[]; stray: boolean }, line: number, lastLine: number): void {
    if (r.stray) {
      this.sink.issue(
        rowIssue(
          lastLine,
          'csv-stray-quote',
          'Text follows a closing quote; quote the whole field or double the quote.',
        ),
      );
    }
    this.sink.record(r.fields, line);
  }

  /** Drops the line that opened the quote, reports it, and reads the lines after it again. */
  private giveUp(why: string): void {
    const [, ...rest] = this.open;
    const first = this.openLine;
    this.open = [];
    this.sink.issue(
      rowIssue(
        first,
        'csv-unterminated-quote',
        `A quoted field that starts on this line is never closed (${why}); this line is skipped${rest.length === 1 ? ` and line ${first + 1} is read as a row` : rest.length > 1 ? ` and lines ${first + 1}–${first + rest.length} are read as rows` : ''}.`,
      ),
    );
    rest.forEach((l, k) => {
      this.line(l.text, l.end, first + 1 + k);
    });
  }
}
