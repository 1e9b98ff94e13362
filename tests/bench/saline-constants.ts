/**
 * How long one saline constant set takes, per row, as a batch solve would call it: conditions vary
 * from row to row, so nothing can be reused. Prints ns per call for the surface and for depth (the
 * pressure branch adds 15 exponentials). Run: `npx tsx tests/bench/saline-constants.ts`.
 * Target (issue 2): about 1–2 µs per call, so the 250 000 solves/s budget is not spent here.
 */

import { salineConstants } from '../../src/chem/saline/constants';

export interface SalineConstantsFigures {
  surfaceNsPerCall: number;
  depthNsPerCall: number;
  millero2010NsPerCall: number;
  callsPerSecond: number;
}

function timeIt(n: number, pressure: boolean, millero2010: boolean): number {
  const opts = millero2010 ? { carbonic: 'millero2010' as const } : undefined;
  let sink = 0;
  const t0 = process.hrtime.bigint();
  for (let i = 0; i < n; i++) {
    // Rows spread over a plausible survey: 4–33 °C, S 30–36, and 0–4000 dbar when at depth.
    const c = salineConstants(
      { temperatureC: 4 + (i % 30), salinity: 30 + (i % 7), pressureDbar: pressure ? (i % 5) * 1000 + 1 : 0 },
      opts,
    );
    sink += c.k1;
  }
  const ns = Number(process.hrtime.bigint() - t0) / n;
  if (!(sink > 0)) throw new Error('benchmark produced no constants');
  return ns;
}

/** Best of `rounds` after one warm-up round: the machine is shared, the minimum is the honest figure. */
export function benchSalineConstants(n = 400_000, rounds = 5): SalineConstantsFigures {
  const best = (pressure: boolean, m2010: boolean) => {
    timeIt(n / 4, pressure, m2010);
    let min = Number.POSITIVE_INFINITY;
    for (let r = 0; r < rounds; r++) min = Math.min(min, timeIt(n, pressure, m2010));
    return min;
  };
  const surfaceNsPerCall = best(false, false);
  const depthNsPerCall = best(true, false);
  const millero2010NsPerCall = best(true, true);
  return { surfaceNsPerCall, depthNsPerCall, millero2010NsPerCall, callsPerSecond: 1e9 / depthNsPerCall };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const f = benchSalineConstants();
  console.log('salineConstants, one set per row (best of 5 rounds of 400 000 calls)');
  console.log(`  surface, Lueker 2000:     ${f.surfaceNsPerCall.toFixed(0)} ns/call`);
  console.log(`  0–4000 dbar, Lueker 2000: ${f.depthNsPerCall.toFixed(0)} ns/call`);
  console.log(`  0–4000 dbar, Millero 2010: ${f.millero2010NsPerCall.toFixed(0)} ns/call`);
  console.log(`  => ${(f.callsPerSecond / 1e6).toFixed(2)} million sets/s at depth`);
}
