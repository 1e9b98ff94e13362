import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';

const ok = { temperature_c: 25, salinity: 35, alkalinity_umol_kg: 2300, dic_umol_kg: 2000 };

describe('the tufa command', { timeout: 60_000 }, () => {
  it('is a bin of the package, reached by npx and by npm run alike', () => {
    const pkg = JSON.parse(readFileSync('package.json', 'utf8'));
    expect(pkg.bin.tufa).toBe('bin/tufa.mjs');
    expect(pkg.scripts.prepare).toContain('bin/build-cli.mjs');
    for (const cmd of [
      ['npx', '--no-install', 'tufa', 'solve', '--fields', 'ph_total'],
      ['npm', 'run', '-s', 'tufa', '--', 'solve', '--fields', 'ph_total'],
    ]) {
      const r = spawnSync(cmd[0]!, cmd.slice(1), { input: `${JSON.stringify(ok)}\n`, encoding: 'utf8' });
      expect(r.status, r.stderr).toBe(0);
      expect(JSON.parse(r.stdout).ph_total).toBeCloseTo(8.0401, 3);
    }
  });

  it('the bundle lists its sources, so a changed source is bundled again before it runs', () => {
    spawnSync(process.execPath, ['bin/tufa.mjs', '--help']);
    const { inputs } = JSON.parse(readFileSync('build/cli/inputs.json', 'utf8')) as {
      inputs: [string, number][];
    };
    const files = inputs.map(([f]) => f);
    expect(files).toContain('src/cli/main.ts');
    expect(files).toContain('src/chem/solve.ts');
    expect(files.every((f) => !f.startsWith('node_modules'))).toBe(true);
  });
});
