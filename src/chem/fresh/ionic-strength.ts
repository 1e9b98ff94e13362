/**
 * Ionic strength of a fresh water, I = ½ Σ m z² (mol/kg of water), from the best data at hand.
 * Order of preference: the major ions (with the carbonate species from the solve), a given value,
 * specific conductance, total dissolved solids. The method used is returned by name so the output
 * can say which estimate it rests on.
 */

import { fail } from '../errors';
import { MOLAR_MASS_G_PER_MOL } from '../physical';

export type IonicStrengthMethod =
  | 'major-ions'
  | 'given'
  | 'conductance-russell-1976'
  | 'conductance-griffin-jurinak-1973'
  | 'tds-langelier-1936';

/** Major ions in mg/L, the units of a water-quality report. Missing ions are absent. */
export interface MajorIonsMgL {
  calcium?: number;
  magnesium?: number;
  sodium?: number;
  potassium?: number;
  chloride?: number;
  sulfate?: number;
}

/** Major ions in mol/kg of water. */
export interface MajorIonsMolKg {
  ca: number;
  mg: number;
  na: number;
  k: number;
  cl: number;
  so4: number;
}

const ION_MASS = {
  calcium: MOLAR_MASS_G_PER_MOL.Ca,
  magnesium: MOLAR_MASS_G_PER_MOL.Mg,
  sodium: MOLAR_MASS_G_PER_MOL.Na,
  potassium: MOLAR_MASS_G_PER_MOL.K,
  chloride: MOLAR_MASS_G_PER_MOL.Cl,
  sulfate: MOLAR_MASS_G_PER_MOL.SO4,
} as const;

/**
 * mg/L to mol/kg of water. A litre of fresh water holds ρ·(1 − TDS/ρ) kg of water; we take the
 * kilograms of water per litre as ρ (kg/L) minus the dissolved mass, which differs from ρ by less
 * than 0.1 % below 1 g/L TDS.
 */
export function mgLToMolKgWater(mgL: number, molarMass: number, kgWaterPerL: number): number {
  return mgL / 1000 / molarMass / kgWaterPerL;
}

/** Converts a report of major ions to mol/kg of water; rejects negative or non-finite values. */
export function majorIonsToMolKg(ions: MajorIonsMgL, kgWaterPerL: number): MajorIonsMolKg {
  const get = (k: keyof MajorIonsMgL): number => {
    const v = ions[k];
    if (v === undefined) return 0;
    if (!Number.isFinite(v) || v < 0) {
      fail('bad-ion-concentration', `${k} must be a number ≥ 0 mg/L (got ${String(v)}).`, `${k}_mg_l`);
    }
    return mgLToMolKgWater(v, ION_MASS[k], kgWaterPerL);
  };
  return {
    ca: get('calcium'),
    mg: get('magnesium'),
    na: get('sodium'),
    k: get('potassium'),
    cl: get('chloride'),
    so4: get('sulfate'),
  };
}

/** True when the report names at least one cation and one anion, enough to build I from ions. */
export function hasMajorIons(ions: MajorIonsMgL): boolean {
  const cat =
    ions.calcium !== undefined ||
    ions.magnesium !== undefined ||
    ions.sodium !== undefined ||
    ions.potassium !== undefined;
  const an = ions.chloride !== undefined || ions.sulfate !== undefined;
  return cat && an;
}

/**
 * I from the major ions plus the carbonate and water ions of the current solve (mol/kg of water):
 * I = ½ (4 Ca + 4 Mg + Na + K + Cl + 4 SO4 + HCO3 + 4 CO3 + OH + H).
 * Exact by definition for fully dissociated salts (ion pairs are not formed in this model).
 */
export function ionicStrengthFromIons(
  m: MajorIonsMolKg,
  carbonate: { hco3: number; co3: number; oh: number; hFree: number },
): number {
  return (
    0.5 *
    (4 * m.ca +
      4 * m.mg +
      m.na +
      m.k +
      m.cl +
      4 * m.so4 +
      carbonate.hco3 +
      4 * carbonate.co3 +
      carbonate.oh +
      carbonate.hFree)
  );
}

/**
 * I from specific conductance at 25 °C.
 * Russell (1976), M.S. thesis, Univ. of Arizona *(memory; as cited by Langmuir 1997)*: I ≈ 1.6e-5 · SC (µS/cm).
 * Griffin & Jurinak (1973), Soil Sci. 116, 26–30: I = 0.013 · EC (dS/m) = 1.3e-5 · SC (µS/cm).
 * Both are empirical for natural waters below ~ 0.1 mol/kg (common practice).
 */
export function ionicStrengthFromConductance(
  scUsCm: number,
  method: 'russell-1976' | 'griffin-jurinak-1973',
): number {
  return (method === 'russell-1976' ? 1.6e-5 : 1.3e-5) * scUsCm;
}

/** Langelier (1936), J. Am. Water Works Assoc. 28, 1500 *(memory)*: I ≈ 2.5e-5 · TDS (mg/L). */
export function ionicStrengthFromTds(tdsMgL: number): number {
  return 2.5e-5 * tdsMgL;
}

/**
 * Charge-balance error in percent, 100 (Σcations − Σanions)/(Σcations + Σanions) in equivalents
 * (the usual definition of water-analysis checks, e.g. Freeze & Cherry 1979; common practice:
 * within ±5 % is acceptable).
 */
export function chargeBalanceErrorPercent(
  m: MajorIonsMolKg,
  carbonate: { hco3: number; co3: number; oh: number; hFree: number },
): number {
  const cations = 2 * m.ca + 2 * m.mg + m.na + m.k + carbonate.hFree;
  const anions = m.cl + 2 * m.so4 + carbonate.hco3 + 2 * carbonate.co3 + carbonate.oh;
  return (100 * (cations - anions)) / (cations + anions);
}
