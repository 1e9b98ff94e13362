import 'fake-indexeddb/auto';
import { openDB } from 'idb';
import { describe, expect, it } from 'vitest';
import { LATEST_VERSION, openTufaDb } from '../../src/store/database';
import { openRepository } from '../../src/store/repository';
import type { ReadingDoc, SiteDoc } from '../../src/store/schema';

describe('schema migrations', () => {
  it('upgrades a database written by v1 (one record per reading) to the latest version with its data intact', async () => {
    const name = `tufa-migrate-${process.pid}`;
    const v1 = await openTufaDb({ name, version: 1 });
    expect([...v1.objectStoreNames].sort()).toEqual([
      'conflicts',
      'outbox',
      'readings',
      'settings',
      'sites',
      'syncMeta',
    ]);
    const site: SiteDoc = {
      id: 's1',
      type: 'site',
      name: 'Holloway well',
      kind: 'well',
      defaults: {},
      notes: 'v1 data',
      updatedAt: '2026-03-01T00:00:00.000Z',
      deleted: false,
      rev: '1-x',
    };
    const reading: ReadingDoc = {
      id: 'r1',
      type: 'reading',
      siteId: 's1',
      takenAt: '2026-03-01T09:30:00.000Z',
      timeZone: 'UTC',
      values: [{ quantity: 'ph', value: 7.05, unit: 'ph' }],
      notes: '',
      updatedAt: '2026-03-01T09:31:00.000Z',
      deleted: false,
    };
    await v1.put('sites', site);
    await v1.put('readings', reading);
    await v1.put('outbox', { docId: 'r1', type: 'reading', updatedAt: reading.updatedAt });
    await v1.put('settings', { key: 'theme', value: 'dark' });
    v1.close();

    const repo = await openRepository({ name });
    expect(repo.db.version).toBe(LATEST_VERSION);
    expect(LATEST_VERSION).toBeGreaterThanOrEqual(2);
    expect(await repo.getSite('s1')).toEqual(site);
    expect(await repo.listReadings('s1')).toEqual([reading]);
    expect(await repo.listOutbox()).toHaveLength(1);
    expect((await repo.getSettings()).theme).toBe('dark');
    // v2 added layouts; v3 moved readings and outbox into pages and buckets, dropping the old stores.
    await repo.putLayout({ name: 'x', headerSignature: 'a,b', columns: {} });
    expect(await repo.listLayouts()).toHaveLength(1);
    expect([...repo.db.objectStoreNames]).not.toContain('readings');
    expect([...repo.db.objectStoreNames]).not.toContain('outbox');
    expect(await repo.getReading('r1')).toEqual(reading);
    expect(await repo.listOutbox()).toEqual([{ docId: 'r1', type: 'reading', updatedAt: reading.updatedAt }]);
    // The migrated reading can be edited like any other, and moves page when its month changes.
    const moved = await repo.updateReading('r1', { takenAt: '2026-04-02T09:30:00.000Z' });
    expect(await repo.listReadings('s1')).toEqual([moved]);
    expect(await repo.countReadings('s1')).toBe(1);
    repo.close();
  });

  it('refuses a version that does not exist', async () => {
    await expect(openTufaDb({ name: 'never', version: LATEST_VERSION + 1 })).rejects.toThrow(RangeError);
  });
});

describe('upgrade blocked by an open older connection', () => {
  it('tells the user with store-upgrade-blocked, then proceeds once the old tab closes', async () => {
    const name = `tufa-blocked-${process.pid}`;
    (await openTufaDb({ name, version: 1 })).close();
    // Another tab still holds version 1 and does not give way (as a build without a handler would);
    // our own connections close themselves on versionchange, so open this one bare.
    const old = await openDB(name, 1);
    const issues: string[] = [];
    const opening = openTufaDb({ name, onBlocked: (i) => issues.push(i.code) });
    await new Promise((r) => setTimeout(r, 50));
    expect(issues).toEqual(['store-upgrade-blocked']);
    old.close();
    const db = await opening;
    expect(db.version).toBe(LATEST_VERSION);
    db.close();
  });
});
