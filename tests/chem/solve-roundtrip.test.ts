import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  CARBONATE_KEYS,
  type CarbonateKey,
  isSolveError,
  type SolvedWater,
  type SolveOutput,
} from '../../src/chem/api';
import { CO2_FAMILY } from '../../src/chem/input';
import { solve } from '../../src/chem/solve';

const PAIRS = CARBONATE_KEYS.flatMap((a, i) =>
  CARBONATE_KEYS.slice(i + 1)
    .filter((b) => !(CO2_FAMILY.has(a) && CO2_FAMILY.has(b)))
    .map((b) => [a, b] as [CarbonateKey, CarbonateKey]),
);

const OUTPUT_OF: Record<CarbonateKey, keyof SolveOutput> = {
  alkalinity_umol_kg: 'alkalinity_umol_kg',
  dic_umol_kg: 'dic_umol_kg',
  ph: 'ph_total',
  pco2_uatm: 'pco2_uatm',
  fco2_uatm: 'fco2_uatm',
  co2_umol_kg: 'co2_umol_kg',
  hco3_umol_kg: 'hco3_umol_kg',
  co3_umol_kg: 'co3_umol_kg',
};
const COMPARED = [
  'alkalinity_umol_kg',
  'dic_umol_kg',
  'pco2_uatm',
  'fco2_uatm',
  'co2_umol_kg',
  'hco3_umol_kg',
  'co3_umol_kg',
  'omega_calcite',
  'revelle_factor',
] as const;

function solved(input: Record<string, unknown>): SolveOutput {
  const r = solve(input);
  if (isSolveError(r)) throw new Error(`${r.error.code}: ${r.error.message} for ${JSON.stringify(input)}`);
  return r;
}

/** Every root of the solve (primary and alternatives). */
const allOf = (r: SolveOutput): SolvedWater[] => [r, ...(r.alternatives ?? [])];

function worst(a: SolvedWater, b: SolvedWater): number {
  let d = Math.abs(a.ph_total - b.ph_total) * Math.LN10; // relative error in h
  for (const k of COMPARED) {
    const x = a[k] as number;
    const y = b[k] as number;
    const floor = k === 'alkalinity_umol_kg' ? Math.abs(a.dic_umol_kg) : 0;
    d = Math.max(d, Math.abs(x - y) / Math.max(Math.abs(x), Math.abs(y), floor, 1e-300));
  }
  return d;
}

describe('round trips through solve() with real constants (t 0–40 °C, S 0–45)', () => {
  it('from pH–DIC, then from every one of the 25 pairs of its outputs, returns the same system to 1e-9', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 40, noNaN: true }),
        fc.double({ min: 0, max: 45, noNaN: true }),
        fc.double({ min: 6.5, max: 9.5, noNaN: true }),
        fc.double({ min: 300, max: 4000, noNaN: true }),
        (t, s, ph, dic) => {
          // model saline: below S 2 the automatic choice would take the fresh model, where ph is the activity pH.
          const base = {
            model: 'saline',
            temperature_c: t,
            salinity: s,
            phosphate_umol_kg: 1,
            silicate_umol_kg: 10,
          };
          const truth = solved({ ...base, ph, dic_umol_kg: dic });
          for (const [a, b] of PAIRS) {
            const again = solved({ ...base, [a]: truth[OUTPUT_OF[a]], [b]: truth[OUTPUT_OF[b]] });
            const best = Math.min(...allOf(again).map((r) => worst(r, truth)));
            expect(best, `${a}–${b}`).toBeLessThan(1e-9);
          }
        },
      ),
      { numRuns: Number(process.env.TUFA_RUNS ?? 120) },
    );
  });
});

describe('more than two parameters', () => {
  it('solves from the conserved pair and reports the misfit of the others', () => {
    const truth = solved({ temperature_c: 20, salinity: 33, alkalinity_umol_kg: 2250, dic_umol_kg: 2010 });
    const r = solved({
      temperature_c: 20,
      salinity: 33,
      alkalinity_umol_kg: 2250,
      dic_umol_kg: 2010,
      ph: truth.ph_total + 0.01,
      pco2_uatm: truth.pco2_uatm,
    });
    expect(r.pair).toEqual(['alkalinity_umol_kg', 'dic_umol_kg']);
    expect(r.misfit?.ph).toBeCloseTo(0.01, 10);
    expect(Math.abs(r.misfit?.pco2_uatm ?? 1)).toBeLessThan(1e-8);
  });
});

describe('input and output conditions', () => {
  it('carries TA and DIC to the output temperature and pressure and recomputes the rest', () => {
    const field = solved({
      temperature_c: 25,
      salinity: 35,
      ph: 7.9,
      ph_scale: 'total',
      alkalinity_umol_kg: 2300,
      output_temperature_c: 12,
      output_pressure_dbar: 1000,
    });
    const atInSitu = solved({
      temperature_c: 12,
      pressure_dbar: 1000,
      salinity: 35,
      alkalinity_umol_kg: field.alkalinity_umol_kg,
      dic_umol_kg: field.dic_umol_kg,
    });
    const at25 = solved({ temperature_c: 25, salinity: 35, ph: 7.9, alkalinity_umol_kg: 2300 });
    expect(field.dic_umol_kg).toBeCloseTo(at25.dic_umol_kg, 9);
    expect(field.ph_total).toBeCloseTo(atInSitu.ph_total, 12);
    // Cooling raises pH and lowers pCO2 of a closed sample (about 4 % per °C; Takahashi et al. 1993).
    expect(field.ph_total).toBeGreaterThan(7.9);
    expect(field.pco2_uatm).toBeLessThan(at25.pco2_uatm);
    expect(field.conditions).toEqual({ temperature_c: 12, salinity: 35, pressure_dbar: 1000 });
  });
});

describe('pH scales', () => {
  it('a pH given on any scale gives the same water', () => {
    const ref = solved({ temperature_c: 18, salinity: 30, ph: 8.0, alkalinity_umol_kg: 2200 });
    for (const scale of ['free', 'seawater', 'nbs'] as const) {
      const key = `ph_${scale === 'seawater' ? 'seawater' : scale}` as const;
      const r = solved({
        temperature_c: 18,
        salinity: 30,
        ph: ref[key],
        ph_scale: scale,
        alkalinity_umol_kg: 2200,
      });
      expect(r.ph_total).toBeCloseTo(8.0, 12);
    }
    expect(ref.ph_free).toBeGreaterThan(ref.ph_total);
    expect(ref.ph_seawater).toBeLessThan(ref.ph_total);
  });
});
