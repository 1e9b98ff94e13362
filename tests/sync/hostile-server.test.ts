/**
 * One test per defect of issue 15 §1, §5, §6, §7, against the misbehaving fake server
 * (`fake-couch.ts`). Each failed before the fix: a poison doc stopped sync for good, a failed pull
 * kept local changes from leaving, a server repeating its `last_seq` kept sync looping, junk rows
 * surfaced as raw JavaScript text, and pulled docs could change a doc's type or overwrite a
 * newer local copy.
 */

import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { listSetAside } from '../../src/sync/quarantine';
import type { SyncStatus } from '../../src/sync/sync-engine';
import { device, readingInput, siteInput } from './devices';
import { FakeCouch } from './fake-couch';

// A fresh server (one database) for every test.
let server = new FakeCouch();
beforeEach(async () => {
  server = new FakeCouch();
  await server.start();
});
afterEach(() => server.stop());

let dbN = 0;
const nextDb = () => `hostile-${dbN++}`;
const RAW_JS = /Cannot read|is not a function|undefined|null \(reading|TypeError|RangeError/;

function serverReading(id: string, siteId: string, i: number, extra: Record<string, unknown> = {}) {
  return {
    _id: id,
    type: 'reading',
    ...readingInput(siteId, i),
    updatedAt: '2026-05-03T10:00:00.000Z',
    deleted: false,
    ...extra,
  };
}

function watch(engine: { subscribe(fn: (s: SyncStatus) => void): () => void }): string[] {
  const messages: string[] = [];
  engine.subscribe((s) => {
    if (s.error) messages.push(s.error.message);
  });
  return messages;
}

describe('§1 one invalid document does not stop sync', () => {
  it('sets the poison doc aside with its id, applies the rest of the page, advances the checkpoint and pushes', async () => {
    const a = await device(server.url, nextDb(), { maxAttempts: 2 });
    const mine = await a.repo.createSite(siteInput('Marl pit 2'));
    server.inject({
      _id: 'site-1',
      type: 'site',
      ...siteInput('Quarry lake'),
      updatedAt: '2026-05-01T00:00:00.000Z',
      deleted: false,
    });
    server.inject(serverReading('good-1', 'site-1', 1));
    server.inject(
      serverReading('poison-1', 'site-1', 2, { values: [{ quantity: 'ph', value: 'NaN', unit: 'nbs' }] }),
    );
    server.inject(serverReading('good-2', 'site-1', 3));

    const run = await a.engine.sync();
    expect(run.pulled).toBe(3);
    expect((await a.repo.getReading('good-1'))?.siteId).toBe('site-1');
    expect((await a.repo.getReading('good-2'))?.siteId).toBe('site-1');
    expect(await a.repo.getReading('poison-1')).toBeUndefined();
    const st = a.engine.getStatus();
    expect(st.state).toBe('idle');
    expect(st.setAside).toHaveLength(1);
    expect(st.setAside[0]).toMatchObject({ code: 'sync-doc-invalid' });
    expect(st.setAside[0]!.message).toMatch(/poison-1.*set aside.*value of ph is not a finite number/);
    const kept = await listSetAside(a.store);
    expect(kept[0]?.json).toContain('"poison-1"');
    expect(await a.store.getMeta('pull-checkpoint')).toBe(4); // the four docs injected (the push comes after the pull)
    expect(server.docOf(mine.id)?.name).toBe('Marl pit 2');
    expect(await a.repo.outboxSize()).toBe(0);
    // Next run: nothing new, the poison is not reported twice.
    await a.engine.sync();
    expect((await listSetAside(a.store)).length).toBe(1);
  });

  it('pushes local changes even when every pull fails', async () => {
    const a = await device(server.url, nextDb(), { maxAttempts: 2 });
    const site = await a.repo.createSite(siteInput('Canal lock 7'));
    server.faults = [{ on: '_changes', kind: 'status-403', times: 100 }];
    const err = await a.engine.sync().catch((e: unknown) => e);
    expect(err).toMatchObject({ code: 'sync-forbidden' });
    expect(server.docOf(site.id)?.name).toBe('Canal lock 7');
    expect(await a.repo.outboxSize()).toBe(0);
  });
});

describe('§5 a feed that never moves on', () => {
  for (const kind of ['same-seq', 'cycle-seq'] as const) {
    it(`stops with sync-no-progress (${kind}) after a bounded number of requests, and still pushes`, async () => {
      const db = nextDb();
      server.inject({
        _id: 'site-x',
        type: 'site',
        ...siteInput('Weir pool'),
        updatedAt: '2026-05-01T00:00:00.000Z',
        deleted: false,
      });
      const a = await device(server.url, db, { maxAttempts: 3, pullLimit: 5 });
      const site = await a.repo.createSite(siteInput('Tide gauge basin'));
      server.faults = [{ on: '_changes', kind, times: 1 }];
      const before = server.counts.get('_changes') ?? 0;
      const err = await a.engine.sync().catch((e: unknown) => e);
      expect(err).toMatchObject({ code: 'sync-no-progress' });
      expect((server.counts.get('_changes') ?? 0) - before).toBeLessThanOrEqual(3);
      expect(a.engine.getStatus().error?.message).toMatch(/without moving on/);
      expect(server.docOf(site.id)).toBeDefined();
    });
  }
});

describe('§6 malformed answers are named, retried, never raw JavaScript', () => {
  const cases: {
    label: string;
    on: '_changes' | '_bulk_docs' | '_all_docs';
    kind: 'null-results' | 'junk-rows' | 'not-json' | 'null-body' | 'hang' | 'missing-rows' | 'status-500';
  }[] = [
    { label: '_changes results null', on: '_changes', kind: 'null-results' },
    { label: '_changes body null', on: '_changes', kind: 'null-body' },
    { label: '_changes not JSON', on: '_changes', kind: 'not-json' },
    { label: '_changes hangs', on: '_changes', kind: 'hang' },
    { label: '_changes rows null or with numeric ids', on: '_changes', kind: 'junk-rows' },
    { label: '_bulk_docs rows with numeric ids', on: '_bulk_docs', kind: 'junk-rows' },
    { label: '_bulk_docs body null', on: '_bulk_docs', kind: 'null-body' },
    { label: '_bulk_docs leaves rows out', on: '_bulk_docs', kind: 'missing-rows' },
    { label: '_bulk_docs 500', on: '_bulk_docs', kind: 'status-500' },
    { label: '_all_docs junk rows', on: '_all_docs', kind: 'junk-rows' },
  ];
  for (const c of cases) {
    it(c.label, async () => {
      const db = nextDb();
      server.inject({
        _id: `far-site-${db}`,
        type: 'site',
        ...siteInput('Far spring'),
        updatedAt: '2026-05-01T00:00:00.000Z',
        deleted: false,
      });
      const a = await device(server.url, db, { maxAttempts: 4, timeoutMs: 300 });
      const site = await a.repo.createSite(siteInput('Estuary mouth'));
      const readings = await Promise.all(
        [1, 2, 3].map((i) => a.repo.createReading(readingInput(site.id, i))),
      );
      const seen = watch(a.engine);
      server.faults = [{ on: c.on, kind: c.kind, times: 1 }];
      const run = await a.engine.sync();
      expect(run.attempts).toBeLessThanOrEqual(2);
      for (const m of seen) expect(m).not.toMatch(RAW_JS);
      for (const r of readings) expect(server.docOf(r.id)?.notes).toBe(r.notes);
      expect(await a.repo.outboxSize()).toBe(0);
      if (c.on !== '_changes' || c.kind === 'junk-rows' || run.attempts > 1)
        expect((await a.repo.getSite(`far-site-${db}`))?.name).toBe('Far spring');
      for (const i of a.engine.getStatus().setAside) expect(i.message).not.toMatch(RAW_JS);
    });
  }
});

describe('§7 pulled docs cannot change a type or overwrite a newer local copy', () => {
  it('refuses a reading that reuses a local site id', async () => {
    const a = await device(server.url, nextDb());
    const site = await a.repo.createSite(siteInput('Fen ditch'));
    await a.engine.sync();
    server.inject({ ...serverReading(site.id, site.id, 1), updatedAt: '2026-12-01T00:00:00.000Z' });
    await a.engine.sync();
    expect((await a.repo.getSite(site.id))?.name).toBe('Fen ditch');
    expect(await a.repo.getReading(site.id)).toBeUndefined();
    expect(a.engine.getStatus().setAside[0]).toMatchObject({ code: 'sync-type-change' });
    expect(a.engine.getStatus().setAside[0]!.message).toContain(site.id);
  });

  it('a remote rewrite that is not newer than the local copy becomes a conflict; a newer edit applies', async () => {
    const a = await device(server.url, nextDb());
    const site = await a.repo.createSite(siteInput('Karst rising'));
    const r = await a.repo.createReading(readingInput(site.id, 1));
    const r2 = await a.repo.createReading(readingInput(site.id, 2));
    await a.engine.sync();
    const onServer = server.docOf(r.id)!;
    server.inject({ ...onServer, notes: 'rewritten by another tool', updatedAt: '2020-01-01T00:00:00.000Z' });
    const later = new Date(Date.parse(r2.updatedAt) + 60_000).toISOString();
    server.inject({ ...server.docOf(r2.id)!, notes: 'edited on another phone', updatedAt: later });
    const run = await a.engine.sync();
    expect(run.conflicts).toBe(1);
    expect((await a.repo.getReading(r.id))?.notes).toBe(r.notes);
    const [c] = await a.store.conflicts();
    expect(c?.docId).toBe(r.id);
    expect(c?.others[0]?.doc.type === 'reading' && c.others[0].doc.notes).toBe('rewritten by another tool');
    expect((await a.repo.getReading(r2.id))?.notes).toBe('edited on another phone');
  });
});
