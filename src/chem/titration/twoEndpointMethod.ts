/**
 * Two-endpoint reduction for low-alkalinity waters: the volumes B and C at which the curve crosses
 * the endpoint pH and a pH 0.3 lower. Past the equivalence point the excess acid is free H+, so
 * (V0 + V)·10^-pH ∝ (V − Ve) (the Gran function, Gran 1952), and two points fix the line:
 *   r = (V0 + C)·10^-pHc / ((V0 + B)·10^-pHb),   Ve = (r·B − C) / (r − 1).
 * Without dilution and with pHc = pHb − 0.3 (r = 10^0.3 ≈ 2) this is the Ve = 2B − C of the
 * low-alkalinity procedure in Standard Methods 2320 B *(memory)*.
 */

import { fail, type Issue, warning } from '../errors';
import type { MethodResult } from './methodResult';
import type { TitrationCurve } from './types';

/** The second endpoint lies this far below the first (Standard Methods 2320 B, *memory*). */
export const SECOND_ENDPOINT_DROP_PH = 0.3;

/** Volume where the curve first falls to `target` pH (linear interpolation) and the reading after it. */
function crossing(curve: TitrationCurve, target: number): { volume: number; i: number } | undefined {
  const { volumeMl, ph } = curve;
  for (let i = 1; i < ph.length; i++) {
    if (ph[i]! <= target && ph[i - 1]! > target) {
      const f = (ph[i - 1]! - target) / (ph[i - 1]! - ph[i]!);
      return { volume: volumeMl[i - 1]! + f * (volumeMl[i]! - volumeMl[i - 1]!), i };
    }
  }
  return undefined;
}

export function reduceTwoEndpoint(
  curve: TitrationCurve,
  sampleVolumeMl: number,
  endpointPh: number,
): MethodResult {
  const warnings: Issue[] = [];
  const second = endpointPh - SECOND_ENDPOINT_DROP_PH;
  const b = crossing(curve, endpointPh);
  const c = crossing(curve, second);
  if (b === undefined || c === undefined) {
    fail(
      'titration-endpoint-not-crossed',
      `The two-endpoint method needs readings down to pH ${second.toFixed(2)} (the endpoint minus ${SECOND_ENDPOINT_DROP_PH}).`,
      'points',
    );
  }
  const r = ((sampleVolumeMl + c.volume) * 10 ** -second) / ((sampleVolumeMl + b.volume) * 10 ** -endpointPh);
  const ve = (r * b.volume - c.volume) / (r - 1);
  if (!(ve > 0) || ve > b.volume) {
    fail(
      'two-endpoint-inconsistent',
      'The two endpoints do not fit a titration past its equivalence point; check the readings near the endpoint.',
      'points',
    );
  }
  if (c.i === b.i) {
    warnings.push(
      warning(
        'two-endpoint-one-step',
        `Both endpoints fall between the same two readings: add acid in smaller steps below pH ${endpointPh}.`,
        'points',
      ),
    );
  }
  return {
    equivalenceVolumeMl: ve,
    fit: {
      r2: null,
      residuals: [],
      rms: 0,
      points_used: [b.i - 1, b.i, c.i - 1, c.i].filter((v, k, all) => all.indexOf(v) === k),
      details: { first_endpoint_ph: endpointPh, second_endpoint_ph: second, b_ml: b.volume, c_ml: c.volume },
    },
    warnings,
  };
}
