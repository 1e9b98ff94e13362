/**
 * Unionized ammonia (NH3, the form toxic to fish) from total ammonia nitrogen.
 *
 * NH3 / (NH3 + NH4+) = K / (K + h) = 1 / (1 + 10^(pK − pH)), with K and h on one pH scale:
 * - fresh water: the thermodynamic pKa of Emerson et al. (1975), made a "mixed" constant for the
 *   H+ activity the meter reads by the activity coefficients of the engine's fresh model
 *   (K' = Ka·γNH4+/γNH3, the same correction the model applies to its own ammonium constant);
 * - saline water: the engine's stoichiometric ammonium constant (Clegg & Whitfield 1995, total
 *   scale, src/chem/saline/ammonium.ts) with h on the total scale.
 */

/** Molar masses, g/mol (IUPAC 2021 standard atomic weights: N 14.007, H 1.008). */
export const N_G_PER_MOL = 14.007;
export const NH3_G_PER_MOL = 17.031;

/**
 * Emerson, K., Russo, R. C., Lund, R. E. & Thurston, R. V. (1975) Aqueous ammonia equilibrium
 * calculations: effect of pH and temperature. J. Fish. Res. Board Can. 32, 2379–2383:
 *   pKa = 0.09018 + 2729.92 / T   (T in K; thermodynamic, infinite dilution)
 * Valid 0–30 °C (their fit; range from memory). Check: pKa = 9.2464 at 25 °C (the formula; the
 * Bates & Pinching 1949 value it reproduces is 9.245, *memory*).
 */
export function pkaAmmoniaEmerson1975(temperatureC: number): number {
  return 0.09018 + 2729.92 / (temperatureC + 273.15);
}

export const EMERSON_1975_VALIDITY_C: readonly [number, number] = [0, 30];

export interface UnionizedAmmonia {
  /** NH3 / total ammonia, 0–1. */
  fraction: number;
  /** NH3 as nitrogen, mg/L. */
  nh3_n_mg_l: number;
  /** NH3 as the molecule, mg/L. */
  nh3_mg_l: number;
}

/**
 * @param totalNMgL total ammonia nitrogen (NH3-N + NH4+-N), mg/L
 * @param ph pH on the scale of `pk`
 * @param pk −log10 of the ammonium dissociation constant on that scale
 */
export function unionizedAmmonia(totalNMgL: number, ph: number, pk: number): UnionizedAmmonia {
  const fraction = 1 / (1 + 10 ** (pk - ph));
  const nh3N = totalNMgL * fraction;
  return { fraction, nh3_n_mg_l: nh3N, nh3_mg_l: (nh3N * NH3_G_PER_MOL) / N_G_PER_MOL };
}
