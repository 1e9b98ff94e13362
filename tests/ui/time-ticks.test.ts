import { describe, expect, it } from 'vitest';
import { timeTicks } from '../../src/ui/charts/time-ticks';

// Noon UTC keeps the calendar day the same in any time zone the tests run in.
const at = (iso: string) => Date.parse(iso) / 1000;
const DAY = 86_400;

describe('time axis labels in the user’s locale', () => {
  it('labels days day-first in German and month-first in US English, year once', () => {
    const splits = [at('2026-11-11T12:00Z'), at('2026-11-15T12:00Z'), at('2026-11-19T12:00Z')];
    expect(timeTicks(splits, 4 * DAY, 'de-DE')).toEqual(['11.11.\n2026', '15.11.', '19.11.']);
    expect(timeTicks(splits, 4 * DAY, 'en-US')).toEqual(['11/11\n2026', '11/15', '11/19']);
  });
  it('labels months with the year where it changes', () => {
    const splits = [at('2026-11-15T12:00Z'), at('2026-12-15T12:00Z'), at('2027-01-15T12:00Z')];
    expect(timeTicks(splits, 30 * DAY, 'en-GB')).toEqual(['Nov\n2026', 'Dec', 'Jan\n2027']);
  });
  it('labels hours within a day with the date once per day', () => {
    const t0 = at('2026-11-11T12:00Z');
    const labels = timeTicks([t0, t0 + 3600, t0 + 7200], 3600, 'de-DE');
    expect(labels.filter((l) => l.includes('\n'))).toHaveLength(1);
    expect(labels.every((l) => /^\d\d:\d\d/.test(l))).toBe(true);
  });
});
