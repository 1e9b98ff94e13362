/**
 * Installable and accessible: the manifest is served and valid, icons are real PNGs of the sizes
 * claimed, the service worker controls the page, the first-load JS stays in budget, and axe-core
 * finds no serious or critical violations on the main screens (light, dark and high contrast).
 */

import { readFileSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { fileURLToPath } from 'node:url';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { SHELL_BUDGET_BYTES, shellSize } from '../bench/size-budget';
import { launch, newContext, openApp, screenshot, untilControlled } from './browser';

let browser: Browser;
let page: Page;
const base = inject('baseUrl');
const axePath = createRequire(import.meta.url).resolve('axe-core/axe.min.js');

beforeAll(async () => {
  browser = await launch();
  page = await (await newContext(browser, { width: 412 })).newPage();
});
afterAll(async () => browser?.close());

interface Violation {
  id: string;
  impact: string | null;
  help: string;
  nodes: { target: string[] }[];
}

async function axe(p: Page): Promise<Violation[]> {
  // Through the DevTools protocol: the app's Content-Security-Policy refuses inline <script> tags.
  if (!(await p.evaluate(() => 'axe' in window)))
    await p.evaluate(`${readFileSync(axePath, 'utf8')};undefined`);
  return p.evaluate(async () => {
    const w = window as unknown as {
      axe: { run: (ctx: Document, o: object) => Promise<{ violations: Violation[] }> };
    };
    const r = await w.axe.run(document, { resultTypes: ['violations'] });
    return r.violations.map((v) => ({
      id: v.id,
      impact: v.impact,
      help: v.help,
      nodes: v.nodes.map((n) => ({ target: n.target })),
    }));
  });
}

function serious(vs: Violation[]): string[] {
  return vs
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id} (${v.impact}): ${v.help} at ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
}

describe('installable app', () => {
  it('serves a valid manifest with 192/512 px and maskable PNG icons', async () => {
    const res = await fetch(new URL('manifest.webmanifest', base));
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toContain('manifest+json');
    const m = (await res.json()) as {
      name: string;
      short_name: string;
      start_url: string;
      display: string;
      icons: { src: string; sizes: string; type: string; purpose?: string }[];
    };
    expect(m.name).toMatch(/Tufa/);
    expect(m.short_name).toBe('Tufa');
    expect(['standalone', 'fullscreen', 'minimal-ui']).toContain(m.display);
    expect(m.start_url).toBeTruthy();
    for (const size of [192, 512]) {
      for (const purpose of ['any', 'maskable']) {
        const icon = m.icons.find(
          (i) => i.sizes === `${size}x${size}` && (i.purpose ?? 'any').split(' ').includes(purpose),
        );
        expect(icon, `${size} ${purpose}`).toBeDefined();
        const png = Buffer.from(await (await fetch(new URL(icon!.src, base))).arrayBuffer());
        // PNG signature, then IHDR width and height (big-endian) at bytes 16 and 20.
        expect(png.subarray(1, 4).toString('ascii')).toBe('PNG');
        expect([png.readUInt32BE(16), png.readUInt32BE(20)]).toEqual([size, size]);
      }
    }
    await openApp(page, base);
    const link = await page.evaluate(() =>
      document.querySelector('link[rel="manifest"]')?.getAttribute('href'),
    );
    expect(link).toMatch(/manifest\.webmanifest$/);
  });

  it('is controlled by the service worker', async () => {
    await openApp(page, base);
    await untilControlled(page);
    const script = await page.evaluate(() => navigator.serviceWorker.controller?.scriptURL);
    expect(script).toBe(new URL('sw.js', base).href);
  });

  it('offers a new version instead of activating it silently', async () => {
    const context = await newContext(browser);
    const p = await context.newPage();
    const swFile = fileURLToPath(new URL('../../dist/sw.js', import.meta.url));
    const original = readFileSync(swFile, 'utf8');
    try {
      await openApp(p, base);
      await untilControlled(p);
      // A new deploy: the worker script changes on the server.
      writeFileSync(swFile, `${original}\n// next version ${Date.now()}\n`);
      await p.evaluate(() => navigator.serviceWorker.getRegistration().then((r) => r?.update()));
      await p.getByText('A new version of Tufa is ready.').waitFor({ timeout: 20_000 });
      expect(
        await p.evaluate(() => navigator.serviceWorker.getRegistration().then((r) => !!r?.waiting)),
      ).toBe(true);
      await screenshot(p, '09-update-prompt', { fullPage: false });
      await Promise.all([
        p.waitForEvent('load'),
        p.getByRole('button', { name: 'Reload to update' }).click(),
      ]);
      await p.waitForSelector('html[data-ready="true"]');
      const after = await p.evaluate(() =>
        navigator.serviceWorker
          .getRegistration()
          .then((r) => ({ waiting: !!r?.waiting, controlled: !!navigator.serviceWorker.controller })),
      );
      expect(after).toEqual({ waiting: false, controlled: true });
      expect(await p.getByText('A new version of Tufa is ready.').count()).toBe(0);
    } finally {
      writeFileSync(swFile, original);
      await context.close();
    }
  });

  it('keeps the first-load JavaScript of the shell within 100 KB gzip', () => {
    const s = shellSize();
    expect(s.files.length).toBeGreaterThan(0);
    expect(s.gzipTotal).toBeLessThanOrEqual(SHELL_BUDGET_BYTES);
  });

  it('has no serious accessibility violations on the main screens, in every theme', async () => {
    await openApp(page, base);
    await page.getByRole('button', { name: 'Load demo scenario' }).click();
    await page.getByRole('link', { name: /Garage reef tank/ }).waitFor();
    const problems: string[] = [];
    for (const theme of ['light', 'dark', 'contrast'] as const) {
      await page.goto(`${base}#/settings`);
      await page.waitForSelector('html[data-ready="true"]');
      await page.getByLabel('Theme').selectOption(theme);
      await expect.poll(() => page.evaluate(() => document.documentElement.dataset.theme)).toBe(theme);
      const screens: [string, () => Promise<void>][] = [
        [
          'settings',
          async () => {
            // The sync and data panels load after the screen: check them too.
            await page.getByRole('heading', { name: 'Sharing with a server' }).waitFor();
            await page.getByRole('heading', { name: 'Data in and out' }).waitFor();
          },
        ],
        ['sites', async () => void (await page.getByRole('link', { name: 'Sites', exact: true }).click())],
        ['site', async () => void (await page.getByRole('link', { name: /Garage reef tank/ }).click())],
        ['entry', async () => void (await page.getByRole('link', { name: 'New reading' }).click())],
        [
          'detail',
          async () => {
            await page.goBack();
            await page.locator('.log a').first().click();
          },
        ],
      ];
      for (const [name, go] of screens) {
        await go();
        await page.waitForTimeout(300);
        if (theme === 'light' || name === 'site')
          await screenshot(page, `10-${theme}-${name}-phone`, { fullPage: false });
        for (const p of serious(await axe(page))) problems.push(`${theme}/${name}: ${p}`);
      }
    }
    expect(problems).toEqual([]);
  });
});
