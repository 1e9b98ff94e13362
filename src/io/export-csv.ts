/**
 * CSV export of readings: RFC 4180, UTF-8, one header row, one column per measured quantity named
 * by its engine key (the unit is part of the name, e.g. `alkalinity_umol_kg`), local sampling time
 * in ISO 8601 with its UTC offset, and optionally what the engine computes from each row.
 * The file re-imports without any mapping work (see `guessRoles`).
 */

import { isSolveError, type SolveResult } from '../chem/api';
import { KEY_ORDER } from '../quantities';
import {
  type ReadingRequest,
  type RequestSettings,
  readingRequest,
  sourcesText,
  typedValues,
} from '../reading/request';
import { safeTextCell, writeCsv } from './csv-write';
import type { ReadingDoc, SiteDoc } from './docs';
import { formatNumber } from './numbers';
import { siteDefaultsText } from './site-defaults-text';
import type { Solver } from './solve-input';
import { formatWithOffset, isKnownTimeZone } from './timestamps';

/**
 * The sampling time as written to the file: local time with offset in the reading's zone, or in
 * UTC (+00:00) when this device does not know that zone (a reading stored by an older Tufa or
 * another tool), so one odd reading never stops the export of all (issue 15 §4).
 */
export function takenAtCell(r: Pick<ReadingDoc, 'takenAt' | 'timeZone'>): string {
  const ms = Date.parse(r.takenAt);
  if (Number.isNaN(ms)) return r.takenAt;
  return formatWithOffset(
    ms,
    typeof r.timeZone === 'string' && isKnownTimeZone(r.timeZone) ? r.timeZone : 'UTC',
  );
}

/** Readings whose time zone this device does not know: their times are exported in UTC. */
export function unknownZoneReadings(readings: readonly ReadingDoc[]): ReadingDoc[] {
  return readings.filter((r) => typeof r.timeZone !== 'string' || !isKnownTimeZone(r.timeZone));
}

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

/** What a titration gave the request, written so a re-import computes the same (see `import-plan.ts`). */
export const TITRATION_COLUMNS = ['titration_alkalinity_meq_l', 'titration_dic_umol_kg'] as const;

export interface ExportOptions {
  /** Only this site's readings; all when absent. */
  siteId?: string;
  solve?: Solver;
  /** Settings the requests are made with (defaults when absent), as on the reading page. */
  settings?: RequestSettings;
  /** Results already computed (e.g. in the app's engine worker), by reading id; used instead of `solve`. */
  results?: ReadonlyMap<string, SolveResult>;
  /** The requests those results were computed from, by reading id (made here when absent). */
  requests?: ReadonlyMap<string, Pick<ReadingRequest, 'input' | 'sources'>>;
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
  // Every reading's request comes from the one request function (src/reading/request.ts).
  const requests = rows.map(
    (r) => options.requests?.get(r.id) ?? readingRequest(r, byId.get(r.siteId), options.settings),
  );
  const converted = requests.map(typedValues);
  const present = new Set(converted.flatMap((c) => Object.keys(c.values)));
  const valueKeys = KEY_ORDER.filter((k) => present.has(k));
  const hasScale = present.has('ph');
  const computing = options.results !== undefined || options.solve !== undefined;
  const resultOf = (r: ReadingDoc, i: number): SolveResult =>
    options.results
      ? (options.results.get(r.id) ?? {
          error: { code: 'internal-error', message: 'This reading was not computed.' },
        })
      : options.solve!(requests[i]!.input);
  const fromTitration = (i: number, key: string): number | undefined => {
    const q = requests[i]!;
    const v = q.input[key];
    return q.sources[key] === 'titration' && typeof v === 'number' ? v : undefined;
  };
  const header = [
    'reading_id',
    'site',
    'site_id',
    'site_kind',
    'site_defaults',
    'taken_at',
    'time_zone',
    'updated_at',
    ...(hasScale ? ['ph_scale'] : []),
    ...valueKeys,
    ...TITRATION_COLUMNS,
    'input_sources',
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
      site?.kind ?? '',
      site ? safeTextCell(siteDefaultsText(site.defaults)) : '',
      takenAtCell(r),
      safeTextCell(r.timeZone),
      r.updatedAt,
      // Only a scale the reading names: a re-import must store the very same values (same reading).
      ...(hasScale ? [opts.ph_scale ?? ''] : []),
      ...valueKeys.map((k) => formatNumber(values[k])),
      formatNumber(fromTitration(i, 'alkalinity_meq_l')),
      formatNumber(fromTitration(i, 'dic_umol_kg')),
      sourcesText(requests[i]!),
      safeTextCell(r.notes),
    ];
    if (computing) {
      const res = resultOf(r, i);
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
