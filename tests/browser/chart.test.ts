/** Charts draw: the demo's time series and speciation canvases are not blank; 10 000 points render. */

import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { inkedShare, launch, newContext, openApp, screenshot } from './browser';
import { injectAppModules } from './bundle';

let browser: Browser;
let page: Page;
const base = inject('baseUrl');

beforeAll(async () => {
  browser = await launch();
  page = await (await newContext(browser)).newPage();
});
afterAll(async () => browser?.close());

/** Saves n readings of one new site through the app's repository (as an import would). */
async function seed(n: number): Promise<string> {
  await injectAppModules(page);
  return page.evaluate(async (count) => {
    type M = typeof import('../bench/browser-entry');
    const { openRepository } = (window as unknown as { TufaModules: M }).TufaModules;
    const repo = await openRepository();
    const site = await repo.createSite({
      name: `Logger pond ${count}`,
      kind: 'pond',
      defaults: {},
      notes: '',
    });
    const t0 = Date.parse('2026-01-01T00:00:00Z');
    const now = new Date().toISOString();
    await repo.bulkPut(
      Array.from({ length: count }, (_, i) => ({
        id: `${site.id}-${i}`,
        type: 'reading' as const,
        siteId: site.id,
        takenAt: new Date(t0 + i * 600e3).toISOString(),
        timeZone: 'UTC',
        values: [
          { quantity: 'temperature', value: 12 + 6 * Math.sin(i / 144) + Math.sin(i * 7.3), unit: 'c' },
        ],
        notes: '',
        updatedAt: now,
        deleted: false,
      })),
    );
    repo.close();
    return site.id;
  }, n);
}

describe('charts', () => {
  it('draws the demo time series and a speciation diagram', async () => {
    await openApp(page, base);
    await page.getByRole('button', { name: 'Load demo scenario' }).click();
    await page.getByRole('link', { name: /Garage reef tank/ }).waitFor();
    await screenshot(page, '05-sites-demo');
    await page.getByRole('link', { name: /Heronmere lake/ }).click();
    await page.locator('[data-testid="time-chart"] canvas').waitFor();
    await page.getByText(/Choose what to plot/).click();
    await page.getByRole('checkbox', { name: /Temperature/ }).check();
    await expect.poll(() => page.locator('.u-legend .u-series').count()).toBe(3);
    await expect.poll(() => inkedShare(page, '[data-testid="time-chart"] canvas')).toBeGreaterThan(0.005);
    await screenshot(page, '06-site-chart');
    await page.locator('.log a').first().click();
    const spec = page.locator('[data-testid="speciation"]');
    if (await spec.count()) {
      await expect.poll(() => inkedShare(page, '[data-testid="speciation"]')).toBeGreaterThan(0.01);
    }
  });

  it('shows a single reading as a dot on the day around it', async () => {
    await openApp(page, base);
    const siteId = await seed(1);
    await page.goto(`${base}#/site/${siteId}`);
    await page.waitForSelector('html[data-ready="true"]');
    await expect.poll(() => page.locator('#site-h + p').textContent()).toContain('1 reading');
    const chart = page.locator('[data-testid="time-chart"]');
    await chart.locator('canvas').waitFor();
    await expect.poll(async () => Number(await chart.getAttribute('data-scale-span'))).toBe(86_400);
    await screenshot(page, '08b-chart-one-reading');
  });

  it('renders a 10 000-point series', async () => {
    await openApp(page, base);
    const siteId = await seed(10_000);
    await page.goto(`${base}#/site/${siteId}`);
    await page.waitForSelector('html[data-ready="true"]');
    await expect.poll(() => page.locator('#site-h + p').textContent()).toContain('10000');
    await page.locator('[data-testid="time-chart"] canvas').waitFor();
    await expect.poll(() => inkedShare(page, '[data-testid="time-chart"] canvas')).toBeGreaterThan(0.005);
    // Every reading is in the chart's data, decimated to the pixels, and the x axis spans the series.
    const chart = page.locator('[data-testid="time-chart"]');
    expect(await chart.getAttribute('data-total-points')).toBe('10000');
    const drawn = Number(await chart.getAttribute('data-drawn-points'));
    expect(drawn).toBeGreaterThan(500);
    expect(drawn).toBeLessThanOrEqual(10_000);
    const xMin = Number(await chart.getAttribute('data-x-min'));
    const xMax = Number(await chart.getAttribute('data-x-max'));
    expect(xMax - xMin).toBe(9_999 * 600);
    await screenshot(page, '08-chart-10000');
  });
});
