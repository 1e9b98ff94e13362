/**
 * Issue 15 §12 (and §11's persistence request): Chromium is killed with SIGKILL while a large CSV
 * import is being stored and while a reading is being saved, then started again on the same
 * profile. The store must hold all of the import or none of it (with a matching outbox), and the
 * app must boot. The browser is our own child process, started with a DevTools port, so the kill
 * is the real thing (no shutdown, no flush), as when a phone's battery dies.
 */

import { type ChildProcess, spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { type Browser, chromium, type Page } from 'playwright-core';
import { afterAll, describe, expect, inject, it } from 'vitest';
import { CHROMIUM, CHROMIUM_ARGS } from './browser';

const base = inject('baseUrl');
const profile = mkdtempSync(join(tmpdir(), 'tufa-kill-'));
let proc: ChildProcess | undefined;
let browser: Browser | undefined;

afterAll(async () => {
  await browser?.close().catch(() => undefined);
  if (proc && proc.exitCode === null) proc.kill('SIGKILL');
  rmSync(profile, { recursive: true, force: true, maxRetries: 5, retryDelay: 200 });
});

/** Starts Chromium on the shared profile and connects to it; returns the first page. */
async function start(): Promise<Page> {
  proc = spawn(
    CHROMIUM,
    [
      ...CHROMIUM_ARGS,
      '--headless=new',
      `--user-data-dir=${profile}`,
      '--remote-debugging-port=0',
      'about:blank',
    ],
    { stdio: ['ignore', 'ignore', 'pipe'] },
  );
  const ws = await new Promise<string>((resolve, reject) => {
    let err = '';
    const t = setTimeout(() => reject(new Error(`Chromium did not start: ${err.slice(-500)}`)), 20_000);
    proc!.stderr!.on('data', (b: Buffer) => {
      err += b.toString();
      const m = /DevTools listening on (ws:\S+)/.exec(err);
      if (m) {
        clearTimeout(t);
        resolve(m[1]!);
      }
    });
  });
  browser = await chromium.connectOverCDP(ws);
  const context = browser.contexts()[0]!;
  // Count the app's requests for persistent storage (Chromium answers them without a prompt).
  await context.addInitScript(() => {
    const sm = navigator.storage as StorageManager & { persistCalls?: number };
    const persist = sm.persist.bind(sm);
    sm.persistCalls = 0;
    sm.persist = () => {
      sm.persistCalls!++;
      return persist();
    };
  });
  const page = context.pages()[0] ?? (await context.newPage());
  await page.setViewportSize({ width: 1000, height: 900 });
  return page;
}

/** SIGKILL: no unload, no IndexedDB flush beyond what has committed. */
async function kill(): Promise<void> {
  const p = proc!;
  const exited = new Promise<void>((resolve) => p.once('exit', () => resolve()));
  p.kill('SIGKILL');
  await exited;
  browser = undefined;
}

async function open(page: Page, hash = ''): Promise<void> {
  await page.goto(`${base}${hash}`);
  await page.waitForSelector('html[data-ready="true"]', { timeout: 30_000 });
}

/** What the store holds, counted through the app's own repository module. */
async function counts(page: Page): Promise<{ sites: number; readings: number; outbox: number }> {
  return page.evaluate(
    () =>
      new Promise((resolve, reject) => {
        const req = indexedDB.open('tufa');
        req.onerror = () => reject(req.error);
        req.onsuccess = () => {
          const db = req.result;
          const tx = db.transaction(['sites', 'readingPageData', 'outboxBuckets'], 'readonly');
          const out = { sites: 0, readings: 0, outbox: 0 };
          tx.objectStore('sites').count().onsuccess = (e) => {
            out.sites = (e.target as IDBRequest<number>).result;
          };
          tx.objectStore('readingPageData').getAll().onsuccess = (e) => {
            for (const p of (e.target as IDBRequest<{ readings: unknown[] }[]>).result)
              out.readings += p.readings.length;
          };
          tx.objectStore('outboxBuckets').getAll().onsuccess = (e) => {
            for (const b of (e.target as IDBRequest<{ entries: object }[]>).result)
              out.outbox += Object.keys(b.entries).length;
          };
          tx.oncomplete = () => {
            db.close();
            resolve(out);
          };
        };
      }),
  );
}

// An invented logger file from one of our own demo sites: 15-minute rows.
function loggerFile(rows: number, site = 'Harbour pontoon'): string {
  const lines = ['Site;Date/Time;Temp (°C);Salinity;pH;Alkalinity (µmol/kg)'];
  const t0 = Date.UTC(2026, 0, 1);
  for (let i = 0; i < rows; i++) {
    const d = new Date(t0 + i * 900_000);
    const stamp = `${String(d.getUTCDate()).padStart(2, '0')}.${String(d.getUTCMonth() + 1).padStart(2, '0')}.${d.getUTCFullYear()} ${String(d.getUTCHours()).padStart(2, '0')}:${String(d.getUTCMinutes()).padStart(2, '0')}`;
    lines.push(`${site};${stamp};${(14 + (i % 50) / 10).toFixed(1).replace('.', ',')};34;8,0${i % 10};2300`);
  }
  return `${lines.join('\r\n')}\r\n`;
}

const ROWS = 20_000;

describe('killing the browser', () => {
  // Killed early and late in the storing phase (the worker's check for ids already present, then
  // the one transaction and its commit); each round imports a file for a new site.
  it.each([
    [1, 150],
    [2, 1500],
  ])(
    'keeps all or nothing of a large import killed while it is stored (round %i, %i ms), and boots',
    async (round, delay) => {
      let page = await start();
      await open(page, '#/settings');
      const before = await counts(page);
      await page.getByLabel('File from a logger or spreadsheet').setInputFiles({
        name: 'pontoon.csv',
        mimeType: 'text/csv',
        buffer: Buffer.from(loggerFile(ROWS, `Harbour pontoon ${round}`)),
      });
      await page.getByText(`${ROWS} readings ready`).waitFor({ timeout: 60_000 });
      await page.getByRole('button', { name: `Import ${ROWS} readings` }).click();
      // The worker computes every row, then stores them ("Importing…"). On a loaded machine either
      // phase can pass between two looks; the kill then lands later, which all-or-nothing covers too.
      await page
        .getByRole('button', { name: /^(Computing|Importing)/ })
        .waitFor({ timeout: 60_000 })
        .catch(() => undefined);
      await new Promise((r) => setTimeout(r, delay));
      await kill();

      page = await start();
      await open(page);
      const c = await counts(page);
      console.log(`round ${round}: after the kill the store holds`, c);
      // All (the site and its readings, each queued for sync) or nothing.
      const added = c.readings - before.readings;
      expect([0, ROWS]).toContain(added);
      expect(c.sites - before.sites).toBe(added === 0 ? 0 : 1);
      expect(c.outbox).toBe(c.readings + c.sites);
      expect(await page.getByRole('heading', { name: 'Sites' }).count()).toBe(1);
      await kill();
    },
    240_000,
  );

  it('keeps a reading whole or not at all when killed during its save, and asks for persistence', async () => {
    let page = await start();
    await open(page);
    const before = await counts(page);
    let siteLink = page.getByRole('link', { name: /Harbour pontoon/ });
    if ((await siteLink.count()) === 0) {
      await page.getByRole('link', { name: 'New site' }).click();
      await page.getByLabel('Name').fill('Harbour pontoon');
      await page.getByLabel('Kind of water').selectOption('tank');
      await page.getByRole('button', { name: 'Save site' }).click();
      await page.getByRole('heading', { name: 'Harbour pontoon' }).waitFor();
    } else await siteLink.first().click();
    const withSite = await counts(page);
    await page.getByRole('link', { name: 'New reading' }).click();
    await page.getByLabel('Temperature', { exact: true }).fill('15');
    await page.getByLabel('pH', { exact: true }).fill('8.0');
    // In the trade's own unit (meq/L at a site imported without a kind, dKH in a tank): both fit.
    await page.getByLabel('Alkalinity', { exact: true }).fill('2.3');
    // First a save that completes: the app asks for persistent storage after it.
    await page.getByRole('button', { name: /^Save/ }).click();
    await page.getByText('Reading saved on this device.').waitFor();
    expect(await page.evaluate(() => (navigator.storage as { persistCalls?: number }).persistCalls)).toBe(1);
    // Then a second reading, killed at the moment of the click.
    await page.getByRole('link', { name: 'Another reading here' }).click();
    await page.getByLabel('Temperature', { exact: true }).fill('16');
    await page.getByLabel('pH', { exact: true }).fill('8.1');
    await page.getByLabel('Alkalinity', { exact: true }).fill('2.31');
    await page.getByRole('button', { name: /^Save/ }).click({ noWaitAfter: true });
    await kill();

    page = await start();
    await open(page);
    const after = await counts(page);
    expect(before.readings).toBe(withSite.readings);
    expect([withSite.readings + 1, withSite.readings + 2]).toContain(after.readings);
    // Whatever was saved was queued with it: one outbox entry per document written since.
    expect(after.outbox - withSite.outbox).toBe(after.readings - withSite.readings);
    siteLink = page.getByRole('link', { name: /Harbour pontoon/ });
    await siteLink.first().waitFor();
    await kill();
  }, 240_000);
});
