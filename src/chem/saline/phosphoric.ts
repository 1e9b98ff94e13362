/**
 * Dissociation constants of phosphoric acid in seawater, total pH scale.
 * Millero, F. J. (1995) Geochimica et Cosmochimica Acta 59, 661–677, in the total-scale form given
 * by DOE (1994) and Dickson et al. (2007), ch. 5.
 */

import type { ValidityRange } from './issues';

/** Millero (1995) phosphoric acid fits: t 0–45 °C, S 0–45 (range from memory). */
export const KP_MILLERO1995_VALIDITY: ValidityRange = {
  label: 'K1P, K2P, K3P (Millero 1995)',
  temperatureC: [0, 45],
  salinity: [0, 45],
};

/**
 * K1P = [H+]T[H2PO4-]/[H3PO4].
 * ln K1P = −4576.752/T + 115.525 − 18.453 ln T + (−106.736/T + 0.69171) √S + (−0.65643/T − 0.01844) S.
 * @param tK temperature, K
 * @param s practical salinity
 * @returns K1P in mol kg-1 (total scale)
 * Valid t 0–45 °C, S 0–45. Check: ln K1P = −3.71 at S 35, 25 °C (Dickson et al. 2007, ch. 5).
 */
export function k1pMillero1995(
  tK: number,
  s: number,
  lnT: number = Math.log(tK),
  sqrtS: number = Math.sqrt(s),
): number {
  return Math.exp(
    -4576.752 / tK +
      115.525 -
      18.453 * lnT +
      (-106.736 / tK + 0.69171) * sqrtS +
      (-0.65643 / tK - 0.01844) * s,
  );
}

/**
 * K2P = [H+]T[HPO4--]/[H2PO4-].
 * ln K2P = −8814.715/T + 172.0883 − 27.927 ln T + (−160.340/T + 1.3566) √S + (0.37335/T − 0.05778) S.
 * @param tK temperature, K
 * @param s practical salinity
 * @returns K2P in mol kg-1 (total scale)
 * Valid t 0–45 °C, S 0–45. Check: ln K2P = −13.727 at S 35, 25 °C (Dickson et al. 2007, ch. 5).
 */
export function k2pMillero1995(
  tK: number,
  s: number,
  lnT: number = Math.log(tK),
  sqrtS: number = Math.sqrt(s),
): number {
  return Math.exp(
    -8814.715 / tK + 172.0883 - 27.927 * lnT + (-160.34 / tK + 1.3566) * sqrtS + (0.37335 / tK - 0.05778) * s,
  );
}

/**
 * K3P = [H+]T[PO4---]/[HPO4--].
 * ln K3P = −3070.75/T − 18.141 + (17.27039/T + 2.81197) √S + (−44.99486/T − 0.09984) S.
 * @param tK temperature, K
 * @param s practical salinity
 * @returns K3P in mol kg-1 (total scale)
 * Valid t 0–45 °C, S 0–45. Check: ln K3P = −20.24 at S 35, 25 °C (Dickson et al. 2007, ch. 5).
 */
export function k3pMillero1995(tK: number, s: number, sqrtS: number = Math.sqrt(s)): number {
  return Math.exp(
    -3070.75 / tK - 18.141 + (17.27039 / tK + 2.81197) * sqrtS + (-44.99486 / tK - 0.09984) * s,
  );
}
