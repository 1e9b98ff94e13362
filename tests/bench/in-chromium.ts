/**
 * Runs a TypeScript entry in a headless Debian Chromium page (playwright-core, no browser
 * download): bundles it with Vite (Preact JSX included), serves it on a loopback port with
 * `styles` inlined, and hands the page to `use`. Used by the data benchmark and the sync panel test.
 */

import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { createServer } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import preact from '@preact/preset-vite';
import { chromium, type Page } from 'playwright-core';
import { build } from 'vite';
import { CHROMIUM, CHROMIUM_ARGS } from '../browser/browser';

export async function inChromium<T>(
  entry: string,
  use: (page: Page) => Promise<T>,
  opts: { css?: string; viewport?: { width: number; height: number } } = {},
): Promise<T> {
  const out = mkdtempSync(join(tmpdir(), 'tufa-page-'));
  try {
    await build({
      configFile: false,
      logLevel: 'error',
      root: process.cwd(),
      plugins: [preact()],
      build: {
        outDir: out,
        emptyOutDir: true,
        minify: false,
        lib: {
          entry: join(process.cwd(), entry),
          formats: ['iife'],
          name: 'tufaPage',
          fileName: () => 'page.js',
        },
      },
    });
    const js = readFileSync(join(out, 'page.js'));
    const css = opts.css ? readFileSync(join(process.cwd(), opts.css), 'utf8') : '';
    const html = `<!doctype html><html lang="en"><meta charset="utf-8"><meta name="viewport" content="width=device-width"><title>Tufa</title><style>${css}</style><body><main id="app"></main><script src="/page.js"></script></body></html>`;
    const server = createServer((req, res) => {
      if (req.url === '/page.js') res.writeHead(200, { 'content-type': 'text/javascript' }).end(js);
      else res.writeHead(200, { 'content-type': 'text/html' }).end(html);
    });
    await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
    const addr = server.address();
    const port = typeof addr === 'object' && addr ? addr.port : 0;
    const browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
    try {
      const page = await browser.newPage({ viewport: opts.viewport ?? { width: 900, height: 1200 } });
      await page.goto(`http://127.0.0.1:${port}/`);
      return await use(page);
    } finally {
      await browser.close();
      server.close();
    }
  } finally {
    rmSync(out, { recursive: true, force: true });
  }
}
