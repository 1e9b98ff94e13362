/**
 * One conversion module for alkalinity and concentrations. Every conversion goes through one base
 * (mol/kg, or eq/kg for alkalinity) so that any pair round-trips; where a per-mass unit meets a
 * per-volume unit the density of the water (kg/L) is applied, never assumed to be 1.
 *
 * Alkalinity counts equivalents of acid (one per mole of H+ neutralised), so for alkalinity
 * µmol/kg = µeq/kg and mmol/L = meq/L. "as CaCO3" expresses those equivalents as the mass of
 * CaCO3 that would supply them (½ CaCO3 per equivalent); "as HCO3-" as the mass of bicarbonate.
 * 1 dKH = 10 mg/L CaO = 2·10/56.0774 meq/L ≈ 0.3566 meq/L (German degree, common practice).
 * `ppm` is mass per mass (mg/kg of water or solution); many test kits print "ppm" for mg/L:
 * the two differ by the density, 2–3 % in seawater.
 */

import { fail } from './errors';
import { MOLAR_MASS_G_PER_MOL } from './physical';
import { densityOneAtmEos80, t68FromT90 } from './seawater/eos80';

export const ALKALINITY_UNITS = [
  'umol_kg',
  'mmol_kg',
  'mmol_l',
  'meq_l',
  'mg_l_caco3',
  'mg_l_hco3',
  'ppm_caco3',
  'dkh',
] as const;
export type AlkalinityUnit = (typeof ALKALINITY_UNITS)[number];

export const CONCENTRATION_UNITS = [
  'umol_kg',
  'mmol_kg',
  'umol_l',
  'mmol_l',
  'meq_l',
  'mg_l',
  'ppm',
  'mg_l_caco3',
  'dgh',
] as const;
export type ConcentrationUnit = (typeof CONCENTRATION_UNITS)[number];

/** A dissolved species: molar mass (g/mol) and charge (for equivalents). */
export interface Species {
  molarMass: number;
  charge: number;
}

const M = MOLAR_MASS_G_PER_MOL;
export const SPECIES = {
  calcium: { molarMass: M.Ca, charge: 2 },
  magnesium: { molarMass: M.Mg, charge: 2 },
  sodium: { molarMass: M.Na, charge: 1 },
  potassium: { molarMass: M.K, charge: 1 },
  chloride: { molarMass: M.Cl, charge: -1 },
  sulfate: { molarMass: M.SO4, charge: -2 },
  bicarbonate: { molarMass: M.HCO3, charge: -1 },
  carbonate: { molarMass: M.CO3, charge: -2 },
  co2: { molarMass: M.CO2, charge: 0 },
} as const satisfies Record<string, Species>;
export type SpeciesName = keyof typeof SPECIES;

/** Grams of CaCO3 per equivalent. */
const G_CACO3_PER_EQ = M.CaCO3 / 2;
/** Moles of CaO in 10 mg, the German degree (dKH for alkalinity as equivalents ×2, dGH as moles). */
const MOL_CAO_PER_DEGREE = 0.01 / M.CaO;

function checkValue(value: number): void {
  if (!Number.isFinite(value))
    fail('bad-value', `The value to convert must be a finite number (got ${String(value)}).`);
}

/** Rejects densities that no natural water has (0.9–1.3 kg/L), which usually means kg/m3 was given as kg/L. */
function checkDensity(densityKgL: number): void {
  if (!Number.isFinite(densityKgL) || densityKgL < 0.9 || densityKgL > 1.3) {
    fail(
      'bad-density',
      `Density must be in kg/L between 0.9 and 1.3 (got ${String(densityKgL)}).`,
      'density_kg_l',
    );
  }
}

/** Alkalinity in `unit` to eq/kg; `densityKgL` is kg of water (fresh) or solution (saline) per litre. */
export function alkalinityToEqKg(value: number, unit: AlkalinityUnit, densityKgL: number): number {
  checkValue(value);
  checkDensity(densityKgL);
  switch (unit) {
    case 'umol_kg':
      return value * 1e-6;
    case 'mmol_kg':
      return value * 1e-3;
    case 'mmol_l':
    case 'meq_l':
      return (value * 1e-3) / densityKgL;
    case 'mg_l_caco3':
      return (value * 1e-3) / G_CACO3_PER_EQ / densityKgL;
    case 'mg_l_hco3':
      return (value * 1e-3) / M.HCO3 / densityKgL;
    case 'ppm_caco3':
      return (value * 1e-3) / G_CACO3_PER_EQ;
    case 'dkh':
      return (value * 2 * MOL_CAO_PER_DEGREE) / densityKgL;
  }
}

/** eq/kg to alkalinity in `unit` (the inverse of {@link alkalinityToEqKg}). */
export function alkalinityFromEqKg(eqKg: number, unit: AlkalinityUnit, densityKgL: number): number {
  checkValue(eqKg);
  checkDensity(densityKgL);
  switch (unit) {
    case 'umol_kg':
      return eqKg * 1e6;
    case 'mmol_kg':
      return eqKg * 1e3;
    case 'mmol_l':
    case 'meq_l':
      return eqKg * densityKgL * 1e3;
    case 'mg_l_caco3':
      return eqKg * densityKgL * G_CACO3_PER_EQ * 1e3;
    case 'mg_l_hco3':
      return eqKg * densityKgL * M.HCO3 * 1e3;
    case 'ppm_caco3':
      return eqKg * G_CACO3_PER_EQ * 1e3;
    case 'dkh':
      return (eqKg * densityKgL) / (2 * MOL_CAO_PER_DEGREE);
  }
}

export function convertAlkalinity(
  value: number,
  from: AlkalinityUnit,
  to: AlkalinityUnit,
  densityKgL: number,
): number {
  if (from === to) {
    checkValue(value);
    return value;
  }
  return alkalinityFromEqKg(alkalinityToEqKg(value, from, densityKgL), to, densityKgL);
}

function needsCharge(unit: ConcentrationUnit, sp: Species): void {
  if ((unit === 'meq_l' || unit === 'mg_l_caco3') && sp.charge === 0) {
    fail('unit-needs-charge', `${unit} counts equivalents, which a neutral species does not have.`);
  }
  if (unit === 'dgh' && Math.abs(sp.charge) !== 2) {
    fail('unit-needs-divalent', 'dGH counts moles of divalent ions (Ca, Mg) as CaO; use it for those only.');
  }
}

/** Concentration of `species` in `unit` to mol/kg. */
export function concentrationToMolKg(
  value: number,
  unit: ConcentrationUnit,
  sp: Species,
  densityKgL: number,
): number {
  checkValue(value);
  checkDensity(densityKgL);
  needsCharge(unit, sp);
  const z = Math.abs(sp.charge);
  switch (unit) {
    case 'umol_kg':
      return value * 1e-6;
    case 'mmol_kg':
      return value * 1e-3;
    case 'umol_l':
      return (value * 1e-6) / densityKgL;
    case 'mmol_l':
      return (value * 1e-3) / densityKgL;
    case 'meq_l':
      return (value * 1e-3) / z / densityKgL;
    case 'mg_l':
      return (value * 1e-3) / sp.molarMass / densityKgL;
    case 'ppm':
      return (value * 1e-3) / sp.molarMass;
    case 'mg_l_caco3':
      // Hardness style: the equivalents of the ion expressed as CaCO3.
      return (value * 1e-3) / G_CACO3_PER_EQ / z / densityKgL;
    case 'dgh':
      // German hardness degree: 10 mg/L CaO per degree, counted as moles of divalent ion.
      return (value * MOL_CAO_PER_DEGREE) / densityKgL;
  }
}

/** mol/kg of `species` to `unit` (the inverse of {@link concentrationToMolKg}). */
export function concentrationFromMolKg(
  molKg: number,
  unit: ConcentrationUnit,
  sp: Species,
  densityKgL: number,
): number {
  checkValue(molKg);
  checkDensity(densityKgL);
  needsCharge(unit, sp);
  const z = Math.abs(sp.charge);
  switch (unit) {
    case 'umol_kg':
      return molKg * 1e6;
    case 'mmol_kg':
      return molKg * 1e3;
    case 'umol_l':
      return molKg * densityKgL * 1e6;
    case 'mmol_l':
      return molKg * densityKgL * 1e3;
    case 'meq_l':
      return molKg * densityKgL * z * 1e3;
    case 'mg_l':
      return molKg * densityKgL * sp.molarMass * 1e3;
    case 'ppm':
      return molKg * sp.molarMass * 1e3;
    case 'mg_l_caco3':
      return molKg * densityKgL * z * G_CACO3_PER_EQ * 1e3;
    case 'dgh':
      return (molKg * densityKgL) / MOL_CAO_PER_DEGREE;
  }
}

export function convertConcentration(
  value: number,
  from: ConcentrationUnit,
  to: ConcentrationUnit,
  sp: Species,
  densityKgL: number,
): number {
  return concentrationFromMolKg(concentrationToMolKg(value, from, sp, densityKgL), to, sp, densityKgL);
}

/**
 * Density of the water in kg/L, one atmosphere (EOS-80; S = 0 gives pure water), for the
 * per-volume conversions. tC on ITS-90. Fresh-water callers that want kg of *water* per litre
 * may subtract the dissolved mass; below 1 g/L TDS the difference is under 0.1 %.
 */
export function densityKgL(salinity: number, tC: number): number {
  return densityOneAtmEos80(salinity, t68FromT90(tC)) / 1000;
}

export function isAlkalinityUnit(u: string): u is AlkalinityUnit {
  return (ALKALINITY_UNITS as readonly string[]).includes(u);
}
export function isConcentrationUnit(u: string): u is ConcentrationUnit {
  return (CONCENTRATION_UNITS as readonly string[]).includes(u);
}
