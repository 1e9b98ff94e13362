/**
 * Uncertainty of a reduced titration from the uncertainties of what was read in the field:
 * sample volume, titrant normality, every titrant volume reading, every pH reading (independent
 * per point) and a pH calibration offset shared by all points. Derivatives of the reduction itself
 * (./propagate.ts), so each method carries its own sensitivity: Gran ignores a pH offset, the fixed
 * endpoint does not.
 */

import { fail } from '../errors';
import { type ConstantsMaker, reduceTitrationWithHints } from '../titration/reduceTitration';
import {
  TITRATION_UNCERTAINTY_KEYS,
  type TitrationInput,
  type TitrationResult,
  type TitrationUncertaintyKey,
} from '../titration/types';
import {
  type Evaluate,
  type OutputUncertainty,
  propagateUncertainty,
  type UncertainInput,
} from './propagate';

/** The outputs that get an uncertainty; the species split and fit numbers are diagnostics. */
const TITRATION_OUTPUTS = [
  'equivalence_volume_ml',
  'alkalinity_meq_l',
  'alkalinity_mg_l_caco3',
  'dic_umol_kg',
] as const;

function outputsOf(r: TitrationResult): Record<string, number> {
  const out: Record<string, number> = {};
  for (const key of TITRATION_OUTPUTS) {
    const v = r[key];
    if (typeof v === 'number') out[key] = v;
  }
  return out;
}

function perturbed(
  input: TitrationInput,
  name: TitrationUncertaintyKey,
  index: number,
  delta: number,
): TitrationInput {
  switch (name) {
    case 'sample_volume_ml':
      return { ...input, sample_volume_ml: input.sample_volume_ml + delta };
    case 'titrant_normality':
      return { ...input, titrant_normality: input.titrant_normality + delta };
    case 'ph_offset':
      return { ...input, points: input.points.map((p) => ({ ...p, ph: p.ph + delta })) };
    case 'ph':
      return { ...input, points: input.points.map((p, i) => (i === index ? { ...p, ph: p.ph + delta } : p)) };
    case 'volume_ml': {
      // Counts are read like volumes: move the reading in whichever unit it was entered. The
      // starting zero is set, not read, so it carries no reading uncertainty.
      const perMl = input.counts_per_ml ?? 1;
      return {
        ...input,
        points: input.points.map((p, i) => {
          if (i !== index || (p.volume_ml ?? p.counts) === 0) return p;
          if (p.volume_ml !== undefined) return { ...p, volume_ml: p.volume_ml + delta };
          return { ...p, counts: (p.counts ?? 0) + delta * perMl };
        }),
      };
    }
  }
}

export function titrationUncertainty(
  input: TitrationInput,
  uncertainty: Record<string, unknown>,
  makeConstants: ConstantsMaker,
): Record<string, OutputUncertainty> {
  const inputs: UncertainInput[] = [];
  for (const [key, u] of Object.entries(uncertainty)) {
    if (!(TITRATION_UNCERTAINTY_KEYS as readonly string[]).includes(key)) {
      fail(
        'uncertainty-unknown-input',
        `No uncertainty can be given for "${key}"; use ${TITRATION_UNCERTAINTY_KEYS.join(', ')}.`,
        'uncertainty',
      );
    }
    if (typeof u !== 'number' || !Number.isFinite(u) || u < 0) {
      fail('uncertainty-invalid', `The uncertainty of ${key} must be a non-negative number.`, 'uncertainty');
    }
    const perPoint = key === 'ph' || key === 'volume_ml';
    inputs.push({ name: key, u, components: perPoint ? input.points.length : 1 });
  }
  // Every perturbed curve fit starts from the unperturbed fit: same minimum, a few iterations.
  const base = reduceTitrationWithHints(input, makeConstants);
  const evaluate: Evaluate = (p) =>
    p === null
      ? outputsOf(base.result)
      : outputsOf(
          reduceTitrationWithHints(
            perturbed(input, p.name as TitrationUncertaintyKey, p.index, p.delta),
            makeConstants,
            base.hints,
          ).result,
        );
  return propagateUncertainty(evaluate, inputs, outputsOf(base.result));
}
