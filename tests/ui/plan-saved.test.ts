/**
 * Issue 10, defects 3 and 4: the purity typed in "dose to a target" reaches the engine, and a
 * plan saved with a reading can be read back (what, amounts, predicted water) and reopened with
 * its own fields.
 */
import { describe, expect, it } from 'vitest';
import { isPlanError, type PlanOutput, plan } from '../../src/chem/plan/plan';
import { DEFAULT_FORM, type PanelForm, planRequest } from '../../src/ui/plan/plan-model';
import { asSavedPlan, formOfSavedPlan, summarizeSavedPlan } from '../../src/ui/plan/saved-plan';
import { REEF } from '../chem/plan/helpers';

const reach = (purityPercent: string): PanelForm => ({
  ...DEFAULT_FORM,
  action: 'reach',
  volumeL: '250',
  chemical: 'sodium_bicarbonate',
  amountUnit: 'g',
  targetQuantity: 'alkalinity_dkh',
  targetValue: '9',
  purityPercent,
});

function grams(out: PlanOutput): number {
  const step = out.steps[0]!;
  const doses = step.substeps?.length ? step.substeps.map((s) => s.dose) : [step.dose!];
  return doses.reduce((n, d) => n + (d.measure.mass_g ?? 0), 0);
}

describe('dose to a target honours the purity (defect 4)', () => {
  it('half as pure needs twice the product; 0 % and 150 % are refused with a code', () => {
    const full = plan(planRequest(REEF, reach('100')));
    const half = plan(planRequest(REEF, reach('50')));
    if (isPlanError(full) || isPlanError(half)) throw new Error('plan failed');
    // Same moles of bicarbonate, so the mass of a 50 % product is exactly twice (to rounding).
    expect(grams(half) / grams(full)).toBeCloseTo(2, 9);
    const zero = plan(planRequest(REEF, reach('0')));
    const over = plan(planRequest(REEF, reach('150')));
    expect(isPlanError(zero) && zero.error.code).toBe('non-positive-value');
    expect(isPlanError(over) && over.error.code).toBe('bad-purity');
  });
});

describe('a saved plan is part of the reading (defect 3)', () => {
  const form = reach('80');
  const request = planRequest(REEF, form);
  const out = plan(request);
  if (isPlanError(out)) throw new Error(out.error.message);

  it('reads back what was planned, the amounts and the predicted water', () => {
    const saved = asSavedPlan({ request, result: out, saved_at: '2026-06-03T10:00:00Z' })!;
    const s = summarizeSavedPlan(saved);
    expect(s.what).toBe('Dose sodium bicarbonate to alkalinity dkh 9 in 250 L');
    expect(s.amounts.length).toBeGreaterThan(0);
    const total = s.amounts.reduce((n, a) => n + (a.measure.mass_g ?? 0), 0);
    expect(total).toBeCloseTo(grams(out), 9);
    expect(s.amounts[0]!.measure.purity_percent).toBe(80);
    const alk = s.water.find((w) => w.key === 'alkalinity_umol_kg')!;
    expect(alk.before).toBe(out.before.alkalinity_umol_kg);
    expect(alk.after).toBe(out.after.alkalinity_umol_kg);
  });

  it('reopens with its own fields: kept ones, or recovered from the request of an older save', () => {
    expect(formOfSavedPlan({ request, result: out, saved_at: 'x', form })).toEqual(form);
    const recovered = formOfSavedPlan({ request, result: out, saved_at: 'x' });
    expect(recovered).toMatchObject({
      action: 'reach',
      volumeL: '250',
      chemical: 'sodium_bicarbonate',
      targetQuantity: 'alkalinity_dkh',
      targetValue: '9',
      purityPercent: '80',
    });
    // Planning again from the recovered fields gives the same request.
    expect(planRequest(REEF, recovered)).toEqual(request);
  });

  it('refuses shapes that are not a saved plan instead of guessing', () => {
    expect(asSavedPlan(undefined)).toBeUndefined();
    expect(asSavedPlan({ request: 1 })).toBeUndefined();
  });
});
