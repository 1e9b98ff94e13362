/**
 * A data manager's path through sync and export, in the built app against a real CouchDB-API
 * server (the CI's shared one when `TUFA_COUCH_URL` is set, else one started here): a reading is
 * made, the server is set up in Settings, the status in words goes from "not set up" to "up to
 * date", the server holds the docs, a change made offline waits and goes out when the network is
 * back, and the site's CSV holds the reading with what the engine computes from it.
 */

import { readFileSync } from 'node:fs';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { isSolveError } from '../../src/chem/api';
import { readingRequest } from '../../src/reading/request';
import type { SiteDoc } from '../../src/store/schema';
import { solve } from '../../src/ui/engine-source';
import { CouchServer } from '../sync/couch-server';
import { ARTIFACTS, launch, newContext, openApp, screenshot } from './browser';

const base = inject('baseUrl');
const server = new CouchServer({ shared: true });
const DB = `tufa-ui-${process.pid}-${Date.now()}`;
let browser: Browser;
let context: BrowserContext;
let page: Page;

beforeAll(async () => {
  await server.start();
  await server.createDb(DB);
  browser = await launch();
  context = await newContext(browser);
  page = await context.newPage();
});
afterAll(async () => {
  await browser?.close();
  await server.stop();
});

async function serverDocs(): Promise<Record<string, unknown>[]> {
  const r = await fetch(`${server.url}${DB}/_all_docs?include_docs=true`);
  const body = (await r.json()) as { rows: { doc: Record<string, unknown> }[] };
  return body.rows.map((row) => row.doc).filter((d) => !String(d._id).startsWith('_'));
}

describe('sync and export through the app', () => {
  it('sets up a server, syncs, shows the state in words, sends an offline change later, exports a site', async () => {
    await openApp(page, base);
    await page.getByRole('link', { name: 'New site' }).click();
    await page.getByLabel('Name').fill('Kestrel Point mooring');
    await page.getByLabel('Kind of water').selectOption('lake');
    await page.getByLabel('Water model').selectOption('saline');
    await page.getByLabel('Usual salinity (optional, PSS-78)').fill('30');
    await page.getByRole('button', { name: 'Save site' }).click();
    await page.getByRole('heading', { name: 'Kestrel Point mooring' }).waitFor();
    await page.getByRole('link', { name: 'New reading' }).click();
    await page.getByLabel('Temperature', { exact: true }).fill('18,5');
    await page.getByLabel('pH', { exact: true }).fill('8,02');
    // A field site starts alkalinity in meq/L; this mooring logs µmol/kg.
    await page.getByLabel('Alkalinity unit').selectOption('umol_kg');
    await page.getByLabel('Alkalinity', { exact: true }).fill('2150');
    await page.getByRole('button', { name: 'Save reading' }).click();
    await page.getByRole('heading', { name: 'Reading', exact: true }).waitFor();

    await page.getByRole('link', { name: 'Settings' }).click();
    const sync = page.locator('section[aria-labelledby="sync-h"]');
    await expect.poll(() => sync.textContent()).toContain('No sync server is set up yet');
    await expect(page.getByTestId('sync-badge').count()).resolves.toBe(0);

    await page.getByLabel('Server address').fill(server.url);
    await page.getByLabel('Database name').fill(DB);
    await page.getByLabel('Sign-in').selectOption('none');
    // Loopback http is fine (no warning); any other plain-http host would be warned about.
    await page.getByRole('button', { name: 'Check and save' }).click();
    await expect
      .poll(() => sync.textContent(), { timeout: 20_000 })
      .toMatch(/Up to date\.Last synced.*\d\d:\d\d:\d\dWaiting to be sent0 changes/);
    await expect.poll(() => page.getByTestId('sync-badge').textContent()).toMatch(/^synced \d\d:\d\d$/);

    const docs = await serverDocs();
    expect(docs.map((d) => d.type).sort()).toEqual(['reading', 'site']);
    const reading = docs.find((d) => d.type === 'reading')!;
    expect(reading.values).toContainEqual({ quantity: 'ph', value: 8.02, unit: 'ph' });
    await page.evaluate(() => window.scrollTo(0, 0)); // the top bar is sticky
    await screenshot(page, '20-settings-sync-data');

    // Offline: an edit is saved and waits in the outbox; the badge says so; back online it goes out.
    await page.getByRole('link', { name: 'Sites', exact: true }).click();
    await page.getByRole('link', { name: /Kestrel Point mooring/ }).click();
    await page.getByRole('link', { name: 'Edit site' }).click();
    await context.setOffline(true);
    await page.getByLabel('Notes').fill('Buoy chain replaced');
    await page.getByRole('button', { name: 'Save site' }).click();
    await page.getByRole('heading', { name: 'Kestrel Point mooring' }).waitFor();
    await expect.poll(() => page.getByTestId('sync-badge').textContent()).toContain('1 to send');
    await context.setOffline(false);
    await expect
      .poll(async () => (await serverDocs()).find((d) => d.type === 'site')?.notes, { timeout: 20_000 })
      .toBe('Buoy chain replaced');
    await expect.poll(() => page.getByTestId('sync-badge').textContent()).toMatch(/^synced/);

    // CSV of this site, with the engine's results for the reading.
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Download CSV of this site' }).click(),
    ]);
    expect(download.suggestedFilename()).toMatch(/^kestrel-point-mooring-\d{4}-\d\d-\d\d\.csv$/);
    const csv = readFileSync((await download.path())!, 'utf8');
    const [head, row, ...rest] = csv.trim().split(/\r\n/);
    expect(rest).toEqual([]);
    const cols = head!.split(',');
    const cells = row!.split(',');
    const cell = (name: string) => cells[cols.indexOf(name)];
    expect(cell('site')).toBe('Kestrel Point mooring');
    expect(cell('ph')).toBe('8.02');
    // What the engine says for the same reading, computed here in Node.
    const site = docs.find((d) => d.type === 'site') as unknown as SiteDoc;
    const expected = solve(readingRequest(reading as never, site).input);
    expect(isSolveError(expected)).toBe(false);
    if (isSolveError(expected)) return;
    expect(Number(cell('computed_dic_umol_kg'))).toBeCloseTo(expected.dic_umol_kg, 6);

    // On a phone the top bar keeps the badge readable next to the network state.
    await page.setViewportSize({ width: 412, height: 800 });
    await screenshot(page, '21-site-phone-sync-badge', { fullPage: false });
    await page.getByRole('link', { name: 'Settings' }).click();
    await page.locator('section[aria-labelledby="sync-h"]').screenshot({
      path: new URL('23-sync-panel-phone.png', ARTIFACTS).pathname,
    });
  }, 120_000);
});
