/**
 * The public shape of a solve: the same snake_case keys as the `tufa solve` JSON Lines contract,
 * so the CLI, the Web Worker, the app and the tests all speak one format.
 * Implementation: `solve()` in `./solve.ts`.
 */

import type { Issue } from './errors';

export type ModelChoice = 'saline' | 'fresh' | 'auto';
export type PhScaleName = 'total' | 'free' | 'seawater' | 'nbs';
export type CarbonicConstants = 'lueker2000' | 'millero2010';
export type BoronTotal = 'lee2010' | 'uppstrom1974';

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
  /** Further keys (fresh-water ions, uncertainties, ...) are added by later capabilities. */
  [key: string]: unknown;
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
  omega_calcite: number;
  omega_aragonite: number;
  revelle_factor: number;
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
}

export interface Conditions {
  temperature_c: number;
  salinity: number;
  pressure_dbar: number;
}

export interface SolveOutput extends SolvedWater {
  /** Other roots for two-root pairs, in the same shape. */
  alternatives?: SolvedWater[];
}

export type SolveResult = SolveOutput | { error: Issue };

export function isSolveError(r: SolveResult): r is { error: Issue } {
  return 'error' in r && typeof (r as { error?: unknown }).error === 'object';
}
