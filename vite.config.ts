import { fileURLToPath } from 'node:url';
import preact from '@preact/preset-vite';
import type { Plugin } from 'vite';
import { VitePWA } from 'vite-plugin-pwa';
import { defineConfig } from 'vitest/config';

const here = (p: string) => fileURLToPath(new URL(p, import.meta.url));

/**
 * The Content-Security-Policy of the built app, set as a `<meta http-equiv>` tag by a build-only
 * Vite plugin (the dev server injects inline styles and scripts for hot reload, so it has none).
 * A meta tag works on any static host, including ones that cannot set headers.
 *
 * No inline script, no eval, no plugins; scripts, styles, workers, images and the manifest come
 * from the app's own origin only. `connect-src` is the one open directive: the sync server is
 * typed in by the user at run time, while a page's policy is fixed when it loads (a later meta
 * tag can only narrow it). So it allows the app's origin, any https server, and plain http only
 * on this device's loopback (a server on the same computer, and the tests); plain http elsewhere
 * is refused, as a browser would refuse it from an https page anyway (mixed content).
 * `frame-ancestors` cannot be set from a meta tag; a host that sends headers should add it.
 */
const CSP_DIRECTIVES: Record<string, string> = {
  'default-src': "'self'",
  'script-src': "'self'",
  'style-src': "'self'",
  'img-src': "'self' data: blob:",
  'font-src': "'self'",
  'worker-src': "'self'",
  'manifest-src': "'self'",
  'connect-src': "'self' https: http://localhost:* http://127.0.0.1:*",
  'object-src': "'none'",
  'base-uri': "'self'",
  'form-action': "'self'",
};

const CSP = Object.entries(CSP_DIRECTIVES)
  .map(([k, v]) => `${k} ${v}`)
  .join('; ');

function cspPlugin(): Plugin {
  return {
    name: 'tufa-csp',
    apply: 'build',
    transformIndexHtml: {
      order: 'post',
      handler: () => [
        {
          tag: 'meta',
          attrs: { 'http-equiv': 'Content-Security-Policy', content: CSP },
          injectTo: 'head-prepend',
        },
      ],
    },
  };
}

// The page lives in src/ (index.html there); static assets in public/; the build goes to dist/.
export default defineConfig({
  root: 'src',
  base: './',
  publicDir: '../public',
  build: { outDir: '../dist', emptyOutDir: true },
  worker: { format: 'es' },
  plugins: [
    preact(),
    cspPlugin(),
    VitePWA({
      strategies: 'injectManifest',
      srcDir: here('./sw'),
      filename: 'sw.ts',
      // We register the worker ourselves (src/ui/sw-register.ts) to show an update prompt.
      injectRegister: false,
      registerType: 'prompt',
      injectManifest: {
        // Vite 8 builds the worker as an ES module but it is registered as a classic script:
        // without iife, registration fails and the app is not offline (see docs/toolchain.md).
        rollupFormat: 'iife',
        globPatterns: ['**/*.{js,css,html,png,webmanifest}'],
        // Store screenshots are for install prompts, not for working offline.
        globIgnores: ['screenshots/**'],
      },
      manifest: {
        name: 'Tufa — carbonate system of natural waters',
        short_name: 'Tufa',
        description: 'From field measurements to the full carbonate system of a water, offline.',
        start_url: './',
        scope: './',
        display: 'standalone',
        background_color: '#f6f4ef',
        theme_color: '#17323a',
        icons: [
          { src: 'icons/icon-192.png', sizes: '192x192', type: 'image/png', purpose: 'any' },
          { src: 'icons/icon-512.png', sizes: '512x512', type: 'image/png', purpose: 'any' },
          { src: 'icons/maskable-192.png', sizes: '192x192', type: 'image/png', purpose: 'maskable' },
          { src: 'icons/maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
        ],
        screenshots: [
          {
            src: 'screenshots/site-phone.png',
            sizes: '412x900',
            type: 'image/png',
            form_factor: 'narrow',
            label: 'A site log with its time series',
          },
          {
            src: 'screenshots/reading-wide.png',
            sizes: '1100x971',
            type: 'image/png',
            form_factor: 'wide',
            label: 'Entering a reading, results as you type',
          },
        ],
      },
    }),
  ],
  test: {
    root: '.',
    setupFiles: ['tests/setup.ts'],
    // Two shared cores: generous limits, since property tests and CLI spawns slow down under load.
    testTimeout: 60_000,
    // Under CI a JSON report is written too, so .ci/run can print one plain "N passed, N failed" line.
    reporters: process.env.CI
      ? ['default', ['json', { outputFile: 'test-artifacts/vitest.json' }]]
      : ['default'],
    environment: 'node',
    // Two cores: keep the pool small so browser tests and unit tests do not starve each other.
    maxWorkers: 2,
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          include: ['tests/**/*.test.ts'],
          exclude: ['tests/browser/**'],
          environment: 'node',
        },
      },
      {
        extends: true,
        test: {
          name: 'browser',
          include: ['tests/browser/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/browser/global-setup.ts'],
          // One Chromium at a time, one file after another.
          fileParallelism: false,
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
});
