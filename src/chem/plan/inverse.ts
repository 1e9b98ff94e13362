/**
 * Inverse planning: the dose of one chemical that takes a water to a target alkalinity, pH, Ω,
 * CO2, DIC or calcium, and its split into steps no larger than the user's limits.
 *
 * The forward model is the same `applyDose` a user can run, so the dose found reproduces the
 * target when applied forward. Root finding: scan the dose upward in factors of 2 from 1e-8 mol
 * per kg of water until the miss changes sign (the smallest dose that reaches the target), then
 * Illinois regula falsi in that bracket with bisection fallback until the miss is within
 * 1e-9·max(1, |target|) in the target's units, or 200 iterations; the miss reached is reported.
 * Every loop here has a fixed bound and ends in a result or a coded error (`plan-search-gave-up`,
 * `target-unreachable`, `too-many-steps`), never a hang, whatever the input.
 */

import { fail, type Issue, warning } from '../errors';
import { MOLAR_MASS_G_PER_MOL } from '../physical';
import { alkalinityFromEqKg } from '../units';
import { type Amount, readAmount } from './amount';
import type { Chemical } from './chemicals';
import { applyDose, type DoseResult } from './dose';
import { kgPerLitre, type PlanWater, phOf } from './water';

export const TARGET_QUANTITIES = [
  'alkalinity_umol_kg',
  'alkalinity_dkh',
  'alkalinity_meq_l',
  'alkalinity_mg_l_caco3',
  'ph',
  'omega_calcite',
  'omega_aragonite',
  'co2_umol_kg',
  'co2_mg_l',
  'pco2_uatm',
  'dic_umol_kg',
  'calcium_umol_kg',
  'calcium_mg_l',
] as const;
export type TargetQuantity = (typeof TARGET_QUANTITIES)[number];

/** A quantity of a planned water, in the target's units. */
export function quantityOf(w: PlanWater, q: TargetQuantity): number {
  const s = w.solved;
  const perL = kgPerLitre(w.input, s).basis;
  switch (q) {
    case 'alkalinity_umol_kg':
      return s.alkalinity_umol_kg;
    case 'alkalinity_dkh':
      return alkalinityFromEqKg(s.alkalinity_umol_kg * 1e-6, 'dkh', perL);
    case 'alkalinity_meq_l':
      return alkalinityFromEqKg(s.alkalinity_umol_kg * 1e-6, 'meq_l', perL);
    case 'alkalinity_mg_l_caco3':
      return alkalinityFromEqKg(s.alkalinity_umol_kg * 1e-6, 'mg_l_caco3', perL);
    case 'ph':
      return phOf(w);
    case 'omega_calcite':
    case 'omega_aragonite': {
      const omega = s[q];
      if (omega === null) {
        fail(
          'target-needs-calcium',
          `${q} needs the calcium of the water: give calcium_mg_l or calcium_umol_kg.`,
          'calcium_mg_l',
        );
      }
      return omega;
    }
    case 'co2_umol_kg':
      return s.co2_umol_kg;
    case 'co2_mg_l':
      return s.co2_umol_kg * 1e-3 * MOLAR_MASS_G_PER_MOL.CO2 * perL;
    case 'pco2_uatm':
      return s.pco2_uatm;
    case 'dic_umol_kg':
      return s.dic_umol_kg;
    case 'calcium_umol_kg':
      return s.totals_umol_kg.calcium;
    case 'calcium_mg_l':
      return s.totals_umol_kg.calcium * 1e-3 * MOLAR_MASS_G_PER_MOL.Ca * perL;
  }
}

/**
 * The amount for any number of moles, in the form the user will measure it: solid product (with
 * purity), or a stock solution of given strength (its water dilutes the tank).
 */
export interface AmountForm {
  amountFor(moles: number): Amount;
  /** What to weigh or measure out for these moles: mass_g of product or stock_volume_ml. */
  describe(moles: number): Record<string, number>;
}

export function amountForm(raw: Readonly<Record<string, unknown>>, chem: Chemical): AmountForm {
  if (raw.stock_mol_l !== undefined || raw.stock_g_l !== undefined || raw.stock_percent_w_w !== undefined) {
    const perLitre = readAmount({ ...raw, stock_volume_ml: 1000 }, chem);
    return {
      amountFor: (n) => {
        const f = n / perLitre.moles;
        return {
          moles: n,
          stockWaterKg: perLitre.stockWaterKg * f,
          stockVolumeL: f,
          given: { stock_volume_ml: f * 1000 },
          warnings: perLitre.warnings,
        };
      },
      describe: (n) => ({ ...perLitre.given, stock_volume_ml: (n / perLitre.moles) * 1000 }),
    };
  }
  const perGram = readAmount({ mass_g: 1, purity_percent: raw.purity_percent }, chem);
  return {
    amountFor: (n) => ({
      moles: n,
      stockWaterKg: 0,
      stockVolumeL: 0,
      given: { mass_g: n / perGram.moles },
      warnings: [],
    }),
    describe: (n) => ({ mass_g: n / perGram.moles, purity_percent: perGram.given.purity_percent ?? 100 }),
  };
}

export interface TargetSolution {
  moles: number;
  dose: DoseResult;
  achieved: number;
  miss: number;
  iterations: number;
  warnings: Issue[];
}

const SCAN_START_MOL_KG = 1e-8;
const SCAN_MAX_MOL_KG = 2;
const MAX_ITERATIONS = 200;
/** Doublings from the start to the end of the scan, plus slack: the scan's hard bound. */
const MAX_SCAN = Math.ceil(Math.log2(SCAN_MAX_MOL_KG / SCAN_START_MOL_KG)) + 2;

function gaveUp(what: string): never {
  fail(
    'plan-search-gave-up',
    `The dose search ${what} and stopped. Check the amount of water and the target; nothing was planned.`,
    'target',
  );
}

export function doseToTarget(
  w: PlanWater,
  chem: Chemical,
  form: AmountForm,
  q: TargetQuantity,
  target: number,
): TargetSolution {
  if (!Number.isFinite(target)) fail('not-a-number', `The target ${q} must be a finite number.`, 'target');
  const tol = 1e-9 * Math.max(1, Math.abs(target));
  const at = (n: number): { d: DoseResult; g: number } => {
    const d = applyDose(w, chem, form.amountFor(n));
    return { d, g: quantityOf(d.water, q) - target };
  };
  const now = quantityOf(w, q);
  if (Math.abs(now - target) <= tol) {
    fail(
      'target-already-met',
      `The water already has ${q} ${now.toPrecision(6)}: no dose is needed.`,
      'target',
    );
  }
  const g0 = now - target;
  let lo = 0;
  let glo = g0;
  let hi = SCAN_START_MOL_KG * w.basisKg;
  const end = SCAN_MAX_MOL_KG * w.basisKg;
  // A water too small for the scan's steps to grow (5e-324 L underflows them to 0) cannot be searched.
  if (!(hi > 0 && Number.isFinite(end) && end > hi)) gaveUp(`cannot scan doses for ${w.basisKg} kg of water`);
  let probe = safeAt(at, hi);
  let scans = 0;
  while (probe !== undefined && Math.sign(probe.g) === Math.sign(g0) && hi < end) {
    if (++scans > MAX_SCAN) gaveUp(`found no bracket after ${MAX_SCAN} steps`);
    lo = hi;
    glo = probe.g;
    hi *= 2;
    probe = safeAt(at, hi);
  }
  if (probe === undefined || Math.sign(probe.g) === Math.sign(g0)) {
    const way = probe !== undefined && Math.abs(probe.g) < Math.abs(g0) ? 'towards' : 'away from';
    fail(
      'target-unreachable',
      `No dose of ${chem.name} up to ${SCAN_MAX_MOL_KG} mol/kg reaches ${q} ${target}: it moves ${q} ${way} the target from ${now.toPrecision(6)}. Choose another chemical or target.`,
      'target',
    );
  }
  let ghi = probe.g;
  let best = probe;
  let bestN = hi;
  let side = 0;
  let i = 0;
  for (; i < MAX_ITERATIONS && Math.abs(best.g) > tol; i++) {
    // Illinois: halve the stale end's weight so regula falsi does not stall on one side.
    let n = (lo * ghi - hi * glo) / (ghi - glo);
    if (!(n > lo && n < hi)) n = 0.5 * (lo + hi);
    const r = safeAt(at, n);
    if (r === undefined) gaveUp(`met a dose the model cannot compute (${n.toPrecision(3)} mol)`);
    if (Math.abs(r.g) < Math.abs(best.g)) {
      best = r;
      bestN = n;
    }
    if (Math.sign(r.g) === Math.sign(ghi)) {
      hi = n;
      ghi = r.g;
      if (side === 1) glo /= 2;
      side = 1;
    } else {
      lo = n;
      glo = r.g;
      if (side === -1) ghi /= 2;
      side = -1;
    }
    if (hi - lo <= 1e-15 * hi) break;
  }
  const warnings: Issue[] = [];
  if (Math.abs(best.g) > tol) {
    warnings.push(
      warning(
        'target-approximate',
        `The dose reaches ${q} to within ${Math.abs(best.g).toPrecision(3)}, not ${tol.toPrecision(1)}.`,
      ),
    );
  }
  return { moles: bestN, dose: best.d, achieved: best.g + target, miss: best.g, iterations: i, warnings };
}

/** The forward model at dose n, or undefined where it fails or misses by a non-number. */
function safeAt<T extends { g: number }>(f: (n: number) => T, n: number): T | undefined {
  try {
    const r = f(n);
    return Number.isFinite(r.g) ? r : undefined;
  } catch {
    return undefined;
  }
}

export interface StepLimits {
  /** Largest pH change per step (pH units). */
  ph?: number;
  /** Largest alkalinity change per step, µmol/kg. */
  alkalinityUmolKg?: number;
}

export interface DoseStep {
  moles: number;
  dose: DoseResult;
}

const MAX_STEPS = 100;

/** How far a dose goes against the limits: 1 = exactly at the tighter limit. */
function load(d: DoseResult, lim: StepLimits): number {
  let x = 0;
  if (lim.ph !== undefined) x = Math.max(x, Math.abs(d.change.delta_ph) / lim.ph);
  if (lim.alkalinityUmolKg !== undefined)
    x = Math.max(x, Math.abs(d.change.delta_alkalinity_umol_kg) / lim.alkalinityUmolKg);
  return x;
}

/**
 * Splits a total dose into steps, each the largest part of what is left that keeps within the
 * limits, applied one after another (each step starts from the water the last one left).
 */
export function splitDose(
  w: PlanWater,
  chem: Chemical,
  form: AmountForm,
  totalMoles: number,
  lim: StepLimits,
): DoseStep[] {
  for (const [k, v] of Object.entries(lim)) {
    if (v !== undefined && !(Number.isFinite(v) && v > 0))
      fail('bad-step-limit', `The step limit ${k} must be greater than zero, got ${v}.`, 'max_step');
  }
  const steps: DoseStep[] = [];
  let water = w;
  let left = totalMoles;
  while (left > 1e-12 * totalMoles) {
    if (steps.length >= MAX_STEPS) {
      fail(
        'too-many-steps',
        `The dose needs more than ${MAX_STEPS} steps within these limits; raise the limits or lower the target.`,
        'max_step',
      );
    }
    const full = applyDose(water, chem, form.amountFor(left));
    if (load(full, lim) <= 1) {
      steps.push({ moles: left, dose: full });
      break;
    }
    // Bisection for the part of the dose that meets the tighter limit (the load rises with the dose).
    let a = 0;
    let b = left;
    let good: DoseStep | undefined;
    for (let i = 0; i < 60; i++) {
      const m = 0.5 * (a + b);
      const d = applyDose(water, chem, form.amountFor(m));
      if (load(d, lim) <= 1) {
        a = m;
        good = { moles: m, dose: d };
      } else b = m;
      if (b - a <= 1e-6 * b) break;
    }
    if (good === undefined)
      fail('too-many-steps', 'Even a tiny dose exceeds the step limit; raise the limit.', 'max_step');
    steps.push(good);
    water = good.dose.water;
    left -= good.moles;
  }
  return steps;
}
