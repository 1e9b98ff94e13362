/** A signed-in device for team tests: its own fake-indexeddb repository, basic auth, stamped author. */

import 'fake-indexeddb/auto';
import { openRepository } from '../../src/store/repository';
import { CouchClient, type Fetch } from '../../src/sync/couch-client';
import { pullSelector } from '../../src/sync/partial-sync';
import { RepositoryStore } from '../../src/sync/repository-store';
import { SyncEngine } from '../../src/sync/sync-engine';

let n = 0;

export async function teamDevice(
  url: string,
  db: string,
  user: string,
  password: string,
  opts: { keepSites?: string[]; fetch?: Fetch } = {},
) {
  const { keepSites } = opts;
  const name = `tufa-team-${process.pid}-${n++}`;
  const repo = await openRepository({ name });
  const store = new RepositoryStore(repo);
  const client = new CouchClient(
    { url, db, auth: { kind: 'basic', user, password }, timeoutMs: 10000 },
    opts.fetch,
  );
  const engine = new SyncEngine(store, client, {
    deviceId: name,
    pushBatch: 100,
    baseDelayMs: 50,
    maxDelayMs: 400,
    maxAttempts: 40,
    author: user,
    pullSelector: keepSites ? pullSelector(keepSites) : null,
  });
  return { repo, store, client, engine };
}

export const basic = (user: string, password: string) => ({
  authorization: `Basic ${Buffer.from(`${user}:${password}`).toString('base64')}`,
  'content-type': 'application/json',
});
