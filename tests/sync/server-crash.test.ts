import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ReadingDoc } from '../../src/store/schema';
import type { Fetch } from '../../src/sync/couch-client';
import { CouchServer } from './couch-server';
import { device, readingInput, siteInput } from './devices';

const server = new CouchServer();

beforeAll(() => server.start(), 30000);
afterAll(() => server.stop());

function readings(siteId: string, n: number): ReadingDoc[] {
  const updatedAt = '2026-05-02T10:00:00.000Z';
  return Array.from({ length: n }, (_, i) => ({
    ...readingInput(siteId, i),
    id: `00000000-0000-4000-8000-${String(i).padStart(12, '0')}`,
    type: 'reading' as const,
    updatedAt,
    deleted: false,
  }));
}

async function expectExactlyOnce(db: string, ids: string[]) {
  const rows = await server.allDocs(db);
  const counts = new Map<string, number>();
  for (const r of rows) counts.set(r.id, (counts.get(r.id) ?? 0) + 1);
  for (const id of ids) expect(counts.get(id), id).toBe(1);
  expect(rows.length).toBe(ids.length);
  // Every doc is at its first revision: no retried write was stored a second time.
  expect(rows.filter((r) => !r.value.rev.startsWith('1-'))).toEqual([]);
}

describe('push survives a server crash and lost answers', () => {
  it('server killed in the middle of a push, restarted: every reading on the server exactly once', async () => {
    const DB = 'tufa-crash';
    await server.createDb(DB);
    let bulkCalls = 0;
    let restarted: Promise<void> | undefined;
    const crashing: Fetch = (url, init) => {
      const p = fetch(url, init);
      if (url.endsWith('/_bulk_docs') && ++bulkCalls === 3) {
        // Kill while this request is on the wire; bring the server back 1.5 s later.
        restarted = (async () => {
          await new Promise((r) => setTimeout(r, 5));
          await server.kill();
          await new Promise((r) => setTimeout(r, 1500));
          await server.start();
        })();
      }
      return p;
    };
    const a = await device(server.url, DB, { fetch: crashing, pushBatch: 100 });
    const site = await a.repo.createSite(siteInput('Trout raceway 4'));
    const docs = readings(site.id, 1000);
    await a.repo.bulkPut(docs);
    const states: string[] = [];
    a.engine.subscribe((s) => states.push(s.state));

    const run = await a.engine.sync();
    await restarted;
    expect(run.attempts).toBeGreaterThan(1);
    expect(states).toContain('waiting-to-retry');
    expect(await a.repo.outboxSize()).toBe(0);
    await expectExactlyOnce(DB, [site.id, ...docs.map((d) => d.id)]);
    expect(a.engine.getStatus()).toMatchObject({ state: 'idle', pending: 0, error: undefined });
  }, 60000);

  it('a push whose answer is lost is retried without duplicates or new revisions', async () => {
    const DB = 'tufa-lost-answer';
    await server.createDb(DB);
    let dropped = 0;
    const losing: Fetch = async (url, init) => {
      const res = await fetch(url, init);
      if (url.endsWith('/_bulk_docs') && dropped < 2) {
        dropped++;
        throw new TypeError('network connection lost'); // the server wrote the docs; we never hear
      }
      return res;
    };
    const a = await device(server.url, DB, { fetch: losing, pushBatch: 50 });
    const site = await a.repo.createSite(siteInput('Reef tank 300 L'));
    const docs = readings(site.id, 120);
    await a.repo.bulkPut(docs);
    await a.engine.sync();
    expect(dropped).toBe(2);
    expect(await a.repo.outboxSize()).toBe(0);
    await expectExactlyOnce(DB, [site.id, ...docs.map((d) => d.id)]);
    // Every local doc knows its server revision, so the next edit updates instead of conflicting.
    const local = await a.repo.listReadings(site.id);
    expect(local.every((r) => r.rev?.startsWith('1-'))).toBe(true);
    expect(await a.store.conflicts()).toEqual([]);
  }, 60000);

  it('gives up with an error in words when the server stays down, keeping the outbox', async () => {
    const dead = await device('http://127.0.0.1:9/', 'tufa-down', { maxAttempts: 3 }); // discard port: nothing listens
    await dead.repo.createSite(siteInput('Spring S1'));
    const engine = dead.engine;
    const err = await engine.sync().catch((e: unknown) => e);
    expect(err).toMatchObject({ code: 'sync-offline' });
    const st = engine.getStatus();
    expect(st.state).toBe('error');
    expect(st.error?.message).toMatch(/cannot be reached/);
    expect(st.pending).toBe(1);
  }, 60000);
});
