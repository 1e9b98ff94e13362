/**
 * Salinity from specific gravity or density, for aquarists' hydrometers and refractometers.
 *
 * Specific gravity here is SG(t_s/t_r) = ρ(S, t_s) / ρ(0, t_r): the density of the sample at its
 * temperature t_s divided by the density of pure water at the reference temperature t_r, both from
 * EOS-80 at one atmosphere. Hydrometers and seawater-calibrated refractometers are labelled with
 * their reference: common labels (common practice) are 25/25 °C (reef hobby), 15.56/15.56 °C
 * (60/60 °F) and 20/20 °C. A refractometer calibrated for seawater that reads SG applies the same
 * definition at its stated reference; one that reads salinity directly needs no conversion.
 */

import { fail } from '../errors';
import { densityOneAtmEos80, densitySmowUnesco1981, t68FromT90 } from './eos80';

/** SG(t_s/t_r) of seawater of salinity s (EOS-80). Check: 1.0264 for S 35 at 25/25 °C (common practice). */
export function specificGravityFromSalinity(s: number, sampleTempC = 25, referenceTempC = 25): number {
  return densityOneAtmEos80(s, t68FromT90(sampleTempC)) / densitySmowUnesco1981(t68FromT90(referenceTempC));
}

/**
 * Practical salinity from one-atmosphere density (kg/m3) at tC (ITS-90), inverting EOS-80 by Newton
 * iteration (tolerance 1e-9 kg/m3, at most 30 steps; ∂ρ/∂S ≈ 0.75 kg/m3 so S is good to ~1e-9).
 */
export function salinityFromDensity(rhoKgM3: number, tC: number): number {
  if (!Number.isFinite(rhoKgM3) || rhoKgM3 <= 0) {
    fail(
      'bad-density',
      `Density must be a positive number in kg/m3 (got ${String(rhoKgM3)}).`,
      'density_kg_m3',
    );
  }
  const t68 = t68FromT90(tC);
  const excess = rhoKgM3 - densitySmowUnesco1981(t68);
  // A reading a hair under pure water is instrument noise (0.01 kg/m3, common practice); more is an error.
  if (excess < -0.01) failBelowPureWater(rhoKgM3, tC);
  if (excess <= 0) return 0;
  let s = excess / 0.76;
  for (let i = 0; i < 30; i++) {
    const f = densityOneAtmEos80(s, t68) - rhoKgM3;
    if (Math.abs(f) < 1e-9) break;
    const h = 1e-6;
    const d =
      (densityOneAtmEos80(s + h, t68) - densityOneAtmEos80(Math.max(s - h, 0), t68)) /
      (s + h - Math.max(s - h, 0));
    s = Math.max(s - f / d, 0);
  }
  return s;
}

function failBelowPureWater(rho: number, tC: number): never {
  fail(
    'density-below-pure-water',
    `A density of ${rho} kg/m3 at ${tC} °C is lighter than pure water: check the reading and its temperature.`,
    'density_kg_m3',
  );
}

/** Practical salinity from SG(t_s/t_r) (EOS-80 inverted); see the module comment for the references. */
export function salinityFromSpecificGravity(sg: number, sampleTempC = 25, referenceTempC = 25): number {
  if (!Number.isFinite(sg) || sg <= 0) {
    fail(
      'bad-specific-gravity',
      `Specific gravity must be a positive number (got ${String(sg)}).`,
      'specific_gravity',
    );
  }
  return salinityFromDensity(sg * densitySmowUnesco1981(t68FromT90(referenceTempC)), sampleTempC);
}
