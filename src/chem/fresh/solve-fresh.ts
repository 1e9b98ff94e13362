/**
 * The fresh-water side of a solve: constants at the sample's ionic strength (iterated with the
 * solved species when I comes from the major ions), and the outputs only the fresh model has.
 * The pair solver itself is shared with the saline model; this module never solves pairs itself
 * but is handed a callback that does.
 */

import type { FreshWaterOutputs } from '../api';
import { type Issue, warning } from '../errors';
import { MOLAR_MASS_G_PER_MOL } from '../physical';
import type { CarbonateState, Conditions, MinorTotals } from '../types';
import { type AlkalinityUnit, alkalinityFromEqKg } from '../units';
import { type FreshConstantSet, freshConstants } from './constants';
import {
  langelierIndex,
  phAtAirEquilibrium,
  phSaturationCalcite,
  precipitationPotentialCalcite,
  ryznarIndex,
  saturationIndex,
} from './indices';
import { chargeBalanceErrorPercent, ionicStrengthFromIons, type MajorIonsMolKg } from './ionic-strength';
import type { FreshRequest, IonicStrengthPlan } from './request';

export interface FreshContext {
  fresh: FreshRequest;
  plan: IonicStrengthPlan;
  ionsMolKg: MajorIonsMolKg;
  /** Calcium and magnesium in mol/kg of water, when known. */
  calciumMolKg: number | undefined;
  magnesiumMolKg: number | undefined;
  /** kg of water per litre of sample, for the per-litre outputs. */
  kgWaterPerL: number;
  minor: MinorTotals;
}

/** Iteration limits for ionic strength from species: |ΔI| ≤ 1e-13 + 1e-10·I within 30 passes. */
export const IONIC_STRENGTH_REL_TOL = 1e-10;
export const IONIC_STRENGTH_MAX_PASSES = 30;

export function freshConstantsAt(
  cond: Conditions,
  ionicStrength: number,
  ctx: FreshContext,
): FreshConstantSet {
  return freshConstants(cond, {
    ionicStrength,
    activity: ctx.fresh.activity,
    dolomite: ctx.fresh.dolomite,
    totalSulfate: ctx.ionsMolKg.so4,
    calcium: ctx.calciumMolKg ?? 0,
    magnesium: ctx.magnesiumMolKg ?? 0,
    minorTotals: ctx.minor,
  });
}

/** I implied by a solved state: from the major ions, or from the alkalinity alone. */
export function ionicStrengthOfState(s: CarbonateState, k: FreshConstantSet, ctx: FreshContext): number {
  const species = { hco3: s.hco3, co3: s.co3, oh: k.kw / s.h, hFree: s.h * k.freeHFactor };
  if (ctx.plan.method === 'major-ions') return ionicStrengthFromIons(ctx.ionsMolKg, species);
  // Sodium bicarbonate water: Na+ balances the alkalinity.
  return 0.5 * (Math.max(s.ta, 0) + species.hco3 + 4 * species.co3 + species.oh + species.hFree);
}

/**
 * Solves at a fixed point of ionic strength: evaluate constants at I, solve, recompute I from the
 * species, until I changes by less than 1e-10 relative (1e-13 absolute) or 30 passes. The
 * dependence is weak (γ varies as √I) and the secant step makes 3–4 passes usual. Returns the constants, the
 * callback's result, and the passes used; warns if the cap was reached.
 */
export function solveAtIonicStrength<T>(
  cond: Conditions,
  ctx: FreshContext,
  solveAt: (k: FreshConstantSet) => T,
  stateOf: (r: T) => CarbonateState,
): { k: FreshConstantSet; result: T; passes: number; warnings: Issue[] } {
  let I = ctx.plan.initial;
  let k = freshConstantsAt(cond, I, ctx);
  let result = solveAt(k);
  if (!ctx.plan.iterate) return { k, result, passes: 1, warnings: [] };
  // Fixed point I = g(I), accelerated by the secant on r(I) = g(I) − I once two passes exist.
  let iPrev = Number.NaN;
  let rPrev = Number.NaN;
  for (let pass = 2; pass <= IONIC_STRENGTH_MAX_PASSES; pass++) {
    const g = ionicStrengthOfState(stateOf(result), k, ctx);
    const r = g - I;
    if (Math.abs(r) <= 1e-13 + IONIC_STRENGTH_REL_TOL * g)
      return { k, result, passes: pass - 1, warnings: [] };
    let next = g;
    if (Number.isFinite(rPrev) && r !== rPrev) {
      const secant = I - (r * (I - iPrev)) / (r - rPrev);
      if (secant > 0 && Number.isFinite(secant)) next = secant;
    }
    iPrev = I;
    rPrev = r;
    I = next;
    k = freshConstantsAt(cond, I, ctx);
    result = solveAt(k);
  }
  return {
    k,
    result,
    passes: IONIC_STRENGTH_MAX_PASSES,
    warnings: [
      warning(
        'ionic-strength-not-converged',
        'The ionic strength did not settle within 30 passes; results are approximate.',
      ),
    ],
  };
}

export const TREATMENT_CAUTION =
  'The saturation indices and the precipitation potential are model estimates. Before dosing acid, lime, soda, CO2 or ' +
  'any conditioner: add it slowly and in steps, re-measure between steps, wear eye and skin protection, keep within ' +
  'the published limits for the animals and plants in the water, and follow local codes, product labels and licensed practice.';

/** The outputs only the fresh model has, for one state at output conditions. */
export function freshOutputs(s: CarbonateState, k: FreshConstantSet, ctx: FreshContext): FreshWaterOutputs {
  const g = k.gamma;
  const alk = (unit: AlkalinityUnit): number => alkalinityFromEqKg(s.ta, unit, ctx.kgWaterPerL);
  const out: FreshWaterOutputs = {
    ph: -Math.log10(s.h),
    ionic_strength_mol_kg: k.ionicStrength,
    ionic_strength_method: ctx.plan.method,
    activity_model: k.activityModel,
    activity_coefficients: { h: g.H, oh: g.OH, hco3: g.HCO3, co3: g.CO3, ca: g.Ca, mg: g.Mg, co2: g.neutral },
    pksp_dolomite: -Math.log10(k.kspDolomite),
    alkalinity_mmol_kg: alk('mmol_kg'),
    alkalinity_mmol_l: alk('mmol_l'),
    alkalinity_meq_l: alk('meq_l'),
    alkalinity_mg_l_caco3: alk('mg_l_caco3'),
    alkalinity_mg_l_hco3: alk('mg_l_hco3'),
    alkalinity_ppm_caco3: alk('ppm_caco3'),
    alkalinity_dkh: alk('dkh'),
    air_pco2_uatm: ctx.fresh.airPco2Uatm,
    pco2_excess_ratio: s.pco2 / (ctx.fresh.airPco2Uatm * 1e-6),
  };
  const airAtm = ctx.fresh.airPco2Uatm * 1e-6;
  if (s.ta > 0) {
    const air = phAtAirEquilibrium(s.ta, airAtm, k, ctx.minor);
    out.ph_air_equilibrium = -Math.log10(air.h);
    out.dic_air_equilibrium_umol_kg = air.dic * 1e6;
  }

  const ca = ctx.calciumMolKg;
  if (ca !== undefined && ca > 0) {
    out.saturation_index_calcite = saturationIndex(ca * s.co3, k.kspCalcite);
    out.saturation_index_aragonite = saturationIndex(ca * s.co3, k.kspAragonite);
    const mg = ctx.magnesiumMolKg;
    if (mg !== undefined && mg > 0)
      out.saturation_index_dolomite = saturationIndex(ca * mg * s.co3 * s.co3, k.kspDolomite);
    const phs = phSaturationCalcite(s.ta, ca, k, ctx.minor);
    if (phs !== undefined) {
      const ph = -Math.log10(s.h);
      out.ph_saturation_calcite = phs;
      out.langelier_index = langelierIndex(ph, phs);
      out.ryznar_index = ryznarIndex(ph, phs);
    }
    const ccpp = precipitationPotentialCalcite(s.ta, s.dic, ca, s.h, k, ctx.minor);
    out.ccpp_mg_l_caco3 = ccpp.molKg * MOLAR_MASS_G_PER_MOL.CaCO3 * 1000 * ctx.kgWaterPerL;
    out.ph_after_ccpp = ccpp.phAfter;
    out.treatment_caution = TREATMENT_CAUTION;
  }
  if (ctx.plan.method === 'major-ions') {
    out.charge_balance_error_percent = chargeBalanceErrorPercent(ctx.ionsMolKg, {
      hco3: s.hco3,
      co3: s.co3,
      oh: k.kw / s.h,
      hFree: s.h * k.freeHFactor,
    });
  }
  return out;
}
