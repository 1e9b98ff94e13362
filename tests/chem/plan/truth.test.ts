/**
 * Plans that tell the truth: limestone stops at calcite saturation, every plan checks the water
 * it predicts against the limits it lists, and the cautions fit the trade. Invented waters.
 */

import { describe, expect, it } from 'vitest';
import { isPlanError, type PlanOutput, plan } from '../../../src/chem/plan/plan';

/** A soft, acid fish pond (invented): 18 mg/L alkalinity, 20 mg/L calcium hardness, pH 6.4. */
const POND = { temperature_c: 22, ph: 6.4, alkalinity_mg_l_caco3: 18, calcium_mg_l: 8 };
const ok = (r: ReturnType<typeof plan>): PlanOutput => {
  if (isPlanError(r)) throw new Error(JSON.stringify(r.error));
  return r;
};

describe('limestone dissolves only to saturation', () => {
  it('stops at Ω calcite = 1 and says how much stays undissolved', () => {
    const r = ok(
      plan({
        water: POND,
        volume_l: 1000,
        actions: [{ action: 'add', chemical: 'calcium_carbonate', mass_g: 1000 }],
      }),
    );
    const step = r.steps[0]!;
    expect(r.after.omega_calcite).toBeLessThanOrEqual(1 + 1e-9);
    expect(r.after.omega_calcite).toBeGreaterThan(0.999);
    expect(step.change!.mass_g).toBeCloseTo(1000, 6);
    expect(step.change!.undissolved_g!).toBeGreaterThan(0);
    expect(step.change!.undissolved_g!).toBeLessThan(1000);
    expect(step.warnings.map((w) => w.code)).toContain('carbonate-stops-at-saturation');
    // What dissolved raised TA by exactly 2 mol per mol CaCO3 (the stoichiometry, dose.ts).
    const dissolvedMol = step.change!.moles * (1 - step.change!.undissolved_g! / step.change!.mass_g);
    expect(step.change!.ta_mol / dissolvedMol).toBeCloseTo(2, 9);
  });
  it('a small dose below saturation dissolves fully, with no warning', () => {
    const r = ok(
      plan({
        water: POND,
        volume_l: 1000,
        actions: [{ action: 'add', chemical: 'calcium_carbonate', mass_g: 1 }],
      }),
    );
    expect(r.steps[0]!.change!.undissolved_g).toBeUndefined();
    expect(r.after.omega_calcite).toBeLessThan(1);
  });
  it('a target beyond saturation is not reached: the plan stops at the saturated water and says so', () => {
    const r = ok(
      plan({
        water: POND,
        volume_l: 14_400_000,
        trade: 'aquaculture',
        actions: [
          {
            action: 'reach',
            chemical: 'calcium_carbonate',
            target: { alkalinity_mg_l_caco3: 150 },
            max_ph_step: 0.3,
          },
        ],
      }),
    );
    const step = r.steps[0]!;
    expect(step.warnings.map((w) => w.code)).toContain('target-beyond-saturation');
    expect(step.target!.achieved).toBeLessThan(150);
    expect(step.warnings.find((w) => w.code === 'target-beyond-saturation')!.message).toMatch(
      /^Calcium carbonate .* at alkalinity \d+(\.\d+)? mg\/L as CaCO₃: the target 150 mg\/L as CaCO₃ cannot be reached/,
    );
    expect(r.after.omega_calcite).toBeLessThanOrEqual(1 + 1e-6);
    // pH ends near calcite saturation, not at the 9.4 full dissolution would predict.
    expect(r.after.ph_nbs).toBeLessThan(9);
  });
});

describe('every plan checks the water it predicts against the limits it lists', () => {
  it('hydrated lime past pH 9 warns, at the step that leaves the range', () => {
    const r = ok(
      plan({
        water: POND,
        volume_l: 1000,
        trade: 'aquaculture',
        actions: [{ action: 'reach', chemical: 'calcium_hydroxide', target: { ph: 10.2 } }],
      }),
    );
    expect(r.after.ph_nbs).toBeGreaterThan(9);
    const w = r.limit_warnings.find((x) => x.message.includes('outside the 6.5–9'));
    expect(w?.code).toBe('plan-leaves-limits');
    expect(r.cautions.limits.some((l) => l.what.startsWith('pH 6.5 to 9.0'))).toBe(true);
  });
  it('a gentle dose inside the limits raises no limit warning', () => {
    const r = ok(
      plan({
        water: { ...POND, ph: 7.2, alkalinity_mg_l_caco3: 60 },
        volume_l: 1000,
        trade: 'aquaculture',
        actions: [{ action: 'add', chemical: 'sodium_bicarbonate', mass_g: 5 }],
      }),
    );
    expect(r.limit_warnings).toEqual([]);
  });
  it('purity changes the dose: 80 % pure lime needs 1/0.8 of the mass', () => {
    const at = (purity: number) =>
      ok(
        plan({
          water: POND,
          volume_l: 1000,
          actions: [
            { action: 'reach', chemical: 'calcium_hydroxide', target: { ph: 7.5 }, purity_percent: purity },
          ],
        }),
      ).steps[0]!.dose!.measure.mass_g!;
    expect(at(80) / at(100)).toBeCloseTo(1 / 0.8, 6);
  });
});

describe('cautions fit the water', () => {
  it('aerating a spring lists no animal limits and no advice about solids', () => {
    const r = ok(
      plan({
        water: { temperature_c: 11, ph: 7.2, alkalinity_meq_l: 4.6, calcium_mg_l: 95 },
        volume_l: 1000,
        trade: 'field',
        actions: [{ action: 'equilibrate' }],
      }),
    );
    expect(r.cautions.limits).toEqual([]);
    expect(r.cautions.general.join(' ')).not.toMatch(/bucket|fish|coral/i);
    expect(r.cautions.defer).not.toMatch(/veterinarian|animals/i);
    expect(r.limit_warnings).toEqual([]);
  });
  it('a reef plan lists the reef limits and no freshwater alkalinity rule', () => {
    const r = ok(
      plan({
        water: { temperature_c: 25.5, salinity: 35, alkalinity_umol_kg: 2400, ph: 8.05 },
        volume_l: 300,
        trade: 'aquarium',
        actions: [{ action: 'add', chemical: 'sodium_bicarbonate', mass_g: 2 }],
      }),
    );
    const what = r.cautions.limits.map((l) => l.what).join(' | ');
    expect(what).toContain('Reef tanks');
    expect(what).not.toContain('20 mg/L as CaCO3');
  });
});
