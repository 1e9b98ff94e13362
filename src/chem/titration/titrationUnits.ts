/**
 * Titration results in the units of the units module. A titration measures equivalents per litre
 * of sample; per-kg units go through the density of fresh water at the sample temperature
 * (EOS-80 at S = 0, via `densityKgL`).
 */

import { ALKALINITY_UNITS, alkalinityFromEqKg, densityKgL } from '../units';

export function alkalinityInEveryUnit(meqL: number, temperatureC: number): Record<string, number> {
  const rho = densityKgL(0, temperatureC);
  const eqKg = (meqL * 1e-3) / rho;
  const out: Record<string, number> = {};
  for (const unit of ALKALINITY_UNITS) out[unit] = alkalinityFromEqKg(eqKg, unit, rho);
  return out;
}

/** mol/L of sample to µmol/kg of water. */
export function dicUmolKg(molL: number, temperatureC: number): number {
  return (molL / densityKgL(0, temperatureC)) * 1e6;
}
