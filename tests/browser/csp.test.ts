/**
 * The built app's Content-Security-Policy (vite.config.ts): present, enforced (an injected inline
 * script does not run), and the app boots, computes, charts and starts offline from its service
 * worker without a single violation.
 */

import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launch, newContext, openApp, screenshot, untilControlled } from './browser';

let browser: Browser;
let context: BrowserContext;
let page: Page;
const base = inject('baseUrl');

beforeAll(async () => {
  browser = await launch();
  context = await newContext(browser);
  // Collect every violation the page reports, from the first byte of every document.
  await context.addInitScript(() => {
    const w = window as unknown as { cspViolations: string[] };
    w.cspViolations = [];
    document.addEventListener('securitypolicyviolation', (e) =>
      w.cspViolations.push(`${e.effectiveDirective} ${e.blockedURI}`),
    );
  });
  page = await context.newPage();
});
afterAll(async () => browser?.close());

const violations = () =>
  page.evaluate(() => (window as unknown as { cspViolations: string[] }).cspViolations);

describe('content security policy', () => {
  it('is enforced and the app boots, computes and starts offline without violations', async () => {
    const consoleCsp: string[] = [];
    page.on('console', (m) => {
      if (/Content Security Policy/i.test(m.text())) consoleCsp.push(m.text());
    });
    await openApp(page, base);
    const meta = await page.getAttribute('meta[http-equiv="Content-Security-Policy"]', 'content');
    expect(meta).toContain("script-src 'self'");
    await untilControlled(page);

    await page.getByRole('link', { name: 'New site' }).click();
    await page.getByLabel('Name').fill('Cistern by the barn');
    await page.getByLabel('Kind of water').selectOption('tank');
    await page.getByRole('button', { name: 'Save site' }).click();
    await page.getByRole('heading', { name: 'Cistern by the barn' }).waitFor();
    await page.getByRole('link', { name: 'New reading' }).click();
    await page.getByLabel('Temperature', { exact: true }).fill('14');
    await page.getByLabel('pH', { exact: true }).fill('7.6');
    await page.getByRole('button', { name: 'Save reading' }).click();
    await page.getByRole('heading', { name: 'Reading', exact: true }).waitFor();
    expect(await violations()).toEqual([]);

    // Offline: the service worker starts the app from its cache under the same policy.
    await context.setOffline(true);
    await page.goto(`${base}#/`);
    await page.waitForSelector('html[data-ready="true"]', { timeout: 10_000 });
    await page.getByRole('link', { name: /Cistern by the barn/ }).click();
    await page.locator('.log li').first().waitFor();
    await screenshot(page, 'csp-offline-site');
    expect(await violations()).toEqual([]);
    expect(consoleCsp).toEqual([]);
    await context.setOffline(false);

    // The policy is live: an inline script added to the page does not run.
    const ran = await page.evaluate(async () => {
      const s = document.createElement('script');
      s.textContent = 'window.inlineRan = true';
      document.body.append(s);
      await new Promise((r) => setTimeout(r, 50));
      return (window as unknown as { inlineRan?: boolean }).inlineRan === true;
    });
    expect(ran).toBe(false);
    expect((await violations()).some((v) => v.startsWith('script-src'))).toBe(true);
  });
});
