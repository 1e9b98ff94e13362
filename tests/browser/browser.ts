/** Launching Debian's Chromium through playwright-core, and small helpers the browser tests share. */

import { existsSync, mkdirSync } from 'node:fs';
import { type Browser, type BrowserContext, chromium, type Page } from 'playwright-core';

export const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

/** Flags for headless Debian Chromium on a closed network (docs: toolchain.md). */
export const CHROMIUM_ARGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-dev-shm-usage',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];
export const ARTIFACTS = new URL('../../test-artifacts/', import.meta.url);

export async function launch(): Promise<Browser> {
  if (!existsSync(CHROMIUM))
    throw new Error(`Chromium not found at ${CHROMIUM}: apt-get install -y chromium`);
  return chromium.launch({
    executablePath: CHROMIUM,
    args: CHROMIUM_ARGS,
  });
}

export async function newContext(
  browser: Browser,
  opts: { locale?: string; width?: number } = {},
): Promise<BrowserContext> {
  return browser.newContext({
    locale: opts.locale ?? 'en-GB',
    timezoneId: 'Europe/Berlin',
    viewport: { width: opts.width ?? 1100, height: 900 },
    serviceWorkers: 'allow',
  });
}

/** Opens the app and waits until the shell has rendered from IndexedDB. */
export async function openApp(page: Page, url: string): Promise<void> {
  await page.goto(url);
  await page.waitForSelector('html[data-ready="true"]');
}

/** Waits for the service worker to be active and to control this page (a reload may be needed). */
export async function untilControlled(page: Page): Promise<void> {
  await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined));
  if (!(await page.evaluate(() => !!navigator.serviceWorker.controller))) {
    await page.reload();
    await page.waitForSelector('html[data-ready="true"]');
  }
  await page.waitForFunction(() => !!navigator.serviceWorker.controller);
}

export async function screenshot(page: Page, name: string, opts: { fullPage?: boolean } = {}): Promise<void> {
  mkdirSync(ARTIFACTS, { recursive: true });
  await page.screenshot({
    path: new URL(`${name}.png`, ARTIFACTS).pathname,
    fullPage: opts.fullPage ?? true,
  });
}

/** Share of canvas pixels that are not fully transparent or background-white. */
export async function inkedShare(page: Page, selector: string): Promise<number> {
  return page.$$eval(selector, (canvases) => {
    let inked = 0;
    let total = 0;
    for (const c of canvases as HTMLCanvasElement[]) {
      const g = c.getContext('2d');
      if (!g || c.width === 0 || c.height === 0) continue;
      const d = g.getImageData(0, 0, c.width, c.height).data;
      for (let i = 0; i < d.length; i += 4) {
        total++;
        if (d[i + 3]! > 0 && !(d[i]! > 245 && d[i + 1]! > 245 && d[i + 2]! > 245)) inked++;
      }
    }
    return total ? inked / total : 0;
  });
}
