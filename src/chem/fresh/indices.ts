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

const PHS_SCAN_FROM = 3;
const PHS_SCAN_TO = 13;
const PHS_SCAN_STEP = 0.25;

/**
 * pHs, the pH at which a water of the same total alkalinity and calcium is in equilibrium with
 * calcite (Langelier 1936, J. Am. Water Works Assoc. 28, 1500; the exact form of Standard Methods
 * 2330 B, which keeps every alkalinity term instead of TA ≈ HCO3-). Found on the fixed-TA path by
 * a scan in steps of 0.25 pH and Illinois refinement to 1e-12 pH. Returns undefined when no pH
 * makes the water saturated (too little calcium or alkalinity).
 */
export function phSaturationCalcite(
  ta: number,
  calcium: number,
  k: ConstantSet,
  t: MinorTotals,
): number | undefined {
  if (!(ta > 0) || !(calcium > 0)) return undefined;
  const f = (x: number): number => {
    const co3 = carbonateAtFixedTa(10 ** -x, ta, k, t);
    // Beyond the pH where OH- alone carries the alkalinity there is no carbonate at all.
    return co3 > 0 ? Math.log10((calcium * co3) / k.kspCalcite) : -50;
  };
  let xPrev = PHS_SCAN_FROM;
  let fPrev = f(xPrev);
  if (fPrev >= 0) return fPrev === 0 ? xPrev : undefined;
  for (let x = PHS_SCAN_FROM + PHS_SCAN_STEP; x <= PHS_SCAN_TO + 1e-9; x += PHS_SCAN_STEP) {
    const fx = f(x);
    if (fx >= 0) return fx === 0 ? x : refineBracket(f, xPrev, x, fPrev, fx);
    if (fx < fPrev) return undefined; // past the maximum of Ω without reaching saturation
    xPrev = x;
    fPrev = fx;
  }
  return undefined;
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
const CCPP_MAX_STEPS = 700;

/**
 * Calcium carbonate precipitation potential, solved (not approximated): the amount x of calcite
 * that must precipitate from (x > 0) or dissolve into (x < 0) the closed water so that
 * (Ca − x)·[CO3--](TA − 2x, DIC − x) = Ksp'. On the pH path of that reaction x is explicit,
 * x(h) = (DIC·φ(h) + A_nc(h) − TA) / (φ(h) − 2) with φ the carbonate alkalinity per DIC, so the
 * equilibrium is one root in pH: a scan from the current pH in steps of 0.02 pH, then Illinois
 * refinement to 1e-12 pH. Ionic strength and activity coefficients are held at the sample's values.
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
  const k1k2 = k.k1 * k.k2;
  const xOf = (h: number): number => {
    const phi = carbonateAlkalinityPerDic(h, k);
    return (dic * phi + nonCarbonateAlkalinity(h, k, t) - ta) / (phi - 2);
  };
  const g = (ph: number): number => {
    const h = 10 ** -ph;
    const x = xOf(h);
    const ca = calcium - x;
    const c = dic - x;
    if (ca <= 0 || c <= 0) return -50; // more than all the calcium or carbon would have to go
    const co3 = (c * k1k2) / (h * h + k.k1 * h + k1k2);
    return Math.log10((ca * co3) / k.kspCalcite);
  };
  const ph0 = -Math.log10(h0);
  const g0 = g(ph0);
  if (g0 === 0) return { molKg: 0, phAfter: ph0 };
  // Precipitation releases H+ (pH falls); dissolution consumes it (pH rises).
  const dir = g0 > 0 ? -1 : 1;
  let a = ph0;
  let fa = g0;
  for (let i = 1; i <= CCPP_MAX_STEPS; i++) {
    const b = ph0 + dir * i * CCPP_STEP;
    const fb = g(b);
    if (fa * fb <= 0) {
      const ph = fb === 0 ? b : refineBracket(g, a, b, fa, fb);
      return { molKg: xOf(10 ** -ph), phAfter: ph };
    }
    a = b;
    fa = fb;
  }
  return fail('ccpp-no-solution', 'No calcite equilibrium was found for this water between pH 0 and 14.');
}

/**
 * pH of the water after it has exchanged CO2 with air of partial pressure pco2Atm until
 * equilibrium, at constant total alkalinity (CO2 exchange leaves TA unchanged).
 * [CO2*] = K0'·fCO2 with fCO2 = pCO2·fugacityFactor; TA(h) at fixed CO2* rises monotonically with
 * pH, so the root is bracketed on pH 0–14 and refined by Illinois to 1e-12 pH.
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
  const dicOf = (h: number): number => co2 * (1 + k.k1 / h + (k.k1 * k.k2) / (h * h));
  const f = (x: number): number => {
    const h = 10 ** -x;
    return dicOf(h) * carbonateAlkalinityPerDic(h, k) + nonCarbonateAlkalinity(h, k, t) - ta;
  };
  const lo = 0;
  const hi = 14;
  const flo = f(lo);
  const fhi = f(hi);
  if (!(flo < 0 && fhi > 0)) {
    fail(
      'no-solution',
      'No pH between 0 and 14 brings this alkalinity into equilibrium with the air.',
      'air_pco2_uatm',
    );
  }
  const x = refineBracket(f, lo, hi, flo, fhi);
  const h = 10 ** -x;
  return { h, dic: dicOf(h) };
}
