import { describe, expect, it } from 'vitest';
import { formatWithOffset, parseTimestamp } from '../../src/io/timestamps';

const utc = (r: ReturnType<typeof parseTimestamp>) =>
  'epochMs' in r ? new Date(r.epochMs).toISOString() : r.reason;

// Offsets from the EU summer-time rule (last Sunday of March to last Sunday of October, 01:00 UTC),
// as carried by the IANA time zone database for Europe/Vienna (from memory of the rule).
describe('sampling times', () => {
  it('reads ISO 8601 with Z, with an offset, and as local time of a zone', () => {
    expect(utc(parseTimestamp('2026-06-03T14:05:00Z', undefined, 'Europe/Vienna', 'dmy'))).toBe(
      '2026-06-03T14:05:00.000Z',
    );
    expect(utc(parseTimestamp('2026-06-03T14:05+02:00', undefined, 'UTC', 'dmy'))).toBe(
      '2026-06-03T12:05:00.000Z',
    );
    expect(utc(parseTimestamp('2026-06-03 14:05', undefined, 'Europe/Vienna', 'dmy'))).toBe(
      '2026-06-03T12:05:00.000Z',
    );
    expect(utc(parseTimestamp('2026-01-15 14:05', undefined, 'Europe/Vienna', 'dmy'))).toBe(
      '2026-01-15T13:05:00.000Z',
    );
  });
  it('reads numeric dates in the order the user chose, with a separate time column', () => {
    expect(utc(parseTimestamp('03.06.2026', '14:05', 'UTC', 'dmy'))).toBe('2026-06-03T14:05:00.000Z');
    expect(utc(parseTimestamp('06/03/2026 14:05:30', undefined, 'UTC', 'mdy'))).toBe(
      '2026-06-03T14:05:30.000Z',
    );
  });
  it('settles local times across the DST change', () => {
    // 2026-03-29: clocks in Vienna go from 02:00 to 03:00 local (01:00 UTC).
    expect(utc(parseTimestamp('2026-03-29 01:30', undefined, 'Europe/Vienna', 'dmy'))).toBe(
      '2026-03-29T00:30:00.000Z',
    );
    expect(utc(parseTimestamp('2026-03-29 03:30', undefined, 'Europe/Vienna', 'dmy'))).toBe(
      '2026-03-29T01:30:00.000Z',
    );
    // 02:30 does not exist that night: read as 03:30 summer time.
    expect(utc(parseTimestamp('2026-03-29 02:30', undefined, 'Europe/Vienna', 'dmy'))).toBe(
      '2026-03-29T01:30:00.000Z',
    );
    // 2026-10-25: 02:30 local happens twice; the first (summer time, 00:30 UTC) is taken.
    expect(utc(parseTimestamp('2026-10-25 02:30', undefined, 'Europe/Vienna', 'dmy'))).toBe(
      '2026-10-25T00:30:00.000Z',
    );
  });
  it('says why a time cannot be read', () => {
    expect(utc(parseTimestamp('2026-02-30 10:00', undefined, 'UTC', 'dmy'))).toMatch(/not a calendar date/);
    expect(utc(parseTimestamp('yesterday', undefined, 'UTC', 'dmy'))).toMatch(/not a date/);
    expect(utc(parseTimestamp('03.06.2026', '25:00', 'UTC', 'dmy'))).toMatch(
      /not a calendar date|not a time/,
    );
  });
  it('writes local time with its offset', () => {
    expect(formatWithOffset(Date.parse('2026-06-03T12:05:00Z'), 'Europe/Vienna')).toBe(
      '2026-06-03T14:05:00+02:00',
    );
    expect(formatWithOffset(Date.parse('2026-01-15T13:05:00Z'), 'Europe/Vienna')).toBe(
      '2026-01-15T14:05:00+01:00',
    );
    expect(formatWithOffset(Date.parse('2026-06-03T12:05:00Z'), 'America/St_Johns')).toBe(
      '2026-06-03T09:35:00-02:30',
    );
  });
});
