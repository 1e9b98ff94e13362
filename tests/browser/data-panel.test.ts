/**
 * The data panel as mounted in Settings of the built app: map columns, preview with results the
 * engine worker computes, refuse a bad file, import a good one, and re-import it harmlessly.
 */

import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launch, newContext, openApp, screenshot } from './browser';

const base = inject('baseUrl');
let browser: Browser;
let page: Page;
beforeAll(async () => {
  browser = await launch();
  page = await (await newContext(browser, { width: 900 })).newPage();
});
afterAll(async () => browser?.close());

// Invented files from our own demo sites.
const GOOD =
  '\uFEFFSite;Date/Time;Temp (°C);Salinity;pH;Alkalinity (µmol/kg)\r\n' +
  'Bay buoy;03.06.2026 09:15;25;35;8,05;2300\r\n' +
  'Bay buoy;03.06.2026 10:15;24,5;35;8,1;2310\r\n';
const BAD = 'Site;Date/Time;pH\r\nBay buoy;03.06.2026 09:15;8,x\r\nBay buoy;31.02.2026 10:15;8,1\r\n';

describe('data panel in Settings', () => {
  it('maps, previews with computed results, refuses a bad file, imports a good one', async () => {
    await openApp(page, `${base}#/settings`);
    const input = page.getByLabel('File from a logger or spreadsheet');
    await input.setInputFiles({ name: 'bad.csv', mimeType: 'text/csv', buffer: Buffer.from(BAD) });
    await page.getByText('2 problems').waitFor();
    expect(await page.textContent('body')).toContain('is not a number');
    expect(await page.getByRole('button', { name: /^Import/ }).isDisabled()).toBe(true);

    await input.setInputFiles({ name: 'bay.csv', mimeType: 'text/csv', buffer: Buffer.from(GOOD) });
    await page.getByText('2 readings ready').waitFor();
    // pH column: tell the panel the logger reports the total scale.
    await page.getByRole('combobox', { name: 'Column pH' }).selectOption('value:ph:total');
    // The preview is re-planned in the import worker: wait for the new mapping, then the engine's pH.
    await page
      .getByText(/pH 8\.05 \(total scale\)/)
      .first()
      .waitFor();
    await page.getByText('8.050').first().waitFor(); // pH total, computed by the engine
    const text = await page.textContent('body');
    expect(text).toContain('decimal comma');
    expect(text).toContain('byte-order mark removed');
    expect(text).toContain('Temperature 25 °C; Salinity 35 PSS-78; pH 8.05 (total scale)');
    expect(text).toContain('new site: Bay buoy');
    await page.evaluate(() => window.scrollTo(0, 0));
    await screenshot(page, '22-data-panel-preview');
    await page.getByRole('button', { name: 'Import 2 readings' }).click();
    await page.getByText(/Imported 2 readings and 1 new site/).waitFor();
    // Same file again: nothing new.
    await input.setInputFiles({ name: 'bay.csv', mimeType: 'text/csv', buffer: Buffer.from(GOOD) });
    await page.getByText('2 readings ready').waitFor();
    // The remembered layout brings back the pH scale choice.
    expect(await page.getByRole('combobox', { name: 'Column pH' }).inputValue()).toBe('value:ph:total');
    await page.getByRole('button', { name: 'Import 2 readings' }).click();
    await page.getByText(/Imported 0 readings; 2 were already here/).waitFor();
  }, 90000);
});
