/** Measured rows (quantity, value, unit) as engine input keys, through the quantities table. */

import type { SolveInput } from '../chem/api';
import type { MeasuredValue } from '../store/schema';
import { quantityById, unitOf } from './table';

/** Engine settings that travel with every solve (from the site's defaults over the user's settings). */
export interface SolveContext {
  model?: string;
  ph_scale?: string;
  carbonic_constants?: string;
  boron_total?: string;
  salinity?: number;
  specific_conductance_us_cm?: number;
}

/** The solve input for measured rows; unknown quantities or units are reported, not dropped silently. */
export function toSolveInput(
  values: MeasuredValue[],
  ctx: SolveContext,
): { input: SolveInput; unknown: string[] } {
  const input: SolveInput = {};
  for (const [k, v] of Object.entries(ctx)) if (v !== undefined && v !== '') input[k] = v;
  const unknown: string[] = [];
  for (const row of values) {
    const q = quantityById(row.quantity);
    const unit = q && unitOf(q, row.unit);
    if (!unit) {
      unknown.push(`${row.quantity} (${row.unit})`);
      continue;
    }
    input[unit.key] = unit.toKey(row.value);
    if (unit.options) Object.assign(input, unit.options);
  }
  return { input, unknown };
}
