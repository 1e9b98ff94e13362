/**
 * Data benchmarks (figures, not a test): import of a 100 000-row CSV (parse, map, compute with
 * solve(), store in one transaction) in headless Chromium with real IndexedDB, and a first sync of
 * 10 000 readings to a local CouchDB-API server (pouchdb-server on loopback), run from Node with
 * fake-indexeddb (a page would need CORS on the test server).
 */

import 'fake-indexeddb/auto';
import { cpus, loadavg } from 'node:os';
import { openRepository } from '../../src/store/repository';
import type { ReadingDoc } from '../../src/store/schema';
import { CouchClient } from '../../src/sync/couch-client';
import { RepositoryStore } from '../../src/sync/repository-store';
import { SyncEngine } from '../../src/sync/sync-engine';
import { CouchServer } from '../sync/couch-server';
import { benchImportChromium } from './data-browser';
import { benchImportIn } from './data-import-core';

const sec = (ms: number) => `${(ms / 1000).toFixed(2)} s`;

export function benchImport(rows = 100_000): Promise<string[]> {
  return benchImportIn(rows, 'Node 20, fake-indexeddb');
}

export async function benchFirstSync(readings = 10_000): Promise<string[]> {
  const server = new CouchServer();
  await server.start();
  try {
    await server.createDb('tufa-bench');
    const repo = await openRepository({ name: `tufa-bench-sync-${Date.now()}` });
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
    const client = new CouchClient({ url: server.url, db: 'tufa-bench', auth: { kind: 'none' } });
    const engine = new SyncEngine(store, client, { deviceId: 'bench', pushBatch: 500 });
    const t0 = performance.now();
    const run = await engine.sync();
    const t1 = performance.now();
    const onServer = (await server.allDocs('tufa-bench')).length;
    repo.close();
    return [
      `readings ${readings}, pushed ${run.pushed}, on server ${onServer}, attempts ${run.attempts}, outbox left ${engine.getStatus().pending}`,
      `first sync ${sec(t1 - t0)} (${Math.round((run.pushed / (t1 - t0)) * 1000)} docs/s; target < 20 s; Node + fake-indexeddb, pouchdb-server in a temp folder)`,
    ];
  } finally {
    await server.stop();
  }
}

/** What `npm run bench` calls. The Node import run is skipped unless TUFA_BENCH_NODE_IMPORT=1 (fake-indexeddb takes minutes). */
export async function benchData(): Promise<string[]> {
  const load = loadavg().map((x) => x.toFixed(1));
  const lines = [`machine: ${cpus().length} cores, load average ${load.join(' ')} (figures scale with it)`];
  lines.push(...(await benchImportChromium()));
  if (process.env.TUFA_BENCH_NODE_IMPORT === '1') lines.push(...(await benchImport()));
  lines.push(...(await benchFirstSync()));
  return lines;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  for (const l of await benchData()) console.log(l);
}
