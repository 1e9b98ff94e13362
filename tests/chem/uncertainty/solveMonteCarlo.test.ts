/**
 * The derivative-based uncertainty of a solve against a Monte Carlo run of the same solver:
 * inputs drawn from normal distributions with the given standard uncertainties, constants shifted
 * by normal draws with the Orr et al. (2018) uncertainties, each draw solved, the spread of each
 * output compared. With 2000 draws the sampling error of a standard deviation is about 1.6 %, so
 * the 10 % criterion tests the propagation, not the luck of the draw.
 */

import { describe, expect, it } from 'vitest';
import { isSolveError, type SolveOutput } from '../../../src/chem/api';
import type { ConstantShifts } from '../../../src/chem/models';
import { solve } from '../../../src/chem/solve';
import { CONSTANT_UNCERTAINTIES } from '../../../src/chem/uncertainty/solveUncertainty';
import { normalDeviates, seededRandom } from '../titration/syntheticTitration';

const RUNS = 2000;
const OUTPUTS = [
  'dic_umol_kg',
  'omega_calcite',
  'ph_total',
  'pco2_uatm',
  'co2_umol_kg',
  'hco3_umol_kg',
  'co3_umol_kg',
  'omega_aragonite',
  'revelle_factor',
];

function spread(input: Record<string, number | string>, u: Record<string, number>, constants: boolean) {
  const gauss = normalDeviates(seededRandom(7));
  const samples: Record<string, number[]> = Object.fromEntries(OUTPUTS.map((k) => [k, []]));
  const c = CONSTANT_UNCERTAINTIES;
  for (let run = 0; run < RUNS; run++) {
    const trial: Record<string, number | string> = { ...input };
    for (const [key, uk] of Object.entries(u)) trial[key] = (input[key] as number) + uk * gauss();
    const shifts: ConstantShifts | undefined = constants
      ? {
          pk0: c.pk0 * gauss(),
          pk1: c.pk1 * gauss(),
          pk2: c.pk2 * gauss(),
          pkb: c.pkb * gauss(),
          pkw: c.pkw * gauss(),
          pkspCalcite: c.pksp_calcite * gauss(),
          pkspAragonite: c.pksp_aragonite * gauss(),
          totalBoronFactor: 1 + c.total_boron * gauss(),
        }
      : undefined;
    const r = solve(trial, shifts ? { shifts } : {});
    if (isSolveError(r)) throw new Error(r.error.message);
    for (const key of OUTPUTS) samples[key]!.push(r[key as keyof SolveOutput] as number);
  }
  const sd: Record<string, number> = {};
  for (const key of OUTPUTS) {
    const xs = samples[key]!;
    const m = xs.reduce((s, x) => s + x, 0) / xs.length;
    sd[key] = Math.sqrt(xs.reduce((s, x) => s + (x - m) ** 2, 0) / (xs.length - 1));
  }
  return sd;
}

// Thousands of solves: a generous limit so a busy shared machine cannot fail a correct run.
describe('solve uncertainties agree with Monte Carlo within 10 %', { timeout: 60_000 }, () => {
  const cases: {
    name: string;
    input: Record<string, number | string>;
    u: Record<string, number>;
    constants: boolean;
  }[] = [
    {
      name: 'open ocean, TA and DIC, with constants',
      input: { temperature_c: 18, salinity: 35, alkalinity_umol_kg: 2300, dic_umol_kg: 2050 },
      u: { alkalinity_umol_kg: 2, dic_umol_kg: 2, temperature_c: 0.05, salinity: 0.01 },
      constants: true,
    },
    {
      name: 'limestone spring, fresh model, field alkalinity and pH, with constants',
      input: {
        model: 'fresh',
        temperature_c: 11,
        specific_conductance_us_cm: 480,
        alkalinity_meq_l: 3.9,
        ph: 7.3,
        calcium_mg_l: 75,
      },
      u: {
        alkalinity_meq_l: 0.04,
        ph: 0.02,
        temperature_c: 0.2,
        specific_conductance_us_cm: 10,
        calcium_mg_l: 3,
      },
      constants: true,
    },
    {
      name: 'reef tank, pH and alkalinity, measurements only',
      input: { temperature_c: 26, salinity: 34, alkalinity_umol_kg: 2600, ph: 8.1, ph_scale: 'nbs' },
      u: { alkalinity_umol_kg: 30, ph: 0.03, temperature_c: 0.3 },
      constants: false,
    },
  ];
  it.each(cases)('$name', ({ input, u, constants }) => {
    const spec = constants ? { ...u, constants: true } : u;
    const r = solve({ ...input, uncertainty: spec });
    if (isSolveError(r)) throw new Error(r.error.message);
    const mc = spread(input, u, constants);
    for (const key of OUTPUTS) {
      const propagated = r.uncertainty![key]!.standard_uncertainty;
      expect(Math.abs(propagated / mc[key]! - 1), `${key}: ${propagated} vs ${mc[key]}`).toBeLessThan(0.1);
    }
  });

  it('names the dominant input and keeps the plain outputs unchanged', () => {
    const input = { temperature_c: 18, salinity: 35, alkalinity_umol_kg: 2300, dic_umol_kg: 2050 };
    const plain = solve(input);
    const withU = solve({ ...input, uncertainty: { dic_umol_kg: 20 } });
    if (isSolveError(plain) || isSolveError(withU)) throw new Error('unexpected error');
    expect(withU.ph_total).toBe(plain.ph_total);
    expect(withU.uncertainty!.pco2_uatm!.dominant_input).toBe('dic_umol_kg');
    expect(withU.warnings.map((w) => w.code)).not.toContain('unknown-key');
  });

  it('an undefined uncertainty is no request at all', () => {
    const r = solve({
      temperature_c: 18,
      salinity: 35,
      alkalinity_umol_kg: 2300,
      dic_umol_kg: 2050,
      uncertainty: undefined,
    });
    if (isSolveError(r)) throw new Error(r.error.message);
    expect(r.uncertainty).toBeUndefined();
    expect(r.warnings.map((w) => w.code)).not.toContain('unknown-key');
  });

  it('a bad uncertainty request is an error value', () => {
    const r = solve({
      temperature_c: 18,
      salinity: 35,
      alkalinity_umol_kg: 2300,
      dic_umol_kg: 2050,
      uncertainty: { ph: 0.01 },
    });
    expect(isSolveError(r) && r.error.code).toBe('uncertainty-input-missing');
  });
});
