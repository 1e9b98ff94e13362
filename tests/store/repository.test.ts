import { describe, expect, it } from 'vitest';
import { storeIssue } from '../../src/store/errors';
import type { ReadingDoc, SiteDoc } from '../../src/store/schema';
import { freshRepo } from './helpers';

const site = {
  name: 'Birchcombe spring',
  kind: 'spring' as const,
  defaults: { model: 'fresh' as const },
  notes: '',
};
const values = [
  { quantity: 'temperature', value: 9.4, unit: 'c' },
  { quantity: 'ph', value: 7.21, unit: 'ph' },
];
const reading = (siteId: string, takenAt: string) => ({
  siteId,
  takenAt,
  timeZone: 'Europe/Berlin',
  values,
  notes: '',
});

describe('repository: sites and readings', () => {
  it('creates, lists by time, updates and tombstones readings, queueing each change', async () => {
    const { repo, tick } = await freshRepo();
    const s = await repo.createSite(site);
    const r2 = await repo.createReading(reading(s.id, '2026-05-02T10:00:00.000Z'));
    const r1 = await repo.createReading(reading(s.id, '2026-05-01T10:00:00.000Z'));
    const other = await repo.createSite({ ...site, name: 'Other' });
    await repo.createReading(reading(other.id, '2026-05-01T11:00:00.000Z'));

    expect((await repo.listReadings(s.id)).map((r) => r.id)).toEqual([r1.id, r2.id]);
    expect((await repo.listReadings(s.id, { newestFirst: true, limit: 1 }))[0]?.id).toBe(r2.id);
    expect(await repo.listReadings(s.id, { from: '2026-05-02T00:00:00.000Z' })).toHaveLength(1);

    tick();
    const edited = await repo.updateReading(r1.id, { notes: 'cloudy' });
    expect(edited.notes).toBe('cloudy');
    expect(edited.updatedAt > r1.updatedAt).toBe(true);

    tick();
    await repo.deleteReading(r1.id);
    expect((await repo.listReadings(s.id)).map((r) => r.id)).toEqual([r2.id]);
    const tomb = await repo.getReading(r1.id);
    expect(tomb?.deleted).toBe(true);
    expect(await repo.listReadings(s.id, { includeDeleted: true })).toHaveLength(2);

    expect(await repo.countReadings(s.id)).toBe(1);

    await repo.restoreReading(r1.id);
    expect(await repo.listReadings(s.id)).toHaveLength(2);
    expect(await repo.countReadings(s.id)).toBe(2);

    // 2 sites + 3 readings, one entry per document however often it changed.
    const outbox = await repo.listOutbox();
    expect(outbox).toHaveLength(5);
    const r1Entry = outbox.find((e) => e.docId === r1.id);
    expect(r1Entry?.updatedAt).toBe((await repo.getReading(r1.id))?.updatedAt);
  });

  it('keeps updatedAt moving forward within one millisecond', async () => {
    const { repo } = await freshRepo();
    const s = await repo.createSite(site);
    const a = await repo.updateSite(s.id, { notes: 'a' });
    const b = await repo.updateSite(s.id, { notes: 'b' });
    expect(a.updatedAt > s.updatedAt && b.updatedAt > a.updatedAt).toBe(true);
  });

  it('deleting a site tombstones its readings in the same transaction', async () => {
    const { repo } = await freshRepo();
    const s = await repo.createSite(site);
    await repo.createReading(reading(s.id, '2026-05-01T10:00:00.000Z'));
    await repo.deleteSite(s.id);
    expect(await repo.listSites()).toHaveLength(0);
    expect(await repo.listReadings(s.id)).toHaveLength(0);
    expect((await repo.listReadings(s.id, { includeDeleted: true }))[0]?.deleted).toBe(true);
  });

  it('ack removes only entries whose document did not change again during the push', async () => {
    const { repo, tick } = await freshRepo();
    const s = await repo.createSite(site);
    const pushed = await repo.listOutbox();
    tick();
    await repo.updateSite(s.id, { notes: 'changed while pushing' });
    expect(await repo.ackOutbox(pushed)).toBe(0);
    expect(await repo.outboxSize()).toBe(1);
    expect(await repo.ackOutbox(await repo.listOutbox())).toBe(1);
    expect(await repo.outboxSize()).toBe(0);
  });

  it('applyRemote writes without queueing and keeps losing revisions', async () => {
    const { repo } = await freshRepo();
    const remote: SiteDoc = {
      id: 'remote-1',
      type: 'site',
      name: 'Fen pond',
      kind: 'pond',
      defaults: {},
      notes: '',
      updatedAt: '2026-04-01T00:00:00.000Z',
      deleted: false,
      rev: '2-b',
    };
    const loser: SiteDoc = { ...remote, name: 'Fen pond (old)', rev: '2-a' };
    await repo.applyRemote(
      [remote],
      [{ id: 'remote-1@2-a', docId: 'remote-1', rev: '2-a', doc: loser, keptAt: remote.updatedAt }],
    );
    expect((await repo.getSite('remote-1'))?.rev).toBe('2-b');
    expect(await repo.outboxSize()).toBe(0);
    expect((await repo.listConflicts('remote-1'))[0]?.doc).toMatchObject({ name: 'Fen pond (old)' });
    // A local edit keeps the server revision so sync can send it as the parent.
    expect((await repo.updateSite('remote-1', { notes: 'x' })).rev).toBe('2-b');
  });
});

describe('repository: bad input never stores anything', () => {
  it('rejects a NaN value with a code and stores nothing', async () => {
    const { repo } = await freshRepo();
    const s = await repo.createSite(site);
    const bad = {
      ...reading(s.id, '2026-05-01T10:00:00.000Z'),
      values: [{ quantity: 'ph', value: Number.NaN, unit: 'ph' }],
    };
    await expect(repo.createReading(bad)).rejects.toMatchObject({ code: 'store-invalid-doc' });
    expect(await repo.listReadings(s.id)).toHaveLength(0);
  });

  it('rejects readings of unknown sites and non-UTC times', async () => {
    const { repo } = await freshRepo();
    await expect(repo.createReading(reading('nope', '2026-05-01T10:00:00.000Z'))).rejects.toMatchObject({
      code: 'store-not-found',
    });
    const s = await repo.createSite(site);
    await expect(repo.createReading(reading(s.id, '2026-05-01 10:00'))).rejects.toMatchObject({
      code: 'store-invalid-doc',
    });
  });

  it('bulkPut is all-or-nothing', async () => {
    const { repo } = await freshRepo();
    const s = await repo.createSite(site);
    const good: ReadingDoc = {
      ...reading(s.id, '2026-05-01T10:00:00.000Z'),
      id: 'g',
      type: 'reading',
      updatedAt: '2026-05-01T10:00:00.000Z',
      deleted: false,
    };
    const broken = { ...good, id: 'b', takenAt: 'yesterday' };
    await expect(repo.bulkPut([good, broken])).rejects.toMatchObject({ code: 'store-invalid-doc' });
    expect(await repo.listReadings(s.id)).toHaveLength(0);
    // A failure inside the transaction (duplicate key in a put that cannot happen with put; use a
    // non-cloneable value) aborts the whole batch too.
    const uncloneable = { ...good, id: 'u', plan: () => 1 } as unknown as ReadingDoc;
    await expect(repo.bulkPut([good, uncloneable])).rejects.toBeDefined();
    expect(await repo.listReadings(s.id)).toHaveLength(0);
    // Nor was anything queued: only the site's own entry is in the outbox.
    expect(await repo.outboxSize()).toBe(1);
    expect(await repo.bulkPut([good])).toBe(1);
    expect(await repo.listReadings(s.id)).toHaveLength(1);
  });

  it('maps browser storage failures to codes', () => {
    expect(storeIssue(new DOMException('full', 'QuotaExceededError')).code).toBe('store-quota-exceeded');
    expect(storeIssue(new DOMException('old', 'VersionError')).code).toBe('store-version-newer');
  });
});

describe('repository: paged readings', () => {
  it('keeps order across months and sites, moves readings whose time changes, finds them by id', async () => {
    const { repo } = await freshRepo();
    const a = await repo.createSite(site);
    const b = await repo.createSite({ ...site, name: 'B' });
    const docs: ReadingDoc[] = [];
    for (let i = 0; i < 300; i++) {
      const day = String(1 + (i % 28)).padStart(2, '0');
      const month = String(1 + ((i * 7) % 12)).padStart(2, '0');
      docs.push({
        ...reading(
          i % 3 === 0 ? b.id : a.id,
          `2025-${month}-${day}T${String(i % 24).padStart(2, '0')}:00:00.000Z`,
        ),
        id: `p-${i}`,
        type: 'reading',
        updatedAt: '2026-01-01T00:00:00.000Z',
        deleted: false,
      });
    }
    await repo.bulkPut(docs);
    const listed = await repo.listReadings(a.id);
    expect(listed).toHaveLength(200);
    for (let i = 1; i < listed.length; i++) expect(listed[i - 1]!.takenAt <= listed[i]!.takenAt).toBe(true);
    const march = await repo.listReadings(a.id, {
      from: '2025-03-01T00:00:00.000Z',
      to: '2025-03-31T23:59:59.999Z',
    });
    expect(march.every((r) => r.takenAt.startsWith('2025-03'))).toBe(true);
    expect(march.length).toBe(listed.filter((r) => r.takenAt.startsWith('2025-03')).length);
    expect(await repo.getReading('p-7')).toEqual(docs[7]);
    const moved = await repo.updateReading('p-1', { takenAt: '2024-12-31T23:00:00.000Z' });
    expect((await repo.listReadings(a.id))[0]).toEqual(moved);
    expect(await repo.countReadings(a.id)).toBe(200);
    expect(await repo.countReadings(b.id)).toBe(100);
    // Re-putting the same documents replaces them, never duplicates.
    await repo.bulkPut(docs.slice(0, 50));
    expect(await repo.listAllReadings()).toHaveLength(300);
    expect(await repo.outboxSize()).toBe(302);
    const got = await repo.getDocs([
      { docId: 'p-2', type: 'reading' },
      { docId: a.id, type: 'site' },
      { docId: 'none', type: 'reading' },
    ]);
    expect(got.map((d) => d.id)).toEqual(['p-2', a.id]);
  });
});

describe('repository: settings and layouts', () => {
  it('merges stored settings over defaults and ignores unknown keys', async () => {
    const { repo } = await freshRepo();
    expect((await repo.getSettings()).atmospheric_pco2_uatm).toBe(420);
    const s = await repo.putSettings({ theme: 'contrast', units: { alkalinity: 'dkh' } });
    expect(s.theme).toBe('contrast');
    expect(s.units).toEqual({ alkalinity: 'dkh' });
    expect(s.ph_scale).toBe('nbs');
  });

  it('remembers CSV layouts by header', async () => {
    const { repo } = await freshRepo();
    await repo.putLayout({
      name: 'probe export',
      headerSignature: 'date;temp;ph',
      columns: { temp: 'temperature:c' },
    });
    expect(await repo.findLayouts('date;temp;ph')).toHaveLength(1);
    expect(await repo.findLayouts('other')).toHaveLength(0);
  });
});
