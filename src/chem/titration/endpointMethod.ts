/**
 * Fixed-endpoint titration: the equivalence volume is where the curve first crosses a chosen pH
 * (4.5 by default, common practice for total alkalinity of natural waters), by linear
 * interpolation in pH between the two readings that bracket it.
 */

import { fail, type Issue, warning } from '../errors';
import type { MethodResult } from './methodResult';
import type { TitrationCurve } from './types';

export const ENDPOINT_PH_DEFAULT = 4.5;
/** A pH step bigger than this across the endpoint makes the interpolation coarse (common practice). */
const COARSE_STEP_PH = 0.3;

export function reduceEndpoint(curve: TitrationCurve, endpointPh: number): MethodResult {
  const warnings: Issue[] = [];
  const { volumeMl, ph } = curve;
  if (ph[0]! <= endpointPh) {
    fail(
      'titration-starts-below-endpoint',
      `The first reading (pH ${ph[0]}) is already at or below the endpoint pH ${endpointPh}.`,
      'points',
    );
  }
  for (let i = 1; i < ph.length; i++) {
    if (ph[i]! <= endpointPh) {
      const p0 = ph[i - 1]!;
      const p1 = ph[i]!;
      const v0 = volumeMl[i - 1]!;
      const v1 = volumeMl[i]!;
      const ve = v0 + ((p0 - endpointPh) / (p0 - p1)) * (v1 - v0);
      if (p0 - p1 > COARSE_STEP_PH) {
        warnings.push(
          warning(
            'endpoint-coarse-steps',
            `pH jumps ${(p0 - p1).toFixed(2)} units across the endpoint: add acid in smaller steps near pH ${endpointPh}.`,
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
          points_used: [i - 1, i],
          details: { endpoint_ph: endpointPh },
        },
        warnings,
      };
    }
  }
  fail(
    'titration-endpoint-not-crossed',
    `The curve never reaches the endpoint pH ${endpointPh} (last reading pH ${ph[ph.length - 1]}). Keep adding acid.`,
    'points',
  );
}
