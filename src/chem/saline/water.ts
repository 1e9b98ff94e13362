/** Ion product of water in seawater, total pH scale. */

import type { ValidityRange } from './issues';

/** Millero (1995): fitted for t 0–45 °C, S 0–45 (range from memory). */
export const KW_MILLERO1995_VALIDITY: ValidityRange = {
  label: 'KW (Millero 1995)',
  temperatureC: [0, 45],
  salinity: [0, 45],
};

/**
 * KW = [H+]T[OH-].
 * Millero, F. J. (1995) Geochimica et Cosmochimica Acta 59, 661–677, total-scale form as given in
 * DOE (1994) and Dickson et al. (2007), ch. 5:
 * ln KW = 148.9652 − 13847.26/T − 23.6521 ln T + (118.67/T − 5.977 + 1.0495 ln T) √S − 0.01615 S.
 * @param tK temperature, K
 * @param s practical salinity
 * @returns KW in mol2 kg-2 (total scale)
 * Valid t 0–45 °C, S 0–45. Check: ln KW = −30.434 at S 35, 25 °C (Dickson et al. 2007, ch. 5).
 */
export function kwMillero1995(
  tK: number,
  s: number,
  lnT: number = Math.log(tK),
  sqrtS: number = Math.sqrt(s),
): number {
  return Math.exp(
    148.9652 - 13847.26 / tK - 23.6521 * lnT + (118.67 / tK - 5.977 + 1.0495 * lnT) * sqrtS - 0.01615 * s,
  );
}
