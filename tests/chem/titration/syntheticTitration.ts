/**
 * Synthetic titrations from the engine's forward model (src/chem/titration/titrationModel.ts),
 * with seeded Gaussian pH noise, for recovery tests and benchmarks. Invented samples only.
 */

import { phAfterAcid, type TitrationSample } from '../../../src/chem/titration/titrationModel';
import type { TitrationInput } from '../../../src/chem/titration/types';
import type { ConstantSet } from '../../../src/chem/types';

/** Mulberry32: a small seeded generator so every run of a test sees the same noise. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Box–Muller standard normal deviates from a uniform generator. */
export function normalDeviates(rand: () => number): () => number {
  return () => {
    const u = 1 - rand();
    const v = rand();
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
  };
}

export interface SyntheticSpec {
  sample: TitrationSample;
  sampleVolumeMl: number;
  titrantEqL: number;
  /** Number of evenly spaced readings, the first at zero acid. */
  points: number;
  /** Titrate on until this pH is reached (sets the last volume). */
  finalPh: number;
  phNoise: number;
  seed: number;
  temperatureC?: number;
}

export function syntheticTitration(spec: SyntheticSpec, k: ConstantSet): TitrationInput {
  const { sampleVolumeMl: v0, titrantEqL: c } = spec;
  const ve = (spec.sample.alkalinity * v0) / c;
  // Past Ve nearly all acid stays free: C(V − Ve) ≈ 10^-pH (V0 + V).
  const hEnd = 10 ** -spec.finalPh;
  const vMax = (c * ve + hEnd * v0) / (c - hEnd);
  const gauss = normalDeviates(seededRandom(spec.seed));
  const points = [];
  for (let i = 0; i < spec.points; i++) {
    const v = (vMax * i) / (spec.points - 1);
    const ph = phAfterAcid(spec.sample, k, v0, c, v) + spec.phNoise * gauss();
    points.push({ volume_ml: Number(v.toFixed(4)), ph: Number(ph.toFixed(4)) });
  }
  return {
    sample_volume_ml: v0,
    titrant_normality: c,
    temperature_c: spec.temperatureC ?? 25,
    ionic_strength_mol_kg: 0,
    points,
  };
}
