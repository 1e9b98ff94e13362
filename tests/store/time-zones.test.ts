/**
 * Issue 15 §4: a reading with a time zone this device does not know is refused where data enters
 * (store writes, which sync's pull and import go through, and backup restore), and one such
 * reading already stored does not break CSV export for all: its time is written in UTC.
 */

import { describe, expect, it } from 'vitest';
import { parseBackup } from '../../src/io/backup';
import { exportReadingsCsv, takenAtCell, unknownZoneReadings } from '../../src/io/export-csv';
import type { ReadingDoc, SiteDoc } from '../../src/store/schema';
import { isTimeZone, validateReading } from '../../src/store/validate';
import { freshRepo } from './helpers';

// Invented readings of one of our own demo sites.
const SITE: SiteDoc = {
  id: 's1',
  type: 'site',
  updatedAt: '2026-06-01T00:00:00.000Z',
  deleted: false,
  name: 'Mill leat',
  kind: 'stream',
  defaults: {},
  notes: '',
};
const reading = (id: string, timeZone: string): ReadingDoc => ({
  id,
  type: 'reading',
  updatedAt: '2026-06-01T00:00:00.000Z',
  deleted: false,
  siteId: 's1',
  takenAt: '2026-06-01T06:00:00.000Z',
  timeZone,
  values: [{ quantity: 'ph', value: 7.9, unit: 'nbs' }],
  notes: '',
});

describe('time zones', () => {
  it('knows IANA names and refuses others', () => {
    expect(isTimeZone('Europe/Berlin')).toBe(true);
    expect(isTimeZone('UTC')).toBe(true);
    for (const z of ['Mars/Olympus', 'Europe/Berlin\u0000', '', 42, null, 'x'.repeat(100)])
      expect(isTimeZone(z), String(z)).toBe(false);
    expect(() => validateReading(reading('r', 'Mars/Olympus'))).toThrow(/time zone/);
  });

  it('refuses a bad zone on write and on restore', async () => {
    const { repo } = await freshRepo();
    await repo.bulkPut([SITE]);
    await expect(repo.bulkPut([reading('r1', 'Mars/Olympus')])).rejects.toMatchObject({
      code: 'store-invalid-doc',
    });
    expect(await repo.countReadings('s1')).toBe(0);
    const b = parseBackup(
      JSON.stringify({
        format: 'tufa-backup',
        version: 1,
        created_at: '2026-06-01T00:00:00Z',
        counts: {},
        sites: [SITE],
        readings: [reading('r2', 'Not/AZone')],
        settings: [],
        layouts: [],
      }),
    );
    expect('error' in b && b.error.code).toBe('backup-bad-doc');
    expect('error' in b && b.error.message).toContain('Not/AZone');
    repo.close();
  });

  it('lets a stored reading with an unknown zone still be deleted', async () => {
    const { repo } = await freshRepo();
    await repo.bulkPut([SITE, reading('r3', 'Europe/Berlin')]);
    // Stored before zones were checked: patch the page record as an older Tufa would have left it.
    const pages = await repo.db.getAll('readingPageData');
    pages[0]!.readings[0]!.timeZone = 'Mars/Olympus';
    await repo.db.put('readingPageData', pages[0]!);
    const gone = await repo.deleteReading('r3');
    expect(gone.deleted).toBe(true);
    repo.close();
  });

  it('exports every reading, one with an unknown zone in UTC', () => {
    const rows = [reading('a', 'Europe/Berlin'), reading('b', 'Mars/Olympus')];
    const csv = exportReadingsCsv(rows, [SITE]);
    expect(csv).toContain('2026-06-01T08:00:00+02:00');
    expect(csv).toContain('2026-06-01T06:00:00+00:00');
    expect(takenAtCell(rows[1]!)).toBe('2026-06-01T06:00:00+00:00');
    expect(unknownZoneReadings(rows).map((r) => r.id)).toEqual(['b']);
  });
});
