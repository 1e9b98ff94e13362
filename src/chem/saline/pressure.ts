/**
 * Effect of pressure on the equilibrium constants (Millero 1995).
 *
 * ln(K_p / K_0) = −(ΔV / RT) P + ½ (Δκ / RT) P², with ΔV = a0 + a1 t + a2 t² (cm3 mol-1) and
 * Δκ = (b0 + b1 t) · 1e−3 (cm3 mol-1 bar-1), P the applied pressure in bar, t in °C and
 * R in cm3 bar mol-1 K-1.
 * Millero, F. J. (1995) Thermodynamics of the carbon dioxide system in the oceans. Geochimica et
 * Cosmochimica Acta 59, 661–677, Table 9, from the partial molal volume and compressibility data of
 * Millero (1979, 1983); calcite and aragonite after Ingle (1975). Coefficients transcribed from
 * memory of that table and its common use.
 *
 * The acid terms belong to the seawater scale (bisulfate and hydrogen fluoride to the free scale):
 * the entry point converts total-scale constants to the seawater scale at zero pressure, applies
 * the factor, and converts back with KS and KF at pressure.
 */

import { R_CM3_BAR_PER_MOL_K, T0_K } from '../physical';
import type { ValidityRange } from './issues';

/** Partial molal volume (a0, a1, a2) and compressibility (b0, b1) change on dissociation. */
export interface PressureTerms {
  readonly a0: number;
  readonly a1: number;
  readonly a2: number;
  readonly b0: number;
  readonly b1: number;
}

/** Millero (1995), Table 9 (memory). */
export const PRESSURE_TERMS_MILLERO1995 = {
  k1: { a0: -25.5, a1: 0.1271, a2: 0, b0: -3.08, b1: 0.0877 },
  k2: { a0: -15.82, a1: -0.0219, a2: 0, b0: 1.13, b1: -0.1475 },
  // a2 with the negative sign of Millero (1979); from memory, and the sign is the least certain digit here.
  kb: { a0: -29.48, a1: 0.1622, a2: -2.608e-3, b0: -2.84, b1: 0 },
  // The seawater values; −25.60 + 0.2324 t − 3.6246e−3 t² of Millero (1983) is the pure-water set.
  kw: { a0: -20.02, a1: 0.1119, a2: -1.409e-3, b0: -5.13, b1: 0.0794 },
  ks: { a0: -18.03, a1: 0.0466, a2: 0.316e-3, b0: -4.53, b1: 0.09 },
  kf: { a0: -9.78, a1: -0.009, a2: -0.942e-3, b0: -3.91, b1: 0.054 },
  k1p: { a0: -14.51, a1: 0.1211, a2: -0.321e-3, b0: -2.67, b1: 0.0427 },
  k2p: { a0: -23.12, a1: 0.1758, a2: -2.647e-3, b0: -5.15, b1: 0.09 },
  k3p: { a0: -26.57, a1: 0.202, a2: -3.042e-3, b0: -4.08, b1: 0.0714 },
  // No measurements for silicic acid: Millero (1995) suggests the boric acid values.
  ksi: { a0: -29.48, a1: 0.1622, a2: -2.608e-3, b0: -2.84, b1: 0 },
  knh4: { a0: -26.43, a1: 0.0889, a2: -0.905e-3, b0: -5.03, b1: 0.0814 },
  kh2s: { a0: -14.8, a1: 0.002, a2: -0.4e-3, b0: 2.89, b1: 0.054 },
  kspCalcite: { a0: -48.76, a1: 0.5304, a2: 0, b0: -11.76, b1: 0.3692 },
  kspAragonite: { a0: -45.96, a1: 0.5304, a2: 0, b0: -11.76, b1: 0.3692 },
} as const satisfies Record<string, PressureTerms>;

/** The compressibility data reach about 1000 bar (memory); deeper is extrapolated. */
export const PRESSURE_MILLERO1995_VALIDITY: ValidityRange = {
  label: 'Pressure corrections (Millero 1995)',
  pressureDbar: [0, 10000],
};

/**
 * ln(K_p / K_0) for one constant.
 * @param terms partial molal volume and compressibility coefficients
 * @param tC temperature, °C
 * @param pBar applied (gauge) pressure, bar
 * @param tK temperature, K (pass it when already computed)
 * @returns natural log of the pressure factor (dimensionless); 0 at pBar = 0
 */
export function lnPressureFactorMillero1995(
  terms: PressureTerms,
  tC: number,
  pBar: number,
  tK: number = tC + T0_K,
): number {
  const dV = terms.a0 + tC * (terms.a1 + tC * terms.a2);
  const dK = (terms.b0 + terms.b1 * tC) * 1e-3;
  return ((-dV + 0.5 * dK * pBar) * pBar) / (R_CM3_BAR_PER_MOL_K * tK);
}

/**
 * ln(K_p / K_0) for K1 or K2 with the salinity-dependent terms Millero (2010) gives with his
 * constants (Marine and Freshwater Research 61, 139–142; coefficients from memory):
 * ΔV1 = −25.50 − 0.151 (S − 34.8) + 0.1271 t, Δκ1 = (−3.08 − 0.578 (S − 34.8) + 0.0877 t) · 1e−3,
 * ΔV2 = −15.82 − 0.321 (S − 34.8) − 0.0219 t, Δκ2 = (1.13 − 0.314 (S − 34.8) − 0.1475 t) · 1e−3.
 * At S 34.8 they are the Millero (1995) terms. Computed without building a terms object because
 * the entry point calls it per row.
 *
 * Checked for issue 12 §4: the salinity terms look physically backwards. At S 0 they give
 * ΔV1 = −20.2 and ΔV2 = −4.6 cm3/mol (10 °C), while the ionisation of pure water's carbonic acid has
 * about −25 and −28 to −29 cm3/mol (Millero 1983, memory): pairing with sea-salt cations makes |ΔV|
 * smaller in seawater, so |ΔV| should grow toward S 0, not shrink. As far as we recall the paper,
 * it prints the terms with these signs (memory; no copy was at hand to confirm), so they are used
 * as printed. Consequence, 1000 dbar, 10 °C: Δlog K2 = 0.010 at S 0 and 0.013 at S 5 against 0.030
 * with the Millero (1995) seawater terms (K1: 0.037 and 0.038 against 0.045), i.e. up to 0.02 in
 * pK2 in deep brackish water, which is rare (tests/chem/saline/pressure.test.ts pins these values,
 * so a corrected transcription shows up there).
 * Since issue 12 the default K1/K2 below S 19 are Millero (2010), so these terms are the default's
 * there; between S 19 and 25 they are blended with the Millero (1995) terms like the constants.
 * @param step 1 for K1, 2 for K2
 * @param s practical salinity
 * @param tC temperature, °C
 * @param pBar applied (gauge) pressure, bar
 * @param tK temperature, K
 * @returns natural log of the pressure factor
 */
export function lnCarbonicPressureFactorMillero2010(
  step: 1 | 2,
  s: number,
  tC: number,
  pBar: number,
  tK: number = tC + T0_K,
): number {
  const ds = s - 34.8;
  const dV = step === 1 ? -25.5 - 0.151 * ds + 0.1271 * tC : -15.82 - 0.321 * ds - 0.0219 * tC;
  const dK = (step === 1 ? -3.08 - 0.578 * ds + 0.0877 * tC : 1.13 - 0.314 * ds - 0.1475 * tC) * 1e-3;
  return ((-dV + 0.5 * dK * pBar) * pBar) / (R_CM3_BAR_PER_MOL_K * tK);
}
