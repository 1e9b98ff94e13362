/**
 * Forward model of an acid titration: the pH of a sample after a volume of strong acid is added,
 * for a closed vessel (DIC stays, only diluted) or a sample open to air (CO2* held at equilibrium
 * with the air). Used by the curve fit and to build synthetic titrations for tests.
 *
 * Proton condition after mixing V mL of acid (C eq/L) into V0 mL of sample of alkalinity TA:
 *   TA_mix = (V0·TA − V·C) / (V0 + V)           (strong acid lowers alkalinity 1:1; Dickson 1981)
 *   TA_mix = DIC_mix·(K1h + 2K1K2)/(h² + K1h + K1K2) + BT·KB/(KB + h) + Kw/h − h·freeHFactor
 * with h the H+ activity (fresh model: internal scale = NBS activity; see ../types.ts).
 *
 * Concentrations here are per litre of solution, because that is what a volumetric titration
 * measures; the constant set is per kg of water. In dilute water the two differ by under 0.5 %,
 * which shifts a pK by under 0.002, far below what a field pH meter resolves.
 */

import { fail } from '../errors';
import type { ConstantSet } from '../types';

/** Stop when a Newton step moves log10 h by less than this (state-of-the-art meters read 0.001). */
export const PH_TOLERANCE = 1e-12;
export const PH_MAX_ITERATIONS = 100;

/** Alkalinity (eq/L) of a solution with DIC and boron at H+ activity h, and its derivative d/dh. */
function alkalinityAndSlope(h: number, dic: number, boron: number, k: ConstantSet): [number, number] {
  const k1 = k.k1;
  const k1k2 = k1 * k.k2;
  const den = h * h + k1 * h + k1k2;
  const num = k1 * h + 2 * k1k2;
  const carb = (dic * num) / den;
  const dCarb = (dic * (k1 * den - num * (2 * h + k1))) / (den * den);
  const kbh = k.kb + h;
  const bor = (boron * k.kb) / kbh;
  const dBor = (-boron * k.kb) / (kbh * kbh);
  const ta = carb + bor + k.kw / h - h * k.freeHFactor;
  const slope = dCarb + dBor - k.kw / (h * h) - k.freeHFactor;
  return [ta, slope];
}

/** Open system: CO2* is fixed, so DIC = CO2*·(1 + K1/h + K1K2/h²); returns alkalinity and d/dh. */
function openAlkalinityAndSlope(h: number, co2: number, boron: number, k: ConstantSet): [number, number] {
  const k1 = k.k1;
  const k1k2 = k1 * k.k2;
  const carb = co2 * (k1 / h + (2 * k1k2) / (h * h));
  const dCarb = co2 * (-k1 / (h * h) - (4 * k1k2) / (h * h * h));
  const kbh = k.kb + h;
  const ta = carb + (boron * k.kb) / kbh + k.kw / h - h * k.freeHFactor;
  const slope = dCarb - (boron * k.kb) / (kbh * kbh) - k.kw / (h * h) - k.freeHFactor;
  return [ta, slope];
}

/**
 * Solves alkalinity(h) = target for h by Newton steps in ln h, kept inside a shrinking bracket
 * (alkalinity falls monotonically with h, so the bracket always holds the single root).
 * Reaches |Δlog10 h| < PH_TOLERANCE in 4–6 steps for natural waters; cap PH_MAX_ITERATIONS.
 */
function solveH(target: number, f: (h: number) => [number, number], startPh = 7): number {
  let lo = -16 * Math.LN10; // ln h bounds: pH 16 .. pH -1
  let hi = 1 * Math.LN10;
  let x = -Math.min(Math.max(startPh, 0), 15) * Math.LN10;
  for (let i = 0; i < PH_MAX_ITERATIONS; i++) {
    const h = Math.exp(x);
    const [ta, slope] = f(h);
    const r = ta - target;
    if (r > 0) lo = x;
    else hi = x;
    let next = x - r / (slope * h);
    // Converged before the bracket test: at the root a last tiny step may land on a bracket edge,
    // and bisecting a bracket whose far edge never moved would throw the iterate far away.
    if (Math.abs(next - x) < PH_TOLERANCE * Math.LN10) return Math.exp(next);
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    x = next;
  }
  fail('titration-model-no-convergence', 'The titration model did not converge to a pH.');
}

export interface TitrationSample {
  /** Alkalinity of the original sample, eq/L. */
  alkalinity: number;
  /** Closed system: DIC of the original sample, mol/L. */
  dic?: number;
  /** Open system: CO2 partial pressure of the air the sample stays in equilibrium with, atm. */
  pco2Atm?: number;
}

/**
 * pH (activity scale) after adding `volumeMl` of acid at `titrantEqL` to `sampleVolumeMl` of sample.
 * Boron (constant set total) is diluted like DIC; other minor acids are left out of a field titration.
 */
export function phAfterAcid(
  sample: TitrationSample,
  k: ConstantSet,
  sampleVolumeMl: number,
  titrantEqL: number,
  volumeMl: number,
  /** Where Newton starts (e.g. the reading's own pH); the same root, reached in fewer steps. */
  startPh = 7,
): number {
  const dilution = sampleVolumeMl / (sampleVolumeMl + volumeMl);
  const taMix = sample.alkalinity * dilution - (titrantEqL * volumeMl) / (sampleVolumeMl + volumeMl);
  const boron = k.totalBoron * dilution;
  let h: number;
  if (sample.pco2Atm !== undefined) {
    const co2 = k.k0 * k.fugacityFactor * sample.pco2Atm;
    h = solveH(taMix, (x) => openAlkalinityAndSlope(x, co2, boron, k), startPh);
  } else {
    const dic = (sample.dic ?? 0) * dilution;
    h = solveH(taMix, (x) => alkalinityAndSlope(x, dic, boron, k), startPh);
  }
  return -Math.log10(h);
}

/** DIC (mol/L) of a water of given alkalinity (eq/L) at pH (activity scale). */
export function dicFromAlkalinityPh(alkalinity: number, ph: number, k: ConstantSet): number {
  const h = 10 ** -ph;
  const k1 = k.k1;
  const k1k2 = k1 * k.k2;
  const perDic = (k1 * h + 2 * k1k2) / (h * h + k1 * h + k1k2);
  const rest = (k.totalBoron * k.kb) / (k.kb + h) + k.kw / h - h * k.freeHFactor;
  return (alkalinity - rest) / perDic;
}

/** DIC (mol/L) of a water at pH in equilibrium with air at pCO2 (atm). */
export function dicOpen(ph: number, pco2Atm: number, k: ConstantSet): number {
  const h = 10 ** -ph;
  const co2 = k.k0 * k.fugacityFactor * pco2Atm;
  return co2 * (1 + k.k1 / h + (k.k1 * k.k2) / (h * h));
}
