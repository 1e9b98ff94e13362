import preact from '@preact/preset-vite';
import { defineConfig } from 'vitest/config';

// The page lives in src/ (index.html there); static assets in public/; the build goes to dist/.
export default defineConfig({
  root: 'src',
  publicDir: '../public',
  build: { outDir: '../dist', emptyOutDir: true },
  plugins: [preact()],
  test: {
    root: '.',
    include: ['tests/**/*.test.ts'],
    setupFiles: ['tests/setup.ts'],
    // Two shared cores: generous limits, since property tests and CLI spawns slow down under load.
    testTimeout: 60_000,
    environment: 'node',
    // Two cores: keep the pool small so browser tests and unit tests do not starve each other.
    maxWorkers: 2,
  },
});
