/**
 * Partial sync on a large team database: a server holding N readings across 500 sites (built with
 * `_bulk_docs`), and a phone that keeps 3 sites. Prints how many docs the phone pulls (it must be
 * exactly the 500 site docs and the 3 sites' readings) and how long its first sync takes, beside
 * the limit of the same path: one raw filtered `_changes` request over the whole database.
 *
 * `npx tsx tests/bench/partial-sync.ts [readings]` (default 1 000 000; loading stops early after
 * BENCH_LOAD_SECONDS, default 600, and the figures say how many were loaded). Invented data.
 */

import 'fake-indexeddb/auto';
import { openRepository } from '../../src/store/repository';
import { CouchClient } from '../../src/sync/couch-client';
import { pullSelector } from '../../src/sync/partial-sync';
import { RepositoryStore } from '../../src/sync/repository-store';
import { SyncEngine } from '../../src/sync/sync-engine';
import { CouchServer } from '../sync/couch-server';

const SITES = 500;
const KEEP = 3;
const target = Number(process.argv[2] ?? 1_000_000);
const loadBudgetMs = Number(process.env.BENCH_LOAD_SECONDS ?? 600) * 1000;
const DB = 'team';
const s = (ms: number) => `${(ms / 1000).toFixed(1)} s`;

const server = new CouchServer();
await server.start();
try {
  await server.createDb(DB);
  const siteIds = Array.from({ length: SITES }, (_, i) => `site-${String(i).padStart(3, '0')}`);
  const updatedAt = '2026-06-01T00:00:00.000Z';
  const post = async (docs: unknown[]) => {
    const r = await fetch(`${server.url}${DB}/_bulk_docs`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ docs }),
    });
    if (!r.ok) throw new Error(`_bulk_docs ${r.status}`);
  };
  await post(
    siteIds.map((id, i) => ({
      _id: id,
      type: 'site',
      name: `Invented site ${i + 1}`,
      kind: 'stream',
      defaults: {},
      notes: '',
      updatedAt,
      deleted: false,
      created_by: 'lead',
      changed_by: 'lead',
    })),
  );
  // Readings spread round-robin over the sites, 10 minutes apart, as loggers would send them.
  const BATCH = 5000;
  let loaded = 0;
  const t0 = performance.now();
  const batch = (from: number) =>
    Array.from({ length: Math.min(BATCH, target - from) }, (_, k) => {
      const i = from + k;
      return {
        _id: `r-${String(i).padStart(8, '0')}`,
        type: 'reading',
        siteId: siteIds[i % SITES],
        takenAt: new Date(Date.UTC(2021, 0, 1) + Math.floor(i / SITES) * 600_000).toISOString(),
        timeZone: 'UTC',
        values: [
          { quantity: 'temperature', value: 8 + (i % 13) / 2, unit: 'c' },
          { quantity: 'ph', value: 7.4 + (i % 9) / 20, unit: 'nbs' },
          { quantity: 'conductance', value: 300 + (i % 50), unit: 'us_cm' },
        ],
        notes: '',
        updatedAt,
        deleted: false,
        created_by: 'logger',
        changed_by: 'logger',
      };
    });
  while (loaded < target && performance.now() - t0 < loadBudgetMs) {
    const a = batch(loaded);
    const b = loaded + a.length < target ? batch(loaded + a.length) : [];
    await Promise.all([post(a), b.length ? post(b) : Promise.resolve()]);
    loaded += a.length + b.length;
  }
  const loadMs = performance.now() - t0;
  const keep = [siteIds[7]!, siteIds[123]!, siteIds[402]!];
  const expectedReadings = Array.from({ length: loaded }, (_, i) => i % SITES).filter((x) =>
    [7, 123, 402].includes(x),
  ).length;
  console.log(`\n## Partial sync: ${loaded} readings across ${SITES} sites; a phone keeping ${KEEP} sites`);
  console.log(
    `server built with _bulk_docs in ${s(loadMs)} (${Math.round(loaded / (loadMs / 1000))} docs/s)`,
  );

  // The limit of this path: one raw filtered _changes request, every change scanned once.
  const sel = pullSelector(keep);
  // Same query as the sync client sends (docs with their conflicts), in one request.
  const q = new URLSearchParams({
    since: '0',
    include_docs: 'true',
    conflicts: 'true',
    style: 'all_docs',
    filter: '_selector',
    selector: JSON.stringify(sel),
  });
  const r0 = performance.now();
  const raw = (await (
    await fetch(`${server.url}${DB}/_changes?${q}`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ selector: sel }),
    })
  ).json()) as { results: unknown[] };
  const rawMs = performance.now() - r0;

  const repo = await openRepository({ name: `bench-partial-${process.pid}` });
  const engine = new SyncEngine(
    new RepositoryStore(repo),
    new CouchClient({ url: server.url, db: DB, auth: { kind: 'none' }, timeoutMs: 600000 }),
    { deviceId: 'phone', pullSelector: sel },
  );
  const p0 = performance.now();
  const run = await engine.sync();
  const syncMs = performance.now() - p0;
  const local = await repo.listAllReadings();
  const wrong = local.filter((x) => !keep.includes(x.siteId)).length;
  console.log(
    `phone pulled ${run.pulled} docs: ${local.length} readings (expected ${expectedReadings}, from other sites ${wrong}) + ${(await repo.listSites()).length} site docs`,
  );
  console.log(
    `first sync ${s(syncMs)}; one raw filtered _changes over the whole database ${s(rawMs)} (${raw.results.length} rows); ratio ${(syncMs / rawMs).toFixed(2)}`,
  );
  console.log(
    `scan rate ${Math.round(loaded / (rawMs / 1000))} changes/s; linear estimate for 1 000 000 readings: raw ${s((rawMs * 1e6) / loaded)}, first sync ${s((syncMs * 1e6) / loaded)}`,
  );
} finally {
  await server.stop();
}
