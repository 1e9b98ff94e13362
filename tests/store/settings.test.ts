/**
 * Issue 15 §2 and §11: every stored setting is checked on write, on read and on restore, so a
 * hostile value cannot reach Intl on every screen; every write is strict; a quota failure is
 * reported as such, also when it arrives as a transaction's AbortError.
 */

import { describe, expect, it } from 'vitest';
import { parseBackup, restoreBackup } from '../../src/io/backup';
import { isQuotaError, storeIssue } from '../../src/store/errors';
import { Repository } from '../../src/store/repository';
import { checkLocale, DEFAULT_SETTINGS, readSettings, SETTING_CHECKS } from '../../src/store/settings';
import { RepositoryStore } from '../../src/sync/repository-store';
import { freshRepo } from './helpers';

describe('setting checks', () => {
  it('has one check per setting, and every default passes its own', () => {
    expect(Object.keys(SETTING_CHECKS).sort()).toEqual(Object.keys(DEFAULT_SETTINGS).sort());
    for (const [k, v] of Object.entries(DEFAULT_SETTINGS))
      expect(SETTING_CHECKS[k as keyof typeof SETTING_CHECKS](v), k).toBeUndefined();
  });

  it('refuses a locale Intl cannot use (the probe: "en_US")', () => {
    expect(checkLocale('en_US')).toMatch(/not a valid language tag/);
    expect(checkLocale('xx-!!')).toBeDefined();
    expect(checkLocale(42)).toBeDefined();
    expect(checkLocale('de-DE')).toBeUndefined();
    expect(checkLocale('')).toBeUndefined();
  });

  it('reads stored rows over defaults and reports what it could not use', () => {
    const { settings, rejected } = readSettings([
      { key: 'locale', value: 'en_US' },
      { key: 'theme', value: 'dark' },
      { key: 'atmospheric_pco2_uatm', value: Number.NaN },
      { key: 'units', value: null },
      { key: 'model', value: { toString: 1 } },
      { key: 'old-key-from-a-future-tufa', value: 1 },
    ]);
    expect(settings).toEqual({ ...DEFAULT_SETTINGS, theme: 'dark' });
    expect(rejected.map((r) => r.key).sort()).toEqual(['atmospheric_pco2_uatm', 'locale', 'model', 'units']);
  });
});

describe('repository settings', () => {
  it('refuses an invalid value with store-invalid-setting and changes nothing', async () => {
    const { repo } = await freshRepo();
    await expect(repo.putSettings({ theme: 'dark', locale: 'en_US' })).rejects.toMatchObject({
      code: 'store-invalid-setting',
    });
    expect(await repo.getSettings()).toEqual(DEFAULT_SETTINGS);
    repo.close();
  });

  it('falls back to the default for a bad value already stored (an older Tufa wrote it)', async () => {
    const { repo } = await freshRepo();
    // Raw write: the state an unchecked restore left behind.
    await repo.db.put('settings', { key: 'locale', value: 'en_US' });
    await repo.db.put('settings', { key: 'theme', value: 'dark' });
    const read = await repo.readSettings();
    expect(read.settings.locale).toBe('');
    expect(read.settings.theme).toBe('dark');
    expect(read.rejected).toEqual([{ key: 'locale', reason: expect.stringContaining('en_US') }]);
    repo.close();
  });

  it('restores the data of a backup with hostile settings, and none of those settings', async () => {
    const { repo } = await freshRepo();
    const backup = parseBackup(
      JSON.stringify({
        format: 'tufa-backup',
        version: 1,
        created_at: '2026-06-01T00:00:00Z',
        counts: {},
        sites: [
          {
            id: 's1',
            type: 'site',
            updatedAt: '2026-06-01T00:00:00Z',
            deleted: false,
            name: 'Weir pool',
            kind: 'stream',
            defaults: {},
            notes: '',
          },
        ],
        readings: [
          {
            id: 'r1',
            type: 'reading',
            updatedAt: '2026-06-01T00:00:00Z',
            deleted: false,
            siteId: 's1',
            takenAt: '2026-06-01T00:00:00Z',
            timeZone: 'UTC',
            values: [{ quantity: 'ph', value: 7.9, unit: 'nbs' }],
            notes: '',
          },
        ],
        settings: [
          { key: 'locale', value: 'en_US' },
          { key: 'ph_uncertainty', value: -1 },
          { key: 'theme', value: 'contrast' },
        ],
        layouts: [],
      }),
    );
    if ('error' in backup) throw new Error(backup.error.message);
    const r = await restoreBackup(new RepositoryStore(repo), backup);
    expect(r.added).toBe(2);
    expect(r.settingsRejected.map((x) => x.key).sort()).toEqual(['locale', 'ph_uncertainty']);
    const read = await repo.readSettings();
    expect(read.rejected).toEqual([]);
    expect(read.settings).toEqual({ ...DEFAULT_SETTINGS, theme: 'contrast' });
    expect(await repo.countReadings('s1')).toBe(1);
    repo.close();
  });
});

describe('durability and quota', () => {
  it('writes every change with durability strict', async () => {
    const { repo } = await freshRepo();
    const seen: { stores: string; durability: string | undefined }[] = [];
    const db = repo.db;
    const original = db.transaction.bind(db);
    (db as { transaction: unknown }).transaction = (
      stores: string | string[],
      mode?: IDBTransactionMode,
      opts?: IDBTransactionOptions,
    ) => {
      if (mode === 'readwrite') seen.push({ stores: String(stores), durability: opts?.durability });
      return original(stores as never, mode, opts);
    };
    const site = await repo.createSite({ name: 'Tank 3', kind: 'tank', defaults: {}, notes: '' });
    await repo.setSyncMeta('seq', '12-abc');
    await repo.keepConflicts([
      { id: `${site.id}@1-a`, docId: site.id, rev: '1-a', doc: site, keptAt: site.updatedAt },
    ]);
    await repo.dropConflict(`${site.id}@1-a`);
    const l = await repo.putLayout({ name: 'logger', headerSignature: 'a|b', columns: {} });
    await repo.deleteLayout(l.id);
    await repo.putSettings({ theme: 'dark' });
    await repo.ackOutbox([]);
    expect(seen.length).toBeGreaterThanOrEqual(8);
    expect(seen.filter((s) => s.durability !== 'strict')).toEqual([]);
    repo.close();
  });

  it('labels a quota failure store-quota-exceeded, also inside an AbortError', async () => {
    const quota = new DOMException('full', 'QuotaExceededError');
    expect(storeIssue(quota).code).toBe('store-quota-exceeded');
    const wrapped = Object.assign(new DOMException('aborted', 'AbortError'), {});
    Object.defineProperty(wrapped, 'target', { value: { transaction: { error: quota } } });
    expect(isQuotaError(wrapped)).toBe(true);
    expect(storeIssue(new DOMException('aborted', 'AbortError')).code).toBe('store-write-failed');

    // A commit that fails for lack of room: idb rejects tx.done with a bare AbortError and the
    // cause is only in tx.error.
    const { repo } = await freshRepo();
    const db = repo.db;
    const fake = new Proxy(db, {
      get(target, prop) {
        if (prop !== 'transaction') return Reflect.get(target, prop, target);
        return (...args: Parameters<typeof db.transaction>) => {
          const tx = target.transaction(...args);
          const done = Promise.reject(new DOMException('aborted', 'AbortError'));
          done.catch(() => undefined);
          return new Proxy(tx, {
            get(t, p) {
              if (p === 'done') return done;
              if (p === 'error') return quota;
              const v = Reflect.get(t, p, t);
              return typeof v === 'function' ? v.bind(t) : v;
            },
          });
        };
      },
    });
    const r = new Repository(
      fake,
      () => new Date('2026-06-01T00:00:00Z'),
      () => 'x1',
    );
    await expect(r.setSyncMeta('k', 1)).rejects.toMatchObject({ code: 'store-quota-exceeded' });
    await expect(r.createSite({ name: 'Pond', kind: 'pond', defaults: {}, notes: '' })).rejects.toMatchObject(
      { code: 'store-quota-exceeded' },
    );
    repo.close();
  });
});
