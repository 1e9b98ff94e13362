import { spawnSync } from 'node:child_process';

/**
 * Runs the `tufa` command as installed: node on bin/tufa.mjs, which runs the install-time bundle
 * (rebuilt first if a source changed). `npx tufa` and `npm run -s tufa` reach the same file; one
 * test in bin.test.ts goes through both, the rest skip npm's own ~0.5 s start.
 */
export function tufa(args: string[], stdin = ''): { status: number | null; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, ['bin/tufa.mjs', ...args], {
    input: stdin,
    encoding: 'utf8',
    maxBuffer: 1 << 28,
  });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}
