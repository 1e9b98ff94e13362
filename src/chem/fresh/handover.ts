/**
 * The handover between the fresh and the saline model for a water known only by its salinity (or
 * the specific conductance that stands for it): below the model boundary of S 2 the fresh model's
 * conditional constants are blended, in log K, with the saline model's constants at the same
 * salinity, converted to the fresh model's activity pH scale.
 *
 * Why a blend of constants: the same water must not change its pCO2 by a factor of two because
 * its salinity moved from 1.99 to 2.01 (issue 12). Without its composition, a water of salinity S
 * is taken as diluted sea salt; for that, Millero (2010) is the formulation fitted to estuarine
 * data (S 1–50) and it reduces to the pure-water constants at S 0, whereas the fresh model knows
 * only the Davies activity coefficients of free ions and misses the pairing of carbonate with Mg,
 * Ca and Na that dominates diluted seawater (at S 1 it puts pCO2 30 % below Millero 2010).
 * Blending constants, not results, keeps one solver for both waters: the blended set is an
 * ordinary `ConstantSet` and every output (pH on every scale, pCO2, Ω, buffer factors, fresh
 * indices) follows from it.
 *
 * The weight of the saline constants is w = 1 − (1 − √(S / 0.5))² below S 0.5 and 1 from there:
 * - at S 0 the fresh model is untouched (both models tend to the same infinite-dilution constants);
 * - w has zero slope at S 0.5, so nothing kinks where the blend ends; in √S (the variable both
 *   models' salinity terms go with) it is a parabola;
 * - from S 0.5 to the boundary at S 2 the fresh model carries the saline constants exactly, so the
 *   switch to the saline model at S 2 changes TA–DIC results only by what the two models still do
 *   differently (per kg of water or of solution, the H+ activity coefficient of the NBS scale):
 *   under 0.1 % in pCO2.
 * Why the blend ends at S 0.5 and not at S 1 or 2: Millero (2010) itself moves pCO2 by up to
 * 2.9 % per 0.05 in S near S 0.5 (for low-alkalinity waters with DIC close to TA, cold), so every
 * blend still running above S 0.5 added its own slope to that and broke 3 % per step somewhere in
 * the test grid (S_FULL 0.7: 3.1 %, 1: 3.2 %; a weight with a kink at S_FULL: 3.6 %). Below S 0.5
 * the steps per 0.05 S are large for any model (Millero alone: up to 6.8 % from S 0.05 to 0.1) and
 * the blend's are of the same size (up to 7.1 % there).
 * The price: a soft water known only by its conductance already carries part of the sea-salt
 * constants (w = 0.53 at S 0.05, about 100 µS/cm, which moves pCO2 by about 5 %). Give the major
 * ions and the fresh model describes the water by its own composition instead.
 * Waters whose major ions are given are described by their own composition and are not blended;
 * neither is a request that names the model (`model: fresh`).
 */

import type { ConstantSet } from '../types';
import type { FreshConstantSet } from './constants';

/** Salinity from which the fresh model carries the saline constants unchanged (weight 1). */
export const HANDOVER_FULL_SALINITY = 0.5;

/** Weight of the saline constants in the fresh model at practical salinity `s` (0 to 1). */
export function handoverWeight(s: number): number {
  if (!(s > 0)) return 0;
  if (s >= HANDOVER_FULL_SALINITY) return 1;
  const x = Math.sqrt(s / HANDOVER_FULL_SALINITY);
  return 1 - (1 - x) * (1 - x);
}

/** Acid constants with one H+ on the product side: on the internal scale in both models. */
const ACID_KEYS = ['k1', 'k2', 'kw', 'kb', 'k1p', 'k2p', 'k3p', 'ksi', 'knh4', 'kh2s'] as const;
/** Constants without H+: the same in both models' units (mol/kg; per kg of water or of solution differ by < 0.2 % below S 2). */
const PLAIN_KEYS = ['k0', 'kspCalcite', 'kspAragonite'] as const;

/** Fresh formulation keys and the saline ones of the same constant, for `formulations`. */
const FORMULATION_KEYS: readonly (readonly [string, string])[] = [
  ['k0', 'k0'],
  ['k1', 'k1'],
  ['k2', 'k2'],
  ['kw', 'kw'],
  ['kb', 'kb'],
  ['k1p', 'k1p'],
  ['k2p', 'k2p'],
  ['k3p', 'k3p'],
  ['ksi', 'ksi'],
  ['knh4', 'knh4'],
  ['kh2s', 'kh2s'],
  ['ksp_calcite', 'kspCalcite'],
  ['ksp_aragonite', 'kspAragonite'],
];

/**
 * The fresh set `kf` with its constants moved toward the saline set `ks` (same temperature and
 * salinity, at the surface) by weight `w` in log K. The saline acid constants (total scale,
 * h_T = [H+]free(1 + ST/KS)) are converted to the fresh internal scale (h = aH = γH·[H+]free) by
 * dividing by h_T/aH = (1/γH)(1 + ST/KS). KS and KF (free scale) and the fresh-only dolomite keep
 * their fresh values. Boron, sulfate and fluoride the user did not give are taken from salinity
 * as the saline model does (Lee et al. 2010, Morris & Riley 1966, Riley 1965): for a TA ≈ DIC
 * water the 25 µmol/kg of borate-forming boron at S 2 alone moves pCO2 by 5 %, and they vanish
 * with S, so the fresh water at S 0 is unchanged. Calcium is never invented: Ω needs it given.
 */
export function blendTowardSaline(kf: FreshConstantSet, ks: ConstantSet, w: number): FreshConstantSet {
  if (!(w > 0)) return kf;
  const toActivity = ks.scaleFactor.free / kf.freeHFactor;
  const out: FreshConstantSet = { ...kf };
  for (const key of ACID_KEYS) out[key] = kf[key] ** (1 - w) * (ks[key] * toActivity) ** w;
  for (const key of PLAIN_KEYS) out[key] = kf[key] ** (1 - w) * ks[key] ** w;
  if (!(kf.totalBoron > 0)) out.totalBoron = ks.totalBoron;
  if (!(kf.totalSulfate > 0)) out.totalSulfate = ks.totalSulfate;
  if (!(kf.totalFluoride > 0)) out.totalFluoride = ks.totalFluoride;
  const free = kf.freeHFactor;
  out.scaleFactor = {
    nbs: 1,
    free,
    total: free * (1 + out.totalSulfate / kf.ks),
    seawater: free * (1 + out.totalSulfate / kf.ks + out.totalFluoride / kf.kf),
  };
  const names: Record<string, string> = { ...kf.formulations };
  for (const [freshKey, salineKey] of FORMULATION_KEYS) {
    const saline = `${ks.formulations[salineKey]} (saline model${freshKey.startsWith('ksp') ? '' : ', converted to the activity scale'})`;
    names[freshKey] =
      w === 1 ? saline : `${kf.formulations[freshKey]} blended with ${saline}, weight ${w.toFixed(3)}`;
  }
  out.formulations = {
    ...names,
    handover: `weight ${w.toFixed(3)} of the saline constants at S ${ks.conditions.salinity.toPrecision(3)} (K1, K2: ${ks.formulations.k1}; K0: ${ks.formulations.k0}; Kw: ${ks.formulations.kw}; calcite, aragonite: ${ks.formulations.kspCalcite}; boron, sulfate, fluoride not given: from salinity), blended in log K with the fresh constants below S ${HANDOVER_FULL_SALINITY} (w = 1 − (1 − √(S/${HANDOVER_FULL_SALINITY}))²)`,
  };
  return out;
}
