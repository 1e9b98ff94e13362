/**
 * Saturation and treatment indices of a fresh water from a solved carbonate state and its fresh
 * ConstantSet: saturation indices, the Langelier and Ryznar indices, the calcium carbonate
 * precipitation potential, and the pH the water reaches in equilibrium with air.
 * Concentrations in mol/kg of water, h = activity of H+ (the fresh model's internal scale).
 */

import { fail } from '../errors';
import { carbonateAlkalinityPerDic, nonCarbonateAlkalinity } from '../solver/alkalinity';
import { refineBracket } from '../solver/roots';
import type { ConstantSet, MinorTotals } from '../types';

/**
 * A root of f near x0: steps away from x0 in direction `dir`, doubling the step (from `step`)
 * until f changes sign or a bound is passed, then refines by Illinois to 1e-12. Returns undefined
 * when no sign change lies between x0 and the bound, or when `stopIfFalling` and f turns down
 * before crossing zero (the maximum was passed).
 */
function rootNear(
  f: (x: number) => number,
  x0: number,
  dir: 1 | -1,
  step: number,
  lo: number,
  hi: number,
  stopIfFalling = false,
): number | undefined {
  let a = Math.min(hi, Math.max(lo, x0));
  let fa = f(a);
  if (fa === 0) return a;
  let h = step;
  for (let i = 0; i < 60; i++) {
    const b = Math.min(hi, Math.max(lo, a + dir * h));
    const fb = f(b);
    if (fa * fb <= 0) return fb === 0 ? b : refineBracket(f, a, b, fa, fb);
    if (b === lo || b === hi) return undefined;
    if (stopIfFalling && fb < fa) return undefined;
    a = b;
    fa = fb;
    h *= 2;
  }
  return undefined;
}

/** SI = log10(IAP/Ksp) = log10 of the conditional product over the conditional constant. */
export function saturationIndex(product: number, kspConditional: number): number {
  return Math.log10(product / kspConditional);
}

/** [CO3--] at h for a water of total alkalinity ta (mol/kg) — the pH path of a fixed-TA water. */
function carbonateAtFixedTa(h: number, ta: number, k: ConstantSet, t: MinorTotals): number {
  const dic = (ta - nonCarbonateAlkalinity(h, k, t)) / carbonateAlkalinityPerDic(h, k);
  const k1k2 = k.k1 * k.k2;
  return (dic * k1k2) / (h * h + k.k1 * h + k1k2);
}

/**
 * The residuals below read their water from module-level scratch records instead of closures, so
 * a solve allocates no function objects here (these run once per row of a batch).
 */
const phs = {
  ta: 0,
  calcium: 0,
  k: undefined as unknown as ConstantSet,
  t: undefined as unknown as MinorTotals,
};
function phsResidual(x: number): number {
  const co3 = carbonateAtFixedTa(10 ** -x, phs.ta, phs.k, phs.t);
  // Beyond the pH where OH- alone carries the alkalinity there is no carbonate at all.
  return co3 > 0 ? Math.log10((phs.calcium * co3) / phs.k.kspCalcite) : -50;
}

/**
 * pHs, the pH at which a water of the same total alkalinity and calcium is in equilibrium with
 * calcite (Langelier 1936, J. Am. Water Works Assoc. 28, 1500; the exact form of Standard Methods
 * 2330 B, which keeps every alkalinity term instead of TA ≈ HCO3-). Found on the fixed-TA path,
 * starting from Langelier's own approximation pHs ≈ pK2′ − pKsp′ + p[Ca] + p[TA], stepping
 * (0.05 pH, doubling) to a sign change and refining by Illinois to 1e-12 pH, within pH 2–13.
 * Returns undefined when no pH makes the water saturated (too little calcium or alkalinity).
 */
export function phSaturationCalcite(
  ta: number,
  calcium: number,
  k: ConstantSet,
  t: MinorTotals,
): number | undefined {
  if (!(ta > 0) || !(calcium > 0)) return undefined;
  phs.ta = ta;
  phs.calcium = calcium;
  phs.k = k;
  phs.t = t;
  const f = phsResidual;
  const guess = Math.log10(k.kspCalcite / (k.k2 * calcium * ta));
  const x0 = Math.min(12, Math.max(3, guess));
  const f0 = f(x0);
  if (f0 === 0) return x0;
  // Ω rises with pH along the path up to a maximum near where OH- takes over the alkalinity.
  return f0 > 0 ? rootNear(f, x0, -1, 0.05, 2, 13) : rootNear(f, x0, 1, 0.05, 2, 13, true);
}

/** Langelier saturation index LSI = pH − pHs (Langelier 1936). Positive: scale-forming. */
export function langelierIndex(ph: number, phs: number): number {
  return ph - phs;
}

/** Ryznar stability index RSI = 2 pHs − pH (Ryznar 1944, J. Am. Water Works Assoc. 36, 472). */
export function ryznarIndex(ph: number, phs: number): number {
  return 2 * phs - ph;
}

export interface PrecipitationPotential {
  /** CaCO3 that precipitates (> 0) or dissolves (< 0) to reach calcite equilibrium, mol/kg. */
  molKg: number;
  /** pH after equilibration. */
  phAfter: number;
}

const CCPP_STEP = 0.02;

const ccpp = {
  ta: 0,
  dic: 0,
  calcium: 0,
  k: undefined as unknown as ConstantSet,
  t: undefined as unknown as MinorTotals,
};
/** CaCO3 removed (mol/kg) on the reaction path when the pH has become −log h. */
function ccppX(h: number): number {
  const phi = carbonateAlkalinityPerDic(h, ccpp.k);
  return (ccpp.dic * phi + nonCarbonateAlkalinity(h, ccpp.k, ccpp.t) - ccpp.ta) / (phi - 2);
}
function ccppResidual(ph: number): number {
  const k = ccpp.k;
  const h = 10 ** -ph;
  const x = ccppX(h);
  const ca = ccpp.calcium - x;
  const c = ccpp.dic - x;
  if (ca <= 0 || c <= 0) return -50; // more than all the calcium or carbon would have to go
  const k1k2 = k.k1 * k.k2;
  const co3 = (c * k1k2) / (h * h + k.k1 * h + k1k2);
  return Math.log10((ca * co3) / k.kspCalcite);
}

/**
 * Calcium carbonate precipitation potential, solved (not approximated): the amount x of calcite
 * that must precipitate from (x > 0) or dissolve into (x < 0) the closed water so that
 * (Ca − x)·[CO3--](TA − 2x, DIC − x) = Ksp'. On the pH path of that reaction x is explicit,
 * x(h) = (DIC·φ(h) + A_nc(h) − TA) / (φ(h) − 2) with φ the carbonate alkalinity per DIC, so the
 * equilibrium is one root in pH: stepping from the current pH (0.02 pH, doubling) to a sign
 * change, then Illinois refinement to 1e-12 pH. Ionic strength and activity coefficients are held at the sample's values.
 */
export function precipitationPotentialCalcite(
  ta: number,
  dic: number,
  calcium: number,
  h0: number,
  k: ConstantSet,
  t: MinorTotals,
): PrecipitationPotential {
  if (!(calcium > 0))
    fail('ccpp-needs-calcium', 'The precipitation potential needs calcium.', 'calcium_mg_l');
  ccpp.ta = ta;
  ccpp.dic = dic;
  ccpp.calcium = calcium;
  ccpp.k = k;
  ccpp.t = t;
  const g = ccppResidual;
  const ph0 = -Math.log10(h0);
  const g0 = g(ph0);
  if (g0 === 0) return { molKg: 0, phAfter: ph0 };
  // Precipitation releases H+ (pH falls); dissolution consumes it (pH rises).
  const ph = rootNear(g, ph0, g0 > 0 ? -1 : 1, CCPP_STEP, 0, 14);
  if (ph !== undefined) return { molKg: ccppX(10 ** -ph), phAfter: ph };
  return fail('ccpp-no-solution', 'No calcite equilibrium was found for this water between pH 0 and 14.');
}

const air = { co2: 0, ta: 0, k: undefined as unknown as ConstantSet, t: undefined as unknown as MinorTotals };
function airDic(h: number): number {
  const k = air.k;
  return air.co2 * (1 + k.k1 / h + (k.k1 * k.k2) / (h * h));
}
function airResidual(x: number): number {
  const h = 10 ** -x;
  return airDic(h) * carbonateAlkalinityPerDic(h, air.k) + nonCarbonateAlkalinity(h, air.k, air.t) - air.ta;
}

/**
 * pH of the water after it has exchanged CO2 with air of partial pressure pco2Atm until
 * equilibrium, at constant total alkalinity (CO2 exchange leaves TA unchanged).
 * [CO2*] = K0'·fCO2 with fCO2 = pCO2·fugacityFactor; TA(h) at fixed CO2* rises monotonically with
 * pH; from the carbonate-only estimate it is bracketed by doubling steps and refined by Illinois
 * to 1e-12 pH, within pH 0–14.
 */
export function phAtAirEquilibrium(
  ta: number,
  pco2Atm: number,
  k: ConstantSet,
  t: MinorTotals,
): { h: number; dic: number } {
  if (!(pco2Atm > 0))
    fail('bad-air-pco2', 'The pCO2 of the air must be a positive number (µatm).', 'air_pco2_uatm');
  const co2 = k.k0 * pco2Atm * k.fugacityFactor;
  air.co2 = co2;
  air.ta = ta;
  air.k = k;
  air.t = t;
  const f = airResidual;
  // Start from the carbonate-only root TA·h² − K1·CO2·h − 2·K1·K2·CO2 = 0.
  const k1c = k.k1 * co2;
  const h0 = (k1c + Math.sqrt(k1c * k1c + 8 * Math.max(ta, 1e-12) * k1c * k.k2)) / (2 * Math.max(ta, 1e-12));
  const x0 = Math.min(14, Math.max(0, -Math.log10(h0)));
  const f0 = f(x0);
  const x = f0 === 0 ? x0 : rootNear(f, x0, f0 > 0 ? -1 : 1, 0.01, 0, 14);
  if (x === undefined) {
    fail(
      'no-solution',
      'No pH between 0 and 14 brings this alkalinity into equilibrium with the air.',
      'air_pco2_uatm',
    );
  }
  const h = 10 ** -x;
  return { h, dic: airDic(h) };
}
