/**
 * Titration benchmark: reducing one 50-point titration by every method, the same with its
 * uncertainty propagated, and (when the solver is given) the cost of a solve with uncertainties
 * in plain solves. Prints figures; never a pass/fail test.
 */

import { solve } from '../../src/chem/solve';
import { freshTitrationConstants, reduceTitration } from '../../src/chem/titration/reduceTitration';
import { TITRATION_METHODS, type TitrationInput } from '../../src/chem/titration/types';
import { titrationUncertainty } from '../../src/chem/uncertainty/titrationUncertainty';
import { syntheticTitration } from '../chem/titration/syntheticTitration';

let sink = 0;

/** Mean milliseconds per call, after a warm-up, over at least `minMs` of calls. */
function msPerCall(fn: () => number, minMs = 300): number {
  for (let i = 0; i < 5; i++) sink += fn();
  let calls = 0;
  const t0 = performance.now();
  let elapsed = 0;
  while (elapsed < minMs) {
    sink += fn();
    calls++;
    elapsed = performance.now() - t0;
  }
  return elapsed / calls;
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;

export function fiftyPointTitration(): TitrationInput {
  // An invented lowland well: 2.4 meq/L, 100 mL titrated with 0.1 N acid, 12 °C, 350 µS/cm.
  const k = freshTitrationConstants(12, 1.6e-5 * 350);
  return {
    ...syntheticTitration(
      {
        sample: { alkalinity: 2.4e-3, dic: 2.8e-3 },
        sampleVolumeMl: 100,
        titrantEqL: 0.1,
        points: 50,
        finalPh: 3.0,
        phNoise: 0.005,
        seed: 50,
        temperatureC: 12,
      },
      k,
    ),
    ionic_strength_mol_kg: undefined,
    specific_conductance_us_cm: 350,
  };
}

export function benchTitration(): string[] {
  const input = fiftyPointTitration();
  const lines: string[] = [];
  const u = { sample_volume_ml: 0.1, titrant_normality: 0.0005, volume_ml: 0.005, ph: 0.01, ph_offset: 0.02 };
  lines.push('method       reduce (ms)  reductions/s   with uncertainty (ms)  reductions per uncertainty');
  for (const method of TITRATION_METHODS) {
    const record = { ...input, method };
    // Plain and uncertain reductions alternate within each round, so their ratio survives load.
    const plains: number[] = [];
    const withUs: number[] = [];
    const ratios: number[] = [];
    for (let round = 0; round < 5; round++) {
      const p = msPerCall(() => reduceTitration(record, freshTitrationConstants).alkalinity_meq_l, 60);
      const w = msPerCall(
        () => titrationUncertainty(record, u, freshTitrationConstants).alkalinity_meq_l!.standard_uncertainty,
        60,
      );
      plains.push(p);
      withUs.push(w);
      ratios.push(w / p);
    }
    const plain = median(plains);
    const withU = median(withUs);
    lines.push(
      `${method.padEnd(12)} ${plain.toFixed(4).padStart(11)}  ${(1000 / plain).toFixed(0).padStart(12)}   ${withU
        .toFixed(3)
        .padStart(21)}  ${median(ratios).toFixed(1).padStart(26)}`,
    );
  }
  lines.push(
    `(medians of 5 rounds; uncertainty of ${Object.keys(u).join(', ')}: per-reading inputs go through the sensitivities of modified_gran, gran and curve_fit; the other methods take one reduction per reading they used)`,
  );
  if (sink === 42) lines.push('');
  return lines;
}

/**
 * Cost of a solve with uncertainties, in plain solves (target: under 25). Two requests: four
 * measured inputs alone, and the same with every constant of Orr et al. (2018).
 */
export function benchSolveUncertainty(): string[] {
  const water = { temperature_c: 18, salinity: 35, alkalinity_umol_kg: 2300, dic_umol_kg: 2050 };
  const measured = { alkalinity_umol_kg: 2, dic_umol_kg: 2, temperature_c: 0.05, salinity: 0.01 };
  const count = (r: ReturnType<typeof solve>) => ('error' in r ? 0 : 1);
  const requests = [
    ['4 inputs', { ...water, uncertainty: measured }],
    ['4 inputs + 8 constants', { ...water, uncertainty: { ...measured, constants: true } }],
  ] as const;
  // The machine is shared: plain and uncertain solves are timed in alternating rounds and the
  // median ratio is reported, so a busy neighbour slows both sides of a ratio alike.
  const ROUNDS = 7;
  const plainTimes: number[] = [];
  const ratios: number[][] = requests.map(() => []);
  for (let round = 0; round < ROUNDS; round++) {
    const plain = msPerCall(() => count(solve(water)), 100);
    plainTimes.push(plain);
    requests.forEach(([, req], i) => {
      ratios[i]!.push(msPerCall(() => count(solve(req)), 100) / plain);
    });
  }
  const lines = [`plain solve: ${(median(plainTimes) * 1000).toFixed(1)} µs (median of ${ROUNDS} rounds)`];
  requests.forEach(([name], i) => {
    lines.push(
      `with uncertainty (${name}): ${median(ratios[i]!).toFixed(1)} plain solves (target < 25; ${
        name.startsWith('4 inputs +') ? 13 : 5
      } solves of work)`,
    );
  });
  return lines;
}
