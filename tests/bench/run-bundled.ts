/** Bundles a benchmark entry with esbuild (ESM, Node) into a temporary folder and runs it with node. */

import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildSync } from 'esbuild';

const entry = process.argv[2] ?? 'tests/bench/engine.ts';
const dir = mkdtempSync(join(tmpdir(), 'tufa-bench-'));
const outfile = join(dir, 'bench.mjs');
buildSync({
  entryPoints: [entry],
  bundle: true,
  platform: 'node',
  format: 'esm',
  outfile,
  logLevel: 'warning',
});
const r = spawnSync(process.execPath, [outfile], { stdio: 'inherit' });
rmSync(dir, { recursive: true, force: true });
process.exitCode = r.status ?? 1;
