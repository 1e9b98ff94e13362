/**
 * A field titration in the reading form: method labels and how typed points are read. How a
 * stored titration feeds the engine is `src/reading/request.ts`'s job.
 */

import type { Issue } from '../chem/errors';
import type { TitrationMethod } from '../chem/titration/types';
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
