/** The CSV import and first-sync benchmarks in headless Chromium with real IndexedDB (see `in-chromium.ts`). */

import type { ImportTimes } from './data-import-core';
import { inChromium } from './in-chromium';

/** The import's own path (parse, ids, solve, store) and the digest comparison, in one Chromium page. */
export function importLimitChromium(
  rows = 100_000,
): Promise<{ times: ImportTimes; digest: { n: number; sync: number; webCrypto: number } }> {
  return inChromium('tests/bench/data-browser-entry.ts', async (page) => {
    await page.waitForFunction(() => typeof window.tufaImportTimes === 'function');
    const times = await page.evaluate((n) => window.tufaImportTimes(n), rows);
    const digest = await page.evaluate((n) => window.tufaDigestTimes(n), rows);
    return { times, digest };
  });
}

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
