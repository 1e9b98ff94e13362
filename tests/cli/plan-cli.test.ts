import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { tufa } from './run-tufa';

// An invented hatchery header tank.
const request = {
  water: { temperature_c: 16, salinity: 33, alkalinity_umol_kg: 2200, pco2_uatm: 1200 },
  volume_l: 2000,
  actions: [
    { action: 'equilibrate', fraction: 0.8 },
    {
      action: 'reach',
      chemical: 'sodium_bicarbonate',
      target: { alkalinity_umol_kg: 2500 },
      max_ph_step: 0.05,
    },
  ],
};

// Each case spawns npm and tsx; on a shared two-core machine that takes seconds.
describe('tufa plan', { timeout: 60_000 }, () => {
  it('writes the before and after waters in the solve format, the doses and the cautions', () => {
    const r = tufa(['plan'], JSON.stringify(request));
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.before.pair).toEqual(['alkalinity_umol_kg', 'pco2_uatm']);
    expect(out.steps).toHaveLength(2);
    expect(out.after.alkalinity_umol_kg).toBeCloseTo(2500, 5);
    expect(typeof out.after.omega_aragonite).toBe('number');
    expect(out.steps[1].dose.measure.mass_g).toBeGreaterThan(0);
    expect(out.water.alkalinity_umol_kg).toBeCloseTo(2500, 5);
    expect(out.cautions.defer).toMatch(/label/);
  });

  it('reads a file and prints a table with --text', () => {
    const dir = mkdtempSync(join(tmpdir(), 'tufa-plan-'));
    const file = join(dir, 'plan.json');
    writeFileSync(file, `\uFEFF${JSON.stringify(request)}`);
    const r = tufa(['plan', '--file', file, '--text']);
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/before\s+1 equilibrate\s+2 reach/);
    expect(r.stdout).toMatch(/Cautions:/);
    expect(r.stdout).toMatch(/common practice/);
  });

  it('a failed plan is a coded error with exit 1; bad arguments exit 2', () => {
    const bad = tufa(
      ['plan'],
      JSON.stringify({ ...request, actions: [{ action: 'add', chemical: 'sodium_bicarbonate' }] }),
    );
    expect(bad.status).toBe(1);
    expect(JSON.parse(bad.stdout).error.code).toBe('missing-amount');
    expect(tufa(['plan'], '{oops').status).toBe(1);
    expect(tufa(['plan', '--frobnicate']).status).toBe(2);
  });

  it('has help and a chemical list', () => {
    expect(tufa(['plan', '--help']).stdout).toMatch(/max_alkalinity_step_dkh/);
    expect(tufa(['plan', '--chemicals']).stdout).toMatch(/sodium_bicarbonate\s+NaHCO3\s+84\.00/);
    expect(tufa(['--help']).stdout).toMatch(/plan/);
  });
});
