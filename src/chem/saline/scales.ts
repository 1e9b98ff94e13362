/**
 * pH scales in seawater and the factors between them.
 *
 * [H+]T = [H+]F (1 + ST/KS) and [H+]SWS = [H+]F (1 + ST/KS + FT/KF), KS and KF on the free scale
 * (Dickson et al. 2007, ch. 5). The NBS scale is an activity scale: in seawater it is tied to the
 * others only through an apparent activity coefficient of H+, which includes the liquid-junction
 * error of electrodes calibrated in dilute buffers. It is therefore approximate in seawater, and
 * every result on it should say so.
 */

import type { PhScale } from '../types';
import type { ValidityRange } from './issues';

/**
 * Takahashi et al. (1982) derived the coefficient from GEOSECS seawater; the range here is a
 * judgement (oceanic salinities, ocean temperatures), not a printed range.
 */
export const NBS_TAKAHASHI1982_VALIDITY: ValidityRange = {
  label: 'NBS pH conversion (Takahashi et al. 1982, approximate in seawater)',
  temperatureC: [0, 40],
  salinity: [20, 40],
};

/**
 * Apparent activity coefficient of H+ in seawater, fH = aH(NBS) / [H+]SWS.
 * Takahashi, T., Williams, R. T. & Bos, D. L. (1982) in GEOSECS Pacific Expedition vol. 3, ch. 3:
 * fH = 1.2948 − 0.002036 T + (0.0004607 − 0.000001475 T) S² (coefficients from memory).
 * @param tK temperature, K
 * @param s practical salinity
 * @returns fH, dimensionless; about 0.71 at S 35, 25 °C (computed from the formula)
 * Approximate: about S 20–40, t 0–40 °C; meaningless in fresh water.
 */
export function nbsActivityCoefficientTakahashi1982(tK: number, s: number): number {
  return 1.2948 - 0.002036 * tK + (0.0004607 - 0.000001475 * tK) * s * s;
}

/**
 * Fills `out` with h on each scale per unit of h on the total scale (the internal scale):
 * h_X = h_total · out[X].
 * @param st total sulfate, mol kg-1
 * @param ks bisulfate constant, free scale
 * @param ft total fluoride, mol kg-1
 * @param kf hydrogen fluoride constant, free scale
 * @param fH apparent H+ activity coefficient for the NBS scale
 */
export function salineScaleFactors(
  st: number,
  ks: number,
  ft: number,
  kf: number,
  fH: number,
  out: Record<PhScale, number> = { total: 1, free: 1, seawater: 1, nbs: 1 },
): Record<PhScale, number> {
  const totalPerFree = 1 + st / ks;
  const swsPerFree = totalPerFree + ft / kf;
  out.total = 1;
  out.free = 1 / totalPerFree;
  out.seawater = swsPerFree / totalPerFree;
  out.nbs = (fH * swsPerFree) / totalPerFree;
  return out;
}

/**
 * Converts a hydrogen ion concentration (or an acid constant, which scales the same way) from one
 * pH scale to another with the factors of one constant set.
 */
export function convertH(
  h: number,
  from: PhScale,
  to: PhScale,
  factors: Readonly<Record<PhScale, number>>,
): number {
  return from === to ? h : (h / factors[from]) * factors[to];
}

/** Converts a pH value between scales: pH_to = pH_from − log10(factor_to / factor_from). */
export function convertPh(
  ph: number,
  from: PhScale,
  to: PhScale,
  factors: Readonly<Record<PhScale, number>>,
): number {
  return from === to ? ph : ph + Math.log10(factors[from]) - Math.log10(factors[to]);
}
