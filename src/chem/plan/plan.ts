/**
 * `plan()`: what a water will be after a sequence of actions (add or remove a chemical, exchange
 * CO2 with a gas, mix with other waters, dose to a target in safe steps). The request and the
 * result are JSON in the snake_case style of `solve()`; every water in the result is a full solve
 * output, and every plan carries its cautions. Never throws: a bad request becomes
 * `{ error: { code, message, field } }` naming the action it concerns.
 */

import type { SolveOutput } from '../api';
import { fail, type Issue, TufaError, toIssue, warning } from '../errors';
import { alkalinityToEqKg } from '../units';
import { readAmount } from './amount';
import { type Cautions, cautionsFor } from './cautions';
import { type Chemical, chemicalById } from './chemicals';
import { applyDose, type DoseChange } from './dose';
import { DEFAULT_AIR_PCO2_UATM, equilibrate } from './gas-exchange';
import {
  amountForm,
  doseToTarget,
  quantityOf,
  splitDose,
  TARGET_QUANTITIES,
  type TargetQuantity,
} from './inverse';
import { checkLimits, type PlanTrade } from './limits';
import { mixWaters } from './mix';
import { kgPerLitre, type PlanWater, planWater, readQuantity } from './water';

export const ACTIONS = ['add', 'equilibrate', 'mix', 'reach'] as const;
export type ActionName = (typeof ACTIONS)[number];

export interface PlanStepDose {
  chemical: string;
  formula: string;
  moles: number;
  /** What to weigh or measure: mass_g (with purity_percent) or stock_volume_ml (with its strength). */
  measure: Record<string, number>;
}

export interface PlanStep {
  action: ActionName;
  dose?: PlanStepDose;
  change?: DoseChange;
  /** equilibrate: the gas pCO2, the fraction of the way, the CO2 moved, and the full equilibrium. */
  exchange?: {
    target_pco2_uatm: number;
    fraction: number;
    co2_mol: number;
    delta_dic_umol_kg: number;
    equilibrium: SolveOutput;
  };
  mix?: { mass_fractions: number[]; volumes_l: number[] };
  /** reach: the target, what was reached, and the steps to take one by one. */
  target?: { quantity: TargetQuantity; value: number; achieved: number; miss: number };
  substeps?: { dose: PlanStepDose; change: DoseChange; after: SolveOutput }[];
  after: SolveOutput;
  /** The resulting water as a solve input, to save or plan further from. */
  water: Record<string, unknown>;
  volume_l: number;
  warnings: Issue[];
}

export interface PlanOutput {
  before: SolveOutput;
  volume_l: number;
  steps: PlanStep[];
  after: SolveOutput;
  water: Record<string, unknown>;
  cautions: Cautions;
  /** Where a step, a part-dose or the result leaves the limits the cautions list (`plan-leaves-limits`). */
  limit_warnings: Issue[];
}

export type PlanResult = PlanOutput | { error: Issue };

export function isPlanError(r: PlanResult): r is { error: Issue } {
  return 'error' in r;
}

type Raw = Readonly<Record<string, unknown>>;

function asObject(x: unknown, what: string, field: string): Raw {
  if (typeof x !== 'object' || x === null || Array.isArray(x))
    fail('input-not-object', `${what} must be a JSON object.`, field);
  return x as Raw;
}

function optNumber(raw: Raw, key: string): number | undefined {
  const v = raw[key];
  if (v === undefined || v === null || v === '') return undefined;
  if (typeof v !== 'number' || !Number.isFinite(v))
    fail('not-a-number', `${key} must be a finite number, got ${JSON.stringify(v)}.`, key);
  return v;
}

function doseOf(chem: Chemical, moles: number, measure: Record<string, number>): PlanStepDose {
  return { chemical: chem.id, formula: chem.formula, moles, measure };
}

function stepFrom(action: ActionName, w: PlanWater, warnings: Issue[]): PlanStep {
  return { action, after: w.solved, water: { ...w.input }, volume_l: w.volumeL, warnings };
}

export function plan(request: unknown): PlanResult {
  try {
    return runPlan(request);
  } catch (e) {
    return { error: toIssue(e) };
  }
}

function runPlan(request: unknown): PlanOutput {
  const req = asObject(request, 'The plan', 'plan');
  const start = planWater(req.water, readQuantity(req, 'The water'), 'The water');
  const actions = req.actions;
  if (!Array.isArray(actions) || actions.length === 0) {
    fail(
      'missing-actions',
      'actions must be a list of at least one action (add, equilibrate, mix, reach).',
      'actions',
    );
  }
  let w = start;
  const steps: PlanStep[] = [];
  const used: Chemical[] = [];
  actions.forEach((a: unknown, i: number) => {
    try {
      const step = runAction(w, asObject(a, `Action ${i + 1}`, `actions[${i}]`), used);
      steps.push(step.step);
      w = step.water;
    } catch (e) {
      if (e instanceof TufaError) {
        throw new TufaError(
          e.code,
          `Action ${i + 1}: ${e.message}`,
          `actions[${i}]${e.field ? `.${e.field}` : ''}`,
        );
      }
      throw e;
    }
  });
  const trade = readTrade(req.trade);
  const checked = steps.flatMap((s, i) => [
    ...(s.substeps ?? []).map((p, j, all) => ({
      where: `step ${i + 1}, part ${j + 1} of ${all.length}`,
      water: p.after,
    })),
    { where: steps.length === 1 ? 'the result' : `step ${i + 1}`, water: s.after },
  ]);
  return {
    before: start.solved,
    volume_l: start.volumeL,
    steps,
    after: w.solved,
    water: { ...w.input },
    cautions: cautionsFor(used, { trade, saline: start.solved.model === 'saline' }),
    limit_warnings: checkLimits(trade, start.solved, checked),
  };
}

function readTrade(x: unknown): PlanTrade | undefined {
  if (x === undefined || x === null || x === '') return undefined;
  if (x === 'field' || x === 'aquarium' || x === 'aquaculture') return x;
  fail('bad-trade', `trade must be field, aquarium or aquaculture; got ${JSON.stringify(x)}.`, 'trade');
}

/** A target quantity in words for messages: [name, unit]. */
const TARGET_WORDS: Record<TargetQuantity, [string, string]> = {
  alkalinity_umol_kg: ['alkalinity', 'µmol/kg'],
  alkalinity_dkh: ['alkalinity', 'dKH'],
  alkalinity_meq_l: ['alkalinity', 'meq/L'],
  alkalinity_mg_l_caco3: ['alkalinity', 'mg/L as CaCO₃'],
  ph: ['pH', ''],
  omega_calcite: ['Ω calcite', ''],
  omega_aragonite: ['Ω aragonite', ''],
  co2_umol_kg: ['dissolved CO₂', 'µmol/kg'],
  co2_mg_l: ['dissolved CO₂', 'mg/L'],
  pco2_uatm: ['pCO₂', 'µatm'],
  dic_umol_kg: ['DIC', 'µmol/kg'],
  calcium_umol_kg: ['calcium', 'µmol/kg'],
  calcium_mg_l: ['calcium', 'mg/L'],
};

/**
 * Limestone cannot reach a target beyond calcite saturation: the plan says so and stops at the
 * saturated water (the dose that saturates it, found by `applyDose`'s own stop), instead of
 * predicting a water that full dissolution would give.
 */
function saturationStop(
  w: PlanWater,
  chem: Chemical,
  form: ReturnType<typeof amountForm>,
  q: TargetQuantity,
  value: number,
) {
  // Far more limestone than any water dissolves: applyDose keeps only what dissolves.
  const plenty = 2 * w.basisKg;
  const d = applyDose(w, chem, form.amountFor(plenty));
  const dissolved = plenty - (d.change.undissolved_g ?? 0) / chem.molarMassGPerMol;
  const sat = applyDose(w, chem, form.amountFor(Math.max(dissolved, 0)));
  const achieved = quantityOf(sat.water, q);
  const [name, unit] = TARGET_WORDS[q];
  const u = unit ? ` ${unit}` : '';
  sat.warnings.push(
    warning(
      'target-beyond-saturation',
      `${chem.name[0]!.toUpperCase()}${chem.name.slice(1)} stops dissolving when the water is saturated with calcite (Ω = 1), at ${name} ${Number(achieved.toPrecision(3))}${u}: the target ${value}${u} cannot be reached with it. The plan stops at saturation; use a soluble chemical (such as sodium bicarbonate or hydrated lime) to go further.`,
      'target',
    ),
  );
  return {
    moles: Math.max(dissolved, 0),
    dose: sat,
    achieved,
    miss: achieved - value,
    warnings: [] as Issue[],
  };
}

function runAction(w: PlanWater, a: Raw, used: Chemical[]): { step: PlanStep; water: PlanWater } {
  const name = a.action;
  if (typeof name !== 'string' || !(ACTIONS as readonly string[]).includes(name)) {
    fail(
      'unknown-action',
      `action must be one of ${ACTIONS.join(', ')}; got ${JSON.stringify(name)}.`,
      'action',
    );
  }
  switch (name as ActionName) {
    case 'add': {
      const chem = chemicalById(a.chemical);
      used.push(chem);
      const amount = readAmount(a, chem);
      const d = applyDose(w, chem, amount);
      const step = stepFrom('add', d.water, d.warnings);
      step.dose = doseOf(chem, amount.moles, amount.given);
      step.change = d.change;
      return { step, water: d.water };
    }
    case 'equilibrate': {
      const target = optNumber(a, 'target_pco2_uatm') ?? DEFAULT_AIR_PCO2_UATM;
      const fraction = optNumber(a, 'fraction') ?? 1;
      const r = equilibrate(w, target, fraction);
      const step = stepFrom('equilibrate', r.water, r.warnings);
      step.exchange = {
        target_pco2_uatm: target,
        fraction,
        co2_mol: r.co2_mol,
        delta_dic_umol_kg: r.delta_dic_umol_kg,
        equilibrium: r.equilibrium.solved,
      };
      return { step, water: r.water };
    }
    case 'mix': {
      const list = a.waters;
      if (!Array.isArray(list) || list.length === 0) {
        fail(
          'mix-needs-two',
          'mix needs waters: a list of { water, volume_l | mass_kg } to mix with the current water.',
          'waters',
        );
      }
      const others = list.map((x: unknown, j: number) => {
        const o = asObject(x, `Mixed water ${j + 1}`, `waters[${j}]`);
        return planWater(o.water, readQuantity(o, `Mixed water ${j + 1}`), `Mixed water ${j + 1}`);
      });
      const opts: { temperatureC?: number; pressureDbar?: number } = {};
      const t = optNumber(a, 'temperature_c');
      const p = optNumber(a, 'pressure_dbar');
      if (t !== undefined) opts.temperatureC = t;
      if (p !== undefined) opts.pressureDbar = p;
      const all = [w, ...others];
      const r = mixWaters(all, opts);
      const step = stepFrom('mix', r.water, r.warnings);
      step.mix = { mass_fractions: r.mass_fractions, volumes_l: all.map((x) => x.volumeL) };
      return { step, water: r.water };
    }
    case 'reach': {
      const chem = chemicalById(a.chemical);
      used.push(chem);
      const target = asObject(a.target, 'target', 'target');
      const keys = Object.keys(target);
      if (keys.length !== 1 || !(TARGET_QUANTITIES as readonly string[]).includes(keys[0]!)) {
        fail(
          'bad-target',
          `target must name one of ${TARGET_QUANTITIES.join(', ')} with its value, e.g. {"ph": 8.2}.`,
          'target',
        );
      }
      const q = keys[0] as TargetQuantity;
      const value = optNumber(target, q);
      if (value === undefined) fail('bad-target', `The target ${q} needs a number.`, 'target');
      const form = amountForm(a, chem);
      let sol: Pick<ReturnType<typeof doseToTarget>, 'moles' | 'dose' | 'achieved' | 'miss' | 'warnings'>;
      try {
        sol = doseToTarget(w, chem, form, q, value);
      } catch (e) {
        if (!(e instanceof TufaError && e.code === 'target-unreachable' && chem.id === 'calcium_carbonate'))
          throw e;
        sol = saturationStop(w, chem, form, q, value);
      }
      const limits: { ph?: number; alkalinityUmolKg?: number } = {};
      const maxPh = optNumber(a, 'max_ph_step');
      const maxTa = optNumber(a, 'max_alkalinity_step_umol_kg');
      const maxDkh = optNumber(a, 'max_alkalinity_step_dkh');
      if (maxTa !== undefined && maxDkh !== undefined) {
        fail(
          'step-limit-given-twice',
          'Give the alkalinity step limit once, in µmol/kg or in dKH.',
          'max_alkalinity_step_dkh',
        );
      }
      if (maxPh !== undefined) limits.ph = maxPh;
      if (maxTa !== undefined) limits.alkalinityUmolKg = maxTa;
      if (maxDkh !== undefined) {
        if (!(maxDkh > 0))
          fail(
            'bad-step-limit',
            `max_alkalinity_step_dkh must be greater than zero, got ${maxDkh}.`,
            'max_alkalinity_step_dkh',
          );
        limits.alkalinityUmolKg = alkalinityToEqKg(maxDkh, 'dkh', kgPerLitre(w.input, w.solved).basis) * 1e6;
      }
      const warnings = [...sol.warnings, ...sol.dose.warnings];
      let water = sol.dose.water;
      const step = stepFrom('reach', water, warnings);
      step.dose = doseOf(chem, sol.moles, form.describe(sol.moles));
      step.change = sol.dose.change;
      step.target = { quantity: q, value, achieved: sol.achieved, miss: sol.miss };
      if (limits.ph !== undefined || limits.alkalinityUmolKg !== undefined) {
        const parts = splitDose(w, chem, form, sol.moles, limits);
        step.substeps = parts.map((s) => ({
          dose: doseOf(chem, s.moles, form.describe(s.moles)),
          change: s.dose.change,
          after: s.dose.water.solved,
        }));
        // The steps end where the single dose ends (moles and masses add); report the stepped water.
        water = parts[parts.length - 1]!.dose.water;
        step.after = water.solved;
        step.water = { ...water.input };
        step.volume_l = water.volumeL;
      }
      return { step, water };
    }
  }
}
