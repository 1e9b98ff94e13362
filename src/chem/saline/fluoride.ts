/** Dissociation constant of hydrogen fluoride in seawater, free pH scale. */

import { ionicStrengthDickson1990, lnWaterFraction } from './ionic-strength';
import type { ValidityRange } from './issues';

/** Perez & Fraga (1987): fitted for t 9–33 °C, S 10–40. */
export const KF_PEREZFRAGA1987_VALIDITY: ValidityRange = {
  label: 'KF (Perez & Fraga 1987)',
  temperatureC: [9, 33],
  salinity: [10, 40],
};

/**
 * KF = [H+]F[F-]/[HF].
 * Perez, F. F. & Fraga, F. (1987) Marine Chemistry 21, 161–168, as restated in Dickson et al.
 * (2007), ch. 5: ln KF = 874/T − 9.68 + 0.111 √S.
 * @param tK temperature, K
 * @param s practical salinity
 * @returns KF in mol kg-1 of seawater (free scale)
 * Valid t 9–33 °C, S 10–40. Check: ln KF = −6.09 at S 35, 25 °C (Dickson et al. 2007, ch. 5).
 *
 * pH scale (issue 12 §4): treated as the free scale. What we can confirm: the check value above is
 * reproduced to the printed digits; the scale itself we could not confirm from the paper (no copy
 * at hand) — Perez & Fraga measured HF in seawater with a fluoride electrode and, as we recall
 * (memory), report [H+] as free, and programs that restate the fit use it on the free scale. If it
 * were on the total scale instead, KF(free) = KF/(1 + ST/KS) would be 1.22 times smaller at S 35
 * and the seawater scale would sit 0.0028 pH further from the total scale (0.0006 at S 10); the
 * total and free scales, TA and every carbonate output at the surface do not depend on KF at the
 * 0.001 level, because HF is negligible above pH 5 (figures computed with the engine).
 */
export function kfPerezFraga1987(tK: number, s: number, sqrtS: number = Math.sqrt(s)): number {
  return Math.exp(874 / tK - 9.68 + 0.111 * sqrtS);
}

/**
 * Dickson & Riley (1979) measured at three salinities (0, 26.7, 34.6) over about 5–35 °C; the
 * range given here is a judgement from that (memory of the paper), not a printed range.
 */
export const KF_DICKSONRILEY1979_VALIDITY: ValidityRange = {
  label: 'KF (Dickson & Riley 1979)',
  temperatureC: [5, 35],
  salinity: [0, 35],
};

/**
 * KF = [H+]F[F-]/[HF].
 * Dickson, A. G. & Riley, J. P. (1979) Marine Chemistry 7, 89–99, as restated in DOE (1994):
 * ln KF = 1590.2/T − 12.641 + 1.525 √I + ln(1 − 0.001005 S).
 * @param tK temperature, K
 * @param s practical salinity
 * @returns KF in mol kg-1 of seawater (free scale)
 * Valid about t 5–35 °C, S 0–35. Check: ln KF = −6.05 at S 35, 25 °C (computed by hand from the
 * formula as restated; no printed check value known).
 */
export function kfDicksonRiley1979(tK: number, s: number): number {
  return Math.exp(1590.2 / tK - 12.641 + 1.525 * Math.sqrt(ionicStrengthDickson1990(s)) + lnWaterFraction(s));
}
