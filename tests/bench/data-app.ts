/**
 * The CSV import as a user does it in the built app (Settings → Data in and out), headless
 * Chromium: choose a 100 000-row file, wait for the preview, import. Prints the time of each step
 * and how long the page's main thread was blocked (long tasks > 50 ms, from the browser's own
 * PerformanceObserver), since the point of solving in the engine worker is a page that stays usable.
 * Figures only; `data.ts` prints them.
 */

import { fileURLToPath } from 'node:url';
import { build } from 'vite';
import { launch, newContext } from '../browser/browser';
import { serveDir } from '../browser/static-server';
import { loggerCsv } from './data-import-core';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const sec = (ms: number) => `${(ms / 1000).toFixed(2)} s`;

async function buildApp(): Promise<void> {
  // As the browser tests do: Vitest or tsx may set NODE_ENV, and the users' build is production.
  const saved = process.env.NODE_ENV;
  process.env.NODE_ENV = 'production';
  try {
    await build({
      root: `${ROOT}src`,
      configFile: `${ROOT}vite.config.ts`,
      mode: 'production',
      logLevel: 'warn',
    });
  } finally {
    process.env.NODE_ENV = saved;
  }
}

declare global {
  interface Window {
    tufaLongTasks?: number[];
  }
}

export async function benchImportInApp(rows = 100_000): Promise<string[]> {
  await buildApp();
  const { server, url } = await serveDir(`${ROOT}dist`);
  const browser = await launch();
  try {
    const page = await (await newContext(browser)).newPage();
    await page.goto(`${url}#/settings`);
    await page.waitForSelector('html[data-ready="true"]');
    await page.getByRole('heading', { name: 'Data in and out' }).waitFor();
    await page.evaluate(() => {
      window.tufaLongTasks = [];
      new PerformanceObserver((l) => {
        for (const e of l.getEntries()) window.tufaLongTasks!.push(e.duration);
      }).observe({ type: 'longtask' });
    });
    const take = () =>
      page.evaluate(() => {
        const t = window.tufaLongTasks!.splice(0);
        return { longest: Math.max(0, ...t), total: t.reduce((a, b) => a + b, 0), n: t.length };
      });
    const text = loggerCsv(rows);
    const t0 = performance.now();
    await page
      .getByLabel('File from a logger or spreadsheet')
      .setInputFiles({ name: 'logger.csv', mimeType: 'text/csv', buffer: Buffer.from(text) });
    await page.getByText(`${rows} readings ready`).waitFor({ timeout: 120_000 });
    await page.locator('table.kv caption').waitFor({ timeout: 60_000 }); // preview rows computed
    const t1 = performance.now();
    const plan = await take();
    await page.getByRole('button', { name: `Import ${rows} readings` }).click();
    await page.getByText(new RegExp(`Imported ${rows} readings`)).waitFor({ timeout: 180_000 });
    const t2 = performance.now();
    const imp = await take();
    const ms = (x: number) => `${Math.round(x)} ms`;
    return [
      `app import of ${rows} rows (${(text.length / 1e6).toFixed(1)} MB), Chromium, built app, Settings panel:`,
      `  choose file to preview shown ${sec(t1 - t0)}; main thread blocked ${ms(plan.total)} in ${plan.n} long tasks, longest ${ms(plan.longest)}`,
      `  import (solve every row in the worker, store) ${sec(t2 - t1)}; main thread blocked ${ms(imp.total)} in ${imp.n} long tasks, longest ${ms(imp.longest)}`,
      `  file to stored ${sec(t2 - t0)} (target < 10 s)`,
    ];
  } finally {
    await browser.close();
    server.close();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  for (const l of await benchImportInApp(Number(process.argv[2] ?? 100_000))) console.log(l);
}
