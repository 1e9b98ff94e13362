/**
 * A field titration in the reading form: the raw record kept with the reading (re-reducible
 * later), how typed points are read, and how a reduction feeds the solve.
 */

import type { SolveInput } from '../chem/api';
import type { Issue } from '../chem/errors';
import type { TitrationInput, TitrationMethod, TitrationResult } from '../chem/titration/types';
import type { MeasuredValue, TitrationRecord } from '../store/schema';
import { parseDecimal } from './numbers';

/** Published method names; labels are ours. */
export const METHOD_LABELS: Record<TitrationMethod, string> = {
  modified_gran: 'Corrected Gran (default, gives DIC too)',
  gran: 'Gran function (points past the endpoint)',
  inflection: 'Inflection point (steepest pH drop)',
  endpoint: 'Fixed endpoint pH',
  two_endpoint: 'Two endpoints (soft water)',
  curve_fit: 'Fit of the whole curve (gives DIC too)',
};

/**
 * Reads "volume pH" lines as typed or pasted from a spreadsheet: separated by tab, semicolon or
 * spaces (a comma only separates when neither is present and the line has exactly one comma and
 * no decimal commas make sense, e.g. "0.5,6.2"). Decimal commas are accepted.
 */
export function parsePoints(
  text: string,
  locale?: string,
): { points: { volumeMl: number; ph: number }[]; issues: Issue[] } {
  const points: { volumeMl: number; ph: number }[] = [];
  const issues: Issue[] = [];
  text.split(/\r?\n/).forEach((raw, i) => {
    const line = raw.trim();
    if (line === '' || /^[a-z#]/i.test(line)) return; // blank, header or comment
    let cells = line.split(/[\t;]+|\s+/).filter(Boolean);
    if (cells.length === 1 && (line.match(/,/g) ?? []).length === 1 && line.includes('.'))
      cells = line.split(',');
    if (cells.length !== 2) {
      issues.push({
        code: 'titration-point-format',
        message: `Line ${i + 1}: give the acid volume (mL) and the pH.`,
      });
      return;
    }
    const v = parseDecimal(cells[0]!, locale);
    const p = parseDecimal(cells[1]!, locale);
    if (!v.ok || !p.ok) {
      issues.push({
        code: 'titration-point-not-a-number',
        message: `Line ${i + 1}: “${line}” is not two numbers.`,
      });
      return;
    }
    points.push({ volumeMl: v.value, ph: p.value });
  });
  return { points, issues };
}

/** The engine's titration input from the stored record and the reading's measured temperature/conductance. */
export function titrationInput(record: TitrationRecord, values: MeasuredValue[]): TitrationInput | Issue {
  const t = values.find((v) => v.quantity === 'temperature');
  if (!t)
    return {
      code: 'titration-needs-temperature',
      message: 'Enter the sample temperature to reduce the titration.',
    };
  const temperature_c = t.unit === 'f' ? ((t.value - 32) * 5) / 9 : t.value;
  const input: TitrationInput = {
    sample_volume_ml: record.sampleVolumeMl,
    titrant_normality: record.titrantNormality,
    temperature_c,
    method: (record.method as TitrationMethod | undefined) ?? 'gran',
    points: record.points.map((p) => ({ volume_ml: p.volumeMl, ph: p.ph })),
  };
  if (record.correctionFactor !== undefined) input.titrant_correction_factor = record.correctionFactor;
  if (record.endpointPh !== undefined) input.endpoint_ph = record.endpointPh;
  const k = values.find((v) => v.quantity === 'conductance');
  if (k) input.specific_conductance_us_cm = k.value;
  return input;
}

/** A measured alkalinity row wins; otherwise the titration's alkalinity (and DIC of a curve fit) feeds the solve. */
export function withTitration(input: SolveInput, result: TitrationResult | undefined): SolveInput {
  if (!result) return input;
  const hasAlk = Object.keys(input).some((k) => k.startsWith('alkalinity_'));
  if (hasAlk) return input;
  return { ...input, alkalinity_meq_l: result.alkalinity_meq_l };
}
