/**
 * pH meter calibration records: buffers and the electrode's readings in mV at one temperature →
 * slope (as % of the Nernst slope), offset at pH 7, accepted or not, and the standard uncertainty
 * the calibration leaves in a pH reading.
 *
 * The Nernst slope is (R T ln 10)/F = 0.198416 · T mV per pH unit (T in K; R and F from CODATA
 * 2018: 8.314462618 J/(mol K), 96485.33212 C/mol), 59.16 mV at 25 °C. The electrode line
 * E = E(7) + s·(pH − 7) is fitted by least squares through the buffers. Acceptance limits are
 * common practice (no single source): slope 95–102 % of Nernst and |E(7)| ≤ 30 mV.
 */

import { fail } from '../errors';

export const NERNST_MV_PER_K = (8.314462618 * Math.LN10 * 1000) / 96485.33212;
export const SLOPE_PERCENT_LIMITS: readonly [number, number] = [95, 102];
export const OFFSET_LIMIT_MV = 30;
/** Standard uncertainty of a technical buffer's pH (±0.02 at k = 2; common practice). */
export const BUFFER_STANDARD_UNCERTAINTY = 0.01;

export interface CalibrationBuffer {
  /** The buffer's pH at the calibration temperature (from its label's table). */
  ph: number;
  /** The electrode's reading in that buffer, mV. */
  mv: number;
}

export interface CalibrationRecord {
  temperature_c: number;
  buffers: CalibrationBuffer[];
  /** ISO 8601 time of the calibration, carried through unchanged. */
  time?: string;
}

export interface CalibrationResult {
  nernst_mv_per_ph: number;
  /** Fitted slope, mV per pH (negative for a glass electrode). */
  slope_mv_per_ph: number;
  slope_percent: number;
  /** Reading at pH 7, mV (the zero-point offset). */
  offset_mv: number;
  accepted: boolean;
  /** Why it was refused (empty when accepted). */
  reasons: string[];
  /** Scatter of the buffers about the line, in pH (0 with two buffers: a line through two points). */
  residual_ph: number;
  buffer_range: [number, number];
  time?: string;
}

/** Nernst slope at a temperature, mV per pH unit. Check: 59.16 mV at 25 °C. */
export function nernstSlopeMv(temperatureC: number): number {
  return NERNST_MV_PER_K * (temperatureC + 273.15);
}

export function phCalibration(record: CalibrationRecord): CalibrationResult {
  const t = record?.temperature_c;
  if (typeof t !== 'number' || !Number.isFinite(t) || t < -2 || t > 100) {
    fail(
      'ph-calibration-invalid',
      'The calibration needs temperature_c between −2 and 100 °C.',
      'temperature_c',
    );
  }
  const buffers = record.buffers;
  if (!Array.isArray(buffers) || buffers.length < 2) {
    fail('ph-calibration-too-few-buffers', 'A calibration needs at least two buffers.', 'buffers');
  }
  for (const [i, b] of buffers.entries()) {
    if (typeof b?.ph !== 'number' || !Number.isFinite(b.ph) || b.ph < 0 || b.ph > 14) {
      fail('ph-calibration-invalid', `buffers[${i}].ph must be a pH from 0 to 14.`, 'buffers');
    }
    if (typeof b.mv !== 'number' || !Number.isFinite(b.mv) || Math.abs(b.mv) > 2000) {
      fail('ph-calibration-invalid', `buffers[${i}].mv must be a reading in mV (|mV| ≤ 2000).`, 'buffers');
    }
  }
  const n = buffers.length;
  const mx = buffers.reduce((s, b) => s + b.ph, 0) / n;
  const my = buffers.reduce((s, b) => s + b.mv, 0) / n;
  let sxx = 0;
  let sxy = 0;
  for (const b of buffers) {
    sxx += (b.ph - mx) ** 2;
    sxy += (b.ph - mx) * (b.mv - my);
  }
  if (!(sxx > 1e-6)) {
    fail(
      'ph-calibration-same-buffer',
      'The buffers must differ in pH (at least two distinct buffers).',
      'buffers',
    );
  }
  const slope = sxy / sxx;
  const offset = my + slope * (7 - mx);
  let sse = 0;
  for (const b of buffers) sse += (b.mv - (my + slope * (b.ph - mx))) ** 2;
  const residualPh = n > 2 ? Math.sqrt(sse / (n - 2)) / Math.abs(slope) : 0;
  const nernst = nernstSlopeMv(t);
  const slopePercent = (-slope / nernst) * 100;
  const reasons: string[] = [];
  if (slopePercent < SLOPE_PERCENT_LIMITS[0] || slopePercent > SLOPE_PERCENT_LIMITS[1]) {
    reasons.push(
      `slope ${slopePercent.toFixed(1)} % of Nernst is outside ${SLOPE_PERCENT_LIMITS[0]}–${SLOPE_PERCENT_LIMITS[1]} %: clean or replace the electrode, use fresh buffers`,
    );
  }
  if (Math.abs(offset) > OFFSET_LIMIT_MV) {
    reasons.push(
      `offset ${offset.toFixed(1)} mV at pH 7 exceeds ±${OFFSET_LIMIT_MV} mV: check the reference junction`,
    );
  }
  const phs = buffers.map((b) => b.ph);
  return {
    nernst_mv_per_ph: nernst,
    slope_mv_per_ph: slope,
    slope_percent: slopePercent,
    offset_mv: offset,
    accepted: reasons.length === 0,
    reasons,
    residual_ph: residualPh,
    buffer_range: [Math.min(...phs), Math.max(...phs)],
    ...(record.time === undefined ? {} : { time: record.time }),
  };
}

/**
 * Standard uncertainty of a pH read with this calibration (GUM quadrature of): the buffers'
 * own uncertainty; the scatter of the buffers about the line; and, outside the bracketed range,
 * the distance beyond it times the slope's relative departure from Nernst (at least 1 %, common
 * practice), since an error of slope grows with distance from the buffers. A refused calibration
 * is still quantified: its larger slope error shows here.
 */
export function phUncertaintyFromCalibration(cal: CalibrationResult, ph: number): number {
  const [lo, hi] = cal.buffer_range;
  const beyond = ph < lo ? lo - ph : ph > hi ? ph - hi : 0;
  const slopeError = Math.max(Math.abs(cal.slope_percent - 100) / 100, 0.01);
  return Math.sqrt(BUFFER_STANDARD_UNCERTAINTY ** 2 + cal.residual_ph ** 2 + (beyond * slopeError) ** 2);
}
