import 'fake-indexeddb/auto';
import { describe, expect, it } from 'vitest';
import { backupToJson, createBackup, parseBackup, restoreBackup } from '../../src/io/backup';
import { openRepository } from '../../src/store/repository';
import { RepositoryStore } from '../../src/sync/repository-store';

let n = 0;
async function fresh() {
  let t = Date.parse('2026-05-01T08:00:00Z');
  const repo = await openRepository({
    name: `tufa-backup-${process.pid}-${n++}`,
    now: () => {
      t += 1000;
      return new Date(t);
    },
  });
  return { repo, store: new RepositoryStore(repo) };
}

async function seeded() {
  const f = await fresh();
  const site = await f.repo.createSite({
    name: 'Oxbow lake L2',
    kind: 'lake',
    defaults: { model: 'fresh' },
    notes: '',
  });
  await f.repo.createReading({
    siteId: site.id,
    takenAt: '2026-05-01T09:00:00.000Z',
    timeZone: 'Europe/Berlin',
    values: [{ quantity: 'ph', value: 8.05, unit: 'nbs' }],
    notes: 'calm',
    titration: {
      sampleVolumeMl: 100,
      titrantNormality: 0.02,
      points: [
        { volumeMl: 0, ph: 8.05 },
        { volumeMl: 1.2, ph: 6.1 },
      ],
    },
  });
  await f.repo.putSettings({ theme: 'dark' });
  await f.repo.setSyncMeta('connection', {
    url: 'https://couch.example.org/',
    user: 'ana',
    password: 'hunter2',
  });
  await f.repo.putLayout({
    name: 'logger A',
    headerSignature: 'site|ph',
    columns: { site: 'site', ph: 'value:ph:nbs' },
  });
  return { ...f, site };
}

describe('JSON backup', () => {
  it('holds sites, readings with titrations, settings and layouts, and no credentials', async () => {
    const { store } = await seeded();
    const b = await createBackup(store, new Date('2026-05-02T00:00:00Z'));
    expect(b.counts).toEqual({ sites: 1, readings: 1, settings: b.settings.length, layouts: 1 });
    expect(b.readings[0]?.titration?.points.length).toBe(2);
    expect(b.settings.find((s) => s.key === 'theme')?.value).toBe('dark');
    const json = backupToJson(b);
    expect(json).not.toMatch(/hunter2|password/);
    expect(parseBackup(json)).toEqual(b);
  });

  it('restores into an empty database and merges by id without duplicates', async () => {
    const { store } = await seeded();
    const json = backupToJson(await createBackup(store));
    const target = await fresh();
    const first = await restoreBackup(target.store, parseBackup(json) as never);
    expect(first).toMatchObject({ added: 2, replaced: 0, unchanged: 0 });
    const second = await restoreBackup(target.store, parseBackup(json) as never);
    expect(second).toMatchObject({ added: 0, replaced: 0, unchanged: 2 });
    expect((await target.repo.listAllReadings()).length).toBe(1);
    expect((await target.repo.listSites()).length).toBe(1);
    expect((await target.repo.getSettings()).theme).toBe('dark');
    expect((await target.repo.listLayouts()).length).toBe(1);
  });

  it('keeps newer local work when an older backup is restored over it', async () => {
    const { store, repo, site } = await seeded();
    const json = backupToJson(await createBackup(store));
    await repo.updateSite(site.id, { notes: 'edited after the backup' });
    const r = await restoreBackup(store, parseBackup(json) as never);
    expect(r).toMatchObject({ added: 0, replaced: 0, unchanged: 2 });
    expect((await repo.getSite(site.id))?.notes).toBe('edited after the backup');
  });

  it('refuses broken files before writing anything', async () => {
    expect(parseBackup('{not json')).toMatchObject({ error: { code: 'backup-not-json' } });
    expect(parseBackup('{"format":"other"}')).toMatchObject({ error: { code: 'backup-wrong-format' } });
    expect(parseBackup('{"format":"tufa-backup","version":99}')).toMatchObject({
      error: { code: 'backup-newer-version' },
    });
    const { store } = await seeded();
    const b = await createBackup(store);
    const broken = JSON.parse(backupToJson(b));
    broken.readings[0].values[0].value = 'seven';
    const res = parseBackup(JSON.stringify(broken));
    expect(res).toMatchObject({ error: { code: 'backup-bad-doc' } });
    expect('error' in res && res.error.message).toMatch(/not finite numbers/);
  });
});
