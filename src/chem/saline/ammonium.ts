/**
 * Dissociation constant of the ammonium ion in seawater.
 *
 * Default: Clegg & Whitfield (1995), total scale. Yao & Millero (1995), seawater scale, is kept as
 * an independent cross-check of the coefficients (both were transcribed from memory of the papers;
 * the tests compare them where both are valid).
 */

import { LN10 } from '../physical';
import { lnWaterFraction } from './ionic-strength';
import type { ValidityRange } from './issues';

/** Clegg & Whitfield (1995): fitted for t −2 to 40 °C, S 0–40 (range from memory). */
export const KNH4_CLEGGWHITFIELD1995_VALIDITY: ValidityRange = {
  label: 'KNH4 (Clegg & Whitfield 1995)',
  temperatureC: [-2, 40],
  salinity: [0, 40],
};

/**
 * KNH4 = [H+]T[NH3]/[NH4+].
 * Clegg, S. L. & Whitfield, M. (1995) A chemical model of seawater including dissolved ammonia and
 * the stoichiometric dissociation constant of ammonia in estuarine water and seawater from −2 to
 * 40 °C. Geochimica et Cosmochimica Acta 59, 2403–2421 (their fitted pK, total scale, mol kg-1 of
 * water, converted here to mol kg-1 of seawater):
 * pK = 9.244605 − 2729.33 (1/298.15 − 1/T) + (0.04203362 − 11.24742/T) S^0.25
 *      + (−13.6416 + 1.176949 √T − 0.02860785 T + 545.4834/T) √S
 *      + (−0.1462507 + 0.0090226468 √T − 0.0001471361 T + 10.5425/T) S^1.5
 *      + (0.004669309 − 0.0001691742 √T − 0.5677934/T) S² + (−2.354039e−5 + 0.009698623/T) S^2.5.
 * @param tK temperature, K
 * @param s practical salinity
 * @returns KNH4 in mol kg-1 of seawater (total scale)
 * Valid t −2 to 40 °C, S 0–40. Check: pK = 9.245 at S 0, 25 °C (Bates & Pinching 1949, the
 * infinite-dilution value the fit is built on; value from memory).
 */
export function knh4CleggWhitfield1995(tK: number, s: number, sqrtS: number = Math.sqrt(s)): number {
  const sqrtT = Math.sqrt(tK);
  const s025 = Math.sqrt(sqrtS);
  const s15 = s * sqrtS;
  const pk =
    9.244605 -
    2729.33 * (1 / 298.15 - 1 / tK) +
    (0.04203362 - 11.24742 / tK) * s025 +
    (-13.6416 + 1.176949 * sqrtT - 0.02860785 * tK + 545.4834 / tK) * sqrtS +
    (-0.1462507 + 0.0090226468 * sqrtT - 0.0001471361 * tK + 10.5425 / tK) * s15 +
    (0.004669309 - 0.0001691742 * sqrtT - 0.5677934 / tK) * s * s +
    (-2.354039e-5 + 0.009698623 / tK) * s * s15;
  // exp(−pK ln 10) rather than 10 ** −pK: Math.pow is markedly slower in V8 and this runs per row.
  return Math.exp(lnWaterFraction(s) - pk * LN10);
}

/** Yao & Millero (1995): t 0–40 °C, S 0–40 (range from memory). */
export const KNH4_YAOMILLERO1995_VALIDITY: ValidityRange = {
  label: 'KNH4 (Yao & Millero 1995)',
  temperatureC: [0, 40],
  salinity: [0, 40],
};

/**
 * KNH4 = [H+]SWS[NH3]/[NH4+], seawater scale.
 * Yao, W. & Millero, F. J. (1995) Aquatic Geochemistry 1, 53–88:
 * ln K = −6285.33/T + 0.0001635 T − 0.25444 + (0.46532 − 123.7184/T) √S + (−0.01992 + 3.17556/T) S.
 * @param tK temperature, K
 * @param s practical salinity
 * @returns KNH4 in mol kg-1 of seawater (seawater scale)
 * Valid t 0–40 °C, S 0–40. Check: pK = 9.245 at S 0, 25 °C (Bates & Pinching 1949; memory).
 */
export function knh4YaoMillero1995(tK: number, s: number, sqrtS: number = Math.sqrt(s)): number {
  return Math.exp(
    -6285.33 / tK +
      0.0001635 * tK -
      0.25444 +
      (0.46532 - 123.7184 / tK) * sqrtS +
      (-0.01992 + 3.17556 / tK) * s,
  );
}
