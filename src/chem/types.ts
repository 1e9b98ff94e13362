/**
 * The contract between the water models and the solver.
 *
 * A water model (saline or fresh) turns conditions into a {@link ConstantSet}: every equilibrium
 * constant already made *conditional* for that water, all on the model's internal pH scale. The
 * solver then knows nothing about salinity, activity or pressure: it solves the same mass and
 * charge balances for both models. That is the one mechanism for both kinds of water.
 *
 * Saline model: stoichiometric constants, mol/kg of solution, internal scale = total scale.
 * Fresh model: "mixed" constants with H+ as activity and the other species as concentrations
 * (mol/kg of water), e.g. K1' = aH·[HCO3-]/[CO2*] = K1·γCO2/γHCO3; internal scale = activity (NBS).
 */

import type { Issue } from './errors';

export type PhScale = 'total' | 'free' | 'seawater' | 'nbs';
export const PH_SCALES: readonly PhScale[] = ['total', 'free', 'seawater', 'nbs'];

export type WaterModel = 'saline' | 'fresh';

/** Conditions at which a constant set is evaluated. */
export interface Conditions {
  temperatureC: number;
  /** Practical salinity (PSS-78); 0 for fresh water. */
  salinity: number;
  /** Applied (gauge) pressure in dbar: 0 at the surface. */
  pressureDbar: number;
}

/**
 * Conditional constants and totals for one water at one temperature and pressure.
 * Acid constants are on the internal pH scale of the model unless noted; concentrations in mol/kg.
 */
export interface ConstantSet {
  model: WaterModel;
  conditions: Conditions;

  /** CO2 solubility: [CO2*] = k0 · fCO2, mol kg-1 atm-1. */
  k0: number;
  /** fCO2 = pCO2 · fugacityFactor (Weiss 1974 virial correction; ~0.9968 at 25 °C, 1 atm). */
  fugacityFactor: number;

  /** Carbonic acid, first and second dissociation. */
  k1: number;
  k2: number;
  /** Water: [H+][OH-] on the internal scale. */
  kw: number;
  /** Boric acid. */
  kb: number;
  /** Bisulfate, on the FREE scale. */
  ks: number;
  /** Hydrogen fluoride, on the FREE scale. */
  kf: number;
  /** Phosphoric acid, three steps. */
  k1p: number;
  k2p: number;
  k3p: number;
  /** Silicic acid, first step. */
  ksi: number;
  /** Ammonium. */
  knh4: number;
  /** Hydrogen sulfide, first step. */
  kh2s: number;

  /** Conditional solubility products for Ω = [Ca][CO3] / Ksp', mol2 kg-2. */
  kspCalcite: number;
  kspAragonite: number;

  /** Totals estimated from salinity (or given), mol/kg. Zero in fresh water unless given. */
  totalBoron: number;
  totalSulfate: number;
  totalFluoride: number;
  calcium: number;

  /** [H+]free = h · freeHFactor, with h on the internal scale (saline: 1/(1+ST/KS); fresh: 1/γH). */
  freeHFactor: number;
  /** h on scale X = h_internal · scaleFactor[X]; the internal scale has factor 1. */
  scaleFactor: Record<PhScale, number>;

  /** Names of the formulations used, keyed by quantity (e.g. `k1: 'Lueker et al. 2000'`). */
  formulations: Record<string, string>;
  /** Validity warnings raised while evaluating the constants. */
  warnings: Issue[];
}

/** Minor acid totals that come from the sample rather than from salinity, mol/kg. */
export interface MinorTotals {
  phosphate: number;
  silicate: number;
  ammonia: number;
  sulfide: number;
}

/** The eight carbonate quantities plus h; concentrations in mol/kg, pressures in atm. */
export interface CarbonateState {
  /** [H+] on the internal scale, mol/kg. */
  h: number;
  ta: number;
  dic: number;
  co2: number;
  hco3: number;
  co3: number;
  fco2: number;
  pco2: number;
}
