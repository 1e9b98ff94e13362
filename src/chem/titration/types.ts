/**
 * The raw record of a field titration and the shape of its reduction.
 *
 * A titration is stored as raw data (sample, titrant, points) and reduced on demand, so the same
 * record can be re-reduced later with another method or other constants. Volumes in mL, pH as the
 * meter reads it (activity scale, NBS buffers), temperatures in °C.
 */

import type { OutputUncertainty } from '../api';
import type { Issue } from '../errors';

export const TITRATION_METHODS = [
  'modified_gran',
  'gran',
  'inflection',
  'endpoint',
  'two_endpoint',
  'curve_fit',
] as const;
export type TitrationMethod = (typeof TITRATION_METHODS)[number];
/** The reduction used when a record names none (see modifiedGranMethod.ts). */
export const DEFAULT_TITRATION_METHOD: TitrationMethod = 'modified_gran';

/** Whether CO2 stays in the vessel (closed) or the sample keeps exchanging with air (open). */
export type TitrationSystem = 'closed' | 'open';

/** One reading: cumulative titrant added (mL, or digital titrator counts) and the pH after it. */
export interface TitrationPoint {
  volume_ml?: number;
  counts?: number;
  ph: number;
}

/** The raw titration, snake_case like every engine JSON shape. */
export interface TitrationInput {
  sample_volume_ml: number;
  /** Nominal titrant concentration, equivalents per litre. */
  titrant_normality: number;
  /** Multiplies the nominal normality (from standardising the titrant); default 1. */
  titrant_correction_factor?: number;
  temperature_c: number;
  method?: TitrationMethod;
  /** Fixed-endpoint pH (also the first of the two endpoints); default 4.5. */
  endpoint_ph?: number;
  ionic_strength_mol_kg?: number;
  specific_conductance_us_cm?: number;
  /** Digital titrator counts per mL of titrant, as printed for the user's cartridge. */
  counts_per_ml?: number;
  /** Modified Gran and curve fit: closed vessel (default) or sample open to air. */
  system?: TitrationSystem;
  /** Curve fit, open system: partial pressure of CO2 in the air, µatm (default 420, then fitted). */
  air_pco2_uatm?: number;
  /** Curve fit: also fit a pH offset common to all readings (meter calibration); default false. */
  curve_fit_ph_offset?: boolean;
  /** Gran: only points at or below this pH are candidates (default 4.0). */
  gran_max_ph?: number;
  points: TitrationPoint[];
  /** Standard uncertainties to propagate to the alkalinity (see `titrationUncertainty`). */
  uncertainty?: Partial<Record<TitrationUncertaintyKey, number>>;
}

/**
 * Inputs of a titration whose uncertainty can be propagated:
 * `sample_volume_ml` (mL), `titrant_normality` (eq/L), `volume_ml` (reading of every point, mL,
 * independent per point), `ph` (reading of every point, independent per point) and `ph_offset`
 * (a calibration offset common to all points).
 */
export const TITRATION_UNCERTAINTY_KEYS = [
  'sample_volume_ml',
  'titrant_normality',
  'volume_ml',
  'ph',
  'ph_offset',
] as const;
export type TitrationUncertaintyKey = (typeof TITRATION_UNCERTAINTY_KEYS)[number];

/** Points after validation: titrant volumes in mL, strictly increasing, same length as `ph`. */
export interface TitrationCurve {
  volumeMl: Float64Array;
  ph: Float64Array;
}

export interface FitQuality {
  /**
   * Coefficient of determination of the fitted quantity (F1 for Gran, pH otherwise); null for the
   * fixed endpoint, which interpolates between two points and fits nothing.
   */
  r2: number | null;
  /** Observed minus fitted, in the fitted quantity, one per point used. */
  residuals: number[];
  /** Root mean square of the residuals. */
  rms: number;
  /** Indices (0-based, in the order given) of the points the method used. */
  points_used: number[];
  /** Free-form numbers specific to the method (slope, iterations, ...). */
  details: Record<string, number>;
}

export interface SpeciesSplit {
  /** Of the original sample, at its first pH reading, mmol/L. */
  hco3_mmol_l: number;
  co3_mmol_l: number;
  oh_mmol_l: number;
  /** Dissolved CO2 (CO2* = CO2(aq) + H2CO3) and DIC at the first reading, mmol/L. */
  co2_mmol_l: number;
  dic_mmol_l: number;
  /** The same as mass concentrations of the ions, mg/L. */
  hco3_mg_l: number;
  co3_mg_l: number;
  oh_mg_l: number;
}

/**
 * How far the reduction can be trusted from the readings alone: standard errors from the scatter
 * of the readings about the fitted model (not the input uncertainties; see `uncertainty`), and a
 * word for the screen: high (alkalinity SE ≤ 0.3 % and 3 or more readings past the endpoint),
 * medium (SE ≤ 1 % and at least one past it), low (otherwise), not_estimated (the method fits
 * nothing: fixed endpoints, inflection).
 */
export interface TitrationConfidence {
  level: 'high' | 'medium' | 'low' | 'not_estimated';
  alkalinity_se_meq_l?: number;
  dic_se_mmol_l?: number;
  points_used: number;
  points_past_endpoint: number;
}

export interface TitrationResult {
  method: TitrationMethod;
  equivalence_volume_ml: number;
  alkalinity_meq_l: number;
  alkalinity_mg_l_caco3: number;
  /** Alkalinity in every unit of the units module, keyed by unit name. */
  alkalinity: Record<string, number>;
  /**
   * DIC of the original sample, µmol/kg of water, from the methods that fit it (modified_gran in
   * a closed vessel, curve_fit), with its standard error from the fit (`dic_se_umol_kg`); a
   * reading can use it as its second carbonate parameter.
   */
  dic_umol_kg?: number;
  dic_se_umol_kg?: number;
  /** Which points were used (also `fit.points_used`) and how far the result can be trusted. */
  confidence: TitrationConfidence;
  species: SpeciesSplit;
  fit: FitQuality;
  ionic_strength_mol_kg: number;
  /** Where the ionic strength came from (given, conductance, estimated from alkalinity). */
  ionic_strength_source: string;
  /** Titrant concentration actually used: normality × correction factor, eq/L. */
  titrant_eq_l: number;
  formulations: Record<string, string>;
  warnings: Issue[];
  uncertainty?: Record<string, OutputUncertainty>;
}
