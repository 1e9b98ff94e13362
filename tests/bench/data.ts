/**
 * Data benchmarks (figures, not a test): import of a 100 000-row CSV (parse, map, compute with
 * solve(), store in one transaction) and a first sync of 10 000 readings to a local CouchDB-API
 * server (pouchdb-server on loopback). Runs in Node with fake-indexeddb, not in Chromium.
 */

import 'fake-indexeddb/auto';
import { solve } from '../../src/chem/solve';
import { defaultMapping } from '../../src/io/column-mapping';
import { parseCsv } from '../../src/io/csv-parse';
import { commitImport, computeWarnings } from '../../src/io/import-commit';
import { planImport } from '../../src/io/import-plan';
import { openRepository } from '../../src/store/repository';
import type { ReadingDoc } from '../../src/store/schema';
import { CouchClient } from '../../src/sync/couch-client';
import { RepositoryStore } from '../../src/sync/repository-store';
import { SyncEngine } from '../../src/sync/sync-engine';
import { CouchServer } from '../sync/couch-server';

const sec = (ms: number) => `${(ms / 1000).toFixed(2)} s`;

/** An invented logger season at five of our own sites: BOM, `;`, decimal commas, local times. */
function loggerCsv(rows: number): string {
  const sites = ['Quellhof spring', 'Mill pond', 'Bay buoy', 'Reef tank 300 L', 'Well W7'];
  const out = ['\uFEFFSite;Date/Time;Temp (°C);Salinity;pH;Alkalinity (µmol/kg)'];
  const t0 = Date.UTC(2026, 0, 1);
  for (let i = 0; i < rows; i++) {
    const d = new Date(t0 + i * 300_000);
    const stamp = `${String(d.getUTCDate()).padStart(2, '0')}.${String(d.getUTCMonth() + 1).padStart(2, '0')}.${d.getUTCFullYear()} ${String(d.getUTCHours()).padStart(2, '0')}:${String(d.getUTCMinutes()).padStart(2, '0')}`;
    const temp = (10 + 8 * Math.sin(i / 4000) + (i % 7) * 0.1).toFixed(2).replace('.', ',');
    const ph = (8.0 + 0.1 * Math.sin(i / 97)).toFixed(3).replace('.', ',');
    const ta = (2250 + (i % 50)).toString();
    out.push(`${sites[i % sites.length]};${stamp};${temp};35;${ph};${ta}`);
  }
  return `${out.join('\r\n')}\r\n`;
}

export async function benchImport(rows = 100_000): Promise<string[]> {
  const text = loggerCsv(rows);
  const repo = await openRepository({ name: `tufa-bench-import-${Date.now()}` });
  const store = new RepositoryStore(repo);
  const t0 = performance.now();
  const csv = parseCsv(text);
  const t1 = performance.now();
  const mapping = defaultMapping(csv.table.header, 'Europe/Vienna');
  mapping.columns[4] = { role: 'value', quantity: 'ph', unit: 'total' };
  const plan = await planImport(csv, mapping, []);
  const t2 = performance.now();
  const warnings = computeWarnings(plan, plan.newSites, solve);
  const t3 = performance.now();
  const report = await commitImport(plan, store);
  const t4 = performance.now();
  const stored = (await repo.listAllReadings()).length;
  repo.close();
  return [
    `rows ${rows}, file ${(text.length / 1e6).toFixed(1)} MB, stored ${stored}, errors ${report.errors.length}, solve warnings ${warnings.length}`,
    `parse ${sec(t1 - t0)} | map + ids ${sec(t2 - t1)} | compute ${sec(t3 - t2)} | store ${sec(t4 - t3)}`,
    `total ${sec(t4 - t0)} (target < 10 s; Node 20 + fake-indexeddb, not Chromium)`,
  ];
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

export async function benchData(): Promise<string[]> {
  return [...(await benchImport()), ...(await benchFirstSync())];
}

if (import.meta.url === `file://${process.argv[1]}`) {
  for (const l of await benchData()) console.log(l);
}
