/**
 * CSV export as the app offers it (data panel: one site or all; site screen: this site), with the
 * computed columns solved in the engine worker, and the browser download of a text file.
 */

import { COMPUTED_COLUMNS, exportReadingsCsv, unknownZoneReadings } from '../../io/export-csv';
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
  return (await readingsCsvWithNote(repo, settings, siteId)).text;
}

/** The CSV text and, when some readings' time zones are unknown here, a note saying so in words. */
export async function readingsCsvWithNote(
  repo: Repository,
  settings: RequestSettings,
  siteId?: string,
): Promise<{ text: string; note?: string }> {
  const sites = await repo.listSites({ includeDeleted: true });
  const readings: ReadingDoc[] = siteId ? await repo.listReadings(siteId) : await repo.listAllReadings();
  const byId = new Map<string, SiteDoc>(sites.map((s) => [s.id, s]));
  const live = readings.filter((r) => !r.deleted);
  // Each reading's request is made in the worker by the one request function, as on its page.
  const solved = await solveReadingsInWorker(live, byId, settings, COMPUTED_COLUMNS);
  const results = new Map(live.map((r, i) => [r.id, solved.results[i]!]));
  const requests = new Map(live.map((r, i) => [r.id, solved.requests[i]!]));
  const text = exportReadingsCsv(live, sites, siteId ? { siteId, results, requests } : { results, requests });
  const odd = unknownZoneReadings(live);
  if (odd.length === 0) return { text };
  const zones = [...new Set(odd.map((r) => String(r.timeZone).slice(0, 40)))].slice(0, 5).join('", "');
  return {
    text,
    note: `time-zone-unknown: ${odd.length} ${odd.length === 1 ? 'reading has' : 'readings have'} a time zone this device does not know ("${zones}"); their times are written in UTC (+00:00). Everything else is exported as usual.`,
  };
}
