/**
 * The first-sync benchmark alone (`npx tsx tests/bench/sync.ts`): in Chromium with real IndexedDB,
 * then in Node with fake-indexeddb. `npm run bench` runs the same through `data.ts`.
 */

import { cpus, loadavg } from 'node:os';
import { benchFirstSync, benchFirstSyncChromium } from './data';

const n = Number(process.env.TUFA_BENCH_SYNC_READINGS ?? 10_000);
console.log(`\n## First sync (${n} readings) against the raw _bulk_docs post`);
console.log(
  `machine: ${cpus().length} cores, load average ${loadavg()
    .map((x) => x.toFixed(1))
    .join(' ')}`,
);
for (const line of await benchFirstSyncChromium(n)) console.log(line);
if (process.env.TUFA_BENCH_SYNC_NODE !== '0') for (const line of await benchFirstSync(n)) console.log(line);
