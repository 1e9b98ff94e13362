/**
 * The public shape of a solve: the same snake_case keys as the `tufa solve` JSON Lines contract,
 * so the CLI, the Web Worker, the app and the tests all speak one format.
 * Implementation: `solve()` in `./solve.ts`.
 */

import type { Issue } from './errors';
import type { TradeOutputs } from './trades/solveOutputs';

export type ModelChoice = 'saline' | 'fresh' | 'auto';
export const MODEL_CHOICES: readonly ModelChoice[] = ['saline', 'fresh', 'auto'];
export type PhScaleName = 'total' | 'free' | 'seawater' | 'nbs';
export const PH_SCALE_CHOICES: readonly PhScaleName[] = ['total', 'free', 'seawater', 'nbs'];
/**
 * K1 and K2 of the saline model: `auto` (the default) takes Millero (2010) below S 19 and
 * Lueker et al. (2000) from S 25, blended in between (`saline/carbonic.ts`); the others are used at
 * every salinity.
 */
export type CarbonicConstants = 'auto' | 'lueker2000' | 'millero2010';
export const CARBONIC_CONSTANT_CHOICES: readonly CarbonicConstants[] = ['auto', 'lueker2000', 'millero2010'];
export type BoronTotal = 'lee2010' | 'uppstrom1974';
export const BORON_TOTAL_CHOICES: readonly BoronTotal[] = ['lee2010', 'uppstrom1974'];

/** The eight carbonate parameters a pair can be chosen from (input key names). */
export const CARBONATE_KEYS = [
  'alkalinity_umol_kg',
  'dic_umol_kg',
  'ph',
  'pco2_uatm',
  'fco2_uatm',
  'co2_umol_kg',
  'hco3_umol_kg',
  'co3_umol_kg',
] as const;
export type CarbonateKey = (typeof CARBONATE_KEYS)[number];

export interface SolveInput {
  temperature_c?: number;
  salinity?: number;
  pressure_dbar?: number;
  model?: ModelChoice;
  alkalinity_umol_kg?: number;
  dic_umol_kg?: number;
  ph?: number;
  ph_scale?: PhScaleName;
  pco2_uatm?: number;
  fco2_uatm?: number;
  co2_umol_kg?: number;
  hco3_umol_kg?: number;
  co3_umol_kg?: number;
  phosphate_umol_kg?: number;
  silicate_umol_kg?: number;
  ammonia_umol_kg?: number;
  sulfide_umol_kg?: number;
  calcium_umol_kg?: number;
  carbonic_constants?: CarbonicConstants;
  boron_total?: BoronTotal;
  fluoride_constant?: 'perezfraga1987' | 'dicksonriley1979';
  output_temperature_c?: number;
  output_pressure_dbar?: number;
  /**
   * Standard uncertainties to propagate: input key → uncertainty in that key's unit, plus
   * `constants: true` for the constants (Orr et al. 2018), or pk0, pk1, pk2, pkb, pkw, pksp_calcite,
   * pksp_aragonite, total_boron (relative) one by one.
   */
  uncertainty?: Record<string, number | boolean>;
  /** Further keys (fresh-water ions, uncertainties, ...) are added by later capabilities. */
  [key: string]: unknown;
}

/** The uncertainty of one output of a solve (or of a titration). */
export interface OutputUncertainty {
  /** Standard uncertainty, in the unit of the output. */
  standard_uncertainty: number;
  /** The input (or constant) with the largest contribution; `none` when nothing moves the output. */
  dominant_input: string;
  /** |∂output/∂input|·u(input) per input, in the unit of the output; they add in quadrature. */
  contributions: Record<string, number>;
}

/** One solved water at output conditions. */
export interface SolvedWater {
  alkalinity_umol_kg: number;
  dic_umol_kg: number;
  ph_total: number;
  ph_free: number;
  ph_seawater: number;
  ph_nbs: number;
  pco2_uatm: number;
  fco2_uatm: number;
  co2_umol_kg: number;
  hco3_umol_kg: number;
  co3_umol_kg: number;
  /** Null in the fresh model when calcium is not given (no saturation state without it). */
  omega_calcite: number | null;
  omega_aragonite: number | null;
  revelle_factor: number;
  /** Egleston et al. (2010) buffer factors, mmol/kg: γ, β, ω with respect to DIC (constant TA) and TA (constant DIC). */
  buffer_factors_mmol_kg: {
    gamma_dic: number;
    beta_dic: number;
    omega_dic: number;
    gamma_ta: number;
    beta_ta: number;
    omega_ta: number;
  };
  /** p-values (−log10) of the constants used at output conditions, e.g. `pk1`. */
  constants: Record<string, number>;
  model: 'saline' | 'fresh';
  /** Formulation names keyed by quantity. */
  formulations: Record<string, string>;
  warnings: Issue[];
  /** Which input pair the system was solved from, e.g. `["alkalinity_umol_kg","dic_umol_kg"]`. */
  pair: [CarbonateKey, CarbonateKey];
  /** Totals used (from salinity or measured), µmol/kg. */
  totals_umol_kg: { boron: number; sulfate: number; fluoride: number; calcium: number };
  /** The output conditions the results refer to. */
  conditions: Conditions;
  /** The input conditions, when they differ from the output conditions. */
  input_conditions?: Conditions;
  /** Measured minus computed (at input conditions) for every extra carbonate parameter given. */
  misfit?: Partial<Record<CarbonateKey, number>>;
  /** Why this model was used: the automatic choice and what it rests on, or "asked for". */
  model_reason?: string;
}

/**
 * Outputs only the fresh-water model gives (`model: "fresh"`). Keys that need calcium, magnesium
 * or major ions are absent when those were not given. Concentrations per kg of water.
 */
export interface FreshWaterOutputs {
  /** Activity pH (the fresh model's internal scale, NBS buffers). */
  ph: number;
  ionic_strength_mol_kg: number;
  /** Which estimate I rests on: major-ions, given, conductance-russell-1976, ... */
  ionic_strength_method: string;
  activity_model: string;
  activity_coefficients: {
    h: number;
    oh: number;
    hco3: number;
    co3: number;
    ca: number;
    mg: number;
    co2: number;
  };
  pksp_dolomite: number;
  /** p-values of the thermodynamic constants before activity corrections (the `constants` are conditional). */
  constants_infinite_dilution: Record<string, number>;
  alkalinity_mmol_kg: number;
  alkalinity_mmol_l: number;
  alkalinity_meq_l: number;
  alkalinity_mg_l_caco3: number;
  alkalinity_mg_l_hco3: number;
  alkalinity_ppm_caco3: number;
  alkalinity_dkh: number;
  air_pco2_uatm: number;
  /** pCO2 of the sample over that of the air. */
  pco2_excess_ratio: number;
  /** pH and DIC after CO2 exchange with the air to equilibrium at constant alkalinity. */
  ph_air_equilibrium?: number;
  dic_air_equilibrium_umol_kg?: number;
  saturation_index_calcite?: number;
  saturation_index_aragonite?: number;
  saturation_index_dolomite?: number;
  /** With calcium and sulfate given: gypsum, from free-ion activities (Nordstrom et al. 1990). */
  saturation_index_gypsum?: number;
  /** pH of calcite saturation at the sample's alkalinity and calcium. */
  ph_saturation_calcite?: number;
  langelier_index?: number;
  ryznar_index?: number;
  /** CaCO3 that precipitates (> 0) or dissolves (< 0) to calcite equilibrium, mg/L as CaCO3. */
  ccpp_mg_l_caco3?: number;
  ph_after_ccpp?: number;
  /** Cautions shown with every index a reader might dose chemicals on. */
  treatment_caution?: string;
  charge_balance_error_percent?: number;
  /** With the major ions: the equivalents each side of the charge balance, meq/kg of water. */
  charge_balance_meq_kg?: { cations: number; anions: number };
  /**
   * With Ca, Mg, Na, K or SO4 given: the speciation the ion pairs give (fractions of each total,
   * summing to 1; free concentrations in µmol/kg of water). `hco3_umol_kg` and `co3_umol_kg`
   * are totals, free plus paired, like the saline model's stoichiometric ones.
   */
  ion_pairs?: {
    calcium: Record<string, number>;
    magnesium: Record<string, number>;
    carbonate: Record<string, number>;
    bicarbonate: Record<string, number>;
    sulfate: Record<string, number>;
    free_umol_kg: Record<string, number>;
  };
}

export interface Conditions {
  temperature_c: number;
  salinity: number;
  pressure_dbar: number;
}

export interface SolveOutput extends SolvedWater, Partial<FreshWaterOutputs>, Partial<TradeOutputs> {
  /** Other roots for two-root pairs, in the same shape. */
  alternatives?: SolvedWater[];
  /** When the input asked for it: the uncertainty of every numeric output, keyed by output name. */
  uncertainty?: Record<string, OutputUncertainty>;
}

export type SolveResult = SolveOutput | { error: Issue };

export function isSolveError(r: SolveResult): r is { error: Issue } {
  return 'error' in r && typeof (r as { error?: unknown }).error === 'object';
}
