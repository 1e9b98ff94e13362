/**
 * Computes and writes an import plan: all rows or none. A plan with any error writes nothing and
 * returns the full error list; readings already in the database (same content id) are counted,
 * not written again, which is what makes re-importing a file harmless.
 */

import { isSolveError, type SolveResult } from '../chem/api';
import { type RequestSettings, readingRequest } from '../reading/request';
import { isQuotaError } from '../store/errors';
import type { ReadingDoc, SiteDoc, TufaDoc } from './docs';
import type { ImportPlan } from './import-plan';
import { type RowIssue, rowIssue } from './io-issues';
import type { Solver } from './solve-input';

export interface ImportTarget {
  /** Which of these ids already exist (tombstones count: a deleted reading is not revived). */
  existingIds(ids: readonly string[]): Promise<Set<string>>;
  /** Writes every doc in one transaction and queues each for sync; all or nothing. */
  bulkPut(docs: TufaDoc[]): Promise<void>;
  /**
   * The stored copies of these ids (tombstones included), so an imported reading that carries its
   * id replaces only an older copy. Without it, a reading already present is never replaced.
   */
  getDocs?(ids: readonly string[]): Promise<Map<string, TufaDoc>>;
}

export interface ImportReport {
  ok: boolean;
  rows: number;
  written: number;
  alreadyPresent: number;
  /** Readings already present that the file holds in a newer version (same id): replaced. */
  replaced: number;
  sitesCreated: number;
  duplicateRows: RowIssue[];
  errors: RowIssue[];
  /** Rows that were stored but that the engine could not solve (e.g. too few parameters). */
  warnings: RowIssue[];
}

export interface PreviewRow {
  line: number;
  reading: ReadingDoc;
  result: ReturnType<Solver>;
}

function siteMap(plan: ImportPlan, sites: readonly SiteDoc[]): Map<string, SiteDoc> {
  return new Map([...sites, ...plan.newSites].map((s) => [s.id, s]));
}

/** The first `n` planned rows with what the engine computes from them. */
export function previewImport(
  plan: ImportPlan,
  sites: readonly SiteDoc[],
  solve: Solver,
  n = 10,
  settings?: RequestSettings,
): PreviewRow[] {
  const byId = siteMap(plan, sites);
  return plan.readings.slice(0, n).map((reading, i) => ({
    line: plan.readingLines[i]!,
    reading,
    result: solve(readingRequest(reading, byId.get(reading.siteId), settings).input),
  }));
}

/** Runs the engine over every planned row; failures become row warnings (the data is still kept). */
export function computeWarnings(
  plan: ImportPlan,
  sites: readonly SiteDoc[],
  solve: Solver,
  settings?: RequestSettings,
): RowIssue[] {
  const byId = siteMap(plan, sites);
  return warningsFromResults(
    plan,
    plan.readings.map((reading) => solve(readingRequest(reading, byId.get(reading.siteId), settings).input)),
  );
}

/**
 * Row warnings from results computed elsewhere (the app's engine worker): `results[i]` is the
 * result for `plan.readings[i]`. A missing result is a warning too, never a silent pass.
 */
export function warningsFromResults(plan: ImportPlan, results: readonly SolveResult[]): RowIssue[] {
  const out: RowIssue[] = [];
  plan.readings.forEach((_, i) => {
    const r = results[i];
    if (r === undefined) {
      out.push(rowIssue(plan.readingLines[i]!, 'row-solve-failed', 'This row was not computed.'));
    } else if (isSolveError(r)) {
      out.push(
        rowIssue(
          plan.readingLines[i]!,
          'row-solve-failed',
          `${r.error.message} (${r.error.code})`,
          r.error.field,
        ),
      );
    }
  });
  return out;
}

export async function commitImport(
  plan: ImportPlan,
  target: ImportTarget,
  options: {
    solve?: Solver;
    sites?: readonly SiteDoc[];
    /** Results already computed for `plan.readings` (same order), used instead of `solve`. */
    results?: readonly SolveResult[];
    /** Row warnings already computed (e.g. by the app's import worker), used as they are. */
    warnings?: RowIssue[];
  } = {},
): Promise<ImportReport> {
  const report: ImportReport = {
    ok: false,
    rows: plan.rowCount,
    written: 0,
    alreadyPresent: 0,
    replaced: 0,
    sitesCreated: 0,
    duplicateRows: plan.duplicateRows,
    errors: [...plan.errors].sort((a, b) => a.row - b.row),
    warnings: [],
  };
  if (report.errors.length > 0) return report;
  if (options.warnings) report.warnings = options.warnings;
  else if (options.results) report.warnings = warningsFromResults(plan, options.results);
  else if (options.solve) report.warnings = computeWarnings(plan, options.sites ?? [], options.solve);
  const existing = await target.existingIds([
    ...plan.readings.map((r) => r.id),
    ...plan.newSites.map((s) => s.id),
  ]);
  const sites = plan.newSites.filter((s) => !existing.has(s.id));
  // Same id, same reading: replaced only by a newer copy, never revived from a tombstone.
  const present = plan.readings.filter((r) => existing.has(r.id)).map((r) => r.id);
  const stored =
    present.length && target.getDocs ? await target.getDocs(present) : new Map<string, TufaDoc>();
  const newer = plan.readings.filter((r, i) => {
    if (!plan.updatedAtGiven[i]) return false;
    const old = stored.get(r.id);
    return old !== undefined && !old.deleted && old.type === 'reading' && r.updatedAt > old.updatedAt;
  });
  // A replaced reading keeps this device's server revision, so its next push updates, not conflicts.
  const replacing = newer.map((r) => {
    const rev = stored.get(r.id)?.rev;
    return rev === undefined ? r : { ...r, rev };
  });
  const readings = [...plan.readings.filter((r) => !existing.has(r.id)), ...replacing];
  try {
    if (sites.length + readings.length > 0) await target.bulkPut([...sites, ...readings]);
  } catch (e) {
    const reason = e instanceof Error ? e.message : String(e);
    report.errors.push(
      rowIssue(
        0,
        isQuotaError(e) ? 'store-quota-exceeded' : 'store-write-failed',
        `Nothing was imported: the database refused the write (${reason}).`,
      ),
    );
    return report;
  }
  report.ok = true;
  report.written = readings.length - newer.length;
  report.replaced = newer.length;
  report.alreadyPresent = plan.readings.length - readings.length;
  report.sitesCreated = sites.length;
  return report;
}
