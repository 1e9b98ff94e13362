/**
 * Conductance and salinity: specific conductance (referred to 25 °C, µS/cm) ↔ practical salinity
 * through PSS-78, and temperature compensation of a conductivity measured at t to 25 °C.
 *
 * Two compensation methods, named in every result:
 * - `linear`: κ25 = κt / (1 + α (t − 25)), α = 0.02 /°C by default. Common practice for fresh natural
 *   waters (field meters use α = 0.019–0.021); it is a rule of thumb, not a formulation.
 * - `pss78`: find S from κt with PSS-78 at t, then κ at 25 °C for that S. Exact for waters of seawater
 *   composition (brackish, marine, reef tanks); for dilute non-marine waters it is an approximation.
 */

import { fail } from '../errors';
import { t68FromT90 } from './eos80';
import { C35_15_0_MS_CM, conductivityRatioPss78, salinityPss78 } from './pss78';

export type CompensationMethod = 'linear' | 'pss78';

/** Common-practice linear temperature coefficient of conductivity, per °C, referred to 25 °C. */
export const LINEAR_ALPHA_PER_C = 0.02;

const US_PER_MS = 1000;

function checkPositive(v: number, field: string, what: string): void {
  if (!Number.isFinite(v) || v < 0)
    fail('bad-conductance', `${what} must be a number ≥ 0 (got ${String(v)}).`, field);
}

/**
 * Practical salinity from conductivity at temperature tC (ITS-90) and pressure, PSS-78.
 * Units: µS/cm, °C, dbar. Check: 42914 µS/cm at 15 °C gives S = 35.000 (UNESCO 1983, R = 1).
 */
export function salinityFromConductivity(condUsCm: number, tC: number, pDbar = 0): number {
  checkPositive(condUsCm, 'conductivity_us_cm', 'Conductivity');
  return salinityPss78(condUsCm / US_PER_MS / C35_15_0_MS_CM, t68FromT90(tC), pDbar);
}

/** Conductivity (µS/cm) of seawater-composition water of salinity s at tC (ITS-90) and pDbar, PSS-78. */
export function conductivityFromSalinity(s: number, tC: number, pDbar = 0): number {
  if (!Number.isFinite(s) || s < 0)
    fail('bad-salinity', `Salinity must be a number ≥ 0 (got ${String(s)}).`, 'salinity');
  return conductivityRatioPss78(s, t68FromT90(tC), pDbar) * C35_15_0_MS_CM * US_PER_MS;
}

/** Practical salinity from specific conductance at 25 °C (µS/cm), PSS-78 at 25 °C and 0 dbar. */
export function salinityFromSpecificConductance(sc25UsCm: number): number {
  return salinityFromConductivity(sc25UsCm, 25, 0);
}

/** Specific conductance at 25 °C (µS/cm) of seawater-composition water of salinity s. ≈ 53 mS/cm at S 35. */
export function specificConductanceFromSalinity(s: number): number {
  return conductivityFromSalinity(s, 25, 0);
}

/**
 * Conductivity measured at tC referred to 25 °C (specific conductance), µS/cm.
 * `alpha` (per °C) applies to the linear method only.
 */
export function specificConductanceAt25(
  condUsCm: number,
  tC: number,
  method: CompensationMethod = 'linear',
  alpha = LINEAR_ALPHA_PER_C,
): number {
  checkPositive(condUsCm, 'conductivity_us_cm', 'Conductivity');
  if (method === 'linear') {
    const f = 1 + alpha * (tC - 25);
    if (f <= 0)
      fail(
        'bad-temperature',
        `Linear compensation fails at ${tC} °C with α = ${alpha} /°C.`,
        'temperature_c',
      );
    return condUsCm / f;
  }
  return specificConductanceFromSalinity(salinityFromConductivity(condUsCm, tC, 0));
}

/** The inverse: conductivity that water of specific conductance sc25 shows at tC, µS/cm. */
export function conductivityAtTemperature(
  sc25UsCm: number,
  tC: number,
  method: CompensationMethod = 'linear',
  alpha = LINEAR_ALPHA_PER_C,
): number {
  checkPositive(sc25UsCm, 'specific_conductance_us_cm', 'Specific conductance');
  if (method === 'linear') return sc25UsCm * (1 + alpha * (tC - 25));
  return conductivityFromSalinity(salinityFromSpecificConductance(sc25UsCm), tC, 0);
}
