/**
 * Synthetic titrations with the activity of H+ and the ionic strength worked out at every
 * reading, for the bias study of issue 12 §3 (tests and tests/bench/titration-bias.ts).
 *
 * - `engine` model: the fresh-water constants of the engine (Plummer & Busenberg 1982, Davies
 *   activities) evaluated at each reading's own ionic strength: the sample's, diluted by the acid,
 *   plus the free strong acid (HCl replacing bicarbonate by chloride leaves the rest unchanged).
 * - `ideal` model: the same equilibria at infinite dilution (every activity coefficient 1), for a
 *   reduction told the same; it checks the reduction's algebra apart from the activity model.
 * Invented samples only. pH is exact (no rounding) unless noise is asked for.
 */

import { freshTitrationConstants } from '../../../src/chem/titration/reduceTitration';
import { phAfterAcid, type TitrationSample } from '../../../src/chem/titration/titrationModel';
import type { TitrationInput } from '../../../src/chem/titration/types';
import type { ConstantSet } from '../../../src/chem/types';
import { normalDeviates, seededRandom } from './syntheticTitration';

export type SyntheticModel = 'engine' | 'ideal';

/** The constants maker a reduction of data from `model` is given. */
export const makerFor = (model: SyntheticModel) =>
  model === 'engine'
    ? freshTitrationConstants
    : (temperatureC: number, _ionicStrength: number): ConstantSet => freshTitrationConstants(temperatureC, 0);

export interface ActivitySpec {
  model: SyntheticModel;
  sample: TitrationSample;
  /** Ionic strength of the sample before any acid, mol/kg (engine model only). */
  ionicStrength: number;
  sampleVolumeMl: number;
  titrantEqL: number;
  temperatureC: number;
  /** Evenly spaced readings from zero acid to the volume where the pH reaches `finalPh`. */
  points: number;
  finalPh: number;
  phNoise: number;
  seed: number;
}

/** pH after `v` mL with the constants at that reading's own ionic strength (fixed point in I). */
export function phWithActivity(spec: ActivitySpec, v: number): number {
  const make = makerFor(spec.model);
  const { sampleVolumeMl: v0, titrantEqL: c } = spec;
  const base = (spec.ionicStrength * v0) / (v0 + v);
  let ionic = base;
  let ph = 7;
  for (let i = 0; i < 30; i++) {
    const k = make(spec.temperatureC, ionic);
    const next = phAfterAcid(spec.sample, k, v0, c, v);
    const free = 10 ** -next * k.freeHFactor;
    const nextIonic = base + free;
    const settled = Math.abs(next - ph) < 1e-13 && Math.abs(nextIonic - ionic) < 1e-15;
    ph = next;
    ionic = nextIonic;
    if (settled) break;
  }
  return ph;
}

/** Volume at which the pH reaches `ph`, by bisection (the pH falls monotonically with acid). */
function volumeAtPh(spec: ActivitySpec, ph: number): number {
  const ve = (spec.sample.alkalinity * spec.sampleVolumeMl) / spec.titrantEqL;
  let lo = 0;
  let hi = ve + 2;
  while (phWithActivity(spec, hi) > ph) hi *= 2;
  for (let i = 0; i < 60; i++) {
    const mid = 0.5 * (lo + hi);
    if (phWithActivity(spec, mid) > ph) lo = mid;
    else hi = mid;
  }
  return hi;
}

export function activityTitration(spec: ActivitySpec): TitrationInput {
  const vMax = volumeAtPh(spec, spec.finalPh);
  const gauss = normalDeviates(seededRandom(spec.seed));
  const points = [];
  for (let i = 0; i < spec.points; i++) {
    const v = (vMax * i) / (spec.points - 1);
    const ph = phWithActivity(spec, v) + (spec.phNoise > 0 ? spec.phNoise * gauss() : 0);
    points.push({ volume_ml: v, ph });
  }
  return {
    sample_volume_ml: spec.sampleVolumeMl,
    titrant_normality: spec.titrantEqL,
    temperature_c: spec.temperatureC,
    ionic_strength_mol_kg: spec.model === 'engine' ? spec.ionicStrength : 0,
    points,
  };
}

/** The grid of issue 12 §3: alkalinity 0.3–5 meq/L, DIC/alkalinity 1–2, acid 0.02–0.16 N. */
export const ALKALINITIES_MEQ_L = [0.3, 0.5, 1, 2, 5];
export const DIC_RATIOS = [1, 1.5, 2];
export const NORMALITIES = [0.02, 0.05, 0.16];

export interface GridCase {
  alkalinityMeqL: number;
  dicRatio: number;
  normality: number;
}

export const GRID: GridCase[] = ALKALINITIES_MEQ_L.flatMap((alkalinityMeqL) =>
  DIC_RATIOS.flatMap((dicRatio) => NORMALITIES.map((normality) => ({ alkalinityMeqL, dicRatio, normality }))),
);

/** One titration of a grid water: 100 mL, 15 °C, 40 readings, background salts 2 mmol/kg of I. */
export function gridTitration(
  g: GridCase,
  model: SyntheticModel,
  finalPh: number,
  phNoise: number,
  seed: number,
): TitrationInput {
  const ta = g.alkalinityMeqL * 1e-3;
  return activityTitration({
    model,
    sample: { alkalinity: ta, dic: ta * g.dicRatio },
    ionicStrength: 0.002 + 1.5 * ta,
    sampleVolumeMl: 100,
    titrantEqL: g.normality,
    temperatureC: 15,
    points: 40,
    finalPh,
    phNoise,
    seed,
  });
}
