/** Simulated devices for sync tests: each has its own fake-indexeddb repository and engine. */

import 'fake-indexeddb/auto';
import { openRepository } from '../../src/store/repository';
import type { ReadingDoc, SiteDoc } from '../../src/store/schema';
import { CouchClient, type Fetch } from '../../src/sync/couch-client';
import { RepositoryStore } from '../../src/sync/repository-store';
import { SyncEngine } from '../../src/sync/sync-engine';

let n = 0;

export async function device(
  serverUrl: string,
  db: string,
  opts: {
    fetch?: Fetch;
    pushBatch?: number;
    maxAttempts?: number;
    timeoutMs?: number;
    pullLimit?: number;
    maxPullPages?: number;
  } = {},
) {
  const name = `tufa-sync-${process.pid}-${n++}`;
  const repo = await openRepository({ name });
  const store = new RepositoryStore(repo);
  const client = new CouchClient(
    { url: serverUrl, db, auth: { kind: 'none' }, timeoutMs: opts.timeoutMs ?? 5000 },
    opts.fetch,
  );
  const engine = new SyncEngine(store, client, {
    deviceId: name,
    pushBatch: opts.pushBatch ?? 100,
    baseDelayMs: 50,
    maxDelayMs: 400,
    maxAttempts: opts.maxAttempts ?? 40,
    ...(opts.pullLimit ? { pullLimit: opts.pullLimit } : {}),
    ...(opts.maxPullPages ? { maxPullPages: opts.maxPullPages } : {}),
  });
  return { repo, store, client, engine, name };
}

export function siteInput(name: string): Omit<SiteDoc, 'id' | 'type' | 'updatedAt' | 'deleted' | 'rev'> {
  return { name, kind: 'spring', defaults: { model: 'fresh' }, notes: '' };
}

export function readingInput(
  siteId: string,
  i: number,
): Omit<ReadingDoc, 'id' | 'type' | 'updatedAt' | 'deleted' | 'rev'> {
  return {
    siteId,
    takenAt: new Date(Date.UTC(2026, 4, 1, 8) + i * 3600_000).toISOString(),
    timeZone: 'Europe/Vienna',
    values: [
      { quantity: 'temperature', value: 9 + (i % 7) * 0.5, unit: 'c' },
      { quantity: 'ph', value: 7.2 + (i % 5) * 0.05, unit: 'nbs' },
      { quantity: 'alkalinity', value: 4.1 + (i % 3) * 0.1, unit: 'meq_l' },
    ],
    notes: `reading ${i}`,
  };
}
