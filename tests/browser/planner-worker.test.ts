/**
 * Issue 15 §3 in the built app: the planner runs in the engine worker (its code is not in any
 * page chunk), and the probe's "reach" on fresh water with a volume of 5e-324 L answers at once
 * with a coded error while the page stays responsive.
 */

import { readdirSync, readFileSync } from 'node:fs';
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

// An invented spring-fed raceway reading, restored through the data panel.
const BACKUP = JSON.stringify({
  format: 'tufa-backup',
  version: 1,
  created_at: '2026-06-01T00:00:00Z',
  counts: {},
  sites: [
    {
      id: 'site-raceway',
      type: 'site',
      updatedAt: '2026-06-01T00:00:00Z',
      deleted: false,
      name: 'Raceway 2',
      kind: 'stream',
      defaults: { model: 'fresh' },
      notes: '',
    },
  ],
  readings: [
    {
      id: 'reading-raceway-1',
      type: 'reading',
      updatedAt: '2026-06-01T00:00:00Z',
      deleted: false,
      siteId: 'site-raceway',
      takenAt: '2026-06-01T06:00:00Z',
      timeZone: 'Europe/Berlin',
      values: [
        { quantity: 'temperature', value: 11, unit: 'c' },
        { quantity: 'ph', value: 7.1, unit: 'nbs' },
        { quantity: 'alkalinity', value: 160, unit: 'mg_l_caco3' },
        { quantity: 'conductance', value: 420, unit: 'us_cm' },
      ],
      notes: '',
    },
  ],
  settings: [],
  layouts: [],
});

describe('planner in the engine worker', () => {
  it('ships the dose search only in the worker bundle', () => {
    const dir = new URL('../../dist/assets/', import.meta.url);
    const files = readdirSync(dir).filter((f) => f.endsWith('.js'));
    const holding = files.filter((f) =>
      readFileSync(new URL(f, dir), 'utf8').includes('plan-search-gave-up'),
    );
    expect(holding.length).toBeGreaterThan(0);
    expect(holding.every((f) => f.includes('worker'))).toBe(true);
  });

  it('answers a 5e-324 L reach with a coded error and keeps the page responsive', async () => {
    await openApp(page, `${base}#/settings`);
    await page
      .getByLabel(/Restore a backup/)
      .setInputFiles({ name: 'raceway.json', mimeType: 'application/json', buffer: Buffer.from(BACKUP) });
    await page.getByText(/Restored: 2 added/).waitFor();
    await page.goto(`${base}#/reading/reading-raceway-1`);
    await page.getByRole('button', { name: /Plan a dose/ }).click();
    await page.getByLabel('What to do').selectOption('reach');
    await page.getByLabel('Water volume (L)').fill('5e-324');
    await page.getByLabel('Target quantity').selectOption('ph');
    await page.getByLabel('Target value').fill('7.4');
    const t0 = Date.now();
    await page.getByRole('button', { name: 'Show the result' }).click();
    await page.getByText(/volume-out-of-range/).waitFor({ timeout: 10_000 });
    expect(Date.now() - t0).toBeLessThan(10_000);
    await screenshot(page, '41-plan-volume-out-of-range');
    // The page answers script at once (not blocked by a search).
    expect(await page.evaluate(() => 1 + 1)).toBe(2);
    // A sensible volume plans in the worker and shows its steps.
    await page.getByLabel('Water volume (L)').fill('2000');
    await page.getByRole('button', { name: 'Show the result' }).click();
    await page
      .getByRole('heading', { name: 'Cautions' })
      .or(page.locator('#plan-problem:not(:has-text("volume-out-of-range"))'))
      .first()
      .waitFor({ timeout: 15_000 });
    expect(await page.locator('#plan-problem').allTextContents()).toEqual([]);
  }, 90000);
});
