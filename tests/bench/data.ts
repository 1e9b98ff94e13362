/**
 * Data benchmarks (figures, not a test): import of a 100 000-row CSV (parse, map, compute with
 * solve(), store in one transaction) in headless Chromium with real IndexedDB, and a first sync of
 * 10 000 readings to a local CouchDB-API server (pouchdb-server on loopback), from a Chromium page
 * with real IndexedDB (pouchdb-server allows CORS by default) and, for comparison, from Node with
 * fake-indexeddb.
 */

import 'fake-indexeddb/auto';
import { cpus, loadavg } from 'node:os';
import { openRepository } from '../../src/store/repository';
import { CouchServer } from '../sync/couch-server';
import { benchImportInApp } from './data-app';
import { benchImportChromium, benchSyncChromium } from './data-browser';
import { benchImportIn } from './data-import-core';
import { benchFirstSyncIn } from './data-sync-core';

export function benchImport(rows = 100_000): Promise<string[]> {
  return benchImportIn(rows, 'Node 20, fake-indexeddb');
}

/** In Node with fake-indexeddb (kept for comparison with the browser figure). */
export async function benchFirstSync(readings = 10_000): Promise<string[]> {
  const server = new CouchServer();
  await server.start();
  try {
    await server.createDb('tufa-bench');
    const repo = await openRepository({ name: `tufa-bench-sync-${Date.now()}` });
    try {
      return await benchFirstSyncIn(
        repo,
        server.url,
        'tufa-bench',
        readings,
        'Node + fake-indexeddb, pouchdb-server in a temp folder',
      );
    } finally {
      repo.close();
    }
  } finally {
    await server.stop();
  }
}

/** In headless Chromium with real IndexedDB, the page talking to pouchdb-server over CORS. */
export async function benchFirstSyncChromium(readings = 10_000): Promise<string[]> {
  const server = new CouchServer();
  await server.start();
  try {
    await server.createDb('tufa-bench-page');
    return await benchSyncChromium(server.url, 'tufa-bench-page', readings);
  } finally {
    await server.stop();
  }
}

/** What `npm run bench` calls. The Node import run is skipped unless TUFA_BENCH_NODE_IMPORT=1 (fake-indexeddb takes minutes). */
export async function benchData(): Promise<string[]> {
  const load = loadavg().map((x) => x.toFixed(1));
  const lines = [`machine: ${cpus().length} cores, load average ${load.join(' ')} (figures scale with it)`];
  lines.push(...(await benchImportChromium()));
  lines.push(...(await benchImportInApp()));
  if (process.env.TUFA_BENCH_NODE_IMPORT === '1') lines.push(...(await benchImport()));
  lines.push(...(await benchFirstSyncChromium()));
  lines.push(...(await benchFirstSync()));
  return lines;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  for (const l of await benchData()) console.log(l);
}
