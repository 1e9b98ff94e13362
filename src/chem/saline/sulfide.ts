/** First dissociation constant of hydrogen sulfide in seawater. */

import type { ValidityRange } from './issues';

/**
 * Millero, Plese & Fernandez (1988) measured from about 5 to 45 °C and S 0–40; the range is from
 * memory of the paper and may be narrower than printed.
 */
export const KH2S_MILLERO1988_VALIDITY: ValidityRange = {
  label: 'KH2S (Millero et al. 1988)',
  temperatureC: [5, 45],
  salinity: [0, 40],
};

/**
 * KH2S = [H+][HS-]/[H2S], taken as the seawater scale (the scale of the compilation of Yao &
 * Millero 1995 that restates it; from memory — the difference from the total scale is about 0.01 in
 * pK, well inside the fit's own scatter).
 * Millero, F. J., Plese, T. & Fernandez, M. (1988) The dissociation of hydrogen sulfide in seawater.
 * Limnology and Oceanography 33, 269–274:
 * ln K = 225.838 − 13275.3/T − 34.6435 ln T + 0.3449 √S − 0.0274 S.
 * @param tK temperature, K
 * @param s practical salinity
 * @returns KH2S in mol kg-1 (seawater scale)
 * Valid about t 5–45 °C, S 0–40. Check: pK = 6.98 at S 0, 25 °C (the fresh-water value, e.g.
 * Millero 1986; value from memory).
 */
export function kh2sMillero1988(
  tK: number,
  s: number,
  lnT: number = Math.log(tK),
  sqrtS: number = Math.sqrt(s),
): number {
  return Math.exp(225.838 - 13275.3 / tK - 34.6435 * lnT + 0.3449 * sqrtS - 0.0274 * s);
}
