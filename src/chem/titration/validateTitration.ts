/**
 * Checks a raw titration and turns its points into a curve of titrant volume (mL) and pH.
 * Bad input throws a TufaError with a stable code; doubtful but usable input becomes a warning.
 */

import { fail, type Issue, warning } from '../errors';
import type { TitrationCurve, TitrationInput } from './types';

/** Fewest points any method can work with. */
export const MIN_POINTS = 4;

function finite(value: unknown, field: string, what: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    fail('titration-value-invalid', `${what} must be a number; got ${JSON.stringify(value)}.`, field);
  }
  return value;
}

function positive(value: unknown, field: string, what: string): number {
  const v = finite(value, field, what);
  if (v <= 0) fail('titration-value-invalid', `${what} must be greater than zero; got ${v}.`, field);
  return v;
}

export interface CheckedTitration {
  sampleVolumeMl: number;
  /** Effective titrant concentration: normality × correction factor, eq/L. */
  titrantEqL: number;
  temperatureC: number;
  endpointPh: number;
  curve: TitrationCurve;
  warnings: Issue[];
}

export function checkTitration(input: TitrationInput): CheckedTitration {
  if (typeof input !== 'object' || input === null) {
    fail('titration-value-invalid', 'A titration must be a JSON object.');
  }
  const warnings: Issue[] = [];
  const sampleVolumeMl = positive(input.sample_volume_ml, 'sample_volume_ml', 'Sample volume (mL)');
  const normality = positive(input.titrant_normality, 'titrant_normality', 'Titrant normality (eq/L)');
  const factor =
    input.titrant_correction_factor === undefined
      ? 1
      : positive(input.titrant_correction_factor, 'titrant_correction_factor', 'Titrant correction factor');
  if (factor < 0.8 || factor > 1.2) {
    warnings.push(
      warning(
        'titrant-factor-unusual',
        `A correction factor of ${factor} is far from 1: check that it is a factor, not a normality.`,
        'titrant_correction_factor',
      ),
    );
  }
  const temperatureC = finite(input.temperature_c, 'temperature_c', 'Sample temperature (°C)');
  if (temperatureC < -2 || temperatureC > 100) {
    fail(
      'titration-value-invalid',
      `Sample temperature ${temperatureC} °C is not liquid water.`,
      'temperature_c',
    );
  }
  const endpointPh =
    input.endpoint_ph === undefined ? 4.5 : finite(input.endpoint_ph, 'endpoint_ph', 'Endpoint pH');
  if (endpointPh < 3 || endpointPh > 9) {
    fail('titration-value-invalid', `Endpoint pH ${endpointPh} is outside 3–9.`, 'endpoint_ph');
  }

  const points = input.points;
  if (!Array.isArray(points))
    fail('titration-points-missing', 'The titration needs a `points` array.', 'points');
  if (points.length < MIN_POINTS) {
    fail(
      'titration-too-few-points',
      `A titration needs at least ${MIN_POINTS} points; got ${points.length}.`,
      'points',
    );
  }
  const countsPerMl =
    input.counts_per_ml === undefined
      ? undefined
      : positive(input.counts_per_ml, 'counts_per_ml', 'Counts per mL');

  const n = points.length;
  const volumeMl = new Float64Array(n);
  const ph = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const p = points[i];
    const where = `points[${i}]`;
    if (typeof p !== 'object' || p === null)
      fail('titration-value-invalid', `${where} must be an object.`, 'points');
    if (p.volume_ml !== undefined) {
      volumeMl[i] = finite(p.volume_ml, 'points', `${where}.volume_ml`);
    } else if (p.counts !== undefined) {
      if (countsPerMl === undefined) {
        fail(
          'titration-counts-factor-missing',
          `${where} gives counts: also give counts_per_ml.`,
          'counts_per_ml',
        );
      }
      volumeMl[i] = finite(p.counts, 'points', `${where}.counts`) / countsPerMl;
    } else {
      fail('titration-value-invalid', `${where} needs volume_ml (or counts with counts_per_ml).`, 'points');
    }
    if (volumeMl[i]! < 0)
      fail('titration-value-invalid', `${where}: titrant volume cannot be negative.`, 'points');
    ph[i] = finite(p.ph, 'points', `${where}.ph`);
    if (ph[i]! < 0 || ph[i]! > 14)
      fail('titration-value-invalid', `${where}: pH ${ph[i]} is outside 0–14.`, 'points');
    if (i > 0 && volumeMl[i]! <= volumeMl[i - 1]!) {
      fail(
        'titration-volume-not-increasing',
        `${where}: titrant volumes must increase point after point (cumulative readings).`,
        'points',
      );
    }
  }

  // Acid only lowers pH; a rise beyond meter noise means a drifting electrode or a typing slip.
  for (let i = 1; i < n; i++) {
    if (ph[i]! > ph[i - 1]! + 0.02) {
      warnings.push(
        warning(
          'titration-ph-not-monotonic',
          `pH rises from ${ph[i - 1]} to ${ph[i]} at point ${i}: check the electrode and the entry.`,
          'points',
        ),
      );
      break;
    }
  }
  return {
    sampleVolumeMl,
    titrantEqL: normality * factor,
    temperatureC,
    endpointPh,
    curve: { volumeMl, ph },
    warnings,
  };
}
