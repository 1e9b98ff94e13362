/**
 * Browser benchmarks in headless Chromium (figures printed, never timed tests):
 * - bulk-saving 100 000 readings through the repository (one all-or-nothing transaction, queued
 *   for sync like an import), target < 5 s;
 * - reading them back for one site, target < 1 s;
 * - rendering a 100 000-point time series (merge, decimate, uPlot draw), target < 200 ms;
 * - cold start offline (browser restarted, network cut, app served by the service worker) to the
 *   first usable input of the reading form, target < 1 s;
 * - and the shell's first-load JS size (budget 100 KB gzip).
 * Run: `npm run bench:browser` (also part of `npm run bench`).
 */

import { mkdtempSync, rmSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium } from 'playwright-core';
import { build } from 'vite';
import { CHROMIUM, launch } from '../browser/browser';
import { injectAppModules } from '../browser/bundle';
import { serveDir } from '../browser/static-server';
import { SHELL_BUDGET_BYTES, shellSize } from './size-budget';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const ARGS = ['--no-sandbox', '--disable-gpu', '--disable-dev-shm-usage', '--disable-quic', '--no-first-run'];

export interface BrowserFigures {
  bulkSaveMs: number;
  readBackMs: number;
  readBackCount: number;
  /** Log documents to chart columns (once per log load). */
  columnsMs: number;
  /** Columns to a drawn chart: merge, decimate, uPlot build and first frame (median of 5). */
  chartMs: number;
  /** The same, first of the 5 renders. */
  chartFirstMs: number;
  chartDrawn: number;
  coldStartMs: number;
  shellGzipBytes: number;
}

async function buildApp(): Promise<void> {
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

async function storeAndChart(url: string): Promise<Omit<BrowserFigures, 'coldStartMs' | 'shellGzipBytes'>> {
  const browser = await launch();
  try {
    const page = await (await browser.newContext({ viewport: { width: 1000, height: 700 } })).newPage();
    // A blank page on the app's origin (its IndexedDB), without starting the app itself.
    await page.route(`${url}bench.html`, (r) =>
      r.fulfill({
        contentType: 'text/html',
        body: '<!doctype html><div id="chart" style="width:900px"></div>',
      }),
    );
    await page.goto(`${url}bench.html`);
    await injectAppModules(page);
    return await page.evaluate(async () => {
      type Bench = typeof import('./browser-entry');
      const B = (window as unknown as { TufaModules: Bench }).TufaModules;
      const repo = await B.openRepository({ name: `bench-${Date.now()}` });
      const site = await repo.createSite({ name: 'Bench logger', kind: 'stream', defaults: {}, notes: '' });
      const n = 100_000;
      const t0 = Date.parse('2025-01-01T00:00:00Z');
      const stamp = new Date().toISOString();
      const docs = Array.from({ length: n }, (_, i) => ({
        id: `r-${i}`,
        type: 'reading' as const,
        siteId: site.id,
        takenAt: new Date(t0 + i * 300e3).toISOString(),
        timeZone: 'UTC',
        values: [
          { quantity: 'temperature', value: 10 + 5 * Math.sin(i / 288), unit: 'c' },
          { quantity: 'ph', value: 7.6 + 0.3 * Math.sin(i / 97), unit: 'ph' },
        ],
        notes: '',
        updatedAt: stamp,
        deleted: false,
      }));
      let s = performance.now();
      await repo.bulkPut(docs);
      const bulkSaveMs = performance.now() - s;

      s = performance.now();
      const back = await repo.listReadings(site.id);
      const readBackMs = performance.now() - s;

      const el = document.getElementById('chart')!;
      s = performance.now();
      const t = Float64Array.from(back, (r) => Date.parse(r.takenAt) / 1000);
      const v = back.map((r) => r.values[0]?.value ?? null);
      const columnsMs = performance.now() - s;
      // Five renders from the same columns: the first (cold) and the median are reported.
      const times: number[] = [];
      let chartDrawn = 0;
      for (let k = 0; k < 5; k++) {
        s = performance.now();
        const chart = B.createTimeChart(el, B.mergeSeries([{ t, v }]), [
          { label: 'Temperature', unit: '°C' },
        ]);
        // uPlot draws on its own commit; wait for the frame that shows it.
        await new Promise((r) => requestAnimationFrame(() => r(undefined)));
        times.push(performance.now() - s);
        chartDrawn = chart.drawnPoints();
        chart.destroy();
      }
      const chartFirstMs = times[0]!;
      const chartMs = times.slice().sort((x, y) => x - y)[2]!;
      repo.close();
      return {
        bulkSaveMs,
        readBackMs,
        readBackCount: back.length,
        columnsMs,
        chartMs,
        chartFirstMs,
        chartDrawn,
      };
    });
  } finally {
    await browser.close();
  }
}

async function coldStart(url: string): Promise<number> {
  const dir = mkdtempSync(join(tmpdir(), 'tufa-cold-'));
  try {
    // First visit online: install the service worker and create a site.
    let ctx = await chromium.launchPersistentContext(dir, { executablePath: CHROMIUM, args: ARGS });
    let page = ctx.pages()[0] ?? (await ctx.newPage());
    await page.goto(url);
    await page.waitForSelector('html[data-ready="true"]');
    await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined));
    const siteId = await page.evaluate(async () => {
      const id = 'cold-site';
      const db = await new Promise<IDBDatabase>((res) => {
        const r = indexedDB.open('tufa');
        r.onsuccess = () => res(r.result);
      });
      await new Promise((res) => {
        const tx = db.transaction('sites', 'readwrite');
        tx.objectStore('sites').put({
          id,
          type: 'site',
          name: 'Cold spring',
          kind: 'spring',
          defaults: {},
          notes: '',
          updatedAt: new Date().toISOString(),
          deleted: false,
        });
        tx.oncomplete = res;
      });
      return id;
    });
    await ctx.close();

    // Restart the browser, cut the network (page and worker), open the reading form.
    ctx = await chromium.launchPersistentContext(dir, {
      executablePath: CHROMIUM,
      args: ARGS,
      offline: true,
    });
    await ctx.route('**/*', (r) => r.abort('internetdisconnected'));
    page = ctx.pages()[0] ?? (await ctx.newPage());
    await page.goto(`${url}#/site/${siteId}/new-reading`);
    await page.waitForSelector('#q-temperature');
    const ms = await page.evaluate(
      () => performance.getEntriesByName('tufa-entry-ready')[0]?.startTime ?? Number.NaN,
    );
    const controlled = await page.evaluate(() => !!navigator.serviceWorker.controller);
    await ctx.close();
    if (!controlled) throw new Error('cold start was not served by the service worker');
    return ms;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

export async function runBrowserBench(): Promise<BrowserFigures> {
  await buildApp();
  const { server, url } = await serveDir(`${ROOT}dist`);
  try {
    const sc = await storeAndChart(url);
    const coldStartMs = await coldStart(url);
    return { ...sc, coldStartMs, shellGzipBytes: shellSize().gzipTotal };
  } finally {
    server.close();
  }
}

function line(name: string, value: string, target: string, ok: boolean) {
  console.log(
    `${name.padEnd(54)} ${value.padStart(12)}   target ${target.padEnd(10)} ${ok ? 'ok' : 'MISSED'}`,
  );
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const f = await runBrowserBench();
  const load = loadavg()
    .map((x) => x.toFixed(1))
    .join(' ');
  console.log(
    `Browser (headless Chromium; ${cpus().length} cores, load average ${load} — figures vary with load):`,
  );
  line(
    'bulk-save 100 000 readings (+ outbox)',
    `${f.bulkSaveMs.toFixed(0)} ms`,
    '< 5000 ms',
    f.bulkSaveMs < 5000,
  );
  line(
    `read back one site (${f.readBackCount} readings)`,
    `${f.readBackMs.toFixed(0)} ms`,
    '< 1000 ms',
    f.readBackMs < 1000,
  );
  line('log to chart columns (100 000 readings)', `${f.columnsMs.toFixed(0)} ms`, '(info)', true);
  line(
    `render 100k-point chart, median of 5 (${f.chartDrawn} drawn)`,
    `${f.chartMs.toFixed(0)} ms`,
    '< 200 ms',
    f.chartMs < 200,
  );
  line(
    'render 100k-point chart, first of 5',
    `${f.chartFirstMs.toFixed(0)} ms`,
    '< 200 ms',
    f.chartFirstMs < 200,
  );
  line(
    'cold start offline to first usable input',
    `${f.coldStartMs.toFixed(0)} ms`,
    '< 1000 ms',
    f.coldStartMs < 1000,
  );
  line(
    'shell first-load JS (gzip)',
    `${(f.shellGzipBytes / 1024).toFixed(1)} KB`,
    '<= 100 KB',
    f.shellGzipBytes <= SHELL_BUDGET_BYTES,
  );
}
