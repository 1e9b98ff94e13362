import { fileURLToPath } from 'node:url';
import preact from '@preact/preset-vite';
import { VitePWA } from 'vite-plugin-pwa';
import { defineConfig } from 'vitest/config';

const here = (p: string) => fileURLToPath(new URL(p, import.meta.url));

// The page lives in src/ (index.html there); static assets in public/; the build goes to dist/.
export default defineConfig({
  root: 'src',
  base: './',
  publicDir: '../public',
  build: { outDir: '../dist', emptyOutDir: true },
  worker: { format: 'es' },
  plugins: [
    preact(),
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
