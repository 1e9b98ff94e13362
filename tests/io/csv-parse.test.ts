import { describe, expect, it } from 'vitest';
import { detectDelimiter, parseCsv, splitRecords } from '../../src/io/csv-parse';
import { writeCsv } from '../../src/io/csv-write';
import { parseNumber } from '../../src/io/numbers';

describe('RFC 4180 records', () => {
  // Cases follow the rules of RFC 4180 section 2 (quoted fields, doubled quotes, CRLF inside quotes).
  it('reads quoted fields with delimiters, doubled quotes and line breaks', () => {
    const text = 'a,b,c\r\n1,"x, y","say ""hi"""\r\n2,"two\r\nlines",z\r\n';
    const { records, lines, issues } = splitRecords(text, ',');
    expect(issues).toEqual([]);
    expect(records).toEqual([
      ['a', 'b', 'c'],
      ['1', 'x, y', 'say "hi"'],
      ['2', 'two\r\nlines', 'z'],
    ]);
    expect(lines).toEqual([1, 2, 3]);
  });
  it('accepts LF only, a missing final line break, empty fields and blank lines', () => {
    const { records } = splitRecords('a;b\n1;\n\n;2', ';');
    expect(records).toEqual([
      ['a', 'b'],
      ['1', ''],
      ['', '2'],
    ]);
  });
  it('reports an unterminated quote and text after a closing quote with their lines', () => {
    expect(splitRecords('a,b\n1,"open\n2,3\n', ',').issues.map((i) => [i.row, i.code])).toEqual([
      [2, 'csv-unterminated-quote'],
    ]);
    expect(splitRecords('a,b\n1,"x"y\n', ',').issues.map((i) => [i.row, i.code])).toEqual([
      [2, 'csv-stray-quote'],
    ]);
  });
  it('writes what it reads (round trip through writeCsv)', () => {
    const rows = [
      ['1', 'comma, inside', 'quote " inside'],
      ['2', 'line\nbreak', ''],
    ];
    const text = writeCsv(['n', 'a', 'b'], rows);
    expect(text.endsWith('\r\n')).toBe(true);
    const back = parseCsv(text, { delimiter: ',' });
    expect(back.table.header).toEqual(['n', 'a', 'b']);
    expect(back.table.rows).toEqual(rows);
  });
});

describe('detection', () => {
  it('finds ; , tab and | as delimiters', () => {
    expect(detectDelimiter('a;b;c\n1,5;2,5;3\n4;5;6')).toBe(';');
    expect(detectDelimiter('a,b,c\n1.5,2,3')).toBe(',');
    expect(detectDelimiter('a\tb\n1\t2')).toBe('\t');
    expect(detectDelimiter('a|b|c\n1|2|3')).toBe('|');
  });
  it('finds a BOM and a decimal comma', () => {
    const p = parseCsv('\uFEFFtime;pH;temp\n2026-06-01 10:00;7,85;12,5\n2026-06-01 11:00;7,9;13\n');
    expect(p.sniff).toEqual({ hadBom: true, delimiter: ';', decimalComma: true });
    expect(p.table.header[0]).toBe('time');
  });
  it('keeps a decimal point when the file has one', () => {
    expect(parseCsv('a;b\n7.85;12.5\n').sniff.decimalComma).toBe(false);
  });
  it('reports ragged rows and duplicate header names', () => {
    const p = parseCsv('a,b,a\n1,2,3\n1,2\n');
    expect(p.issues.map((i) => [i.row, i.code])).toEqual([
      [1, 'csv-duplicate-header'],
      [3, 'csv-ragged-row'],
    ]);
  });
});

describe('numbers', () => {
  it.each([
    ['7.85', false, 7.85],
    ['7,85', true, 7.85],
    ['-0,5', true, -0.5],
    ['1 234,5', true, 1234.5],
    ['1e-3', false, 0.001],
    ['\u22122.5', false, -2.5],
  ])('%s (decimal comma %s) is %d', (raw, comma, v) => {
    expect(parseNumber(raw, comma)).toBe(v);
  });
  it.each([
    ['7,85', false],
    ['7.85', true],
    ['1.234,5', true],
    ['abc', false],
    ['NaN', false],
    ['Infinity', false],
    ['', false],
  ])('%s (decimal comma %s) is not a number', (raw, comma) => {
    expect(parseNumber(raw, comma)).toBeUndefined();
  });
});
