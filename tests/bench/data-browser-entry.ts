/** Runs the CSV import benchmark inside a page (real IndexedDB); loaded by `data-browser.ts`. */

import { benchImportIn } from './data-import-core';

declare global {
  interface Window {
    tufaBenchImport: (rows: number) => Promise<string[]>;
  }
}

window.tufaBenchImport = (rows) => benchImportIn(rows, 'Chromium, real IndexedDB');
