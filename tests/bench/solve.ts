/**
 * Saline solver throughput: 100 000 random rows for TA–DIC, TA–pH and pH–pCO2, with constants
 * recomputed per row and with one constant set shared, plus the ratio of the pair solve's time to
 * the time of evaluating its constants. Also the whole JSON `solve()` path per row.
 */

import { salineConstants } from '../../src/chem/saline/constants';
import { solve } from '../../src/chem/solve';
import { type Param, solvePair, stateFromHDic } from '../../src/chem/solver/pairs';
import type { Conditions, MinorTotals } from '../../src/chem/types';
import { between, mulberry32 } from './random';

const N = 100_000;
const minor: MinorTotals = { phosphate: 1e-6, silicate: 10e-6, ammonia: 0, sulfide: 0 };

interface Rows {
  cond: Conditions[];
  ta: Float64Array;
  dic: Float64Array;
  ph: Float64Array;
  co2: Float64Array;
}

function makeRows(): Rows {
  const rand = mulberry32(20261201);
  const rows: Rows = {
    cond: [],
    ta: new Float64Array(N),
    dic: new Float64Array(N),
    ph: new Float64Array(N),
    co2: new Float64Array(N),
  };
  for (let i = 0; i < N; i++) {
    const cond = { temperatureC: between(rand, 0, 35), salinity: between(rand, 20, 40), pressureDbar: 0 };
    const k = salineConstants(cond);
    const s = stateFromHDic(10 ** -between(rand, 7.6, 8.4), between(rand, 1800e-6, 2300e-6), k, minor);
    rows.cond.push(cond);
    rows.ta[i] = s.ta;
    rows.dic[i] = s.dic;
    rows.ph[i] = -Math.log10(s.h);
    rows.co2[i] = s.co2;
  }
  return rows;
}

function time(fn: () => void): number {
  fn(); // warm-up: let the JIT settle before timing
  const t0 = performance.now();
  fn();
  return (performance.now() - t0) / 1000;
}

let sink = 0;

export function benchSolve(): string[] {
  const rows = makeRows();
  const shared = salineConstants({ temperatureC: 25, salinity: 35, pressureDbar: 0 });
  const constantsTime = time(() => {
    for (let i = 0; i < N; i++) sink += salineConstants(rows.cond[i]!).k1;
  });
  const lines = [
    `saline constants: ${fmt(N / constantsTime)} sets/s (${((constantsTime / N) * 1e9).toFixed(0)} ns each)`,
  ];
  const pairs: [string, Param, Float64Array, Param, Float64Array][] = [
    ['TA–DIC', 'ta', rows.ta, 'dic', rows.dic],
    ['TA–pH', 'ta', rows.ta, 'ph', rows.ph],
    ['pH–pCO2', 'ph', rows.ph, 'co2', rows.co2],
  ];
  for (const [name, a, va, b, vb] of pairs) {
    const perRow = time(() => {
      for (let i = 0; i < N; i++) {
        const k = salineConstants(rows.cond[i]!);
        sink += solvePair(a, va[i]!, b, vb[i]!, k, minor)[0]!.h;
      }
    });
    const sharedTime = time(() => {
      for (let i = 0; i < N; i++) sink += solvePair(a, va[i]!, b, vb[i]!, shared, minor)[0]!.h;
    });
    lines.push(
      `${name.padEnd(8)} per-row constants ${fmt(N / perRow)} solves/s; shared constants ${fmt(N / sharedTime)} solves/s; solve/constants time ratio ${(sharedTime / constantsTime).toFixed(2)}`,
    );
  }
  const inputs = Array.from({ length: N }, (_, i) => ({
    temperature_c: rows.cond[i]!.temperatureC,
    salinity: rows.cond[i]!.salinity,
    alkalinity_umol_kg: rows.ta[i]! * 1e6,
    dic_umol_kg: rows.dic[i]! * 1e6,
  }));
  const full = time(() => {
    for (let i = 0; i < N; i++) sink += 'error' in solve(inputs[i]) ? 0 : 1;
  });
  lines.push(`solve() JSON API, TA–DIC, all outputs: ${fmt(N / full)} rows/s`);
  if (sink === 42) lines.push('');
  return lines;
}

function fmt(x: number): string {
  return Math.round(x).toLocaleString('en-US');
}
