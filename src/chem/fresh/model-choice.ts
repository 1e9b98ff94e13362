/**
 * Which water model serves a sample. `auto` decides from the salinity, or from what stands for it
 * (specific conductance, then ionic strength, then TDS), and always says why.
 *
 * The boundary is practical salinity 2 (about I = 0.04 mol/kg and 3.6 mS/cm at 25 °C):
 * - below it the saline formulations are outside their published ranges (Lueker et al. 2000 from
 *   S 19, Millero 2010 from S 1 with few data below 5) and PSS-78 itself needs the Hill et al. (1986)
 *   extension, while Davies and Debye–Hückel activity coefficients are well inside theirs (I < 0.1);
 * - above it sea-salt ion pairing dominates and stoichiometric constants describe it better.
 * Between S 0.5 and 5 (the oligohaline band of the Venice system, 1958) either model is an
 * approximation: the choice is made at S 2 and a `brackish-water` warning names it.
 *
 * The boundary is not a step in the results: with `auto`, a water known only by its salinity (or
 * conductance) takes the saline model's constants into the fresh model below S 2 — blended in log K
 * from S 0 to 0.5, unchanged from S 0.5 — so pCO2 moves less than 3 % per 0.05 in S across the
 * boundary and agrees with Millero (2010) from S 0.5 (`handover.ts`, `formulations.handover`).
 * Waters whose major ions are given keep their own composition (ion pairs) and are not blended.
 */

import { type Issue, warning } from '../errors';
import type { WaterModel } from '../types';

export const FRESH_SALINE_BOUNDARY = 2;
export const BRACKISH_BAND = { min: 0.5, max: 5 } as const;

/** Practical salinity of seawater per mol/kg of ionic strength: I = 19.924 S / (1000 − 1.005 S) (DOE 1994, memory). */
export function ionicStrengthFromSalinity(s: number): number {
  return (19.924 * s) / (1000 - 1.005 * s);
}
export function salinityFromIonicStrength(i: number): number {
  return (1000 * i) / (19.924 + 1.005 * i);
}

export interface SalinityEvidence {
  salinity?: number;
  /** Salinity derived from specific conductance (PSS-78 at 25 °C). */
  salinityFromConductance?: number;
  ionicStrength?: number;
  tdsMgL?: number;
  /** Fresh-only inputs were given (major ions in mg/L, alkalinity in mg/L as CaCO3, ...). */
  freshKeys: string[];
}

export interface ModelDecision {
  model: WaterModel;
  /** One sentence: what the choice rests on. */
  reason: string;
  warnings: Issue[];
}

/** Decides the model for `choice` (`auto` looks at the evidence; the others are obeyed). */
export function chooseModel(choice: 'saline' | 'fresh' | 'auto', e: SalinityEvidence): ModelDecision {
  if (choice !== 'auto') return { model: choice, reason: `model ${choice} was asked for`, warnings: [] };
  let s: number | undefined;
  let basis = '';
  if (e.salinity !== undefined) {
    s = e.salinity;
    basis = `salinity ${s}`;
  } else if (e.salinityFromConductance !== undefined) {
    s = e.salinityFromConductance;
    basis = `salinity ${s.toPrecision(3)} from the specific conductance (PSS-78)`;
  } else if (e.ionicStrength !== undefined) {
    s = salinityFromIonicStrength(e.ionicStrength);
    basis = `ionic strength ${e.ionicStrength} mol/kg (salinity ≈ ${s.toPrecision(3)} if it were sea salt)`;
  } else if (e.tdsMgL !== undefined) {
    // TDS in g/kg is close to absolute salinity; practical salinity ≈ TDS/1.00488 g/kg (common practice).
    s = e.tdsMgL / 1000;
    basis = `TDS ${e.tdsMgL} mg/L (≈ salinity ${s.toPrecision(3)})`;
  }
  if (s === undefined) {
    if (e.freshKeys.length > 0) {
      return {
        model: 'fresh',
        reason: `no salinity or conductance was given, and ${e.freshKeys.join(', ')} are fresh-water inputs`,
        warnings: [],
      };
    }
    // Sea and reef water is always measured with its salinity; a sample without any sign of salt
    // is far more often a stream, spring or well, so the fresh model is assumed, with a warning.
    return {
      model: 'fresh',
      reason: 'no salinity, conductance or other sign of salt was given, so fresh water is assumed',
      warnings: [
        warning(
          'model-assumed-fresh',
          'No salinity or conductance was given, so the fresh-water model was assumed. For sea or reef water give salinity (or set model to saline).',
          'model',
        ),
      ],
    };
  }
  const model: WaterModel = s < FRESH_SALINE_BOUNDARY ? 'fresh' : 'saline';
  const reason = `${basis} is ${model === 'fresh' ? 'below' : 'at or above'} the fresh/saline boundary of S ${FRESH_SALINE_BOUNDARY}`;
  const warnings: Issue[] = [];
  if (s >= BRACKISH_BAND.min && s < BRACKISH_BAND.max) {
    warnings.push(
      warning(
        'brackish-water',
        `Brackish water (${basis}): the ${model} model was chosen because S is ${model === 'fresh' ? 'below' : 'at or above'} ${FRESH_SALINE_BOUNDARY}. ` +
          'Between S 0.5 and 5 both models are approximations. Without major ions the fresh model here uses the saline ' +
          'constants of this salinity (see formulations.handover), so the result does not jump at S 2; ' +
          'set model to saline for diluted seawater (estuaries) or to fresh for inland mineral water.',
        'model',
      ),
    );
  }
  return { model, reason, warnings };
}
