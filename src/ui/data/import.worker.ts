/// <reference lib="webworker" />
/**
 * The heavy part of a CSV import, off the main thread: parse the file, plan it for a column
 * mapping (content ids, unit conversion, row errors), solve the preview rows and, on import,
 * every row. The worker keeps the parsed file and the last plan, so a mapping change or the
 * import sends only a mapping or a request, and only the import ships the documents back (the
 * page's repository writes them; IndexedDB stays in one place).
 */

import { toIssue } from '../../chem/errors';
import type { ColumnMapping } from '../../io/column-mapping';
import { type CsvSniff, type ParsedCsv, parseCsv } from '../../io/csv-parse';
import type { SiteDoc } from '../../io/docs';
import { computeWarnings, type PreviewRow, previewImport } from '../../io/import-commit';
import { type ImportPlan, planImport } from '../../io/import-plan';
import type { RowIssue } from '../../io/io-issues';
import type { Solver } from '../../io/solve-input';
import type { RequestSettings } from '../../reading/request';
import { solve } from '../engine-source';

export interface FileSummary {
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
  | { id: number; kind: 'open'; text: string }
  | {
      id: number;
      kind: 'plan';
      mapping: ColumnMapping;
      sites: SiteDoc[];
      previewRows: number;
      /** Settings the rows are computed with, as on their reading pages. */
      settings?: RequestSettings;
    }
  | { id: number; kind: 'take' };

export type ImportResponse =
  | { id: number; kind: 'open'; file: FileSummary }
  | { id: number; kind: 'plan'; plan: PlanSummary }
  | { id: number; kind: 'take'; plan: ImportPlan; warnings: RowIssue[] }
  | { id: number; kind: 'failed'; message: string };

let csv: ParsedCsv | undefined;
let last: { plan: ImportPlan; sites: SiteDoc[]; settings?: RequestSettings } | undefined;

const safeSolve: Solver = (input) => {
  try {
    return solve(input);
  } catch (e) {
    return { error: toIssue(e) };
  }
};

async function answer(req: ImportRequest): Promise<ImportResponse> {
  switch (req.kind) {
    case 'open': {
      csv = parseCsv(req.text);
      last = undefined;
      return {
        id: req.id,
        kind: 'open',
        file: { header: csv.table.header, sniff: csv.sniff, rowCount: csv.table.rows.length },
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
    case 'take': {
      if (!last) throw new Error('nothing is planned');
      // Rows the engine cannot compute are kept (they are data) and reported as warnings.
      const warnings = last.plan.errors.length
        ? []
        : computeWarnings(last.plan, last.sites, safeSolve, last.settings);
      return { id: req.id, kind: 'take', plan: last.plan, warnings };
    }
  }
}

const scope = self as unknown as DedicatedWorkerGlobalScope;
scope.onmessage = (ev: MessageEvent<ImportRequest>) => {
  answer(ev.data).then(
    (r) => scope.postMessage(r),
    (e: unknown) =>
      scope.postMessage({
        id: ev.data.id,
        kind: 'failed',
        message: e instanceof Error ? e.message : String(e),
      } satisfies ImportResponse),
  );
};
