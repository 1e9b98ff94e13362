import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { defaultMapping } from '../../src/io/column-mapping';
import { parseCsv } from '../../src/io/csv-parse';
import { cellNumber, rowReader } from '../../src/io/import-plan';
import { parseNumber } from '../../src/io/numbers';

// Invented logger rows from our own demo stations: several rows share a time (one per station),
// a time zone column changes while the time text stays the same, and a bad time repeats.
const LOGGER =
  'Date/Time;Zone;Station;Temp (°C);pH\r\n' +
  '2026-10-04 02:30;Australia/Adelaide;Reed bay;14,1;8,02\r\n' +
  '2026-10-04 02:30;Australia/Adelaide;Gum creek;14,3;8,05\r\n' +
  '2026-10-04 02:30;Europe/Vienna;Gum creek;14,3;8,05\r\n' +
  '2026-10-04 03:00;Australia/Adelaide;Reed bay;14,0;8,01\r\n' +
  '31.02.2026 10:00;Europe/Vienna;Reed bay;14,0;8,01\r\n' +
  '31.02.2026 10:00;Europe/Vienna;Reed bay;14,0;8,01\r\n' +
  '2026-10-04 03:00;Australia/Adelaide;Reed bay;14,0;8,01\r\n';

describe('row reader', () => {
  const csv = parseCsv(LOGGER);
  const mapping = defaultMapping(csv.table.header, 'UTC');
  const rows = csv.table.rows;

  it('reads every row alike whether the time before it was the same or not', () => {
    const read = rowReader(csv.table.header, mapping, true);
    const inOrder = rows.map((r, i) => read(r, i + 2));
    // Each row read by a fresh reader (nothing remembered) gives the same answer.
    const alone = rows.map((r, i) => rowReader(csv.table.header, mapping, true)(r, i + 2));
    expect(inOrder).toEqual(alone);
    // Adelaide has no 02:30 that night (02:00 +09:30 jumps to 03:00 +10:30): read at +09:30.
    expect(inOrder.map((r) => r.takenAt)).toEqual([
      '2026-10-03T17:00:00.000Z',
      '2026-10-03T17:00:00.000Z',
      '2026-10-04T00:30:00.000Z',
      '2026-10-03T16:30:00.000Z',
      undefined,
      undefined,
      '2026-10-03T16:30:00.000Z',
    ]);
    expect(inOrder[4]!.errors.map((e) => [e.code, e.row])).toEqual([['time-unreadable', 6]]);
    expect(inOrder[5]!.errors.map((e) => [e.code, e.row])).toEqual([['time-unreadable', 7]]);
  });

  it('fills content-id values unless told not to; measured values are the same either way', () => {
    const withIds = rowReader(csv.table.header, mapping, true)(rows[0]!, 2);
    const without = rowReader(csv.table.header, mapping, true, {
      timeRequired: true,
      limits: true,
      contentValues: false,
    })(rows[0]!, 2);
    expect(withIds.values).toEqual({ temperature_c: 14.1, ph: 8.02, ph_scale_code: 0 });
    expect(without.values).toEqual({});
    expect(without.measured).toEqual(withIds.measured);
    expect(without.takenAt).toBe(withIds.takenAt);
  });
});

describe('cellNumber', () => {
  it('reads every cell as parseNumber does, in both decimal modes', () => {
    const cells = fc.oneof(
      fc.stringMatching(/^-?[0-9]{0,5}[.,]?[0-9]{0,5}$/),
      fc.stringMatching(/^[-+ 0-9.,eE'\u2212]{0,10}$/),
      fc.double({ noNaN: true }).map(String),
      fc.string({ maxLength: 8 }),
    );
    fc.assert(
      fc.property(cells, fc.boolean(), (cell, comma) => {
        const raw = cell.trim();
        expect(cellNumber(raw, comma)).toBe(parseNumber(raw, comma));
      }),
      { numRuns: 5000 },
    );
    for (const raw of [
      '',
      '-',
      ',',
      '.',
      '-,5',
      '-.5',
      '5,',
      '5.',
      '1,2,3',
      '1.2.3',
      '9'.repeat(400),
      '0,000',
    ])
      for (const comma of [true, false]) expect(cellNumber(raw, comma)).toBe(parseNumber(raw, comma));
  });
});
