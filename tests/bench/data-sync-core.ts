/**
 * First sync of N readings from an empty server: the same run in Node (fake-indexeddb) and in a
 * Chromium page (real IndexedDB, the server reached over CORS, which pouchdb-server enables by
 * default). Figures only; `data.ts` prints them.
 */

import type { Repository } from '../../src/store/repository';
import type { ReadingDoc } from '../../src/store/schema';
import { CouchClient } from '../../src/sync/couch-client';
import { RepositoryStore } from '../../src/sync/repository-store';
import { SyncEngine } from '../../src/sync/sync-engine';

const sec = (ms: number) => `${(ms / 1000).toFixed(2)} s`;

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
  const store = new RepositoryStore(repo);
  const client = new CouchClient({ url: serverUrl, db, auth: { kind: 'none' } });
  const engine = new SyncEngine(store, client, { deviceId: 'bench', pushBatch: 500 });
  const t0 = performance.now();
  const run = await engine.sync();
  const t1 = performance.now();
  const info = (await (await fetch(`${serverUrl}${db}`)).json()) as { doc_count: number };
  return [
    `readings ${readings}, pushed ${run.pushed}, on server ${info.doc_count} (with the site), attempts ${run.attempts}, outbox left ${engine.getStatus().pending}`,
    `first sync ${sec(t1 - t0)} (${Math.round((run.pushed / (t1 - t0)) * 1000)} docs/s; target < 20 s; ${where})`,
  ];
}
