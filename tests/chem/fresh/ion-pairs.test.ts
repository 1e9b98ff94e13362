/**
 * Ion pairs of the fresh model (issue 12 §2): each constant against its published value, the
 * temperature terms against the published enthalpies, and the solved speciation against its own
 * mass balances and the free-ion activity products the saturation indices must rest on.
 */

import { describe, expect, it } from 'vitest';
import { isSolveError, type SolveOutput } from '../../../src/chem/api';
import {
  logKCaCo3PlummerBusenberg1982,
  logKCaHco3PlummerBusenberg1982,
  logKMgCo3Nordstrom1990,
  logKMgHco3Nordstrom1990,
  logKspGypsumNordstrom1990,
  NORDSTROM_1990_PAIRS,
  pairLogK,
} from '../../../src/chem/fresh/ion-pairs';
import {
  logKspAragonitePlummerBusenberg1982,
  logKspCalcitePlummerBusenberg1982,
  logKwHarnedOwen1958,
} from '../../../src/chem/fresh/thermo';
import { LN10, MOLAR_MASS_G_PER_MOL, R_J_PER_MOL_K, T0_K } from '../../../src/chem/physical';
import { solve } from '../../../src/chem/solve';
import { densityKgL } from '../../../src/chem/units';
import { NORDSTROM_1990_ROWS } from '../../fixtures/nordstrom-1990';
import { PB82_ION_PAIRS } from '../../fixtures/plummer-busenberg-1982';

const T25 = 25 + T0_K;
/** ΔH (kcal/mol) implied by a log K(T) expression at 25 °C: ΔH = R ln10 T² d log K/dT. */
function deltaHKcal(f: (tK: number) => number): number {
  const h = 1e-3;
  return ((f(T25 + h) - f(T25 - h)) / (2 * h)) * ((R_J_PER_MOL_K * LN10 * T25 * T25) / 4184);
}

const ANALYTIC: Record<string, (tK: number) => number> = {
  caHco3: logKCaHco3PlummerBusenberg1982,
  caCo3: logKCaCo3PlummerBusenberg1982,
  mgHco3: logKMgHco3Nordstrom1990,
  mgCo3: logKMgCo3Nordstrom1990,
  gypsum: logKspGypsumNordstrom1990,
};

describe('ion-pair constants against their sources', () => {
  for (const row of PB82_ION_PAIRS) {
    it(`${row.pair}: log K ${row.logK} and ΔH ${row.deltaHKcal} kcal/mol at 25 °C (${row.source})`, () => {
      const f = ANALYTIC[row.pair]!;
      expect(Math.abs(f(T25) - row.logK)).toBeLessThanOrEqual(row.tol);
      expect(deltaHKcal(f)).toBeCloseTo(row.deltaHKcal, 2);
    });
  }
  for (const row of NORDSTROM_1990_ROWS) {
    it(`${row.species}: log K ${row.logK} at 25 °C (Nordstrom et al. 1990, memory)`, () => {
      const analytic = ANALYTIC[row.species];
      if (analytic !== undefined) {
        expect(Math.abs(analytic(T25) - row.logK)).toBeLessThanOrEqual(row.tol);
        if (row.deltaHKcal !== null) expect(deltaHKcal(analytic)).toBeCloseTo(row.deltaHKcal, 2);
        return;
      }
      const [logK, dH] = NORDSTROM_1990_PAIRS[row.species as keyof typeof NORDSTROM_1990_PAIRS];
      expect(logK).toBe(row.logK);
      expect(dH).toBe(row.deltaHKcal ?? 0);
    });
  }

  it('pairLogK at 25 °C: the tabulated values; hydrolysis turned into formation from OH- with Kw', () => {
    const lkw = logKwHarnedOwen1958(T25);
    const k = pairLogK(T25, lkw);
    expect(k.caSo4).toBeCloseTo(2.3, 12);
    expect(k.caOh).toBeCloseTo(-12.78 - lkw, 12);
    expect(k.mgOh).toBeCloseTo(-11.44 - lkw, 12);
  });

  it('van t Hoff terms: at 5 °C CaSO4° is weaker by ΔH/(R ln10)(1/278.15 − 1/298.15)', () => {
    const lkw = logKwHarnedOwen1958(5 + T0_K);
    const k = pairLogK(5 + T0_K, lkw);
    const expected = 2.3 - ((1.65 * 4184) / (R_J_PER_MOL_K * LN10)) * (1 / (5 + T0_K) - 1 / T25);
    expect(k.caSo4).toBeCloseTo(expected, 12);
    expect(k.caSo4).toBeLessThan(2.3);
  });
});

function out(input: Record<string, unknown>): SolveOutput {
  const r = solve(input);
  if (isSolveError(r)) throw new Error(`${r.error.code}: ${r.error.message}`);
  return r;
}

// An invented gypsum-bearing spring, "Chalkpit Rise", and an invented hard well, "Harrow Bore".
const GYPSUM_SPRING = {
  model: 'fresh',
  temperature_c: 12,
  ph: 7.1,
  alkalinity_mg_l_caco3: 220,
  calcium_mg_l: 480,
  magnesium_mg_l: 60,
  sodium_mg_l: 25,
  potassium_mg_l: 3,
  chloride_mg_l: 35,
  sulfate_mg_l: 1300,
};
const HARD_WELL = {
  model: 'fresh',
  temperature_c: 15,
  ph: 7.6,
  alkalinity_meq_l: 6,
  calcium_mg_l: 110,
  magnesium_mg_l: 35,
  sodium_mg_l: 40,
  potassium_mg_l: 4,
  chloride_mg_l: 60,
  sulfate_mg_l: 90,
};

describe('solved speciation', () => {
  for (const [name, water] of [
    ['gypsum spring', GYPSUM_SPRING],
    ['hard well', HARD_WELL],
  ] as const) {
    it(`${name}: fractions sum to 1 and reproduce the totals`, () => {
      const o = out(water);
      const p = o.ion_pairs!;
      for (const family of ['calcium', 'magnesium', 'carbonate', 'bicarbonate', 'sulfate'] as const) {
        const sum = Object.values(p[family]).reduce((a, b) => a + b, 0);
        expect(sum).toBeCloseTo(1, 12);
      }
      // Free HCO3- and CO3-- over their fractions give back the solver's totals.
      expect(p.free_umol_kg.hco3! / p.bicarbonate.free!).toBeCloseTo(o.hco3_umol_kg, 6);
      expect(p.free_umol_kg.co3! / p.carbonate.free!).toBeCloseTo(o.co3_umol_kg, 6);
      // Free calcium over its fraction gives back the calcium given (mol/kg of water).
      const caTotal = (p.free_umol_kg.ca! / p.calcium.free!) * 1e-6;
      expect(caTotal * 40.078 * 1000).toBeCloseTo(water.calcium_mg_l, 0);
    });

    it(`${name}: SI of calcite, aragonite, dolomite and gypsum are free-ion activity products`, () => {
      const o = out(water);
      const f = o.ion_pairs!.free_umol_kg;
      const g = o.activity_coefficients!;
      const tK = water.temperature_c + T0_K;
      const logA = (m: number, gamma: number) => Math.log10(m * 1e-6 * gamma);
      const iapCalcite = logA(f.ca!, g.ca) + logA(f.co3!, g.co3);
      expect(o.saturation_index_calcite!).toBeCloseTo(iapCalcite - logKspCalcitePlummerBusenberg1982(tK), 9);
      expect(o.saturation_index_aragonite!).toBeCloseTo(
        iapCalcite - logKspAragonitePlummerBusenberg1982(tK),
        9,
      );
      const iapDolomite = iapCalcite + logA(f.mg!, g.mg) + logA(f.co3!, g.co3);
      expect(o.saturation_index_dolomite!).toBeCloseTo(
        iapDolomite + o.constants_infinite_dilution!.pksp_dolomite!,
        9,
      );
      // Davies γ of SO4-- equals that of CO3-- (charge 2).
      const iapGypsum = logA(f.ca!, g.ca) + logA(f.so4!, g.co3);
      expect(o.saturation_index_gypsum!).toBeCloseTo(iapGypsum - logKspGypsumNordstrom1990(tK), 9);
    });
  }

  it('pairs lower the free calcium and the calcite SI of the gypsum spring (CaSO4° takes a share)', () => {
    const o = out(GYPSUM_SPRING);
    expect(o.ion_pairs!.calcium.caso4!).toBeGreaterThan(0.15);
    expect(o.ion_pairs!.calcium.free!).toBeLessThan(0.85);
    // The same water described by its ionic strength alone, calcium only: fewer pairs, higher SI.
    const fewer = out({
      model: 'fresh',
      temperature_c: 12,
      ph: 7.1,
      alkalinity_mg_l_caco3: 220,
      calcium_mg_l: 480,
      ionic_strength_mol_kg: o.ionic_strength_mol_kg,
    });
    expect(fewer.saturation_index_calcite!).toBeGreaterThan(o.saturation_index_calcite!);
    expect(o.saturation_index_gypsum!).toBeGreaterThan(-0.5);
    expect(o.saturation_index_gypsum!).toBeLessThan(0.2);
  });

  it('the charge balance is reported as equivalents and agrees with its percentage', () => {
    const o = out(HARD_WELL);
    const { cations, anions } = o.charge_balance_meq_kg!;
    expect((100 * (cations - anions)) / (cations + anions)).toBeCloseTo(o.charge_balance_error_percent!, 9);
  });

  it('the iteration has settled: one more sweep of the mass balances moves no free ion', async () => {
    const { speciate, conditionalBetas } = await import('../../../src/chem/fresh/ion-pairs');
    const { activityCoefficients } = await import('../../../src/chem/fresh/activity');
    const o = out(HARD_WELL);
    const f = o.ion_pairs!.free_umol_kg;
    const free = { ca: f.ca! * 1e-6, mg: f.mg! * 1e-6, na: f.na! * 1e-6, k: f.k! * 1e-6, so4: f.so4! * 1e-6 };
    const tK = 15 + T0_K;
    const betas = conditionalBetas(
      pairLogK(tK, logKwHarnedOwen1958(tK)),
      activityCoefficients(15, o.ionic_strength_mol_kg!, 'davies', true),
    );
    const p = o.ion_pairs!;
    // Totals as the model reads them: Ca, Mg, SO4 back from their fractions; Na, K from mg/L per
    // kg of water (EOS-80 pure water at 15 °C).
    const kgw = densityKgL(0, 15);
    const totals = {
      ca: free.ca / p.calcium.free!,
      mg: free.mg / p.magnesium.free!,
      na: HARD_WELL.sodium_mg_l / 1000 / MOLAR_MASS_G_PER_MOL.Na / kgw,
      k: HARD_WELL.potassium_mg_l / 1000 / MOLAR_MASS_G_PER_MOL.K / kgw,
      so4: free.so4 / p.sulfate.free!,
    };
    // OH-: total from the conditional Kw' over h, free after its pairs with Ca++ and Mg++.
    const ohTotal = 10 ** (o.ph! - o.constants.pkw!);
    const oh = ohTotal / (1 + betas.caOh * free.ca + betas.mgOh * free.mg);
    const anions = { hco3: f.hco3! * 1e-6, co3: f.co3! * 1e-6, oh };
    const again = speciate(betas, totals, anions, free);
    expect(again.ca / free.ca).toBeCloseTo(1, 5);
    expect(again.mg / free.mg).toBeCloseTo(1, 5);
    expect(again.na / free.na).toBeCloseTo(1, 5);
    expect(again.so4 / free.so4).toBeCloseTo(1, 5);
  });

  it('without Ca, Mg, Na, K or SO4 nothing pairs, and formulations say so', () => {
    const o = out({
      model: 'fresh',
      temperature_c: 10,
      ph: 7,
      alkalinity_umol_kg: 1000,
      ionic_strength_mol_kg: 0.005,
    });
    expect(o.ion_pairs).toBeUndefined();
    expect(o.formulations.ion_pairs).toMatch(/^none/);
    expect(out(HARD_WELL).formulations.ion_pairs).toContain('Plummer & Busenberg 1982');
  });
});

describe("the pair iteration's residual", () => {
  // Straight through the iteration, so the test reads the solved state and the constants it
  // stopped at, not the rounded outputs: every balance it iterates must close at the end.
  for (const [name, water, ta, dic] of [
    ['gypsum spring', GYPSUM_SPRING, 4.4e-3, 4.9e-3],
    ['hard well', HARD_WELL, 6e-3, 6.3e-3],
  ] as const) {
    it(`${name}: mass balances and ionic strength close to 1e-9, constants are those of the last I`, async () => {
      const { parseSolveInput } = await import('../../../src/chem/input');
      const { freshContext } = await import('../../../src/chem/fresh/setup');
      const { solveAtIonicStrength } = await import('../../../src/chem/fresh/solve-fresh');
      const { solvePair } = await import('../../../src/chem/solver/pairs');
      const { activityCoefficients } = await import('../../../src/chem/fresh/activity');
      const { conditionalBetas } = await import('../../../src/chem/fresh/ion-pairs');
      const ctx = freshContext(parseSolveInput({ ...water }));
      expect(ctx.plan.method).toBe('major-ions');
      const tC = water.temperature_c;
      const cond = { temperatureC: tC, salinity: 0, pressureDbar: 0 };
      const r = solveAtIonicStrength(
        cond,
        ctx,
        (k) => solvePair('ta', ta, 'dic', dic, k, ctx.minor)[0]!,
        (s) => s,
      );
      expect(r.warnings).toEqual([]);
      // 5–9 passes (10–13 before): a pin on the method, not a timing.
      expect(r.passes).toBeLessThanOrEqual(10);
      const { k, result: s } = r;
      const I = k.ionicStrength;
      const tK = tC + T0_K;
      const g = activityCoefficients(tC, I, 'davies', true);
      const b = conditionalBetas(pairLogK(tK, logKwHarnedOwen1958(tK)), g);
      for (const key of Object.keys(b) as (keyof typeof b)[]) {
        expect(Math.abs(k.pairs!.betas[key] / b[key] - 1)).toBeLessThan(1e-12);
      }
      const f = k.pairs!.free;
      const ohTotal = k.kw / s.h;
      const hco3 = s.hco3 / (1 + b.caHco3 * f.ca + b.mgHco3 * f.mg + b.naHco3 * f.na);
      const co3 = s.co3 / (1 + b.caCo3 * f.ca + b.mgCo3 * f.mg + b.naCo3 * f.na);
      const oh = ohTotal / (1 + b.caOh * f.ca + b.mgOh * f.mg);
      const m = ctx.ionsMolKg;
      const rel = (a: number, t: number): number => Math.abs(a - t) / t;
      const caPairs = b.caHco3 * hco3 + b.caCo3 * co3 + b.caSo4 * f.so4 + b.caOh * oh;
      const mgPairs = b.mgHco3 * hco3 + b.mgCo3 * co3 + b.mgSo4 * f.so4 + b.mgOh * oh;
      expect(rel(f.ca * (1 + caPairs), ctx.calciumMolKg!)).toBeLessThan(1e-9);
      expect(rel(f.mg * (1 + mgPairs), ctx.magnesiumMolKg!)).toBeLessThan(1e-9);
      expect(rel(f.na * (1 + b.naHco3 * hco3 + b.naCo3 * co3 + b.naSo4 * f.so4), m.na)).toBeLessThan(1e-9);
      expect(rel(f.k * (1 + b.kSo4 * f.so4), m.k)).toBeLessThan(1e-9);
      const so4Pairs = b.caSo4 * f.ca + b.mgSo4 * f.mg + b.naSo4 * f.na + b.kSo4 * f.k;
      expect(rel(f.so4 * (1 + so4Pairs), m.so4)).toBeLessThan(1e-9);
      // The solver's totals are free anion plus its pairs.
      expect(rel(hco3 * (1 + b.caHco3 * f.ca + b.mgHco3 * f.mg + b.naHco3 * f.na), s.hco3)).toBeLessThan(
        1e-12,
      );
      // I = ½ Σ z² m over free ions, charged pairs (charge 1), Cl- and free H+, written out here.
      const charged =
        b.caHco3 * f.ca * hco3 +
        b.caOh * f.ca * oh +
        b.mgHco3 * f.mg * hco3 +
        b.mgOh * f.mg * oh +
        b.naCo3 * f.na * co3 +
        b.naSo4 * f.na * f.so4 +
        b.kSo4 * f.k * f.so4;
      const iSpecies =
        0.5 *
        (4 * f.ca + 4 * f.mg + f.na + f.k + 4 * f.so4 + hco3 + 4 * co3 + oh + charged + m.cl + s.h / g.H);
      expect(rel(iSpecies, I)).toBeLessThan(1e-9);
    });
  }
});
