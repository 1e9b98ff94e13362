/**
 * Issue 10, end to end on the built app: a reading whose alkalinity comes only from its field
 * titration gives the same computed outputs (1e-9 relative) on the reading page, in the planner's
 * "before" column, in the CSV export, on another device after re-importing that CSV, and on a
 * third after restoring a backup, and on a fourth after sync; the reading page says where each input came from, and a saved
 * plan shows again and reopens with its settings.
 */
import { readFileSync } from 'node:fs';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { solve } from '../../src/chem/solve';
import { DEFAULT_TITRATION_METHOD } from '../../src/chem/titration/types';
import { readingRequest } from '../../src/reading/request';
import type { MeasuredValue, SiteDoc } from '../../src/store/schema';
import { DEFAULT_SETTINGS } from '../../src/store/settings';
import { KESTREL } from '../reading/fixtures';
import { CouchServer } from '../sync/couch-server';
import { launch, newContext, openApp, screenshot } from './browser';

const base = inject('baseUrl');
const server = new CouchServer({ shared: true });
const DB = `tufa-one-truth-${process.pid}-${Date.now()}`;
let browser: Browser;
beforeAll(async () => {
  await server.start();
  await server.createDb(DB);
  browser = await launch();
}, 30_000);
afterAll(async () => {
  await browser?.close();
  await server.stop();
});

/** Sets up sharing with the test server (Settings) and syncs once. */
async function shareAndSync(p: Page): Promise<void> {
  await p.getByRole('link', { name: 'Settings' }).click();
  await p.getByLabel('Server address').fill(server.url);
  await p.getByLabel('Database name').fill(DB);
  await p.getByLabel('Sign-in').selectOption('none');
  await p.getByRole('button', { name: 'Check and save' }).click();
  const panel = p.locator('section[aria-labelledby="sync-h"]');
  await expect.poll(() => panel.textContent(), { timeout: 20_000 }).toContain('Up to date.');
  await p.getByRole('button', { name: 'Sync now' }).click();
  await expect
    .poll(() => p.getByTestId('sync-badge').textContent(), { timeout: 20_000 })
    .toMatch(/synced \d\d:\d\d$/);
}

/** Outputs compared on every path (all are on the reading page and in the CSV). */
const KEYS = ['dic_umol_kg', 'alkalinity_umol_kg', 'pco2_uatm', 'co2_umol_kg', 'hco3_umol_kg', 'co3_umol_kg'];
const near = (a: number, b: number) => Math.abs(a - b) / Math.max(Math.abs(b), 1e-300);

async function readingPageValues(page: Page): Promise<Record<string, number>> {
  const out: Record<string, number> = {};
  for (const k of KEYS) {
    const el = page.locator(`.results .output[data-key="${k}"]`).first();
    await el.waitFor({ state: 'attached', timeout: 20_000 });
    out[k] = Number(await el.getAttribute('data-value'));
  }
  return out;
}

describe('one reading, one truth', () => {
  it('a titration-only reading is the same on its page, in the planner, the CSV, after re-import, restore and sync', async () => {
    const values: MeasuredValue[] = [
      { quantity: 'temperature', value: 11.2, unit: 'c' },
      { quantity: 'ph', value: 7.16, unit: 'ph' },
      { quantity: 'conductance', value: 480, unit: 'us_cm' },
    ];
    const site = { defaults: { model: 'fresh' } } as SiteDoc;
    // The form saves its default reduction with the points (src/chem/titration/types.ts).
    const titration = { ...KESTREL, method: DEFAULT_TITRATION_METHOD };
    const truth = solve(readingRequest({ values, titration }, site, DEFAULT_SETTINGS).input);
    if ('error' in truth) throw new Error(truth.error.message);

    const page = await (await newContext(browser)).newPage();
    await openApp(page, base);
    await page.getByRole('link', { name: 'New site' }).click();
    await page.getByLabel('Name').fill('Kestrel Hollow spring');
    await page.getByLabel('Kind of water').selectOption('spring');
    await page.getByLabel('Water model').selectOption('fresh');
    await page.getByRole('button', { name: 'Save site' }).click();
    await page.getByRole('heading', { name: 'Kestrel Hollow spring' }).waitFor();
    await page.getByRole('link', { name: 'New reading' }).click();
    await page.getByLabel('Temperature', { exact: true }).fill('11.2');
    await page.getByLabel('pH', { exact: true }).fill('7.16');
    await page.getByLabel('Specific conductance (25 °C)', { exact: true }).fill('480');
    await page.getByText('Field titration (optional)').click();
    await page.getByLabel('Sample volume (mL)').fill(String(KESTREL.sampleVolumeMl));
    await page.getByLabel('Acid normality (eq/L)').fill(String(KESTREL.titrantNormality));
    await page
      .getByLabel('Points: acid added (mL) and pH, one pair per line')
      .fill(KESTREL.points.map((p) => `${p.volumeMl}\t${p.ph}`).join('\n'));
    await page
      .locator('.results .output[data-key="dic_umol_kg"]')
      .waitFor({ state: 'attached', timeout: 20_000 });
    await page.getByRole('button', { name: 'Save reading' }).click();
    await page.getByRole('heading', { name: 'Titration' }).waitFor();
    const readingId = decodeURIComponent(page.url().split('#/reading/')[1]!.split('/')[0]!);

    // 1. The reading page (after a reload, from the store), with where each input came from.
    await page.reload();
    await page.waitForSelector('html[data-ready="true"]');
    const onPage = await readingPageValues(page);
    for (const k of KEYS)
      expect(near(onPage[k]!, truth[k as keyof typeof truth] as number), k).toBeLessThan(1e-9);
    const alkRow = page.locator('[data-testid="inputs-used"] tr[data-key="alkalinity_meq_l"]');
    expect(await alkRow.getAttribute('data-source')).toBe('titration');
    await page.getByText('Inputs used and where they came from').click();
    await screenshot(page, '40-reading-inputs-used');

    // 2. The planner's "before" column.
    await page.getByRole('button', { name: 'Plan a dose, aeration or mix for this water' }).click();
    await page.getByLabel('What to do').selectOption('equilibrate');
    await page.getByRole('button', { name: 'Show the result' }).click();
    for (const k of KEYS) {
      const row = page.locator(`.plan-table tr[data-key="${k}"]`).first();
      await row.waitFor({ timeout: 20_000 });
      expect(near(Number(await row.getAttribute('data-before')), onPage[k]!), `planner ${k}`).toBeLessThan(
        1e-9,
      );
    }
    await page.getByRole('button', { name: 'Save plan with this reading' }).click();
    await page.getByTestId('saved-plan').waitFor();
    await screenshot(page, '41-reading-saved-plan');
    // After a reload the plan is still on the page and reopens with its own settings.
    await page.reload();
    await page.waitForSelector('html[data-ready="true"]');
    await page.getByTestId('saved-plan').waitFor();
    expect(await page.getByTestId('saved-plan').textContent()).toContain(
      'Exchange CO2 towards 420 µatm in 100 L',
    );
    await page.getByRole('button', { name: 'Open the saved plan in the planner' }).click();
    expect(await page.getByLabel('What to do').inputValue()).toBe('equilibrate');
    await page.locator('.plan-table tr[data-key="dic_umol_kg"]').first().waitFor();

    // 3. The CSV export of the site.
    await page.locator(`a[href^="#/site/"]`).first().click();
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Download CSV of this site' }).click(),
    ]);
    const csv = readFileSync((await download.path())!, 'utf8');
    const [head, row] = csv.split('\r\n');
    const header = head!.split(',');
    const cells = row!.split(',');
    const cell = (k: string) => cells[header.indexOf(k)]!;
    expect(cell('reading_id')).toBe(readingId);
    expect(cell('site_kind')).toBe('spring');
    expect(cell('input_sources')).toContain('alkalinity_meq_l=titration');
    // CSV numbers carry 12 significant digits.
    for (const k of KEYS)
      expect(near(Number(cell(`computed_${k}`)), onPage[k]!), `csv ${k}`).toBeLessThan(1e-9);

    // 4. Re-imported on another device (a fresh browser profile): same id, same outputs, same kind.
    const other = await (await newContext(browser)).newPage();
    await openApp(other, base);
    await other.getByRole('link', { name: 'Settings' }).click();
    await other
      .getByLabel('File from a logger or spreadsheet')
      .setInputFiles({ name: 'kestrel.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
    await other.getByText('1 readings ready').or(other.getByText('1 reading ready')).waitFor();
    await other.getByRole('button', { name: /^Import/ }).click();
    await other.getByText(/Imported 1 readings? and 1 new site/).waitFor();
    await other.goto(`${base}#/reading/${readingId}`);
    await other.waitForSelector('html[data-ready="true"]');
    const again = await readingPageValues(other);
    await screenshot(other, '42-reading-after-csv-reimport');
    for (const k of KEYS) expect(near(again[k]!, onPage[k]!), `re-import ${k}`).toBeLessThan(1e-9);
    expect(
      await other
        .locator('[data-testid="inputs-used"] tr[data-key="alkalinity_meq_l"]')
        .getAttribute('data-source'),
    ).toBe('titration');

    // 5. A backup of the first device restored on a third one: same id, same outputs, titration kept.
    await page.getByRole('link', { name: 'Settings' }).click();
    const [backup] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Download backup (JSON)' }).click(),
    ]);
    const third = await (await newContext(browser)).newPage();
    await openApp(third, base);
    await third.getByRole('link', { name: 'Settings' }).click();
    await third.getByLabel(/Restore a backup/).setInputFiles((await backup.path())!);
    await third.getByText(/Restored: 2 added/).waitFor();
    await third.goto(`${base}#/reading/${readingId}`);
    await third.waitForSelector('html[data-ready="true"]');
    const restored = await readingPageValues(third);
    for (const k of KEYS) expect(near(restored[k]!, onPage[k]!), `restore ${k}`).toBeLessThan(1e-9);
    await third.getByRole('heading', { name: 'Titration' }).waitFor();
    await third.getByTestId('saved-plan').waitFor();

    // 6. Synced to a second phone through the server: same id, same outputs.
    await shareAndSync(page);
    const fourth = await (await newContext(browser)).newPage();
    await openApp(fourth, base);
    await shareAndSync(fourth);
    await fourth.goto(`${base}#/reading/${readingId}`);
    await fourth.waitForSelector('html[data-ready="true"]');
    const synced = await readingPageValues(fourth);
    for (const k of KEYS) expect(near(synced[k]!, onPage[k]!), `sync ${k}`).toBeLessThan(1e-9);
  }, 180_000);
});
