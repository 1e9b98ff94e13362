/**
 * No signal at the spring: with the network cut (page AND service worker requests aborted), a
 * reload still starts the app from the worker's cache and a new reading saves; back online,
 * nothing is lost.
 */

import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launch, newContext, openApp, screenshot, untilControlled } from './browser';
import { injectAppModules } from './bundle';

let browser: Browser;
let context: BrowserContext;
let page: Page;
const base = inject('baseUrl');

beforeAll(async () => {
  browser = await launch();
  context = await newContext(browser);
  page = await context.newPage();
});
afterAll(async () => browser?.close());

async function addReading(temperature: string, note: string) {
  await page.getByRole('link', { name: 'New reading' }).click();
  await page.getByLabel('Temperature', { exact: true }).fill(temperature);
  await page.getByLabel('pH', { exact: true }).fill('7,4');
  await page.getByLabel('Notes').fill(note);
  await page.getByRole('button', { name: 'Save reading' }).click();
  await page.getByRole('heading', { name: 'Reading', exact: true }).waitFor();
}

describe('offline', () => {
  it('starts offline from the service worker and saves a reading; nothing lost back online', async () => {
    await openApp(page, base);
    await untilControlled(page);
    await page.getByRole('link', { name: 'New site' }).click();
    await page.getByLabel('Name').fill('Nettlebed seep');
    await page.getByLabel('Kind of water').selectOption('spring');
    await page.getByRole('button', { name: 'Save site' }).click();
    await page.getByRole('heading', { name: 'Nettlebed seep' }).waitFor();
    await addReading('9.1', 'online reading');

    // Cut everything: the page's network and every request the service worker itself makes.
    let aborted = 0;
    await context.setOffline(true);
    await context.route('**/*', (route) => {
      aborted++;
      return route.abort('internetdisconnected');
    });
    await page.goto(`${base}#/`);
    await page.waitForSelector('html[data-ready="true"]', { timeout: 10_000 });
    expect(await page.evaluate(() => !!navigator.serviceWorker.controller)).toBe(true);
    await expect.poll(() => page.locator('.net').textContent()).toContain('Offline');
    await page.getByRole('link', { name: /Nettlebed seep/ }).click();
    await addReading('9.3', 'offline reading');
    await screenshot(page, '07-offline-reading');
    // The cached shell answered: nothing in this phase needed the network.
    expect(aborted).toBe(0);

    await context.unroute('**/*');
    await context.setOffline(false);
    await page.goto(`${base}#/`);
    await page.waitForSelector('html[data-ready="true"]');
    await page.getByRole('link', { name: /Nettlebed seep/ }).click();
    await expect.poll(() => page.locator('.log li').count()).toBe(2);
    await injectAppModules(page);
    const notes = await page.evaluate(async () => {
      type M = typeof import('../bench/browser-entry');
      const repo = await (window as unknown as { TufaModules: M }).TufaModules.openRepository();
      const all = await repo.listAllReadings();
      repo.close();
      return all.map((r) => r.notes).sort();
    });
    expect(notes).toEqual(['offline reading', 'online reading']);
  });
});
