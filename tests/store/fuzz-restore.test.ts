/**
 * Issue 15 §6 fuzz: hostile backups and hostile stored settings (fast-check; CI uses the fixed
 * seed of tests/setup.ts). Invariants: parsing and restoring never throw anything but a coded
 * error, no reading already stored is lost or changed by an older copy, and what the app reads at
 * start (settings) always works: every value passes its check and formats with Intl.
 */

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { TufaError } from '../../src/chem/errors';
import { parseBackup, restoreBackup } from '../../src/io/backup';
import type { ReadingDoc, SiteDoc } from '../../src/store/schema';
import { SETTING_CHECKS, SETTING_KEYS } from '../../src/store/settings';
import { RepositoryStore } from '../../src/sync/repository-store';
import { freshRepo } from './helpers';

// Invented data of one of our own demo sites.
const SITE: SiteDoc = {
  id: 'site-fuzz',
  type: 'site',
  updatedAt: '2026-05-01T08:00:00.000Z',
  deleted: false,
  name: 'Culvert outfall',
  kind: 'stream',
  defaults: {},
  notes: '',
};
const reading = (i: number): ReadingDoc => ({
  id: `reading-fuzz-${i}`,
  type: 'reading',
  updatedAt: '2026-05-01T08:00:00.000Z',
  deleted: false,
  siteId: SITE.id,
  takenAt: `2026-05-0${1 + i}T06:00:00.000Z`,
  timeZone: 'Europe/Berlin',
  values: [{ quantity: 'ph', value: 7.5 + i / 10, unit: 'nbs' }],
  notes: '',
});
const STORED = [reading(0), reading(1), reading(2)];

const hostileValue = fc.oneof(
  fc.jsonValue(),
  fc.constantFrom(
    'en_US',
    'xx-!!',
    '',
    'de-DE',
    '\u0000',
    'Mars/Olympus',
    Number.NaN,
    Number.POSITIVE_INFINITY,
    -0,
    1e308,
    5e-324,
    null,
    [],
    {},
    { __proto__: { polluted: true } },
    'a'.repeat(10_000),
  ),
);
const settingEntry = fc.record({
  key: fc.oneof(
    fc.constantFrom(...SETTING_KEYS),
    fc.string(),
    fc.constantFrom('__proto__', 'constructor', 'password'),
  ),
  value: hostileValue,
});
/** A reading as a hostile file may hold it: the stored ids, newer or older, with any field broken. */
const hostileReading = fc.record(
  {
    id: fc.oneof(fc.constantFrom(...STORED.map((r) => r.id)), fc.string(), fc.constant(42)),
    type: fc.constantFrom('reading', 'site', 'evil', undefined),
    updatedAt: fc.oneof(
      fc.constantFrom('2026-04-01T00:00:00.000Z', '2026-06-01T00:00:00.000Z', 'yesterday', ''),
      fc.jsonValue(),
    ),
    deleted: fc.oneof(fc.boolean(), hostileValue),
    siteId: fc.oneof(fc.constant(SITE.id), fc.string(), hostileValue),
    takenAt: fc.oneof(fc.constantFrom('2026-05-09T06:00:00.000Z', '2026-13-45T99:00:00Z'), hostileValue),
    timeZone: fc.oneof(fc.constantFrom('UTC', 'Europe/Berlin', 'Mars/Olympus', ''), hostileValue),
    values: fc.oneof(
      fc.array(
        fc.record({
          quantity: fc.constantFrom('ph', 'temperature'),
          value: hostileValue,
          unit: fc.constantFrom('nbs', 'c'),
        }),
        {
          maxLength: 3,
        },
      ),
      hostileValue,
    ),
    notes: fc.oneof(fc.string(), hostileValue),
  },
  { requiredKeys: [] },
);
const hostileBackup = fc.record({
  format: fc.oneof(fc.constant('tufa-backup'), fc.string()),
  version: fc.oneof(fc.constant(1), fc.constantFrom(0, 2, -1, Number.NaN), fc.jsonValue()),
  created_at: fc.string(),
  counts: fc.jsonValue(),
  sites: fc.oneof(fc.constant([SITE]), fc.array(fc.jsonValue(), { maxLength: 2 })),
  readings: fc.oneof(fc.array(hostileReading, { maxLength: 4 }), fc.jsonValue()),
  settings: fc.oneof(fc.array(settingEntry, { maxLength: 12 }), fc.jsonValue()),
  layouts: fc.oneof(fc.constant([]), fc.array(fc.jsonValue(), { maxLength: 2 })),
});

/**
 * A backup that reads as one (so restore runs): stored readings in older or newer copies and new
 * ones, at most one field of each made hostile, and hostile settings.
 */
const nearValidReading = fc
  .record({
    i: fc.integer({ min: 0, max: 5 }),
    updatedAt: fc.constantFrom('2026-04-01T00:00:00.000Z', '2026-06-01T00:00:00.000Z'),
    field: fc.constantFrom(undefined, 'timeZone', 'values', 'takenAt', 'notes', 'siteId', 'titration'),
    value: hostileValue,
  })
  .map(({ i, updatedAt, field, value }) => {
    const r: Record<string, unknown> = { ...reading(i), updatedAt };
    if (field) r[field] = value;
    return r;
  });
const nearValidBackup = fc.record({
  format: fc.constant('tufa-backup'),
  version: fc.constant(1),
  created_at: fc.constant('2026-06-01T00:00:00Z'),
  counts: fc.constant({}),
  sites: fc.constant([SITE]),
  readings: fc.array(nearValidReading, { maxLength: 5 }),
  settings: fc.array(settingEntry, { maxLength: 12 }),
  layouts: fc.constant([]),
});

/** What boot does with settings, and the formatters every screen builds from them. */
async function bootsWith(repo: Awaited<ReturnType<typeof freshRepo>>['repo']): Promise<void> {
  const { settings } = await repo.readSettings();
  for (const k of SETTING_KEYS) expect(SETTING_CHECKS[k](settings[k]), k).toBeUndefined();
  new Intl.NumberFormat(settings.locale || undefined).format(1234.5);
  new Intl.DateTimeFormat(settings.locale || undefined, { timeZone: 'UTC' }).format(0);
}

describe('fuzz: hostile backups and settings', () => {
  it('restore never throws uncoded, never loses a stored reading, and the app still starts', async () => {
    const { repo } = await freshRepo();
    await repo.bulkPut([SITE, ...STORED]);
    const store = new RepositoryStore(repo);
    let cases = 0;
    let restored = 0;
    await fc.assert(
      fc.asyncProperty(
        fc.oneof(nearValidBackup, nearValidBackup, hostileBackup, fc.jsonValue(), fc.string()),
        async (b) => {
          cases++;
          const text = typeof b === 'string' ? b : JSON.stringify(b);
          const parsed = parseBackup(text);
          if (!('error' in parsed)) {
            try {
              await restoreBackup(store, parsed);
              restored++;
            } catch (e) {
              expect(e).toBeInstanceOf(TufaError);
            }
          } else expect(parsed.error.code).toMatch(/^backup-/);
          // Every stored reading is still there, and no older copy replaced a newer one.
          for (const r of STORED) {
            const now = await repo.getReading(r.id);
            expect(now, r.id).toBeDefined();
            expect(Date.parse(now!.updatedAt)).toBeGreaterThanOrEqual(Date.parse(r.updatedAt));
          }
          await bootsWith(repo);
        },
      ),
      { numRuns: 300 },
    );
    console.log(
      `restore fuzz: ${cases} hostile backups, ${restored} restored (partly or wholly), failures 0`,
    );
    repo.close();
  }, 120_000);

  it('any stored settings rows read as usable settings', async () => {
    const { repo } = await freshRepo();
    let cases = 0;
    await fc.assert(
      fc.asyncProperty(fc.array(settingEntry, { maxLength: 12 }), async (rows) => {
        cases++;
        await repo.db.clear('settings');
        for (const r of rows)
          if (typeof r.key === 'string') await repo.db.put('settings', { key: r.key, value: r.value });
        await bootsWith(repo);
        // And every write of such a value is refused or stored as usable.
        for (const r of rows) {
          try {
            await repo.putSettings({ [r.key]: r.value });
          } catch (e) {
            expect((e as TufaError).code).toBe('store-invalid-setting');
          }
        }
        await bootsWith(repo);
      }),
      { numRuns: 200 },
    );
    console.log(`settings fuzz: ${cases} hostile settings sets, failures 0`);
    repo.close();
  }, 120_000);
});
