#!/usr/bin/env node
/**
 * The `tufa` command (`npx tufa …`, `npm run -s tufa -- …`): runs the bundle made at install time
 * by bin/build-cli.mjs, after checking that none of its source files changed since (one stat per
 * file, about a millisecond); if one did, or there is no bundle yet, it bundles again first.
 */

import { readFileSync, statSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const bundle = join(root, 'build', 'cli', 'tufa.mjs');

function isFresh() {
  try {
    const { inputs } = JSON.parse(readFileSync(join(root, 'build', 'cli', 'inputs.json'), 'utf8'));
    statSync(bundle);
    return inputs.every(([file, mtime]) => statSync(join(root, file)).mtimeMs === mtime);
  } catch {
    return false;
  }
}

if (!isFresh()) await (await import('./build-cli.mjs')).buildCli();
await import(pathToFileURL(bundle).href);
