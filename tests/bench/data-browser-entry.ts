/** Runs the CSV import benchmark inside a page (real IndexedDB); loaded by `data-browser.ts`. */

import { openRepository } from '../../src/store/repository';
import { benchImportIn, digestTimes, type ImportTimes, importTimes } from './data-import-core';
import { benchFirstSyncIn } from './data-sync-core';

declare global {
  interface Window {
    tufaBenchImport: (rows: number) => Promise<string[]>;
    tufaImportTimes: (rows: number) => Promise<ImportTimes>;
    tufaDigestTimes: (n: number) => Promise<{ n: number; sync: number; webCrypto: number }>;
    tufaBenchSync: (serverUrl: string, db: string, readings: number) => Promise<string[]>;
  }
}

window.tufaBenchImport = (rows) => benchImportIn(rows, 'Chromium, real IndexedDB');
window.tufaImportTimes = importTimes;
window.tufaDigestTimes = digestTimes;

window.tufaBenchSync = async (serverUrl, db, readings) => {
  const repo = await openRepository({ name: `tufa-bench-sync-${Date.now()}` });
  try {
    return await benchFirstSyncIn(repo, serverUrl, db, readings, 'Chromium, real IndexedDB, over CORS');
  } finally {
    repo.close();
  }
};
