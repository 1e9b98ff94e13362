/**
 * First-load JavaScript of the app shell, gzipped: every script the built index.html loads or
 * preloads, and their static imports (not the lazily loaded chart or the engine worker). Budget:
 * 100 KB. Run after a build: `npx tsx tests/bench/size-budget.ts` (exit 1 above budget); the
 * browser tests run the same check on every `npm test`.
 */

import { existsSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { gzipSync } from 'node:zlib';

export const SHELL_BUDGET_BYTES = 100 * 1024;

export interface ShellSize {
  files: { file: string; raw: number; gzip: number }[];
  gzipTotal: number;
}

export function shellSize(distDir = fileURLToPath(new URL('../../dist/', import.meta.url))): ShellSize {
  const html = readFileSync(`${distDir}/index.html`, 'utf8');
  const queue = [
    ...html.matchAll(/<(?:script[^>]*\ssrc|link[^>]*rel="modulepreload"[^>]*\shref)="\.?\/?([^"]+\.js)"/g),
  ].map((m) => m[1]!);
  const seen = new Set<string>();
  const files: ShellSize['files'] = [];
  while (queue.length) {
    const file = queue.shift()!;
    if (seen.has(file)) continue;
    seen.add(file);
    const path = `${distDir}/${file}`;
    if (!existsSync(path)) throw new Error(`index.html loads ${file}, which is not in dist/`);
    const code = readFileSync(path);
    files.push({ file, raw: code.length, gzip: gzipSync(code, { level: 9 }).length });
    // Static imports between chunks are loaded up front too; dynamic import() ones are not.
    const dir = file.includes('/') ? file.slice(0, file.lastIndexOf('/') + 1) : '';
    for (const m of code
      .toString('utf8')
      .matchAll(/\bimport\s*(?:[\w{}\s,*$]+from\s*)?["'`]\.\/([^"'`]+\.js)["'`]/g)) {
      queue.push(dir + m[1]!);
    }
  }
  return { files, gzipTotal: files.reduce((n, f) => n + f.gzip, 0) };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const s = shellSize();
  for (const f of s.files) {
    console.log(`${f.file}  ${(f.raw / 1024).toFixed(1)} KB raw, ${(f.gzip / 1024).toFixed(1)} KB gzip`);
  }
  const ok = s.gzipTotal <= SHELL_BUDGET_BYTES;
  console.log(
    `shell first-load JS: ${(s.gzipTotal / 1024).toFixed(1)} KB gzip (budget ${SHELL_BUDGET_BYTES / 1024} KB) ${ok ? 'OK' : 'OVER BUDGET'}`,
  );
  if (!ok) process.exit(1);
}
