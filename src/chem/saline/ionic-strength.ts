/**
 * Ionic strength of seawater from salinity, the variable the bisulfate, hydrogen fluoride and
 * silicic acid fits use.
 *
 * I = 19.924 S / (1000 − 1.005 S), mol kg-1 of water (Dickson 1990a, J. Chem. Thermodyn. 22,
 * 113–127; as in Dickson et al. 2007, ch. 5).
 * @param s practical salinity
 * @returns ionic strength, mol kg-1 H2O; 0.7227 at S 35 (computed from the formula)
 */
export function ionicStrengthDickson1990(s: number): number {
  return (19.924 * s) / (1000 - 1.005 * s);
}

/**
 * ln of the factor that turns mol kg-1 of water into mol kg-1 of seawater, ln(1 − 0.001005 S)
 * (1.005 S g of salt per kg of solution; Dickson et al. 2007, ch. 5).
 */
export function lnWaterFraction(s: number): number {
  return Math.log1p(-0.001005 * s);
}
