/**
 * Stoichiometric solubility products of calcite and aragonite in seawater, Ksp = [Ca][CO3] at
 * saturation, mol2 kg-2 of seawater (no pH scale).
 * Mucci, A. (1983) The solubility of calcite and aragonite in seawater at various salinities,
 * temperatures, and one atmosphere total pressure. American Journal of Science 283, 780–799.
 */

import { LN10 } from '../physical';
import type { ValidityRange } from './issues';

/** Mucci (1983): t 5–40 °C, S 5–44. */
export const KSP_MUCCI1983_VALIDITY: ValidityRange = {
  label: 'Calcite and aragonite Ksp (Mucci 1983)',
  temperatureC: [5, 40],
  salinity: [5, 44],
};

/**
 * log10 Ksp(calcite) = −171.9065 − 0.077993 T + 2839.319/T + 71.595 log10 T
 *                      + (−0.77712 + 0.0028426 T + 178.34/T) √S − 0.07711 S + 0.0041249 S^1.5.
 * @param tK temperature, K
 * @param s practical salinity
 * @returns Ksp in mol2 kg-2
 * Valid t 5–40 °C, S 5–44. Check: 4.27e−7 at S 35, 25 °C (Mucci 1983; value from memory).
 */
export function kspCalciteMucci1983(
  tK: number,
  s: number,
  lnT: number = Math.log(tK),
  sqrtS: number = Math.sqrt(s),
): number {
  const log10T = lnT / LN10;
  return Math.exp(
    (-171.9065 -
      0.077993 * tK +
      2839.319 / tK +
      71.595 * log10T +
      (-0.77712 + 0.0028426 * tK + 178.34 / tK) * sqrtS -
      0.07711 * s +
      0.0041249 * s * sqrtS) *
      LN10,
  );
}

/**
 * log10 Ksp(aragonite) = −171.945 − 0.077993 T + 2903.293/T + 71.595 log10 T
 *                        + (−0.068393 + 0.0017276 T + 88.135/T) √S − 0.10018 S + 0.0059415 S^1.5.
 * @param tK temperature, K
 * @param s practical salinity
 * @returns Ksp in mol2 kg-2
 * Valid t 5–40 °C, S 5–44. Check: 6.48e−7 at S 35, 25 °C (Mucci 1983; value from memory).
 */
export function kspAragoniteMucci1983(
  tK: number,
  s: number,
  lnT: number = Math.log(tK),
  sqrtS: number = Math.sqrt(s),
): number {
  const log10T = lnT / LN10;
  return Math.exp(
    (-171.945 -
      0.077993 * tK +
      2903.293 / tK +
      71.595 * log10T +
      (-0.068393 + 0.0017276 * tK + 88.135 / tK) * sqrtS -
      0.10018 * s +
      0.0059415 * s * sqrtS) *
      LN10,
  );
}
