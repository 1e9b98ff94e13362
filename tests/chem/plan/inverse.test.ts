import { describe, expect, it } from 'vitest';
import { CHEMICALS, type ChemicalId } from '../../../src/chem/plan/chemicals';
import {
  amountForm,
  doseToTarget,
  quantityOf,
  splitDose,
  type TargetQuantity,
} from '../../../src/chem/plan/inverse';
import { isPlanError, type PlanOutput, plan } from '../../../src/chem/plan/plan';
import { planWater } from '../../../src/chem/plan/water';
import { plantedWater, pondWater, REEF, reefWater, springWater } from './helpers';

const cases: [ChemicalId, TargetQuantity, number][] = [
  ['sodium_bicarbonate', 'alkalinity_umol_kg', 2800],
  ['sodium_bicarbonate', 'alkalinity_dkh', 9.5],
  ['sodium_carbonate', 'ph', 8.25],
  ['sodium_hydroxide', 'omega_aragonite', 4],
  ['calcium_hydroxide', 'ph', 8.3],
  ['calcium_chloride_dihydrate', 'calcium_mg_l', 450],
  ['hydrochloric_acid', 'ph', 7.8],
  ['sulfuric_acid', 'alkalinity_meq_l', 2.0],
  ['carbon_dioxide', 'co2_mg_l', 2],
  ['carbon_dioxide', 'pco2_uatm', 1500],
];

describe('dose to a target', () => {
  it.each(cases)('%s to %s %d hits the target to 1e-6 and agrees with the forward dose', (id, q, target) => {
    const w = reefWater();
    const chem = CHEMICALS[id];
    const form = amountForm({}, chem);
    const sol = doseToTarget(w, chem, form, q, target);
    expect(Math.abs(quantityOf(sol.dose.water, q) - target)).toBeLessThan(1e-6 * Math.max(1, target));
    // Forward: the dose as a user would enter it (grams of product) through plan().
    const grams = form.describe(sol.moles).mass_g!;
    const r = plan({ water: REEF, volume_l: 300, actions: [{ action: 'add', chemical: id, mass_g: grams }] });
    if (isPlanError(r)) throw new Error(r.error.message);
    const after = planWaterAfter(r);
    expect(Math.abs(after(q) - target)).toBeLessThan(1e-6 * Math.max(1, target));
  });

  it.each([
    ['sodium_bicarbonate', 'alkalinity_mg_l_caco3', 180],
    ['carbon_dioxide', 'co2_mg_l', 40],
    ['calcium_hydroxide', 'omega_calcite', 1],
  ] as const)('fresh: %s to %s %d hits the target to 1e-6', (id, q, target) => {
    for (const w of [springWater(), plantedWater()]) {
      const chem = CHEMICALS[id];
      const sol = doseToTarget(w, chem, amountForm({}, chem), q, target);
      expect(sol.dose.water.solved.model).toBe('fresh');
      expect(Math.abs(quantityOf(sol.dose.water, q) - target)).toBeLessThan(1e-6 * Math.max(1, target));
    }
  });

  it("reef keepers' rule: NaHCO3 for +2 dKH in 300 L is 2 × 0.3566 meq/L × 300 L", () => {
    // 1 dKH = 10 mg/L CaO = 0.3566 meq/L (trade definition, common practice; chemistry.md).
    const w = planWater(
      { ...REEF, alkalinity_umol_kg: undefined, alkalinity_dkh: 7 },
      { volumeL: 300 },
      'reef',
    );
    const chem = CHEMICALS.sodium_bicarbonate;
    const sol = doseToTarget(w, chem, amountForm({}, chem), 'alkalinity_dkh', 9);
    const expected = 2 * ((2 * 10) / 56.0774) * 1e-3 * 300;
    // Off only by the dilution of the salt added (about 5e-5 here).
    expect(Math.abs(sol.moles / expected - 1)).toBeLessThan(2e-4);
    expect(form(sol.moles)).toBeCloseTo(17.98, 1);
    function form(n: number) {
      return amountForm({}, chem).describe(n).mass_g!;
    }
  });

  it('a stock solution form reports millilitres and includes the stock water', () => {
    const w = pondWater();
    const chem = CHEMICALS.hydrochloric_acid;
    const form = amountForm({ stock_mol_l: 1, stock_density_kg_l: 1.016 }, chem);
    const sol = doseToTarget(w, chem, form, 'ph', 7.5);
    expect(quantityOf(sol.dose.water, 'ph')).toBeCloseTo(7.5, 7);
    const ml = form.describe(sol.moles).stock_volume_ml!;
    expect(ml).toBeCloseTo(sol.moles * 1000, 9);
    expect(sol.dose.water.volumeL).toBeCloseTo(5000 + ml / 1000, 9);
  });

  it('refuses a target the chemical moves away from, with a code', () => {
    const w = reefWater();
    expect(() =>
      doseToTarget(w, CHEMICALS.hydrochloric_acid, amountForm({}, CHEMICALS.hydrochloric_acid), 'ph', 8.6),
    ).toThrow(expect.objectContaining({ code: 'target-unreachable' }));
    expect(() =>
      doseToTarget(
        w,
        CHEMICALS.calcium_chloride,
        amountForm({}, CHEMICALS.calcium_chloride),
        'alkalinity_umol_kg',
        3000,
      ),
    ).toThrow(expect.objectContaining({ code: 'target-unreachable' }));
  });
});

describe('safe steps', () => {
  it('no step exceeds the limits, the steps add up to the dose and end where it ends', () => {
    const w = reefWater();
    const chem = CHEMICALS.sodium_carbonate;
    const form = amountForm({ purity_percent: 99 }, chem);
    const sol = doseToTarget(w, chem, form, 'alkalinity_umol_kg', 3300);
    const steps = splitDose(w, chem, form, sol.moles, { ph: 0.1, alkalinityUmolKg: 300 });
    expect(steps.length).toBeGreaterThan(2);
    for (const s of steps) {
      expect(Math.abs(s.dose.change.delta_ph)).toBeLessThanOrEqual(0.1 + 1e-12);
      expect(Math.abs(s.dose.change.delta_alkalinity_umol_kg)).toBeLessThanOrEqual(300 + 1e-9);
    }
    expect(steps.reduce((a, s) => a + s.moles, 0)).toBeCloseTo(sol.moles, 12);
    const last = steps[steps.length - 1]!.dose.water;
    expect(last.solved.alkalinity_umol_kg).toBeCloseTo(3300, 6);
    expect(last.solved.ph_total).toBeCloseTo(sol.dose.water.solved.ph_total, 7);
  });

  it('plan() reports substeps when a limit is set', () => {
    const r = plan({
      water: REEF,
      volume_l: 300,
      actions: [
        {
          action: 'reach',
          chemical: 'sodium_bicarbonate',
          target: { alkalinity_dkh: 11 },
          max_alkalinity_step_dkh: 1,
        },
      ],
    });
    if (isPlanError(r)) throw new Error(r.error.message);
    const s = r.steps[0]!;
    expect(s.substeps!.length).toBeGreaterThanOrEqual(4);
    expect(Math.abs(s.target!.achieved - 11)).toBeLessThan(1e-6);
    expect(r.cautions.chemicals[0]!.chemical).toMatch(/bicarbonate/);
  });
});

describe('plan() errors are coded values', () => {
  it.each([
    [
      { water: REEF, volume_l: 300, actions: [{ action: 'add', chemical: 'vinegar', mass_g: 1 }] },
      'unknown-chemical',
    ],
    [
      { water: REEF, volume_l: 300, actions: [{ action: 'add', chemical: 'sodium_hydroxide', mass_g: -1 }] },
      'cannot-remove',
    ],
    [
      { water: REEF, volume_l: 300, actions: [{ action: 'add', chemical: 'sodium_hydroxide' }] },
      'missing-amount',
    ],
    [
      {
        water: REEF,
        volume_l: 300,
        actions: [
          { action: 'add', chemical: 'hydrochloric_acid', stock_volume_ml: 5, stock_percent_w_w: 31 },
        ],
      },
      'missing-stock-density',
    ],
    [{ water: REEF, volume_l: -3, actions: [{ action: 'equilibrate' }] }, 'bad-volume'],
    [{ water: REEF, volume_l: 300, actions: [] }, 'missing-actions'],
    [{ water: REEF, volume_l: 300, actions: [{ action: 'boil' }] }, 'unknown-action'],
    [
      {
        water: { temperature_c: 20, salinity: 35, ph: 8 },
        volume_l: 3,
        actions: [{ action: 'equilibrate' }],
      },
      'too-few-parameters',
    ],
    [
      {
        water: REEF,
        volume_l: 300,
        actions: [{ action: 'reach', chemical: 'sodium_bicarbonate', target: { ph: 'high' } }],
      },
      'not-a-number',
    ],
  ])('%#: %s', (req, code) => {
    const r = plan(req);
    expect(isPlanError(r)).toBe(true);
    if (isPlanError(r)) {
      expect(r.error.code).toBe(code);
      expect(r.error.message.length).toBeGreaterThan(10);
    }
  });

  it('names the action in the error field', () => {
    const r = plan({
      water: REEF,
      volume_l: 300,
      actions: [{ action: 'equilibrate' }, { action: 'add', chemical: 'x', moles: 1 }],
    });
    expect(isPlanError(r) && r.error.field).toBe('actions[1].chemical');
  });

  it('acid past all the alkalinity is refused with a code; acid to below pH 4.5 warns', () => {
    const over = plan({
      water: REEF,
      volume_l: 1,
      actions: [{ action: 'add', chemical: 'hydrochloric_acid', moles: 0.0026 }],
    });
    expect(isPlanError(over) && over.error.code).toBe('acid-exceeds-alkalinity');
    // 2400 µmol/kg in 1.0234 kg is 2.456 mmol: 2.44 mmol of HCl leaves about 16 µmol/kg.
    const r = plan({
      water: REEF,
      volume_l: 1,
      actions: [{ action: 'add', chemical: 'hydrochloric_acid', moles: 0.00244 }],
    });
    if (isPlanError(r)) throw new Error(r.error.message);
    expect(r.steps[0]!.warnings.map((w) => w.code)).toContain('acid-below-buffer');
    expect(Number.isFinite(r.after.ph_total)).toBe(true);
  });
});

function planWaterAfter(r: PlanOutput) {
  return (q: TargetQuantity): number => {
    const last = r.steps[r.steps.length - 1]!;
    return quantityOf({ input: last.water, solved: last.after, volumeL: last.volume_l, basisKg: 0 }, q);
  };
}
