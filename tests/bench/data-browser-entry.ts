/** Runs the CSV import benchmark inside a page (real IndexedDB); loaded by `data-browser.ts`. */

import { openRepository } from '../../src/store/repository';
import { benchImportIn } from './data-import-core';
import { benchFirstSyncIn } from './data-sync-core';

declare global {
  interface Window {
    tufaBenchImport: (rows: number) => Promise<string[]>;
    tufaBenchSync: (serverUrl: string, db: string, readings: number) => Promise<string[]>;
  }
}

window.tufaBenchImport = (rows) => benchImportIn(rows, 'Chromium, real IndexedDB');

window.tufaBenchSync = async (serverUrl, db, readings) => {
  const repo = await openRepository({ name: `tufa-bench-sync-${Date.now()}` });
  try {
    return await benchFirstSyncIn(repo, serverUrl, db, readings, 'Chromium, real IndexedDB, over CORS');
  } finally {
    repo.close();
  }
};
