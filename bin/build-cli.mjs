/**
 * Bundles the command line (src/cli/entry.ts) with esbuild into build/cli/tufa.mjs, one ES module
 * that node starts in a few tens of milliseconds (tsx compiles the sources on every start: ~1 s).
 * Runs on `npm ci` / `npm install` as the `prepare` script, and again from bin/tufa.mjs whenever a
 * source file changed since the last bundle, so the command never runs stale code.
 * Beside the bundle it writes the list of its input files with their modification times.
 */

import { mkdirSync, renameSync, statSync, writeFileSync } from 'node:fs';
import { dirname, join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
export const BUNDLE = join(root, 'build', 'cli', 'tufa.mjs');
export const INPUTS = join(root, 'build', 'cli', 'inputs.json');

export async function buildCli() {
  const { build } = await import('esbuild');
  mkdirSync(dirname(BUNDLE), { recursive: true });
  // Written under a private name, then renamed: two processes that rebuild at once never see half a file.
  const tmp = `${BUNDLE}.${process.pid}.tmp`;
  const result = await build({
    entryPoints: [join(root, 'src', 'cli', 'entry.ts')],
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    outfile: tmp,
    metafile: true,
    logLevel: 'warning',
    banner: { js: '// Built by bin/build-cli.mjs from src/cli; do not edit.' },
  });
  const inputs = Object.keys(result.metafile.inputs).map((f) => {
    const rel = relative(root, join(root, f));
    return [rel, statSync(join(root, rel)).mtimeMs];
  });
  writeFileSync(`${INPUTS}.${process.pid}.tmp`, JSON.stringify({ inputs }));
  renameSync(tmp, BUNDLE);
  renameSync(`${INPUTS}.${process.pid}.tmp`, INPUTS);
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) await buildCli();
