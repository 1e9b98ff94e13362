/** Dissociation constant of the bisulfate ion in seawater, free pH scale. */

import { ionicStrengthDickson1990, lnWaterFraction } from './ionic-strength';
import type { ValidityRange } from './issues';

/** Dickson (1990a): fitted for t 0–45 °C, S 5–45. */
export const KS_DICKSON1990A_VALIDITY: ValidityRange = {
  label: 'KS (Dickson 1990a)',
  temperatureC: [0, 45],
  salinity: [5, 45],
};

/**
 * KS = [H+]F[SO4--]/[HSO4-].
 * Dickson, A. G. (1990a) J. Chem. Thermodynamics 22, 113–127, as restated in Dickson et al.
 * (2007), ch. 5, with I the ionic strength of seawater (see {@link ionicStrengthDickson1990}):
 * ln KS = −4276.1/T + 141.328 − 23.093 ln T + (−13856/T + 324.57 − 47.986 ln T) √I
 *         + (35474/T − 771.54 + 114.723 ln T) I − 2698/T I^1.5 + 1776/T I² + ln(1 − 0.001005 S).
 * @param tK temperature, K
 * @param s practical salinity
 * @returns KS in mol kg-1 of seawater (free scale)
 * Valid t 0–45 °C, S 5–45. Check: ln KS = −2.30 at S 35, 25 °C (Dickson et al. 2007, ch. 5).
 */
export function ksDickson1990a(tK: number, s: number, lnT: number = Math.log(tK)): number {
  const i = ionicStrengthDickson1990(s);
  const sqrtI = Math.sqrt(i);
  return Math.exp(
    -4276.1 / tK +
      141.328 -
      23.093 * lnT +
      (-13856 / tK + 324.57 - 47.986 * lnT) * sqrtI +
      (35474 / tK - 771.54 + 114.723 * lnT) * i -
      (2698 / tK) * i * sqrtI +
      (1776 / tK) * i * i +
      lnWaterFraction(s),
  );
}
