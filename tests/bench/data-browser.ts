/**
 * The CSV import benchmark in headless Debian Chromium (playwright-core, no browser download):
 * bundles `data-browser-entry.ts` with Vite, serves it on a loopback port, runs it in a page.
 */

import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { createServer } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium } from 'playwright-core';
import { build } from 'vite';

export async function benchImportChromium(rows = 100_000): Promise<string[]> {
  const out = mkdtempSync(join(tmpdir(), 'tufa-bench-browser-'));
  try {
    await build({
      configFile: false,
      logLevel: 'error',
      root: process.cwd(),
      build: {
        outDir: out,
        emptyOutDir: true,
        minify: false,
        lib: {
          entry: join(process.cwd(), 'tests/bench/data-browser-entry.ts'),
          formats: ['iife'],
          name: 'tufaBench',
          fileName: () => 'bench.js',
        },
      },
    });
    const js = readFileSync(join(out, 'bench.js'));
    const server = createServer((req, res) => {
      if (req.url === '/bench.js') {
        res.writeHead(200, { 'content-type': 'text/javascript' }).end(js);
      } else {
        res
          .writeHead(200, { 'content-type': 'text/html' })
          .end('<!doctype html><meta charset="utf-8"><script src="/bench.js"></script>');
      }
    });
    await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
    const addr = server.address();
    const port = typeof addr === 'object' && addr ? addr.port : 0;
    const browser = await chromium.launch({
      executablePath: '/usr/bin/chromium',
      args: [
        '--no-sandbox',
        '--disable-gpu',
        '--disable-dev-shm-usage',
        '--disable-quic',
        '--no-first-run',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
      ],
    });
    try {
      const page = await browser.newPage();
      await page.goto(`http://127.0.0.1:${port}/`);
      await page.waitForFunction(() => typeof window.tufaBenchImport === 'function');
      return await page.evaluate((n) => window.tufaBenchImport(n), rows);
    } finally {
      await browser.close();
      server.close();
    }
  } finally {
    rmSync(out, { recursive: true, force: true });
  }
}
