/**
 * Totals of the conservative constituents estimated from salinity, mol kg-1 of seawater.
 * All assume the constituent keeps its open-ocean ratio to chlorinity, Cl (‰) = S / 1.80655
 * (the UNESCO definition linking practical salinity and chlorinity); in estuaries where rivers
 * carry their own boron or calcium this is an approximation — pass a measured calcium if you have one.
 */

import { MOLAR_MASS_G_PER_MOL } from '../physical';
import type { ValidityRange } from './issues';

/** Salinity over chlorinity (S = 1.80655 Cl). */
const S_PER_CL = 1.80655;

/** Ratios to chlorinity hold for seawater diluted with pure water; below about S 5 river water dominates. */
export const TOTALS_FROM_SALINITY_VALIDITY: ValidityRange = {
  label: 'Totals scaled from salinity (seawater ratios)',
  salinity: [5, 45],
};

/**
 * Total boron, Lee et al. (2010): B/Cl = 0.2414 mg kg-1 ‰-1.
 * Lee, K., Kim, T.-W., Byrne, R. H., Millero, F. J., Feely, R. A. & Liu, Y.-M. (2010) Geochimica et
 * Cosmochimica Acta 74, 1801–1811.
 * @param s practical salinity
 * @returns total boron, mol kg-1
 * Check: 432.6 µmol kg-1 at S 35 (Lee et al. 2010; value from memory).
 */
export function totalBoronLee2010(s: number): number {
  return ((0.2414e-3 / MOLAR_MASS_G_PER_MOL.B) * s) / S_PER_CL;
}

/**
 * Total boron, Uppström (1974): B/Cl = 0.232 mg kg-1 ‰-1.
 * Uppström, L. R. (1974) Deep-Sea Research 21, 161–162.
 * @param s practical salinity
 * @returns total boron, mol kg-1
 * Check: 416 µmol kg-1 at S 35 (DOE 1994 / Dickson et al. 2007, ch. 5; value from memory).
 */
export function totalBoronUppstrom1974(s: number): number {
  return ((0.232e-3 / MOLAR_MASS_G_PER_MOL.B) * s) / S_PER_CL;
}

/**
 * Total sulfate, Morris & Riley (1966): SO4/Cl = 0.1400 g kg-1 ‰-1.
 * Morris, A. W. & Riley, J. P. (1966) Deep-Sea Research 13, 699–705.
 * @param s practical salinity
 * @returns total sulfate, mol kg-1
 * Check: 0.02824 mol kg-1 at S 35 (Dickson et al. 2007, ch. 5; value from memory).
 */
export function totalSulfateMorrisRiley1966(s: number): number {
  return ((0.14 / MOLAR_MASS_G_PER_MOL.SO4) * s) / S_PER_CL;
}

/**
 * Total fluoride, Riley (1965): F/Cl = 6.7e−5 g kg-1 ‰-1.
 * Riley, J. P. (1965) Deep-Sea Research 12, 219–220.
 * @param s practical salinity
 * @returns total fluoride, mol kg-1
 * Check: 6.8e−5 mol kg-1 at S 35 (Dickson et al. 2007, ch. 5; value from memory).
 */
export function totalFluorideRiley1965(s: number): number {
  return ((0.000067 / MOLAR_MASS_G_PER_MOL.F) * s) / S_PER_CL;
}

/**
 * Calcium, Riley & Tongudai (1967): Ca/Cl = 0.02128 g kg-1 ‰-1.
 * Riley, J. P. & Tongudai, M. (1967) Chemical Geology 2, 263–269.
 * @param s practical salinity
 * @returns calcium, mol kg-1
 * Check: 0.01028 mol kg-1 at S 35 (the formula 0.02128/40.078 × S/1.80655 of the project's
 * chemistry reference, worked by hand).
 */
export function calciumRileyTongudai1967(s: number): number {
  return ((0.02128 / MOLAR_MASS_G_PER_MOL.Ca) * s) / S_PER_CL;
}
