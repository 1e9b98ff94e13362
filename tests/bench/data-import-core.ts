/**
 * The CSV import benchmark itself, shared by the Node run (fake-indexeddb) and the Chromium run
 * (real IndexedDB): parse, map with content ids, compute every row with solve(), store in one
 * transaction, on an invented logger season at five of our own sites.
 */

import { solve } from '../../src/chem/solve';
import { defaultMapping } from '../../src/io/column-mapping';
import { parseCsv } from '../../src/io/csv-parse';
import { commitImport, computeWarnings } from '../../src/io/import-commit';
import { planImport } from '../../src/io/import-plan';
import { sha256 } from '../../src/io/sha256';
import { openRepository } from '../../src/store/repository';
import { RepositoryStore } from '../../src/sync/repository-store';

const sec = (ms: number) => `${(ms / 1000).toFixed(2)} s`;

/** BOM, `;`, decimal commas and local times, as a spreadsheet in a comma-decimal locale writes them. */
export function loggerCsv(rows: number): string {
  const sites = ['Quellhof spring', 'Mill pond', 'Bay buoy', 'Reef tank 300 L', 'Well W7'];
  const out = ['\uFEFFSite;Date/Time;Temp (°C);Salinity;pH;Alkalinity (µmol/kg)'];
  const t0 = Date.UTC(2026, 0, 1);
  const two = (n: number) => String(n).padStart(2, '0');
  for (let i = 0; i < rows; i++) {
    const d = new Date(t0 + i * 300_000);
    const stamp = `${two(d.getUTCDate())}.${two(d.getUTCMonth() + 1)}.${d.getUTCFullYear()} ${two(d.getUTCHours())}:${two(d.getUTCMinutes())}`;
    const temp = (10 + 8 * Math.sin(i / 4000) + (i % 7) * 0.1).toFixed(2).replace('.', ',');
    const ph = (8.0 + 0.1 * Math.sin(i / 97)).toFixed(3).replace('.', ',');
    out.push(`${sites[i % sites.length]};${stamp};${temp};35;${ph};${2250 + (i % 50)}`);
  }
  return `${out.join('\r\n')}\r\n`;
}

/** Milliseconds of each part of the import's own path (no page, no worker hop), one run. */
export interface ImportTimes {
  rows: number;
  parse: number;
  mapIds: number;
  compute: number;
  store: number;
}

/**
 * The limit the app's import is measured against: parse + solve + store of the same file in the
 * same process, one bulkPut transaction (content ids reported apart as map + ids).
 */
export async function importTimes(rows: number): Promise<ImportTimes> {
  const text = loggerCsv(rows);
  const repo = await openRepository({ name: `tufa-bench-limit-${Date.now()}` });
  try {
    const t0 = performance.now();
    const csv = parseCsv(text);
    const t1 = performance.now();
    const mapping = defaultMapping(csv.table.header, 'Europe/Vienna');
    mapping.columns[4] = { role: 'value', quantity: 'ph', unit: 'total' };
    const plan = await planImport(csv, mapping, []);
    const t2 = performance.now();
    computeWarnings(plan, plan.newSites, solve);
    const t3 = performance.now();
    await repo.bulkPut([...plan.newSites, ...plan.readings]);
    const t4 = performance.now();
    return { rows, parse: t1 - t0, mapIds: t2 - t1, compute: t3 - t2, store: t4 - t3 };
  } finally {
    repo.close();
  }
}

/**
 * Content-id digests of `n` canonical strings the size of a reading's: the synchronous
 * `src/io/sha256.ts` against Web Crypto's `digest`, batched (all calls of a batch in flight).
 */
export async function digestTimes(
  n: number,
  batch = 1000,
): Promise<{ n: number; sync: number; webCrypto: number }> {
  const texts = Array.from(
    { length: n },
    (_, i) =>
      `r|${crypto.randomUUID()}|2026-01-${String(1 + (i % 28)).padStart(2, '0')}T00:00:00.000Z|temperature_c=${i % 30}|ph=8.0${i % 10}|alkalinity_umol_kg=${2250 + (i % 50)}|salinity=35`,
  );
  const enc = new TextEncoder();
  const t0 = performance.now();
  let x = 0;
  for (const t of texts) x ^= sha256(t)[0]!;
  const t1 = performance.now();
  for (let i = 0; i < n; i += batch) {
    const ds = await Promise.all(
      texts.slice(i, i + batch).map((t) => crypto.subtle.digest('SHA-256', enc.encode(t))),
    );
    for (const d of ds) x ^= new Uint8Array(d)[0]!;
  }
  const t2 = performance.now();
  if (x === -1) console.log(x); // keeps both loops' results live
  return { n, sync: t1 - t0, webCrypto: t2 - t1 };
}

export async function benchImportIn(rows: number, where: string): Promise<string[]> {
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
  // Store alone, for comparison: the repository's bulkPut of the same docs into another database.
  const repo2 = await openRepository({ name: `tufa-bench-bulk-${Date.now()}` });
  const t5 = performance.now();
  await repo2.bulkPut([...plan.newSites, ...plan.readings]);
  const t6 = performance.now();
  repo2.close();
  repo.close();
  return [
    `${where}: rows ${rows}, file ${(text.length / 1e6).toFixed(1)} MB, stored ${stored}, errors ${report.errors.length}, solve warnings ${warnings.length}`,
    `parse ${sec(t1 - t0)} | map + ids ${sec(t2 - t1)} | compute ${sec(t3 - t2)} | store ${sec(t4 - t3)} | total ${sec(t4 - t0)} (target < 10 s)`,
    `(repository bulkPut alone of the same ${plan.readings.length} readings: ${sec(t6 - t5)})`,
  ];
}
