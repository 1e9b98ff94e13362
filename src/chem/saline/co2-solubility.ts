/**
 * CO2 solubility and the fugacity of CO2 in moist air over seawater (Weiss 1974).
 *
 * Weiss, R. F. (1974) Carbon dioxide in water and seawater: the solubility of a non-ideal gas.
 * Marine Chemistry 2, 203–215.
 *
 * Pressure choice: K0 carries Weiss's partial molar volume term, so at an applied (gauge)
 * pressure it relates [CO2*] to the in-situ fugacity. The fugacity factor is always evaluated at
 * 1 atm total pressure: pCO2 is reported as the partial pressure of CO2 in a gas at 1 atm that
 * is in equilibrium with the water; a gas phase at hundreds of atmospheres does not exist in the
 * water column, and applying the virial term there would give a meaningless number.
 */

import { R_CM3_BAR_PER_MOL_K } from '../physical';
import type { ValidityRange } from './issues';

/** Weiss (1974) fit range: −1 to 40 °C, salinity 0 to 40. */
export const K0_WEISS1974_VALIDITY: ValidityRange = {
  label: 'CO2 solubility K0 (Weiss 1974)',
  temperatureC: [-1, 40],
  salinity: [0, 40],
};

/**
 * Solubility of CO2, K0 = [CO2*]/fCO2, at 1 atm total pressure.
 * Weiss (1974), the fit in mol kg-1 atm-1 (as restated in Dickson et al. 2007, ch. 5).
 * @param tK temperature, K
 * @param s practical salinity
 * @returns K0 in mol kg-1 atm-1
 * Valid −1 to 40 °C, S 0–40. Check: ln K0 = −3.5617 at S 35, 25 °C (Dickson et al. 2007, ch. 5).
 */
export function k0Weiss1974(tK: number, s: number): number {
  const t100 = tK / 100;
  return Math.exp(
    -60.2409 +
      93.4517 / t100 +
      23.3585 * Math.log(t100) +
      s * (0.023517 - 0.023656 * t100 + 0.0047036 * t100 * t100),
  );
}

/** Partial molar volume of CO2 in seawater, cm3 mol-1 (Weiss 1974; value from memory). */
export const V_CO2_CM3_PER_MOL = 32.3;

/**
 * Pressure factor for K0: K0(p) = K0(0) · factor, from ln K0(P) = ln K0(1 atm) − v̄ (P − 1 atm)/RT
 * (Weiss 1974, with the partial molar volume 32.3 cm3 mol-1; from memory of the paper).
 * @param tK temperature, K
 * @param pBar applied (gauge) pressure, bar
 * @returns dimensionless factor ≤ 1
 */
export function k0PressureFactorWeiss1974(tK: number, pBar: number): number {
  return Math.exp((-V_CO2_CM3_PER_MOL * pBar) / (R_CM3_BAR_PER_MOL_K * tK));
}

/** The virial coefficients were fitted to gas data from about −1 to 40 °C as well. */
export const FUGACITY_WEISS1974_VALIDITY: ValidityRange = {
  label: 'CO2 fugacity factor (Weiss 1974)',
  temperatureC: [-1, 40],
};

/** Gas constant in cm3 atm mol-1 K-1, for the virial term whose pressure is in atm. */
const R_CM3_ATM_PER_MOL_K = R_CM3_BAR_PER_MOL_K / 1.01325;

/**
 * fCO2 / pCO2 for CO2 in air (mole fraction ≪ 1) at 1 atm total pressure:
 * exp[(B + 2δ) · P / (R T)] with P = 1 atm, where
 * B = −1636.75 + 12.0408 T − 3.27957e−2 T² + 3.16528e−5 T³ (cm3 mol-1) is the second virial
 * coefficient of pure CO2 and δ = 57.7 − 0.118 T (cm3 mol-1) the CO2–air cross term
 * (Weiss 1974). The factor (1 − xCO2)² on δ is taken as 1 (xCO2 < 0.01 changes the
 * result by less than 1e−5 relative).
 * @param tK temperature, K
 * @returns dimensionless factor, about 0.9968 at 25 °C (value from memory, common practice)
 * Valid −1 to 40 °C.
 */
export function fugacityFactorWeiss1974(tK: number): number {
  const b = -1636.75 + tK * (12.0408 + tK * (-0.0327957 + tK * 3.16528e-5));
  const delta = 57.7 - 0.118 * tK;
  return Math.exp((b + 2 * delta) / (R_CM3_ATM_PER_MOL_K * tK));
}
