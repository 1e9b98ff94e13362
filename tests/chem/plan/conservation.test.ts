import { describe, expect, it } from 'vitest';
import { MOLAR_MASS_G_PER_MOL } from '../../../src/chem/physical';
import { readAmount } from '../../../src/chem/plan/amount';
import { CHEMICAL_IDS, CHEMICALS, molarMassOf } from '../../../src/chem/plan/chemicals';
import { applyDose } from '../../../src/chem/plan/dose';
import { equilibrate } from '../../../src/chem/plan/gas-exchange';
import { mixWaters } from '../../../src/chem/plan/mix';
import { planWater, totalsOf } from '../../../src/chem/plan/water';
import { INTAKE, PLANTED, plantedWater, pondWater, reefWater, springWater } from './helpers';

const moles = (n: number) => ({
  moles: n,
  stockWaterKg: 0,
  stockVolumeL: 0,
  given: { moles: n },
  warnings: [],
});

describe('molar masses from element counts', () => {
  // IUPAC 2021 standard atomic weights, as abridged in src/chem/physical.ts.
  it.each([
    ['CaCO3', { Ca: 1, C: 1, O: 3 }, MOLAR_MASS_G_PER_MOL.CaCO3],
    ['CaO', { Ca: 1, O: 1 }, MOLAR_MASS_G_PER_MOL.CaO],
    ['CO2', { C: 1, O: 2 }, MOLAR_MASS_G_PER_MOL.CO2],
  ] as const)('%s', (_f, el, m) => {
    // physical.ts carries O as 15.9994, this module the abridged 15.999: they agree to 0.002 g/mol.
    expect(Math.abs(molarMassOf(el) - m)).toBeLessThan(0.002);
  });
});

describe('every addition changes TA, DIC and calcium by exactly its stoichiometry', () => {
  it.each(CHEMICAL_IDS)('%s in a reef tank, a brackish pond, a spring and a planted tank', (id) => {
    const chem = CHEMICALS[id];
    const waters = [reefWater(), pondWater(), springWater(), plantedWater()];
    expect(waters.map((w) => w.solved.model)).toEqual(['saline', 'saline', 'fresh', 'fresh']);
    for (const w of waters) {
      const dose = 2e-4 * w.basisKg; // 200 µmol/kg
      const d = applyDose(w, chem, moles(dose));
      // Calcium carbonate dissolves only to calcite saturation: count what dissolved.
      const n = dose - (d.change.undissolved_g ?? 0) / chem.molarMassGPerMol;
      const t0 = totalsOf(w);
      const t1 = totalsOf(d.water);
      const scale = n * 1e-9;
      expect(t1.ta * d.water.basisKg - t0.ta * w.basisKg).toBeCloseTo(chem.perMole.ta * n, 0);
      expect(Math.abs(t1.ta * d.water.basisKg - t0.ta * w.basisKg - chem.perMole.ta * n)).toBeLessThan(
        scale + 1e-12 * t0.ta * w.basisKg,
      );
      expect(Math.abs(t1.dic * d.water.basisKg - t0.dic * w.basisKg - chem.perMole.dic * n)).toBeLessThan(
        scale + 1e-12 * t0.dic * w.basisKg,
      );
      expect(
        Math.abs(t1.calcium! * d.water.basisKg - t0.calcium! * w.basisKg - chem.perMole.calcium * n),
      ).toBeLessThan(scale + 1e-12 * t0.calcium! * w.basisKg);
      // n came back through grams (undissolved_g / molar mass): equal up to that round trip's rounding.
      expect(Math.abs(d.change.ta_mol - chem.perMole.ta * n)).toBeLessThanOrEqual(
        1e-15 * Math.abs(chem.perMole.ta * n),
      );
      // The fresh model keeps calcium in mg/L as given: the plan writes it back there.
      if (w.input.calcium_mg_l !== undefined) expect(d.water.input.calcium_umol_kg).toBeUndefined();
    }
  });

  it('a stock solution brings its water: the moles still add exactly and the rest is diluted', () => {
    const w = reefWater();
    const chem = CHEMICALS.sodium_hydroxide;
    const a = readAmount({ stock_volume_ml: 250, stock_mol_l: 1, stock_density_kg_l: 1.04 }, chem);
    expect(a.moles).toBeCloseTo(0.25, 12);
    // 250 mL × 1.04 kg/L = 0.26 kg of solution, of which 0.25 mol × 39.997 g/mol is NaOH.
    expect(a.stockWaterKg).toBeCloseTo(0.26 - 0.25 * chem.molarMassGPerMol * 1e-3, 12);
    const d = applyDose(w, chem, a);
    const t0 = totalsOf(w);
    const t1 = totalsOf(d.water);
    expect(t1.ta * d.water.basisKg - t0.ta * w.basisKg).toBeCloseTo(0.25, 9);
    expect(t1.dic * d.water.basisKg).toBeCloseTo(t0.dic * w.basisKg, 9);
    expect(d.water.volumeL).toBeCloseTo(300.25, 12);
    expect(t1.dic).toBeLessThan(t0.dic);
  });

  it('a mass of product is converted with its molar mass and purity', () => {
    const a = readAmount({ mass_g: 84.0066, purity_percent: 50 }, CHEMICALS.sodium_bicarbonate);
    // NaHCO3 84.0066 g/mol from IUPAC 2021 atomic weights (this module's molarMassOf).
    expect(a.moles).toBeCloseTo(0.5, 4);
  });

  it('salinity follows the dissolved mass, and CO2 leaves it alone', () => {
    const w = reefWater();
    const salt = applyDose(w, CHEMICALS.calcium_chloride, moles(1));
    // 110.98 g in 307.0 kg of seawater: 0.3614 g/kg, less the dilution of the 35 g/kg already there
    // (35.165 × 0.111/307.1 = 0.0127), over S_R/S_P = 1.00472: ΔS = 0.347.
    expect(salt.change.delta_salinity).toBeGreaterThan(0.34);
    expect(salt.change.delta_salinity).toBeLessThan(0.355);
    const gas = applyDose(w, CHEMICALS.carbon_dioxide, moles(0.05));
    expect(gas.change.delta_salinity).toBeGreaterThan(0); // CO2 is weighed as dissolved mass too
    expect(gas.change.delta_alkalinity_umol_kg).toBeCloseTo(0, 1);
  });
});

describe('lime softening reaction Ca(OH)2 + CO2 -> CaCO3 + H2O', () => {
  // The first-stage lime reaction of water-treatment texts (memory): lime then the CaCO3 it
  // precipitates must leave the same water as taking the CO2 out directly.
  it('lime followed by precipitating the same moles of CaCO3 equals stripping that CO2', () => {
    const w = pondWater();
    const n = 1e-4 * w.basisKg;
    const lime = applyDose(w, CHEMICALS.calcium_hydroxide, moles(n));
    const softened = applyDose(lime.water, CHEMICALS.calcium_carbonate, moles(-n));
    const stripped = applyDose(w, CHEMICALS.carbon_dioxide, moles(-n));
    // The lime path leaves the reaction's water behind (18 g/mol: 9 g in 5 t here), a dilution
    // of 1.8e-6 that stripping has not: compare to 3e-6 relative.
    const rel = (a: number, b: number) => Math.abs(a / b - 1);
    expect(
      rel(softened.water.solved.alkalinity_umol_kg, stripped.water.solved.alkalinity_umol_kg),
    ).toBeLessThan(3e-6);
    expect(rel(softened.water.solved.dic_umol_kg, stripped.water.solved.dic_umol_kg)).toBeLessThan(3e-6);
    expect(softened.water.solved.totals_umol_kg.calcium).toBeCloseTo(w.solved.totals_umol_kg.calcium, 1);
  });
});

describe('fresh waters', () => {
  it('NaHCO3 in a tank with major ions adds its sodium in mg/L', () => {
    const w = plantedWater(200);
    const d = applyDose(w, CHEMICALS.sodium_bicarbonate, moles(0.01));
    // 0.01 mol × 22.98977 g/mol = 229.9 mg into 200 L: +1.149 mg/L (IUPAC 2021 atomic weight of Na).
    expect((d.water.input.sodium_mg_l as number) - 10).toBeCloseTo(1.149, 3);
    expect(d.water.input.chloride_mg_l).toBe(15);
  });

  it('a spring water without ions gets its ionic strength raised, with a warning', () => {
    const w = springWater();
    const d = applyDose(w, CHEMICALS.calcium_chloride, moles(10));
    expect(d.warnings.map((x) => x.code)).toContain('ionic-strength-estimated');
    expect(d.water.input.ionic_strength_mol_kg as number).toBeGreaterThan(
      (w.solved as unknown as { ionic_strength_mol_kg: number }).ionic_strength_mol_kg,
    );
  });
});

describe('mixing is conservative', () => {
  it('the moles of TA, DIC and calcium of the mix are the sums', () => {
    const a = reefWater(300);
    const b = planWater(INTAKE, { volumeL: 700 }, 'intake');
    const m = mixWaters([a, b]);
    for (const key of ['ta', 'dic', 'calcium'] as const) {
      const sum = totalsOf(a)[key]! * a.basisKg + totalsOf(b)[key]! * b.basisKg;
      expect(totalsOf(m.water)[key]! * m.water.basisKg).toBeCloseTo(sum, 9);
    }
    expect(m.water.solved.conditions.salinity).toBeGreaterThan(31);
    expect(m.water.solved.conditions.salinity).toBeLessThan(35);
    expect(m.mass_fractions.reduce((x, y) => x + y, 0)).toBeCloseTo(1, 12);
  });

  it('spring water mixed with seawater is conservative across models and is solved as saline', () => {
    const a = springWater(900);
    const b = planWater(
      { temperature_c: 15, salinity: 34, alkalinity_umol_kg: 2300, ph: 8.05 },
      { volumeL: 100 },
      'sea',
    );
    const m = mixWaters([a, b]);
    expect(m.water.solved.model).toBe('saline');
    expect(m.warnings.map((w) => w.code)).toContain('mix-models-differ');
    for (const key of ['ta', 'dic', 'calcium'] as const) {
      const sum = totalsOf(a)[key]! * a.basisKg + totalsOf(b)[key]! * b.basisKg;
      expect(totalsOf(m.water)[key]! * m.water.basisKg).toBeCloseTo(sum, 9);
    }
  });

  it('two fresh waters mix by volume in their mg/L keys', () => {
    const a = plantedWater(100);
    const b = planWater({ ...PLANTED, calcium_mg_l: 90, alkalinity_dkh: 8 }, { volumeL: 300 }, 'b');
    const m = mixWaters([a, b]);
    expect(m.water.solved.model).toBe('fresh');
    expect(m.water.input.calcium_mg_l).toBeCloseTo((30 * 100 + 90 * 300) / 400, 12);
    const sum = totalsOf(a).ta * a.basisKg + totalsOf(b).ta * b.basisKg;
    expect(totalsOf(m.water).ta * m.water.basisKg).toBeCloseTo(sum, 9);
  });

  it('a water mixed with itself is unchanged', () => {
    const m = mixWaters([reefWater(100), reefWater(50)]);
    const r = reefWater().solved;
    expect(m.water.solved.ph_total).toBeCloseTo(r.ph_total, 9);
    expect(m.water.solved.alkalinity_umol_kg).toBeCloseTo(r.alkalinity_umol_kg, 6);
  });

  it('pH does not mix linearly while TA and DIC do', () => {
    // Mixing waters of different pCO2 gives a pH off the mean: the mixing of two waters
    // discussed in aquatic-chemistry textbooks (e.g. Stumm & Morgan, Aquatic Chemistry; memory).
    const lo = planWater(
      { temperature_c: 20, salinity: 35, alkalinity_umol_kg: 2300, pco2_uatm: 300 },
      { massKg: 1 },
      'a',
    );
    const hi = planWater(
      { temperature_c: 20, salinity: 35, alkalinity_umol_kg: 2300, pco2_uatm: 3000 },
      { massKg: 1 },
      'b',
    );
    const m = mixWaters([lo, hi]);
    expect(m.water.solved.alkalinity_umol_kg).toBeCloseTo(2300, 6);
    expect(m.water.solved.dic_umol_kg).toBeCloseTo((lo.solved.dic_umol_kg + hi.solved.dic_umol_kg) / 2, 6);
    const meanPh = (lo.solved.ph_total + hi.solved.ph_total) / 2;
    expect(Math.abs(m.water.solved.ph_total - meanPh)).toBeGreaterThan(0.05);
  });
});

describe('CO2 exchange keeps TA', () => {
  it('reaches the target pCO2 at constant TA, and a fraction moves that share of DIC', () => {
    const w = planWater(INTAKE, { volumeL: 1000 }, 'intake');
    const full = equilibrate(w, 420, 1);
    expect(full.water.solved.pco2_uatm).toBeCloseTo(420, 9);
    expect(full.water.solved.alkalinity_umol_kg).toBeCloseTo(w.solved.alkalinity_umol_kg, 9);
    const half = equilibrate(w, 420, 0.5);
    expect(half.water.solved.alkalinity_umol_kg).toBeCloseTo(w.solved.alkalinity_umol_kg, 9);
    expect(half.water.solved.dic_umol_kg).toBeCloseTo(
      (w.solved.dic_umol_kg + full.water.solved.dic_umol_kg) / 2,
      9,
    );
    expect(half.co2_mol).toBeLessThan(0); // degassing
    expect(half.water.solved.ph_total).toBeGreaterThan(w.solved.ph_total);
  });

  it('refuses a fraction outside 0..1', () => {
    expect(() => equilibrate(reefWater(), 420, 1.5)).toThrow(/fraction/);
  });
});
