/**
 * First sync of N readings from an empty server, against its limit measured in the same run:
 * posting the same docs raw with `_bulk_docs` in batches of 500 into a second, empty database of
 * the same server. Then the next sync of the same device (it must not download what it just
 * pushed). The same code runs in Node (fake-indexeddb) and in a Chromium page (real IndexedDB,
 * the server reached over CORS, which pouchdb-server enables by default). Figures only.
 */

import type { Repository } from '../../src/store/repository';
import type { ReadingDoc } from '../../src/store/schema';
import { CouchClient } from '../../src/sync/couch-client';
import { toCouch } from '../../src/sync/doc-codec';
import { RepositoryStore } from '../../src/sync/repository-store';
import { SyncEngine } from '../../src/sync/sync-engine';

const sec = (ms: number) => `${(ms / 1000).toFixed(2)} s`;

/** Wraps every method of `o` to add up the time spent in it (calls overlap when work is pipelined). */
function timed<T extends object>(o: T, into: Map<string, number>, prefix: string): T {
  return new Proxy(o, {
    get(target, key, recv) {
      const v = Reflect.get(target, key, recv);
      if (typeof v !== 'function' || typeof key !== 'string') return v;
      return async (...args: unknown[]) => {
        const t = performance.now();
        try {
          return await v.apply(target, args);
        } finally {
          const k = `${prefix}.${key}`;
          into.set(k, (into.get(k) ?? 0) + performance.now() - t);
        }
      };
    },
  });
}
const RAW_BATCH = 500;

/** The limit: the same docs, as sync would send them, posted with nothing else around it. */
async function rawPost(serverUrl: string, db: string, docs: ReadingDoc[]): Promise<number> {
  const put = await fetch(`${serverUrl}${db}`, { method: 'PUT' });
  if (!put.ok && put.status !== 412) throw new Error(`cannot create ${db}: HTTP ${put.status}`);
  const t0 = performance.now();
  for (let i = 0; i < docs.length; i += RAW_BATCH) {
    const res = await fetch(`${serverUrl}${db}/_bulk_docs`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', accept: 'application/json' },
      body: JSON.stringify({ docs: docs.slice(i, i + RAW_BATCH).map((d) => toCouch(d)) }),
    });
    await res.json();
  }
  return performance.now() - t0;
}

export async function benchFirstSyncIn(
  repo: Repository,
  serverUrl: string,
  db: string,
  readings: number,
  where: string,
): Promise<string[]> {
  // Invented readings at an invented buoy, every 10 minutes from 1 Jan 2026.
  const site = await repo.createSite({ name: 'Bay buoy', kind: 'other', defaults: {}, notes: '' });
  const updatedAt = new Date().toISOString();
  const docs: ReadingDoc[] = Array.from({ length: readings }, (_, i) => ({
    id: crypto.randomUUID(),
    type: 'reading',
    siteId: site.id,
    takenAt: new Date(Date.UTC(2026, 0, 1) + i * 600_000).toISOString(),
    timeZone: 'UTC',
    values: [
      { quantity: 'temperature', value: 12 + (i % 10) / 10, unit: 'c' },
      { quantity: 'ph', value: 8 + (i % 20) / 100, unit: 'total' },
    ],
    notes: '',
    updatedAt,
    deleted: false,
  }));
  await repo.bulkPut(docs);
  const spent = new Map<string, number>();
  const store = timed(new RepositoryStore(repo), spent, 'store');
  const client = timed(new CouchClient({ url: serverUrl, db, auth: { kind: 'none' } }), spent, 'http');
  const engine = new SyncEngine(store, client, { deviceId: 'bench', pushBatch: 500 });
  // Raw post before and after the sync; the limit is the faster of the two (warm-up and load swings).
  const raw1 = await rawPost(serverUrl, `${db}-raw1`, docs);
  const t0 = performance.now();
  const run = await engine.sync();
  const t1 = performance.now();
  const raw2 = await rawPost(serverUrl, `${db}-raw2`, docs);
  const raw = Math.min(raw1, raw2);
  const firstSpent = [...spent].filter(([, ms]) => ms >= 50).map(([k, ms]) => `${k} ${sec(ms)}`);
  spent.clear();
  const t2 = performance.now();
  const again = await engine.sync();
  const t3 = performance.now();
  const info = (await (await fetch(`${serverUrl}${db}`)).json()) as { doc_count: number };
  return [
    `readings ${readings}, pushed ${run.pushed}, on server ${info.doc_count} (with the site), attempts ${run.attempts}, outbox left ${engine.getStatus().pending}`,
    `first sync ${sec(t1 - t0)} (${Math.round((run.pushed / (t1 - t0)) * 1000)} docs/s); raw _bulk_docs post of the same docs in batches of ${RAW_BATCH}: ${sec(raw1)} before, ${sec(raw2)} after; ratio ${((t1 - t0) / raw).toFixed(2)} × the faster raw post (goal ≤ 2, aim 1.3; ${where})`,
    `  time inside calls (overlapping): ${firstSpent.join(', ')}`,
    `next sync of the same device ${sec(t3 - t2)}, pulled ${again.pulled} docs (its own pushes are not downloaded again)`,
    `  time inside calls: ${[...spent]
      .filter(([, ms]) => ms >= 50)
      .map(([k, ms]) => `${k} ${sec(ms)}`)
      .join(', ')}`,
  ];
}
