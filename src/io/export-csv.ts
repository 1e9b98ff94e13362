/**
 * CSV export of readings: RFC 4180, UTF-8, one header row, one column per measured quantity named
 * by its engine key (the unit is part of the name, e.g. `alkalinity_umol_kg`), local sampling time
 * in ISO 8601 with its UTC offset, and optionally what the engine computes from each row.
 * The file re-imports without any mapping work (see `guessRoles`).
 */

import { isSolveError, type SolveResult } from '../chem/api';
import { safeTextCell, writeCsv } from './csv-write';
import type { ReadingDoc, SiteDoc } from './docs';
import { formatNumber } from './numbers';
import { KEY_ORDER } from './quantities';
import { engineValues, type Solver, solveInputOf } from './solve-input';
import { formatWithOffset } from './timestamps';

/** Outputs written when a solver is given, with our column names. */
export const COMPUTED_COLUMNS = [
  'alkalinity_umol_kg',
  'dic_umol_kg',
  'ph_total',
  'ph_free',
  'ph_nbs',
  'pco2_uatm',
  'co2_umol_kg',
  'hco3_umol_kg',
  'co3_umol_kg',
  'omega_calcite',
  'omega_aragonite',
  'revelle_factor',
] as const;

export interface ExportOptions {
  /** Only this site's readings; all when absent. */
  siteId?: string;
  solve?: Solver;
  /** Results already computed (e.g. in the app's engine worker), by reading id; used instead of `solve`. */
  results?: ReadonlyMap<string, SolveResult>;
  withBom?: boolean;
}

export function exportReadingsCsv(
  readings: readonly ReadingDoc[],
  sites: readonly SiteDoc[],
  options: ExportOptions = {},
): string {
  const byId = new Map(sites.map((s) => [s.id, s]));
  const rows = readings
    .filter((r) => !r.deleted && (options.siteId === undefined || r.siteId === options.siteId))
    .sort((a, b) =>
      a.siteId === b.siteId ? a.takenAt.localeCompare(b.takenAt) : a.siteId.localeCompare(b.siteId),
    );
  const converted = rows.map((r) => engineValues(r));
  const present = new Set(converted.flatMap((c) => Object.keys(c.values)));
  const valueKeys = KEY_ORDER.filter((k) => present.has(k));
  const hasScale = present.has('ph');
  const computing = options.results !== undefined || options.solve !== undefined;
  const resultOf = (r: ReadingDoc, site: SiteDoc | undefined): SolveResult =>
    options.results
      ? (options.results.get(r.id) ?? {
          error: { code: 'internal-error', message: 'This reading was not computed.' },
        })
      : options.solve!(solveInputOf(r, site));
  const header = [
    'reading_id',
    'site',
    'site_id',
    'taken_at',
    'time_zone',
    ...(hasScale ? ['ph_scale'] : []),
    ...valueKeys,
    'notes',
    ...(computing
      ? [...COMPUTED_COLUMNS.map((c) => `computed_${c}`), 'computed_model', 'computed_issues']
      : []),
  ];
  const body = rows.map((r, i) => {
    const site = byId.get(r.siteId);
    const { values, options: opts } = converted[i]!;
    const out = [
      safeTextCell(r.id),
      safeTextCell(site?.name ?? ''),
      safeTextCell(r.siteId),
      formatWithOffset(Date.parse(r.takenAt), r.timeZone),
      safeTextCell(r.timeZone),
      ...(hasScale ? [opts.ph_scale ?? site?.defaults.ph_scale ?? ''] : []),
      ...valueKeys.map((k) => formatNumber(values[k])),
      safeTextCell(r.notes),
    ];
    if (computing) {
      const res = resultOf(r, site);
      if (isSolveError(res)) {
        out.push(
          ...COMPUTED_COLUMNS.map(() => ''),
          '',
          safeTextCell(`${res.error.code}: ${res.error.message}`),
        );
      } else {
        out.push(
          ...COMPUTED_COLUMNS.map((c) =>
            formatNumber(typeof res[c] === 'number' ? (res[c] as number) : undefined),
          ),
          res.model,
          safeTextCell(res.warnings.map((w) => `${w.code}: ${w.message}`).join(' | ')),
        );
      }
    }
    return out;
  });
  return writeCsv(header, body, { withBom: options.withBom ?? false });
}
