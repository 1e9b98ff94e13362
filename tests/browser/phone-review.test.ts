/**
 * A field user's walk through the app on a 390×844 phone: sites list, new site, a reading typed
 * with decimal commas and switched units, the reading page, the site chart, settings, and the app
 * reloaded with the network and the service worker's requests cut. Each screen is saved to
 * test-artifacts/ for a person to look at, and checked for what a user trips over: no NaN or
 * "undefined" on screen, nothing wider than the phone, and tap targets at least 44 px high
 * (common practice for touch screens).
 */

import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { ARTIFACTS, launch, openApp, screenshot, untilControlled } from './browser';
import { audit, type Trouble } from './phone-audit';

const base = inject('baseUrl');
const SITE = 'Larchwood dipping pond';
let browser: Browser;
let context: BrowserContext;
let page: Page;

beforeAll(async () => {
  browser = await launch();
  context = await browser.newContext({
    locale: 'de-DE',
    timezoneId: 'Europe/Berlin',
    viewport: { width: 390, height: 844 },
    deviceScaleFactor: 1,
    hasTouch: true,
    isMobile: true,
    serviceWorkers: 'allow',
  });
  page = await context.newPage();
});
afterAll(async () => {
  await browser?.close();
});

async function look(p: Page, name: string, troubles: Trouble[]): Promise<void> {
  await p.evaluate(() => window.scrollTo(0, 0));
  await screenshot(p, name);
  troubles.push(...(await audit(p, name)));
}

describe('a field user on a phone', () => {
  it('walks every screen on 390×844, online and offline, without tripping', async () => {
    const troubles: Trouble[] = [];
    await openApp(page, base);
    await untilControlled(page);
    // The audit itself must see trouble when there is some.
    await page.evaluate(() => {
      const b = document.createElement('button');
      b.id = 'audit-probe';
      b.textContent = 'NaN';
      b.style.cssText = 'height:20px;min-height:0;position:absolute;left:380px;width:60px';
      document.body.append(b);
    });
    expect((await audit(page, 'probe')).map((t) => t.what)).toEqual([
      'shows “NaN”',
      expect.stringMatching(/^page is 44\d px wide on a 390 px screen$/),
      'button “NaN” is 20 px high',
      'button “NaN” runs past the right edge',
    ]);
    await page.evaluate(() => document.getElementById('audit-probe')?.remove());
    await look(page, '40-phone-sites-empty', troubles);

    await page.getByRole('link', { name: 'New site' }).click();
    await page.getByLabel('Name').fill(SITE);
    await page.getByLabel('Kind of water').selectOption('lake');
    await look(page, '41-phone-new-site', troubles);
    await page.getByRole('button', { name: 'Save site' }).click();
    await page.getByRole('heading', { name: SITE }).waitFor();
    await look(page, '42-phone-site-no-readings', troubles);

    const readings: [string, string, string][] = [
      ['54,5', '7,62', '2,9'],
      ['56,1', '7,81', '3,1'],
      ['53,2', '7,55', '2,7'],
    ];
    for (const [i, [tempF, ph, alk]] of readings.entries()) {
      await page.getByRole('link', { name: 'New reading' }).click();
      await page.getByLabel('Temperature unit').selectOption('f');
      await page.getByLabel('Temperature', { exact: true }).fill(tempF);
      await page.getByLabel('pH', { exact: true }).fill(ph);
      await page.getByLabel('Alkalinity unit').selectOption('meq_l');
      await page.getByLabel('Alkalinity', { exact: true }).fill(alk);
      const when = page.getByLabel('Sampled at (local time)');
      await when.fill(`2026-11-${String(10 + i * 7).padStart(2, '0')}T09:30`);
      if (i === 0) {
        // The live results under the form, computed as the user types.
        await expect.poll(() => page.locator('.results').textContent(), { timeout: 15_000 }).toContain('DIC');
        await look(page, '43-phone-new-reading', troubles);
        await page.locator('.results').scrollIntoViewIfNeeded();
        await screenshot(page, '43b-phone-new-reading-results', { fullPage: false });
      }
      await page.getByRole('button', { name: 'Save reading' }).click();
      await page.getByRole('heading', { name: 'Reading', exact: true }).waitFor();
      if (i === 0) {
        await expect
          .poll(() => page.locator('section[aria-labelledby="computed-h"]').textContent())
          .toMatch(/\d/);
        await look(page, '44-phone-reading', troubles);
        await page.locator('section[aria-labelledby="computed-h"]').screenshot({
          path: new URL('44b-phone-reading-computed.png', ARTIFACTS).pathname,
        });
      }
      await page.getByRole('link', { name: SITE }).first().click();
      await page.getByRole('heading', { name: SITE }).waitFor();
    }
    // A slip of the thumb: the message with its code beside the field, nothing saved.
    await page.getByRole('link', { name: 'New reading' }).click();
    await page.getByLabel('Temperature unit').selectOption('c');
    await page.getByLabel('Temperature', { exact: true }).fill('12,,5');
    await page.getByLabel('pH', { exact: true }).fill('40');
    await expect
      .poll(() => page.locator('.qmsg .issue.error').first().textContent())
      .toContain('input-not-a-number');
    const phRow = page.locator('.qrow', { has: page.getByLabel('pH', { exact: true }) });
    await expect
      .poll(() => phRow.locator('.issue.warn').textContent())
      .toBe(
        'input-unusual-value pH is usually between 2 and 12: please check the value (it is kept as typed).',
      );
    await page.getByRole('button', { name: 'Save reading' }).click();
    await expect.poll(() => page.getByRole('alert').first().textContent()).toContain('input-not-a-number');
    await look(page, '43c-phone-new-reading-bad-input', troubles);
    await page.getByRole('link', { name: 'Cancel' }).click();
    await page.getByRole('heading', { name: SITE }).waitFor();
    await expect.poll(() => page.getByText(/3 readings/).count()).toBe(1);
    await page.waitForSelector('canvas');
    await expect.poll(() => page.getByText('Tap the chart to read the values').isVisible()).toBe(true);
    await look(page, '45-phone-site-chart', troubles);
    // A tap on the plot reads the values there.
    const plot = page.locator('.u-over');
    const box = (await plot.boundingBox())!;
    await page.mouse.click(box.x + box.width / 2, box.y + box.height / 2);
    await expect.poll(() => page.locator('.u-legend').getAttribute('class')).not.toContain('idle');
    await screenshot(page, '45b-phone-site-chart-tapped', { fullPage: false });

    await page.getByRole('link', { name: 'Settings' }).click();
    await look(page, '46-phone-settings', troubles);
    await screenshot(page, '46b-phone-settings-top', { fullPage: false });
    // A closed select shows only its chosen option: each must fit the box on a phone. A probe
    // with a label too long for any phone shows the check can fail.
    await page.evaluate(() => {
      const probe = document.createElement('select');
      probe.id = 'select-probe';
      probe.style.width = '300px';
      probe.append(new Option('A label much too long to be read in a closed select box on a phone'));
      document.querySelector('main')?.append(probe);
    });
    const cut = await page.$$eval('select', (els) =>
      (els as HTMLSelectElement[])
        .filter((el) => {
          const probe = document.createElement('span');
          const cs = getComputedStyle(el);
          probe.style.cssText = `position:absolute;visibility:hidden;white-space:pre;font:${cs.font}`;
          probe.textContent = el.selectedOptions[0]?.textContent ?? '';
          document.body.append(probe);
          const fits = probe.getBoundingClientRect().width + 40 <= el.getBoundingClientRect().width;
          probe.remove();
          return !fits;
        })
        .map((el) => el.selectedOptions[0]?.textContent),
    );
    expect(cut).toEqual(['A label much too long to be read in a closed select box on a phone']);
    await page.evaluate(() => document.getElementById('select-probe')?.remove());

    // Offline: the page's network and every request of the service worker are cut, then reload.
    await context.setOffline(true);
    await context.route('**/*', (route) => route.abort('internetdisconnected'));
    await page.goto(`${base}#/`);
    await page.reload();
    await page.waitForSelector('html[data-ready="true"]', { timeout: 10_000 });
    await expect.poll(() => page.locator('.net').textContent()).toContain('Offline');
    await look(page, '47-phone-offline-sites', troubles);
    await page.getByRole('link', { name: new RegExp(SITE) }).click();
    await page.getByRole('heading', { name: SITE }).waitFor();
    await look(page, '48-phone-offline-site', troubles);
    await context.unroute('**/*');
    await context.setOffline(false);

    expect(troubles).toEqual([]);
  }, 150_000);
});
