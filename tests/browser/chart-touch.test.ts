/**
 * Touch zoom on the site chart: two fingers spread apart on the plot narrow its time span
 * (synthetic touch events, as Chromium's headless mode has no touch screen to pinch).
 */

import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launch, openApp } from './browser';

const base = inject('baseUrl');
let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => browser?.close());

describe('site chart on a phone', () => {
  it('zooms the time axis with a two-finger pinch', async () => {
    const context = await browser.newContext({
      viewport: { width: 390, height: 844 },
      hasTouch: true,
      isMobile: true,
      serviceWorkers: 'block',
    });
    const page = await context.newPage();
    await openApp(page, base);
    await page.getByRole('button', { name: /demo/i }).first().click();
    await page.locator('a.card').first().click();
    await page.waitForSelector('[data-testid="time-chart"] .u-over');
    const chart = page.locator('[data-testid="time-chart"]');
    const span0 = Number(await chart.getAttribute('data-scale-span'));
    expect(span0).toBeGreaterThan(0);
    await page.evaluate(() => {
      const over = document.querySelector('[data-testid="time-chart"] .u-over') as HTMLElement;
      const r = over.getBoundingClientRect();
      const y = r.top + r.height / 2;
      const touches = (d: number) =>
        [r.left + r.width / 2 - d, r.left + r.width / 2 + d].map(
          (x, i) => new Touch({ identifier: i, target: over, clientX: x, clientY: y }),
        );
      const fire = (type: string, t: Touch[]) =>
        over.dispatchEvent(
          new TouchEvent(type, { touches: t, changedTouches: t, bubbles: true, cancelable: true }),
        );
      fire('touchstart', touches(20));
      fire('touchmove', touches(60));
      fire('touchend', []);
    });
    await expect
      .poll(async () => Number(await chart.getAttribute('data-scale-span')))
      .toBeLessThan(span0 / 2);
    await context.close();
  }, 60_000);
});
