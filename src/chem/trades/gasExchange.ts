/**
 * CO2 exchange between a stream or pond and the air.
 *
 * flux F = k_CO2 · (CO2*_water − CO2*_eq), CO2*_eq = K0 · fCO2,air; positive F leaves the water.
 * k_CO2 = k600 · (Sc/600)^−n, n = 0.5 for a turbulent (stream, wind-rippled) surface and 2/3 for
 * a smooth one (Jähne et al. 1987, as summarised by Wanninkhof 2014; exponent values common
 * practice).
 */

/**
 * Schmidt number of CO2 in fresh water (S 0), Wanninkhof (2014) Limnol. Oceanogr. Methods 12,
 * 351–362, Table 1 (*memory*): Sc = 1923.6 − 125.06 t + 4.3773 t² − 0.085681 t³ + 0.00070284 t⁴.
 * Valid −2 to 40 °C. Check: Sc = 600 at 20 °C (the reference of k600).
 */
export function schmidtCo2Fresh(t: number): number {
  return 1923.6 + t * (-125.06 + t * (4.3773 + t * (-0.085681 + t * 0.00070284)));
}

/**
 * Schmidt number of CO2 in seawater (S 35), Wanninkhof (2014) Table 1 (*memory*):
 * Sc = 2116.8 − 136.25 t + 4.7353 t² − 0.092307 t³ + 0.0007555 t⁴. Valid −2 to 40 °C.
 * Check: Sc = 668 at 20 °C (Wanninkhof 2014, *memory*).
 */
export function schmidtCo2Seawater(t: number): number {
  return 2116.8 + t * (-136.25 + t * (4.7353 + t * (-0.092307 + t * 0.0007555)));
}

/**
 * Between the two fits, linear in salinity (the interpolation Wanninkhof 2014 suggests for
 * intermediate salinities; *memory*); above S 35 the seawater fit is extrapolated linearly too.
 */
export function schmidtCo2(t: number, salinity: number): number {
  const f = Math.max(salinity, 0) / 35;
  return schmidtCo2Fresh(t) + f * (schmidtCo2Seawater(t) - schmidtCo2Fresh(t));
}

export const SCHMIDT_VALIDITY_C: readonly [number, number] = [-2, 40];

/**
 * Gas transfer velocity normalised to Sc 600 for a stream from its slope, mean velocity and
 * depth: Raymond et al. (2012) Limnol. Oceanogr.: Fluids & Environments 2, 41–53, equation 5 of
 * their Table 2 (*memory*): k600 = 5037 · (V·S)^0.89 · D^0.54, k600 m/d, V m/s, S m/m, D m.
 * Fitted on streams and small rivers (slopes about 1e-4 to 0.1, depths 0.05–3 m; *memory*).
 */
export function k600Raymond2012(slope: number, velocityMS: number, depthM: number): number {
  return 5037 * (velocityMS * slope) ** 0.89 * depthM ** 0.54;
}

/** k_CO2 (same unit as k600) from k600 and the Schmidt number, exponent 0.5 or 2/3. */
export function kCo2FromK600(k600: number, schmidt: number, exponent = 0.5): number {
  return k600 * (schmidt / 600) ** -exponent;
}

/**
 * CO2 flux, mmol m⁻² d⁻¹ (positive = out of the water).
 * @param kCo2MD transfer velocity of CO2, m/d
 * @param co2WaterMolKg CO2* in the water, mol/kg
 * @param co2EquilibriumMolKg CO2* the water would hold in equilibrium with the air, mol/kg
 * @param densityKgL density of the water, kg/L
 */
export function co2FluxMmolM2D(
  kCo2MD: number,
  co2WaterMolKg: number,
  co2EquilibriumMolKg: number,
  densityKgL: number,
): number {
  // mol/kg × kg/L × 1000 L/m³ = mol/m³; × m/d = mol m⁻² d⁻¹; × 1000 = mmol.
  return kCo2MD * (co2WaterMolKg - co2EquilibriumMolKg) * densityKgL * 1e6;
}
