/**
 * Builds the app once and serves dist/ on a loopback port for the browser tests. Set
 * TUFA_SKIP_BUILD=1 to reuse an existing dist/ while iterating on tests.
 */

import { fileURLToPath } from 'node:url';
import { build } from 'vite';
import type { TestProject } from 'vitest/node';
import { serveDir } from './static-server';

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string;
  }
}

export default async function setup(project: TestProject) {
  const root = fileURLToPath(new URL('../../', import.meta.url));
  if (!process.env.TUFA_SKIP_BUILD) {
    // Vitest sets NODE_ENV=test, which would make Vite build a development bundle (dev JSX,
    // import.meta.env.DEV true, no service worker registration). Build what users get.
    const saved = process.env.NODE_ENV;
    process.env.NODE_ENV = 'production';
    try {
      await build({
        root: `${root}src`,
        configFile: `${root}vite.config.ts`,
        mode: 'production',
        logLevel: 'warn',
      });
    } finally {
      process.env.NODE_ENV = saved;
    }
  }
  const { server, url } = await serveDir(`${root}dist`);
  project.provide('baseUrl', url);
  return () => new Promise<void>((resolve) => server.close(() => resolve()));
}
