/**
 * Uncertainty of a reduced titration from the uncertainties of what was read in the field:
 * sample volume, titrant normality, every titrant volume reading, every pH reading (independent
 * per point) and a pH calibration offset shared by all points. Derivatives of the reduction itself
 * (./propagate.ts), so each method carries its own sensitivity: Gran ignores a pH offset, the fixed
 * endpoint does not.
 */

import { fail } from '../errors';
import type { PerPointDerivatives } from '../titration/pointSensitivity';
import { type ConstantsMaker, reduceTitrationWithHints } from '../titration/reduceTitration';
import {
  TITRATION_UNCERTAINTY_KEYS,
  type TitrationInput,
  type TitrationResult,
  type TitrationUncertaintyKey,
} from '../titration/types';
import {
  combineVariances,
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
  const baseOut = outputsOf(base.result);
  // Methods that fit the readings report how the result moves with each one: per-point inputs
  // then cost nothing more (linear in the number of points); the others are perturbed one by one.
  const sens = base.sensitivity;
  const analytic = sens === undefined ? [] : inputs.filter((i) => i.name === 'ph' || i.name === 'volume_ml');
  // Without sensitivities, only the readings a method used can move its result to first order
  // (a reading outside its selection changes nothing until it crosses a selection edge).
  const usedPoints = base.result.fit.points_used;
  const numeric = inputs
    .filter((i) => !analytic.includes(i))
    .map((i) => ((i.components ?? 1) > 1 ? { ...i, components: usedPoints.length } : i));
  const evaluate: Evaluate = (p) =>
    p === null
      ? outputsOf(base.result)
      : outputsOf(
          reduceTitrationWithHints(
            perturbed(
              input,
              p.name as TitrationUncertaintyKey,
              p.name === 'ph' || p.name === 'volume_ml' ? usedPoints[p.index]! : p.index,
              p.delta,
            ),
            makeConstants,
            base.hints,
          ).result,
        );
  const result = propagateUncertainty(evaluate, numeric, baseOut);
  if (sens === undefined || analytic.length === 0) return result;
  const perInput = analytic.map((inp) => ({
    inp,
    variances: perPointVariances(
      base.result,
      baseOut,
      sens[inp.name as 'ph' | 'volume_ml'],
      inp.u,
      inp.name === 'volume_ml' ? zeroVolumes(input) : null,
    ),
  }));
  return mergeContributions(result, inputs, perInput);
}

/** Points whose volume is the set starting zero (no reading uncertainty). */
function zeroVolumes(input: TitrationInput): boolean[] {
  return input.points.map((p) => (p.volume_ml ?? p.counts) === 0);
}

/**
 * Σᵢ (∂out/∂θᵢ · u)² for every output. Alkalinity outputs are proportional to the alkalinity (at
 * fixed sample volume, normality and temperature), dic_umol_kg to the DIC.
 */
function perPointVariances(
  r: TitrationResult,
  out: Record<string, number>,
  d: PerPointDerivatives,
  u: number,
  skip: boolean[] | null,
): Record<string, number> {
  let sumTa = 0;
  let sumDic = 0;
  for (let i = 0; i < d.alkalinity.length; i++) {
    if (skip?.[i]) continue;
    sumTa += d.alkalinity[i]! ** 2;
    if (d.dic) sumDic += d.dic[i]! ** 2;
  }
  const ta = r.alkalinity_meq_l * 1e-3;
  const variances: Record<string, number> = {};
  for (const [key, value] of Object.entries(out)) {
    if (key === 'dic_umol_kg') {
      // dic_umol_kg is DIC (mol/L) scaled by 1e6/density: the ratio value/DIC carries the factor.
      const dicMolL = r.species.dic_mmol_l * 1e-3;
      variances[key] = d.dic && dicMolL > 0 ? (value / dicMolL) ** 2 * sumDic * u * u : 0;
    } else {
      variances[key] = (value / ta) ** 2 * sumTa * u * u;
    }
  }
  return variances;
}

function mergeContributions(
  result: Record<string, OutputUncertainty>,
  inputs: readonly UncertainInput[],
  perInput: { inp: UncertainInput; variances: Record<string, number> }[],
): Record<string, OutputUncertainty> {
  for (const [key, entry] of Object.entries(result)) {
    result[key] = combineVariances(inputs, (name) => {
      const extra = perInput.find((x) => x.inp.name === name);
      return extra ? (extra.variances[key] ?? 0) : (entry.contributions[name] ?? 0) ** 2;
    });
  }
  return result;
}
