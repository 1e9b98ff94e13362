import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CARBONATE_KEYS, type CarbonateKey, isSolveError, type SolveOutput } from '../../../src/chem/api';
import {
  logK1PlummerBusenberg1982,
  logK2PlummerBusenberg1982,
  logKhPlummerBusenberg1982,
  logKwHarnedOwen1958,
} from '../../../src/chem/fresh/thermo';
import { CO2_FAMILY } from '../../../src/chem/input';
import { k1Millero2010, k2Millero2010 } from '../../../src/chem/saline/carbonic';
import { solve } from '../../../src/chem/solve';

function solved(input: Record<string, unknown>): SolveOutput {
  const r = solve(input);
  if (isSolveError(r)) throw new Error(`${r.error.code}: ${r.error.message}`);
  return r;
}

// An invented limestone spring, "Hollow Beck", 9 °C.
const spring = {
  model: 'fresh',
  temperature_c: 9,
  ph: 7.25,
  alkalinity_mg_l_caco3: 245,
  calcium_mg_l: 88,
  magnesium_mg_l: 9,
  sodium_mg_l: 6,
  potassium_mg_l: 1.1,
  chloride_mg_l: 11,
  sulfate_mg_l: 17,
};

describe('Millero (2010) at S → 0 against Plummer & Busenberg (1982)', () => {
  it('pK1 and pK2 agree within 0.004 over 0–50 °C (both rest on Harned & Davis 1943 / Harned & Scholes 1941)', () => {
    for (let t = 0; t <= 50; t += 5) {
      const T = t + 273.15;
      expect(Math.abs(-Math.log10(k1Millero2010(T, 0)) + logK1PlummerBusenberg1982(T))).toBeLessThan(0.004);
      expect(Math.abs(-Math.log10(k2Millero2010(T, 0)) + logK2PlummerBusenberg1982(T))).toBeLessThan(0.004);
    }
  });
});

describe('fresh solve', () => {
  it('at I = 0 reproduces the plain thermodynamic equations', () => {
    const r = solved({
      model: 'fresh',
      temperature_c: 15,
      ph: 7.8,
      dic_umol_kg: 2500,
      ionic_strength_mol_kg: 0,
    });
    const T = 288.15;
    const k1 = 10 ** logK1PlummerBusenberg1982(T);
    const k2 = 10 ** logK2PlummerBusenberg1982(T);
    const h = 10 ** -7.8;
    const dic = 2500e-6;
    const den = h * h + k1 * h + k1 * k2;
    const hco3 = (dic * k1 * h) / den;
    const co3 = (dic * k1 * k2) / den;
    const co2 = (dic * h * h) / den;
    const ta = hco3 + 2 * co3 + 10 ** logKwHarnedOwen1958(T) / h - h;
    expect(r.hco3_umol_kg).toBeCloseTo(hco3 * 1e6, 9);
    expect(r.co3_umol_kg).toBeCloseTo(co3 * 1e6, 9);
    expect(r.alkalinity_umol_kg).toBeCloseTo(ta * 1e6, 9);
    expect(r.fco2_uatm / 1e6).toBeCloseTo(co2 / 10 ** logKhPlummerBusenberg1982(T), 12);
    expect(r.ph).toBeCloseTo(7.8, 12);
    expect(r.ph_free).toBeCloseTo(7.8, 12);
  });

  it('moves in the published direction as I rises: lower pH at fixed TA–DIC, lower SI at fixed Ca', () => {
    // Stumm & Morgan (1996) §3.4 and §7.6: activity corrections raise the conditional constants
    // and lower the activities of Ca++ and CO3--.
    const base = {
      model: 'fresh',
      temperature_c: 20,
      alkalinity_umol_kg: 2500,
      dic_umol_kg: 2600,
      calcium_mg_l: 60,
    };
    const lo = solved({ ...base, ionic_strength_mol_kg: 0.001 });
    const hi = solved({ ...base, ionic_strength_mol_kg: 0.05 });
    expect(hi.ph!).toBeLessThan(lo.ph!);
    expect(hi.saturation_index_calcite!).toBeLessThan(lo.saturation_index_calcite!);
  });

  it('iterates I from the major ions and reports what it rests on', () => {
    const r = solved(spring);
    expect(r.model).toBe('fresh');
    expect(r.ionic_strength_method).toBe('major-ions');
    // I = ½ Σ m z² of the free ions and charged pairs, with the solved carbonate species. Since the
    // ion pairs (issue 12) the neutral pairs CaSO4°, CaCO3°, MgSO4° take I from 0.0082 to 0.0080.
    expect(r.ionic_strength_mol_kg!).toBeGreaterThan(0.0075);
    expect(r.ionic_strength_mol_kg!).toBeLessThan(0.012);
    expect(Math.abs(r.charge_balance_error_percent!)).toBeLessThan(5);
    expect(r.alkalinity_mg_l_caco3).toBeCloseTo(245, 9);
    expect(r.saturation_index_dolomite).toBeDefined();
    expect(r.treatment_caution).toMatch(/local codes/);
  });

  it('the Langelier index, CCPP and SI agree in sign; the air-equilibrated water has the air pCO2', () => {
    const r = solved(spring);
    expect(Math.sign(r.langelier_index!)).toBe(Math.sign(r.saturation_index_calcite!));
    expect(Math.sign(r.ccpp_mg_l_caco3!)).toBe(Math.sign(r.saturation_index_calcite!));
    expect(r.ryznar_index).toBeCloseTo(2 * r.ph_saturation_calcite! - r.ph!, 12);
    // The equilibrium is computed at the sample's activity coefficients and ion-pair speciation;
    // re-solved with the same ions (which re-speciate at the new pH) it is within 1 %.
    const again = solved({
      ...spring,
      ph: r.ph_air_equilibrium,
      alkalinity_mg_l_caco3: undefined,
      alkalinity_umol_kg: r.alkalinity_umol_kg,
    });
    expect(Math.abs(again.pco2_uatm / 420 - 1)).toBeLessThan(0.01);
    expect(r.pco2_excess_ratio).toBeCloseTo(r.pco2_uatm / 420, 12);
    // Without paired ions the constants do not depend on pH: re-solved at the same I it is exact.
    const plain = solved({
      model: 'fresh',
      temperature_c: 9,
      ionic_strength_mol_kg: 0.008,
      ph: 7.25,
      alkalinity_mg_l_caco3: 245,
    });
    const eq = solved({
      model: 'fresh',
      temperature_c: 9,
      ionic_strength_mol_kg: 0.008,
      ph: plain.ph_air_equilibrium,
      alkalinity_umol_kg: plain.alkalinity_umol_kg,
    });
    expect(eq.pco2_uatm).toBeCloseTo(420, 4);
  });

  it('honours a user-set air pCO2', () => {
    const a = solved({ ...spring, air_pco2_uatm: 1000 });
    const b = solved(spring);
    expect(a.ph_air_equilibrium!).toBeLessThan(b.ph_air_equilibrium!);
  });

  it('gives null saturation without calcium, never a made-up zero', () => {
    const r = solved({
      model: 'fresh',
      temperature_c: 10,
      ph: 7,
      alkalinity_meq_l: 1,
      specific_conductance_us_cm: 150,
    });
    expect(r.omega_calcite).toBeNull();
    expect(r.saturation_index_calcite).toBeUndefined();
    expect(r.ionic_strength_method).toBe('conductance-russell-1976');
  });

  it('refuses contradictory or bad fresh inputs with codes', () => {
    const err = (x: Record<string, unknown>) => {
      const r = solve(x);
      return isSolveError(r) ? r.error.code : 'solved';
    };
    expect(err({ ...spring, calcium_umol_kg: 2000 })).toBe('calcium-given-twice');
    expect(err({ ...spring, alkalinity_dkh: 12 })).toBe('alkalinity-given-twice');
    expect(err({ ...spring, sodium_mg_l: -2 })).toBe('negative-value');
    expect(err({ ...spring, activity_model: 'guess' })).toBe('unknown-option');
    expect(err({ ...spring, air_pco2_uatm: -5 })).toBe('bad-air-pco2');
  });

  it('warns when the ions do not balance', () => {
    const r = solved({ ...spring, chloride_mg_l: 400 });
    expect(r.warnings.map((w) => w.code)).toContain('charge-balance');
  });

  it('keeps TA and DIC and re-solves at output temperature', () => {
    const r = solved({ ...spring, output_temperature_c: 25 });
    const same = solved(spring);
    expect(r.alkalinity_umol_kg).toBeCloseTo(same.alkalinity_umol_kg, 9);
    expect(r.dic_umol_kg).toBeCloseTo(same.dic_umol_kg, 9);
    expect(r.ph!).toBeLessThan(same.ph!);
  });
});

describe('automatic model choice in solve()', () => {
  it('takes fresh for a stream by its conductance and says so', () => {
    const r = solved({
      temperature_c: 14,
      ph: 7.6,
      alkalinity_mg_l_caco3: 90,
      specific_conductance_us_cm: 310,
    });
    expect(r.model).toBe('fresh');
    expect(r.model_reason).toMatch(/specific conductance/);
  });
  it('takes saline for seawater, and warns in the brackish band naming the choice', () => {
    expect(
      solved({ temperature_c: 25, salinity: 35, alkalinity_umol_kg: 2300, dic_umol_kg: 2000 }).model,
    ).toBe('saline');
    const b = solved({ temperature_c: 25, salinity: 3, alkalinity_umol_kg: 1200, dic_umol_kg: 1150 });
    expect(b.model).toBe('saline');
    expect(b.warnings.find((w) => w.code === 'brackish-water')?.message).toMatch(/saline model was chosen/);
  });
  it('converts reef-tank dKH with the seawater density', () => {
    const r = solved({ temperature_c: 25, salinity: 35, alkalinity_dkh: 8, ph: 8.2, ph_scale: 'nbs' });
    // 8 dKH = 2.8532 meq/L; per kg of seawater that is 2.8532 / 1.02334 mmol/kg.
    expect(r.alkalinity_umol_kg).toBeCloseTo(((8 * 0.35665) / 1.023343) * 1000, 0);
  });
});

describe('fresh round trips through solve()', () => {
  const PAIRS = CARBONATE_KEYS.flatMap((a, i) =>
    CARBONATE_KEYS.slice(i + 1)
      .filter((b) => !(CO2_FAMILY.has(a) && CO2_FAMILY.has(b)))
      .map((b) => [a, b] as [CarbonateKey, CarbonateKey]),
  );
  const OUT: Record<CarbonateKey, keyof SolveOutput> = {
    alkalinity_umol_kg: 'alkalinity_umol_kg',
    dic_umol_kg: 'dic_umol_kg',
    ph: 'ph',
    pco2_uatm: 'pco2_uatm',
    fco2_uatm: 'fco2_uatm',
    co2_umol_kg: 'co2_umol_kg',
    hco3_umol_kg: 'hco3_umol_kg',
    co3_umol_kg: 'co3_umol_kg',
  };
  it('every pair of the outputs returns the same water (conductance I to 1e-9, ion-iterated I to 1e-8)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 40, noNaN: true }),
        fc.double({ min: 6.5, max: 9.3, noNaN: true }),
        fc.double({ min: 300, max: 5000, noNaN: true }),
        fc.boolean(),
        (t, ph, dic, ions) => {
          const base = ions
            ? { ...spring, ph: undefined, alkalinity_mg_l_caco3: undefined, temperature_c: t }
            : { model: 'fresh', temperature_c: t, specific_conductance_us_cm: 600, calcium_mg_l: 50 };
          const truth = solved({ ...base, ph, dic_umol_kg: dic });
          // DIC–HCO3- at the top of its curve has two roots that nearly meet: there the root moves
          // with the square root of any change in the constants, and with ion pairs the constants
          // of each root depend on the root (1e-10 in them is 1e-5 in pH). Left out when the
          // discriminant of the quadratic is within 1 % of b² (roots closer than about 0.1 pH).
          const k1 = 10 ** -truth.constants.pk1!;
          const k2 = 10 ** -truth.constants.pk2!;
          const bq = truth.dic_umol_kg / truth.hco3_umol_kg - 1;
          const nearTop = (bq * bq - (4 * k2) / k1) / (bq * bq) < 0.01;
          for (const [a, b] of PAIRS) {
            if (nearTop && a === 'dic_umol_kg' && b === 'hco3_umol_kg') continue;
            const again = [solved({ ...base, [a]: truth[OUT[a]], [b]: truth[OUT[b]] })];
            again.push(...((again[0]!.alternatives ?? []) as SolveOutput[]));
            const rel = Math.min(
              ...again.map((r) =>
                Math.max(
                  Math.abs(r.dic_umol_kg - truth.dic_umol_kg) / truth.dic_umol_kg,
                  Math.abs(r.co3_umol_kg - truth.co3_umol_kg) / truth.co3_umol_kg,
                  Math.abs(r.ph_nbs - truth.ph_nbs),
                ),
              ),
            );
            expect(rel, `${a}–${b}`).toBeLessThan(ions ? 1e-8 : 1e-9);
          }
        },
      ),
      { numRuns: 25 },
    );
  });
});

describe('never NaN', () => {
  const finiteEverywhere = (v: unknown, path: string): void => {
    if (typeof v === 'number') expect(Number.isFinite(v), path).toBe(true);
    else if (v && typeof v === 'object')
      for (const [k, x] of Object.entries(v)) finiteEverywhere(x, `${path}.${k}`);
  };
  it('every number of a fresh solve is finite, or the solve is a coded error', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -2, max: 99, noNaN: true }),
        fc.double({ min: 3, max: 11.5, noNaN: true }),
        fc.double({ min: 0, max: 20, noNaN: true }),
        fc.option(fc.double({ min: 0, max: 600, noNaN: true })),
        fc.option(fc.double({ min: 0, max: 5000, noNaN: true })),
        fc.constantFrom('davies', 'debye-huckel', 'truesdell-jones'),
        fc.constantFrom('ph', 'pco2', 'ions'),
        (t, ph, meq, ca, sc, activity, variant) => {
          const ions =
            variant === 'ions'
              ? { chloride_mg_l: sc ?? 5, sodium_mg_l: (sc ?? 5) / 3, sulfate_mg_l: 10 }
              : {};
          const r = solve({
            model: 'fresh',
            temperature_c: t,
            ...(variant === 'pco2' ? { pco2_uatm: 10 ** ph } : { ph }),
            alkalinity_meq_l: meq,
            calcium_mg_l: ca ?? undefined,
            specific_conductance_us_cm: sc ?? undefined,
            activity_model: activity,
            ...ions,
          });
          if (isSolveError(r)) expect(r.error.code).toMatch(/^[a-z-]+$/);
          else finiteEverywhere(r, 'out');
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe('fresh-water keys in the saline model', () => {
  it('uses calcium in mg/L with the seawater density and says which fresh keys it ignores', () => {
    const r = solved({
      temperature_c: 25,
      salinity: 35,
      alkalinity_dkh: 8,
      ph: 8.15,
      ph_scale: 'nbs',
      calcium_mg_l: 420,
      magnesium_mg_l: 1300,
    });
    expect(r.model).toBe('saline');
    // 420 mg/L / 40.078 g/mol / 1.023343 kg/L (EOS-80) = 10 240 µmol/kg.
    expect(r.totals_umol_kg.calcium).toBeCloseTo((420 / 40.078 / 1.023343) * 1000, 0);
    expect(r.warnings.find((w) => w.code === 'fresh-keys-unused')?.message).toContain('magnesium_mg_l');
  });
});

describe('ionic-strength estimates say when they are weak', () => {
  it('warns when only the alkalinity is known, and when conductance is beyond its fitted range', () => {
    const a = solved({ model: 'fresh', temperature_c: 15, ph: 7.5, alkalinity_meq_l: 2 });
    expect(a.ionic_strength_method).toBe('alkalinity-only');
    expect(a.warnings.map((w) => w.code)).toContain('ionic-strength-from-alkalinity');
    const b = solved({
      model: 'fresh',
      temperature_c: 15,
      ph: 7.5,
      alkalinity_meq_l: 2,
      specific_conductance_us_cm: 9000,
      salinity: 1,
    });
    expect(b.warnings.map((w) => w.code)).toContain('ionic-strength-estimate-out-of-range');
  });
});

describe('assignFreshOutputs', () => {
  it('copies every key freshOutputs produces (a key added there and forgotten here fails this)', async () => {
    const { parseSolveInput } = await import('../../../src/chem/input');
    const { freshContext } = await import('../../../src/chem/fresh/setup');
    const { assignFreshOutputs, freshConstantsAt, freshOutputs } = await import(
      '../../../src/chem/fresh/solve-fresh'
    );
    const { solvePair } = await import('../../../src/chem/solver/pairs');
    const req = parseSolveInput({ ...spring });
    const ctx = freshContext(req);
    const k = freshConstantsAt({ temperatureC: 9, salinity: 0, pressureDbar: 0 }, 0.009, ctx);
    const s = solvePair('ph', 7.25, 'ta', 4.9e-3, k, ctx.minor)[0]!;
    const f = freshOutputs(s, k, ctx);
    const target = {};
    assignFreshOutputs(target, f);
    expect(Object.keys(target).sort()).toEqual(Object.keys(f).sort());
    expect(target).toEqual(f);
  });
});

describe('a sample with no sign of salt', () => {
  it('is solved with the fresh model and says the model was assumed', () => {
    const r = solve({ temperature_c: 12, ph: 7.4, alkalinity_umol_kg: 2000 });
    if ('error' in r) throw new Error(r.error.message);
    expect(r.model).toBe('fresh');
    expect(r.warnings.map((w) => w.code)).toContain('model-assumed-fresh');
  });
});
