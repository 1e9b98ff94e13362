/**
 * The app's own store and chart modules bundled for injection into a page (tests and benchmarks
 * call the real repository in Chromium instead of writing raw object stores).
 */

import { fileURLToPath } from 'node:url';
import { build } from 'esbuild';
import type { Page } from 'playwright-core';

const ENTRY = fileURLToPath(new URL('../bench/browser-entry.ts', import.meta.url));
let cached: string | undefined;

export async function appModulesBundle(): Promise<string> {
  if (cached) return cached;
  const out = await build({
    entryPoints: [ENTRY],
    bundle: true,
    format: 'iife',
    globalName: 'TufaModules',
    write: false,
    minify: true,
    // tsx would otherwise wrap functions passed to page.evaluate with a helper the page lacks.
    keepNames: false,
    loader: { '.css': 'empty' },
    target: 'es2022',
  });
  cached = out.outputFiles[0]!.text;
  return cached;
}

/** Makes `window.TufaModules` (openRepository, createTimeChart, mergeSeries, decimate) available. */
export async function injectAppModules(page: Page): Promise<void> {
  if (await page.evaluate(() => 'TufaModules' in window)) return;
  // Evaluated through the DevTools protocol, not as an inline <script>, which the app's
  // Content-Security-Policy forbids (see vite.config.ts).
  await page.evaluate(`${await appModulesBundle()};window.TufaModules = TufaModules;undefined`);
}
