/** Dissociation constant of boric acid in seawater, total pH scale. */

import type { ValidityRange } from './issues';

/** Dickson (1990b): fitted for t 0–45 °C, S 5–45. */
export const KB_DICKSON1990B_VALIDITY: ValidityRange = {
  label: 'KB (Dickson 1990b)',
  temperatureC: [0, 45],
  salinity: [5, 45],
};

/**
 * KB = [H+]T[B(OH)4-]/[B(OH)3].
 * Dickson, A. G. (1990b) Deep-Sea Research 37, 755–766, eq. 23 as restated in Dickson et al.
 * (2007), ch. 5:
 * ln KB = (−8966.90 − 2890.53 √S − 77.942 S + 1.728 S^1.5 − 0.0996 S²)/T + 148.0248
 *         + 137.1942 √S + 1.62142 S − (24.4344 + 25.085 √S + 0.2474 S) ln T + 0.053105 √S T.
 * @param tK temperature, K
 * @param s practical salinity
 * @returns KB in mol kg-1 (total scale)
 * Valid t 0–45 °C, S 5–45. Check: ln KB = −19.7964 at S 35, 25 °C (Dickson et al. 2007, ch. 5).
 */
export function kbDickson1990b(
  tK: number,
  s: number,
  lnT: number = Math.log(tK),
  sqrtS: number = Math.sqrt(s),
): number {
  const s15 = s * sqrtS;
  return Math.exp(
    (-8966.9 - 2890.53 * sqrtS - 77.942 * s + 1.728 * s15 - 0.0996 * s * s) / tK +
      148.0248 +
      137.1942 * sqrtS +
      1.62142 * s -
      (24.4344 + 25.085 * sqrtS + 0.2474 * s) * lnT +
      0.053105 * sqrtS * tK,
  );
}
