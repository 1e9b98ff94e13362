/**
 * CSV export as the app offers it (data panel: one site or all; site screen: this site), with the
 * computed columns solved in the engine worker, and the browser download of a text file.
 */

import { COMPUTED_COLUMNS, exportReadingsCsv } from '../../io/export-csv';
import type { RequestSettings } from '../../reading/request';
import type { Repository } from '../../store/repository';
import type { ReadingDoc, SiteDoc } from '../../store/schema';
import { solveReadingsInWorker } from '../engine-client';

export function downloadText(name: string, text: string, type: string): void {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  a.click();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/** A file name safe on every system, from a site's name. */
export function fileStem(name: string): string {
  const s = name
    .normalize('NFKD')
    .replace(/[^\w\s-]/g, '')
    .trim()
    .replace(/\s+/g, '-')
    .toLowerCase();
  return s || 'site';
}

/** Readings of one site (or all) as CSV text, with what the engine computes from each row. */
export async function readingsCsv(
  repo: Repository,
  settings: RequestSettings,
  siteId?: string,
): Promise<string> {
  const sites = await repo.listSites({ includeDeleted: true });
  const readings: ReadingDoc[] = siteId ? await repo.listReadings(siteId) : await repo.listAllReadings();
  const byId = new Map<string, SiteDoc>(sites.map((s) => [s.id, s]));
  const live = readings.filter((r) => !r.deleted);
  // Each reading's request is made in the worker by the one request function, as on its page.
  const solved = await solveReadingsInWorker(live, byId, settings, COMPUTED_COLUMNS);
  const results = new Map(live.map((r, i) => [r.id, solved.results[i]!]));
  const requests = new Map(live.map((r, i) => [r.id, solved.requests[i]!]));
  return exportReadingsCsv(live, sites, siteId ? { siteId, results, requests } : { results, requests });
}
