/**
 * Titration uncertainty for long curves (issue 13): reduction with every input uncertainty
 * (sample volume, normality, each pH and volume reading, pH offset) against the plain reduction
 * of the same points, timed alternately in the same run. Per-reading inputs go through the
 * methods' sensitivities (src/chem/titration/pointSensitivity.ts), so the ratio should stay flat
 * as the number of points grows. Prints figures; never a pass/fail test.
 *
 * Run: npx tsx tests/bench/titration-uncertainty.ts
 */

import { freshTitrationConstants, reduceTitration } from '../../src/chem/titration/reduceTitration';
import type { TitrationInput, TitrationMethod } from '../../src/chem/titration/types';
import { titrationUncertainty } from '../../src/chem/uncertainty/titrationUncertainty';
import { syntheticTitration } from '../chem/titration/syntheticTitration';

const U = { sample_volume_ml: 0.1, titrant_normality: 0.0005, volume_ml: 0.0005, ph: 0.005, ph_offset: 0.02 };

function curve(points: number): TitrationInput {
  // An invented logger titration of a lowland well: 2.4 meq/L, 100 mL, 0.1 N acid, 12 °C.
  const k = freshTitrationConstants(12, 1.6e-5 * 350);
  const t = syntheticTitration(
    {
      sample: { alkalinity: 2.4e-3, dic: 2.8e-3 },
      sampleVolumeMl: 100,
      titrantEqL: 0.1,
      points,
      finalPh: 3.0,
      phNoise: 0.003,
      seed: points,
      temperatureC: 12,
    },
    k,
  );
  // The writer rounds volumes to 1e-4 mL; keep them strictly increasing for long curves.
  const step = t.points[t.points.length - 1]!.volume_ml! / (points - 1);
  const pts = t.points.map((p, i) => ({ ...p, volume_ml: i * step }));
  return { ...t, points: pts, ionic_strength_mol_kg: undefined, specific_conductance_us_cm: 350 };
}

/** Mean ms per call over at least 40 ms of calls (one call when a call takes longer). */
const ms = (fn: () => void) => {
  const t0 = performance.now();
  let calls = 0;
  let elapsed = 0;
  while (elapsed < 40) {
    fn();
    calls++;
    elapsed = performance.now() - t0;
  }
  return elapsed / calls;
};
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;

export function benchTitrationUncertainty(): string[] {
  const lines = ['method         points   plain (ms)   with uncertainty (ms)   ratio'];
  const methods: TitrationMethod[] = ['modified_gran', 'curve_fit', 'gran'];
  for (const points of [50, 1000, 20000]) {
    const input = curve(points);
    for (const method of methods) {
      const record = { ...input, method };
      const rounds = points >= 20000 ? 3 : 5;
      const plains: number[] = [];
      const withUs: number[] = [];
      const ratios: number[] = [];
      reduceTitration(record, freshTitrationConstants);
      titrationUncertainty(record, U, freshTitrationConstants);
      for (let r = 0; r < rounds; r++) {
        const p = ms(() => reduceTitration(record, freshTitrationConstants));
        const w = ms(() => titrationUncertainty(record, U, freshTitrationConstants));
        plains.push(p);
        withUs.push(w);
        ratios.push(w / p);
      }
      lines.push(
        `${method.padEnd(13)} ${String(points).padStart(7)}   ${median(plains).toFixed(1).padStart(10)}   ${median(
          withUs,
        )
          .toFixed(1)
          .padStart(21)}   ${median(ratios).toFixed(1).padStart(5)}`,
      );
    }
  }
  lines.push('(medians of alternating rounds; target for 20 000 points: under 2 s, flat ratio)');
  return lines;
}

if (process.argv[1]?.endsWith('titration-uncertainty.ts')) {
  for (const line of benchTitrationUncertainty()) console.log(line);
}
