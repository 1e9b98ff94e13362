/** First dissociation constant of silicic acid in seawater, total pH scale. */

import { ionicStrengthDickson1990, lnWaterFraction } from './ionic-strength';
import type { ValidityRange } from './issues';

/** Millero (1995) silicic acid fit: t 0–45 °C, S 0–45 (range from memory). */
export const KSI_MILLERO1995_VALIDITY: ValidityRange = {
  label: 'KSi (Millero 1995)',
  temperatureC: [0, 45],
  salinity: [0, 45],
};

/**
 * KSi = [H+]T[SiO(OH)3-]/[Si(OH)4].
 * Millero (1995), total-scale form of DOE (1994) / Dickson et al. (2007), ch. 5, with I the
 * ionic strength of seawater:
 * ln KSi = −8904.2/T + 117.385 − 19.334 ln T + (−458.79/T + 3.5913) √I + (188.74/T − 1.5998) I
 *          + (−12.1652/T + 0.07871) I² + ln(1 − 0.001005 S).
 * @param tK temperature, K
 * @param s practical salinity
 * @returns KSi in mol kg-1 (total scale)
 * Valid t 0–45 °C, S 0–45. Check: ln KSi = −21.61 at S 35, 25 °C (Dickson et al. 2007, ch. 5).
 */
export function ksiMillero1995(tK: number, s: number, lnT: number = Math.log(tK)): number {
  const i = ionicStrengthDickson1990(s);
  return Math.exp(
    -8904.2 / tK +
      117.385 -
      19.334 * lnT +
      (-458.79 / tK + 3.5913) * Math.sqrt(i) +
      (188.74 / tK - 1.5998) * i +
      (-12.1652 / tK + 0.07871) * i * i +
      lnWaterFraction(s),
  );
}
