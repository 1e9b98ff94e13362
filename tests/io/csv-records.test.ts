import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { splitRecords } from '../../src/io/csv-parse';
import { CsvSplitter, MAX_QUOTED_LINES } from '../../src/io/csv-records';
import type { RowIssue } from '../../src/io/io-issues';

function inPieces(text: string, cuts: number[]) {
  const records: [string[], number][] = [];
  const issues: RowIssue[] = [];
  const s = new CsvSplitter(',', { record: (f, l) => records.push([f, l]), issue: (i) => issues.push(i) });
  let at = 0;
  for (const c of [...cuts].sort((a, b) => a - b)) {
    s.push(text.slice(at, Math.max(at, c)));
    at = Math.max(at, c);
  }
  s.push(text.slice(at));
  s.end();
  return { records, issues };
}

describe('CSV records from a stream', () => {
  it('gives the same records and lines however the text is cut into chunks', () => {
    const cell = fc.constantFrom('1', 'x', '"a,b"', '"two\r\nlines"', '"q""q"', '', '"open', 'y"z');
    const line = fc.array(cell, { minLength: 1, maxLength: 4 }).map((c) => c.join(','));
    const text = fc
      .tuple(
        fc.array(line, { maxLength: 12 }),
        fc.array(fc.constantFrom('\r\n', '\n', '\r'), { minLength: 12, maxLength: 12 }),
      )
      .map(([ls, ends]) => ls.map((l, i) => l + ends[i]).join(''));
    fc.assert(
      fc.property(text, fc.array(fc.nat(200), { maxLength: 6 }), (t, cuts) => {
        const whole = splitRecords(t, ',');
        const parts = inPieces(t, cuts);
        expect(parts.records.map((r) => r[0])).toEqual(whole.records);
        expect(parts.records.map((r) => r[1])).toEqual(whole.lines);
        expect(parts.issues).toEqual(whole.issues);
      }),
    );
  });

  it('an unclosed quote costs its own line only; the rows after it are read and the loss is reported', () => {
    const rows = Array.from({ length: 300 }, (_, i) => `${i + 3},7.${i % 10}`);
    const text = `n,ph\n2,"8.1\n${rows.join('\n')}\n`;
    const { records, lines, issues } = splitRecords(text, ',');
    expect(issues.map((i) => [i.row, i.code])).toEqual([[2, 'csv-unterminated-quote']]);
    expect(issues[0]!.message).toMatch(/never closed/);
    // Header plus every row after the bad one, each on its own line number.
    expect(records).toHaveLength(1 + 300);
    expect(lines.slice(1, 4)).toEqual([3, 4, 5]);
    // At the end of a file, the same.
    const tail = splitRecords('n,ph\n1,7\n2,"7.5\n3,8\n', ',');
    expect(tail.records.map((r) => r[0])).toEqual(['n', '1', '3']);
    expect(tail.issues[0]).toMatchObject({ row: 3, code: 'csv-unterminated-quote' });
    expect(MAX_QUOTED_LINES).toBeGreaterThan(10);
  });
});
