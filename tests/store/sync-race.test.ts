/**
 * The window between "sync reads the local doc" and "sync writes it back": a local edit whose
 * transaction starts in that window must survive. The edit is started in the same tick as the sync
 * call, so IndexedDB queues its transaction right behind sync's first one — exactly where a
 * read-then-write in two transactions would lose it.
 */

import { describe, expect, it } from 'vitest';
import { RepositoryStore } from '../../src/sync/repository-store';
import { freshRepo } from './helpers';

const site = {
  name: 'Ashgill pond',
  kind: 'pond' as const,
  defaults: { model: 'fresh' as const },
  notes: '',
};
const values = [
  { quantity: 'temperature', value: 14.2, unit: 'c' },
  { quantity: 'ph', value: 7.8, unit: 'ph' },
];

async function setup() {
  const { repo, tick } = await freshRepo();
  const s = await repo.createSite(site);
  const r = await repo.createReading({
    siteId: s.id,
    takenAt: '2026-05-01T09:00:00.000Z',
    timeZone: 'Europe/Berlin',
    values,
    notes: '',
  });
  tick();
  return { repo, store: new RepositoryStore(repo), s, r };
}

describe('sync bookkeeping against concurrent local edits', () => {
  it('recording a push keeps an edit made during it, gives it the new rev and leaves it queued', async () => {
    const { repo, store, r } = await setup();
    const [, edited] = await Promise.all([
      store.markPushed([{ docId: r.id, rev: '1-aaa', updatedAt: r.updatedAt }]),
      repo.updateReading(r.id, { notes: 'edited while pushing' }),
    ]);
    const now = await repo.getReading(r.id);
    expect(now?.notes).toBe('edited while pushing');
    expect(now?.updatedAt).toBe(edited.updatedAt);
    expect(now?.rev).toBe('1-aaa');
    const outbox = await repo.listOutbox();
    expect(outbox.filter((e) => e.docId === r.id).map((e) => e.updatedAt)).toEqual([edited.updatedAt]);
  });

  it('recording a push with no edit sets the rev and empties the outbox entry', async () => {
    const { repo, store, s, r } = await setup();
    await store.markPushed([
      { docId: r.id, rev: '1-bbb', updatedAt: r.updatedAt },
      { docId: s.id, rev: '1-ccc', updatedAt: s.updatedAt },
    ]);
    expect((await repo.getReading(r.id))?.rev).toBe('1-bbb');
    expect((await repo.getSite(s.id))?.rev).toBe('1-ccc');
    expect(await repo.outboxSize()).toBe(0);
  });

  it('applying a pulled doc never overwrites an edit made during it', async () => {
    const { repo, store, r } = await setup();
    const remote = {
      ...r,
      notes: 'from the other device',
      rev: '2-ddd',
      updatedAt: '2026-05-01T10:00:00.000Z',
    };
    const [skipped, edited] = await Promise.all([
      store.applyRemote([remote], new Map([[r.id, r.updatedAt]])),
      repo.updateReading(r.id, { notes: 'edited here' }),
    ]);
    // Either order is fine (the edit lands on top of the pulled doc, or the pulled doc is set
    // aside as changed-meanwhile); what must never happen is the edit vanishing.
    const now = await repo.getReading(r.id);
    expect(now?.notes).toBe('edited here');
    expect(now?.updatedAt).toBe(edited.updatedAt);
    if (skipped.length === 0) expect(now?.rev).toBe('2-ddd');
    expect((await repo.listOutbox()).some((e) => e.docId === r.id && e.updatedAt === edited.updatedAt)).toBe(
      true,
    );
  });

  it('applying a pulled doc skips one changed locally since sync looked at it, and says so', async () => {
    const { repo, store, r } = await setup();
    const seen = new Map([[r.id, r.updatedAt]]);
    await repo.updateReading(r.id, { notes: 'edited here' });
    const skipped = await store.applyRemote([{ ...r, notes: 'from the other device', rev: '2-ddd' }], seen);
    expect(skipped).toEqual([r.id]);
    expect((await repo.getReading(r.id))?.notes).toBe('edited here');
  });

  it('applying a pulled doc writes it when nothing changed locally, and a new doc always', async () => {
    const { repo, store, s, r } = await setup();
    const remote = { ...r, notes: 'from the other device', rev: '2-eee' };
    const fresh = { ...r, id: 'remote-only', notes: 'new', rev: '1-fff' };
    const skipped = await store.applyRemote(
      [remote, fresh],
      new Map<string, string | undefined>([
        [r.id, r.updatedAt],
        ['remote-only', undefined],
      ]),
    );
    expect(skipped).toEqual([]);
    expect((await repo.getReading(r.id))?.notes).toBe('from the other device');
    expect((await repo.getReading('remote-only'))?.siteId).toBe(s.id);
    // Pulled docs are not queued again: only the two local creations wait.
    expect(await repo.outboxSize()).toBe(2);
  });
});
