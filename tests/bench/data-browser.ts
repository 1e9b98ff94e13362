/** The CSV import and first-sync benchmarks in headless Chromium with real IndexedDB (see `in-chromium.ts`). */

import { inChromium } from './in-chromium';

export function benchImportChromium(rows = 100_000): Promise<string[]> {
  return inChromium('tests/bench/data-browser-entry.ts', async (page) => {
    await page.waitForFunction(() => typeof window.tufaBenchImport === 'function');
    return page.evaluate((n) => window.tufaBenchImport(n), rows);
  });
}

export function benchSyncChromium(serverUrl: string, db: string, readings = 10_000): Promise<string[]> {
  return inChromium('tests/bench/data-browser-entry.ts', async (page) => {
    await page.waitForFunction(() => typeof window.tufaBenchSync === 'function');
    return page.evaluate(([u, d, n]) => window.tufaBenchSync(u, d, n), [serverUrl, db, readings] as const);
  });
}
