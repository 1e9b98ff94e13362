/// <reference lib="webworker" />
/**
 * A CSV import, all of it off the main thread: parse the file, plan it for a column mapping
 * (content ids, unit conversion, row errors), solve the preview rows and, on import, solve every
 * row and store the documents. The worker keeps the parsed file and the last plan, so a mapping
 * change or the import sends only a mapping or a request. On import it opens its own connection
 * to the database through the same repository (`src/store`: one schema, one all-or-nothing
 * `bulkPut` transaction) and writes there itself; the page receives only progress and the report.
 */

import { toIssue } from '../../chem/errors';
import type { ColumnMapping } from '../../io/column-mapping';
import { type CsvSniff, type ParsedCsv, parseCsv } from '../../io/csv-parse';
import type { SiteDoc } from '../../io/docs';
import {
  commitImport,
  type ImportReport,
  type PreviewRow,
  previewImport,
  warningsFromResults,
} from '../../io/import-commit';
import { type ImportPlan, planImport } from '../../io/import-plan';
import type { RowIssue } from '../../io/io-issues';
import type { Solver } from '../../io/solve-input';
import { type RequestSettings, readingRequest } from '../../reading/request';
import { asStoreError } from '../../store/errors';
import { openRepository } from '../../store/repository';
import { RepositoryStore } from '../../sync/repository-store';
import { solve } from '../engine-source';

export interface FileSummary {
  /** How the bytes were read: UTF-8, or the Windows-1252 fallback for older spreadsheets. */
  encoding: 'UTF-8' | 'Windows-1252';
  header: string[];
  sniff: CsvSniff;
  rowCount: number;
}

/** What the panel shows of a plan; the documents stay in the worker until the import. */
export interface PlanSummary {
  readingCount: number;
  newSites: SiteDoc[];
  errors: RowIssue[];
  duplicateRows: RowIssue[];
  preview: PreviewRow[];
}

export type ImportRequest =
  /** The file's bytes (transferred, not copied); decoding happens here too. */
  | { id: number; kind: 'open'; bytes: ArrayBuffer }
  | {
      id: number;
      kind: 'plan';
      mapping: ColumnMapping;
      sites: SiteDoc[];
      previewRows: number;
      /** Settings the rows are computed with, as on their reading pages. */
      settings?: RequestSettings;
    }
  /** Solve every row (warnings), then store the plan in one transaction: all or nothing. */
  | { id: number; kind: 'commit' };

/** Sent while a commit runs (same id as the request); the answer follows as usual. */
export interface ImportProgress {
  id: number;
  kind: 'progress';
  phase: 'computing' | 'storing';
  done: number;
  total: number;
}

export type ImportResponse =
  | { id: number; kind: 'open'; file: FileSummary }
  | { id: number; kind: 'plan'; plan: PlanSummary }
  | { id: number; kind: 'commit'; report: ImportReport }
  | { id: number; kind: 'failed'; message: string; code?: string };

let csv: ParsedCsv | undefined;
let last: { plan: ImportPlan; sites: SiteDoc[]; settings?: RequestSettings } | undefined;

const safeSolve: Solver = (input) => {
  try {
    return solve(input);
  } catch (e) {
    return { error: toIssue(e) };
  }
};

const scope = self as unknown as DedicatedWorkerGlobalScope;
const CHUNK = 5000;

/** Every planned row through the engine, in chunks with progress; failures become row warnings. */
function solveAll(
  id: number,
  plan: ImportPlan,
  sites: readonly SiteDoc[],
  settings: RequestSettings | undefined,
): RowIssue[] {
  const byId = new Map([...sites, ...plan.newSites].map((s) => [s.id, s]));
  const out: RowIssue[] = [];
  const total = plan.readings.length;
  for (let i = 0; i < total; i += CHUNK) {
    const readings = plan.readings.slice(i, i + CHUNK);
    // The one request function, as on each reading's page.
    const results = readings.map((r) => safeSolve(readingRequest(r, byId.get(r.siteId), settings).input));
    out.push(
      ...warningsFromResults(
        { ...plan, readings, readingLines: plan.readingLines.slice(i, i + CHUNK) },
        results,
      ),
    );
    scope.postMessage({
      id,
      kind: 'progress',
      phase: 'computing',
      done: Math.min(total, i + CHUNK),
      total,
    } satisfies ImportProgress);
  }
  return out;
}

async function commit(
  id: number,
  plan: ImportPlan,
  sites: readonly SiteDoc[],
  settings: RequestSettings | undefined,
): Promise<ImportReport> {
  // Rows the engine cannot compute are kept (they are data) and reported as warnings.
  const warnings = plan.errors.length ? [] : solveAll(id, plan, sites, settings);
  const total = plan.readings.length;
  scope.postMessage({ id, kind: 'progress', phase: 'storing', done: 0, total } satisfies ImportProgress);
  // Our own connection, closed after the write and whenever a newer page wants to upgrade.
  const repo = await openRepository({ onVersionChange: () => undefined });
  try {
    return await commitImport(plan, new RepositoryStore(repo), { warnings, sites });
  } catch (e) {
    throw asStoreError(e);
  } finally {
    repo.close();
  }
}

async function answer(req: ImportRequest): Promise<ImportResponse> {
  switch (req.kind) {
    case 'open': {
      // Keep the BOM for parseCsv to see; files that are not UTF-8 come from older spreadsheets in
      // Windows-1252, which is what the fallback reads.
      let text: string;
      let encoding: FileSummary['encoding'] = 'UTF-8';
      try {
        text = new TextDecoder('utf-8', { fatal: true, ignoreBOM: true }).decode(req.bytes);
      } catch {
        text = new TextDecoder('windows-1252').decode(req.bytes);
        encoding = 'Windows-1252';
      }
      csv = parseCsv(text);
      last = undefined;
      return {
        id: req.id,
        kind: 'open',
        file: { encoding, header: csv.table.header, sniff: csv.sniff, rowCount: csv.table.rows.length },
      };
    }
    case 'plan': {
      if (!csv) throw new Error('no file is open');
      const plan = await planImport(csv, req.mapping, req.sites);
      last = req.settings ? { plan, sites: req.sites, settings: req.settings } : { plan, sites: req.sites };
      return {
        id: req.id,
        kind: 'plan',
        plan: {
          readingCount: plan.readings.length,
          newSites: plan.newSites,
          errors: plan.errors,
          duplicateRows: plan.duplicateRows,
          preview: previewImport(plan, req.sites, safeSolve, req.previewRows, req.settings),
        },
      };
    }
    case 'commit': {
      if (!last) throw new Error('nothing is planned');
      const report = await commit(req.id, last.plan, last.sites, last.settings);
      return { id: req.id, kind: 'commit', report };
    }
  }
}

scope.onmessage = (ev: MessageEvent<ImportRequest>) => {
  answer(ev.data).then(
    (r) => scope.postMessage(r),
    (e: unknown) => {
      const issue = toIssue(e);
      scope.postMessage({
        id: ev.data.id,
        kind: 'failed',
        message: e instanceof Error ? e.message : String(e),
        ...(issue.code !== 'internal-error' ? { code: issue.code } : {}),
      } satisfies ImportResponse);
    },
  );
};
