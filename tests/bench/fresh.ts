/**
 * Fresh-model throughput beside the saline model, through the same `solve()` JSON path, so the
 * figure includes everything a user gets back (constants, pair, indices, CCPP, air equilibrium).
 * Target (issue 3): a fresh solve costs no more than three times a saline solve.
 * Rows are invented but typical: streams and wells (fresh), coastal and open sea (saline).
 */

import { solve } from '../../src/chem/solve';
import { between, mulberry32 } from './random';

const N = 20_000;

function time(fn: () => void): number {
  fn(); // warm-up: let the JIT settle before timing
  const t0 = performance.now();
  fn();
  return (performance.now() - t0) / 1000;
}

function fmt(x: number): string {
  return Math.round(x).toLocaleString('en-US');
}

export function benchFresh(): string[] {
  const rand = mulberry32(20261202);
  const saline: Record<string, unknown>[] = [];
  const freshConductance: Record<string, unknown>[] = [];
  const freshIons: Record<string, unknown>[] = [];
  for (let i = 0; i < N; i++) {
    const t = between(rand, 2, 30);
    saline.push({
      temperature_c: t,
      salinity: between(rand, 20, 40),
      alkalinity_umol_kg: between(rand, 2000, 2400),
      dic_umol_kg: between(rand, 1800, 2200),
    });
    const ta = between(rand, 300, 5000);
    const ph = between(rand, 6.8, 8.6);
    const ca = between(rand, 5, 150);
    freshConductance.push({
      model: 'fresh',
      temperature_c: t,
      ph,
      alkalinity_umol_kg: ta,
      specific_conductance_us_cm: between(rand, 50, 1500),
      calcium_mg_l: ca,
    });
    freshIons.push({
      model: 'fresh',
      temperature_c: t,
      ph,
      alkalinity_umol_kg: ta,
      calcium_mg_l: ca,
      magnesium_mg_l: ca / 4,
      sodium_mg_l: between(rand, 2, 60),
      potassium_mg_l: between(rand, 0.5, 5),
      chloride_mg_l: between(rand, 2, 80),
      sulfate_mg_l: between(rand, 2, 100),
    });
  }
  let errors = 0;
  const run = (rows: Record<string, unknown>[]) => () => {
    for (const r of rows) if ('error' in solve(r)) errors++;
  };
  const tSaline = time(run(saline));
  const tFreshSc = time(run(freshConductance));
  const tFreshIons = time(run(freshIons));
  return [
    `saline solve() TA–DIC:                              ${fmt(N / tSaline)} rows/s`,
    `fresh solve() pH–TA, I from conductance, all indices: ${fmt(N / tFreshSc)} rows/s (cost ×${(tFreshSc / tSaline).toFixed(2)} of saline)`,
    `fresh solve() pH–TA, I iterated from major ions:      ${fmt(N / tFreshIons)} rows/s (cost ×${(tFreshIons / tSaline).toFixed(2)} of saline)`,
    `target: fresh cost ≤ ×3 of saline; rows that failed: ${errors}`,
  ];
}
