/**
 * A plan saved with a reading, read back: what was planned, the amounts to weigh or measure, the
 * predicted water, and the planner's fields to reopen it with. The store keeps `plan` opaque (and
 * sync may bring a plan saved by an older version), so everything here is read defensively and
 * nothing imports the plan engine (the reading page is part of the app shell).
 */

import type { PlanOutput } from '../../chem/plan/plan';
import { DEFAULT_FORM, type PanelForm } from './plan-model';

export interface SavedPlan {
  request: Record<string, unknown>;
  result: PlanOutput;
  saved_at: string;
  /** The planner's fields when it was saved (absent in plans saved before they were kept). */
  form?: PanelForm;
}

type Raw = Record<string, unknown>;
const obj = (x: unknown): Raw | undefined =>
  typeof x === 'object' && x !== null && !Array.isArray(x) ? (x as Raw) : undefined;
const num = (x: unknown): number | undefined => (typeof x === 'number' && Number.isFinite(x) ? x : undefined);
const text = (x: unknown): string => (x === undefined ? '' : String(x));

/** The saved plan when `x` has its shape, else undefined. */
export function asSavedPlan(x: unknown): SavedPlan | undefined {
  const o = obj(x);
  if (!o || !obj(o.request) || !obj(o.result) || typeof o.saved_at !== 'string') return undefined;
  return o as unknown as SavedPlan;
}

/** The first action of the request (the planner saves one action per plan). */
function firstAction(p: SavedPlan): Raw | undefined {
  const actions = p.request.actions;
  return Array.isArray(actions) ? obj(actions[0]) : undefined;
}

/**
 * The planner's fields for a saved plan: those it kept, or recovered from its request, over the
 * defaults — so "Plan a change" reopens with the plan's own settings.
 */
export function formOfSavedPlan(p: SavedPlan): PanelForm {
  if (p.form) return { ...DEFAULT_FORM, ...p.form };
  const f: PanelForm = { ...DEFAULT_FORM };
  const vol = num(p.request.volume_l);
  if (vol !== undefined) f.volumeL = String(vol);
  const a = firstAction(p);
  if (!a) return f;
  const kind = a.action;
  if (kind === 'add' || kind === 'reach') {
    f.action = kind;
    if (typeof a.chemical === 'string') f.chemical = a.chemical as PanelForm['chemical'];
    if (a.purity_percent !== undefined) f.purityPercent = text(a.purity_percent);
    if (a.stock_mol_l !== undefined) {
      f.amountUnit = 'ml_stock';
      f.stockMolL = text(a.stock_mol_l);
    } else f.amountUnit = 'g';
    if (kind === 'add') {
      if (a.mass_g !== undefined) f.amount = text(a.mass_g);
      else if (a.moles !== undefined) {
        f.amountUnit = 'mol';
        f.amount = text(a.moles);
      } else if (a.stock_volume_ml !== undefined) f.amount = text(a.stock_volume_ml);
    } else {
      const target = obj(a.target);
      const [q, v] = Object.entries(target ?? {})[0] ?? [];
      if (q !== undefined) {
        f.targetQuantity = q as PanelForm['targetQuantity'];
        f.targetValue = text(v);
      }
      if (a.max_ph_step !== undefined) f.maxPhStep = text(a.max_ph_step);
      if (a.max_alkalinity_step_dkh !== undefined) f.maxAlkStepDkh = text(a.max_alkalinity_step_dkh);
    }
  } else if (kind === 'equilibrate') {
    f.action = 'equilibrate';
    if (a.target_pco2_uatm !== undefined) f.targetPco2 = text(a.target_pco2_uatm);
    const fr = num(a.fraction);
    if (fr !== undefined) f.fractionPercent = String(fr * 100);
  } else if (kind === 'mix') {
    f.action = 'mix';
    const w = Array.isArray(a.waters) ? obj(a.waters[0]) : undefined;
    const water = obj(w?.water);
    if (w?.volume_l !== undefined) f.mixVolumeL = text(w.volume_l);
    if (water) {
      f.mixTemperatureC = text(water.temperature_c);
      f.mixSalinity = text(water.salinity);
      f.mixAlkalinity = text(water.alkalinity_umol_kg);
      f.mixPh = text(water.ph);
    }
  }
  return f;
}

export interface SavedPlanSummary {
  savedAt: string;
  /** What was planned, in words. */
  what: string;
  /** What to weigh or measure, one line per dose (key → number, e.g. mass_g). */
  amounts: { chemical: string; measure: Record<string, number> }[];
  /** The predicted water: output key → value, before and after. */
  water: { key: string; before: number | undefined; after: number | undefined }[];
}

/** Outputs shown for the predicted water (those the planner's targets speak of). */
const WATER_KEYS = [
  'ph_nbs',
  'ph_total',
  'ph',
  'alkalinity_umol_kg',
  'dic_umol_kg',
  'pco2_uatm',
  'omega_calcite',
  'omega_aragonite',
];

export function summarizeSavedPlan(p: SavedPlan): SavedPlanSummary {
  const a = firstAction(p);
  const vol = num(p.request.volume_l);
  const inVol = vol !== undefined ? ` in ${vol} L` : '';
  let what = 'A plan';
  if (a?.action === 'add') what = `Add ${text(a.chemical).replace(/_/g, ' ')}${inVol}`;
  else if (a?.action === 'reach') {
    const [q, v] = Object.entries(obj(a.target) ?? {})[0] ?? [];
    what = `Dose ${text(a.chemical).replace(/_/g, ' ')} to ${text(q).replace(/_/g, ' ')} ${text(v)}${inVol}`;
  } else if (a?.action === 'equilibrate')
    what = `Exchange CO2 towards ${text(a.target_pco2_uatm)} µatm${inVol}`;
  else if (a?.action === 'mix') what = `Mix with another water${inVol}`;
  const amounts: SavedPlanSummary['amounts'] = [];
  for (const step of Array.isArray(p.result.steps) ? p.result.steps : []) {
    const doses = step.substeps?.length ? step.substeps.map((s) => s.dose) : step.dose ? [step.dose] : [];
    for (const d of doses) amounts.push({ chemical: d.formula ?? d.chemical, measure: d.measure ?? {} });
  }
  const before = obj(p.result.before) ?? {};
  const after = obj(p.result.after) ?? {};
  const water = WATER_KEYS.filter((k) => num(after[k]) !== undefined).map((k) => ({
    key: k,
    before: num(before[k]),
    after: num(after[k]),
  }));
  return { savedAt: p.saved_at, what, amounts, water };
}
