/**
 * Spreadsheet formula injection (OWASP "CSV Injection"): text cells that start with =, +, -, @,
 * tab or carriage return are written with a leading apostrophe; numbers are written unchanged.
 */

import { describe, expect, it } from 'vitest';
import { parseCsv } from '../../src/io/csv-parse';
import { safeTextCell } from '../../src/io/csv-write';
import type { ReadingDoc, SiteDoc } from '../../src/io/docs';
import { exportReadingsCsv } from '../../src/io/export-csv';

describe('formula injection', () => {
  it('neutralizes every trigger character, keeps plain text and numbers', () => {
    for (const s of ['=1+1', '+SUM(A1)', '-2+3', '@cmd', '\tx', '\rx', '=HYPERLINK("http://x")'])
      expect(safeTextCell(s), JSON.stringify(s)).toBe(`'${s}`);
    for (const s of ['-1.5', '+3e-2', '-0,25', 'Pond 1', '', '7.9', "'quoted"])
      expect(safeTextCell(s)).toBe(s);
  });

  it('an exported site name and note cannot run as a formula; negative values stay numbers', () => {
    const site: SiteDoc = {
      id: 's1',
      type: 'site',
      name: '=HYPERLINK("http://example.invalid","Pond")',
      kind: 'pond',
      defaults: {},
      notes: '',
      updatedAt: '2026-05-01T00:00:00.000Z',
      deleted: false,
    };
    const reading: ReadingDoc = {
      id: 'r1',
      type: 'reading',
      siteId: 's1',
      takenAt: '2026-05-01T08:00:00.000Z',
      timeZone: 'UTC',
      values: [
        { quantity: 'temperature', value: -1.5, unit: 'c' },
        { quantity: 'ph', value: 7.9, unit: 'ph' },
      ],
      notes: '@SUM(1+1)*cmd|" /C calc"!A0',
      updatedAt: '2026-05-01T00:00:00.000Z',
      deleted: false,
    };
    const csv = exportReadingsCsv([reading], [site]);
    const { header, rows } = parseCsv(csv).table;
    const cell = (name: string) => rows[0]![header.indexOf(name)];
    expect(cell('site')).toBe(`'${site.name}`);
    expect(cell('notes')).toBe(`'${reading.notes}`);
    expect(cell('temperature_c')).toBe('-1.5');
  });
});
