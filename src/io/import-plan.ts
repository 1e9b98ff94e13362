/**
 * Turns a parsed CSV and a column mapping into the documents an import would write, and a report
 * of every problem by row and column. Nothing is written here: `import-commit.ts` writes the plan
 * in one transaction, and only when it has no errors.
 */

import type { ColumnMapping } from './column-mapping';
import { checkMapping } from './column-mapping';
import { contentId, normalizeName, readingCanonical, siteCanonical } from './content-id';
import type { ParsedCsv } from './csv-parse';
import type { MeasuredValue, ReadingDoc, SiteDoc } from './docs';
import { type RowIssue, rowIssue } from './io-issues';
import { parseNumber } from './numbers';
import { quantityById, storedForm } from './quantities';
import { isKnownTimeZone, parseTimestamp } from './timestamps';

export interface ImportPlan {
  readings: ReadingDoc[];
  /** File line of each planned reading (same order as `readings`). */
  readingLines: number[];
  /** Sites named in the file that do not exist yet; created with the readings. */
  newSites: SiteDoc[];
  errors: RowIssue[];
  /** Rows that repeat an earlier row of the same file (skipped, not an error). */
  duplicateRows: RowIssue[];
  rowCount: number;
}

/** Case-insensitive lookup of existing sites by id or name. */
function siteIndex(sites: readonly SiteDoc[]): Map<string, SiteDoc> {
  const m = new Map<string, SiteDoc>();
  for (const s of sites) {
    if (s.deleted) continue;
    m.set(s.id.toLowerCase(), s);
    m.set(normalizeName(s.name), s);
  }
  return m;
}

export async function planImport(
  csv: ParsedCsv,
  mapping: ColumnMapping,
  sites: readonly SiteDoc[],
  now: Date = new Date(),
): Promise<ImportPlan> {
  const { header, rows, lines } = csv.table;
  const errors: RowIssue[] = [...csv.issues, ...checkMapping(header, mapping)];
  const plan: ImportPlan = {
    readings: [],
    readingLines: [],
    newSites: [],
    errors,
    duplicateRows: [],
    rowCount: rows.length + csv.issues.filter((i) => i.code === 'csv-ragged-row').length,
  };
  if (!isKnownTimeZone(mapping.timeZone)) {
    errors.push(
      rowIssue(1, 'time-zone-unknown', `"${mapping.timeZone}" is not a time zone this device knows.`),
    );
  }
  if (errors.some((e) => e.row === 1)) return plan;

  const known = siteIndex(sites);
  const fixedSite = mapping.siteId ? known.get(mapping.siteId.toLowerCase()) : undefined;
  if (mapping.siteId && !fixedSite) {
    errors.push(rowIssue(1, 'site-missing', 'The site chosen for these readings no longer exists.'));
    return plan;
  }
  const created = new Map<string, SiteDoc>();
  const updatedAt = now.toISOString();
  const col = (role: string) => mapping.columns.findIndex((c) => c.role === role);
  const cSite = col('site');
  const readRow = rowReader(header, mapping, csv.sniff.decimalComma);
  const seenIds = new Map<string, number>();

  for (let r = 0; r < rows.length; r++) {
    const row = rows[r]!;
    const line = lines[r]!;
    const rowErrors: RowIssue[] = [];
    const cell = (i: number) => (i >= 0 ? (row[i] ?? '').trim() : '');

    // Site
    let site = fixedSite;
    if (cSite >= 0) {
      const name = cell(cSite);
      if (name === '') {
        rowErrors.push(rowIssue(line, 'site-missing', 'No site is given in this row.', header[cSite]));
      } else {
        site =
          known.get(name.toLowerCase()) ?? known.get(normalizeName(name)) ?? created.get(normalizeName(name));
        if (!site) {
          site = {
            id: contentId(siteCanonical(name)),
            type: 'site',
            name: name.replace(/\s+/g, ' '),
            kind: 'other',
            defaults: {},
            notes: 'Created by CSV import.',
            updatedAt,
            deleted: false,
          };
          created.set(normalizeName(name), site);
        }
      }
    }

    const read = readRow(row, line);
    rowErrors.push(...read.errors);
    const { takenAt, zone, measured, values } = read;

    if (rowErrors.length > 0 || !site || !takenAt) {
      errors.push(...rowErrors);
      continue;
    }
    const id = contentId(readingCanonical(site.id, takenAt, values));
    const earlier = seenIds.get(id);
    if (earlier !== undefined) {
      plan.duplicateRows.push(
        rowIssue(line, 'row-duplicate', `Same site, time and values as line ${earlier}.`),
      );
      continue;
    }
    seenIds.set(id, line);
    const reading: ReadingDoc = {
      id,
      type: 'reading',
      siteId: site.id,
      takenAt,
      timeZone: zone,
      values: measured,
      notes: read.notes,
      updatedAt,
      deleted: false,
    };
    plan.readings.push(reading);
    plan.readingLines.push(line);
  }
  plan.newSites = [...created.values()];
  return plan;
}

/** What one row says apart from its site: time, measured values (as written and in engine keys), notes. */
export interface RowRead {
  /** ISO 8601 instant, when the row has a time. */
  takenAt?: string;
  zone: string;
  measured: MeasuredValue[];
  /** Engine keys and values (plus `ph_scale_code`), as the content id sees them. */
  values: Record<string, number>;
  notes: string;
  errors: RowIssue[];
}

export interface RowReaderOptions {
  /** A row without a time is an error (true for storing into a log; a lab sheet for computing needs none). */
  timeRequired: boolean;
  /** Refuse values outside the quantity's physical limits (false leaves them to the engine's own codes). */
  limits: boolean;
}

/**
 * Reads rows of one file under one mapping: the single home of how a cell becomes a time or a
 * measured value, shared by the app's import (`planImport`) and the command line's table reader.
 */
export function rowReader(
  header: readonly string[],
  mapping: ColumnMapping,
  decimalComma: boolean,
  options: RowReaderOptions = { timeRequired: true, limits: true },
): (row: readonly string[], line: number) => RowRead {
  const col = (role: string) => mapping.columns.findIndex((c) => c.role === role);
  const cTimestamp = col('timestamp');
  const cDate = col('date');
  const cTime = col('time');
  const cZone = col('time-zone');
  const cNotes = col('notes');
  const cScale = col('ph-scale');
  const hasTime = cTimestamp >= 0 || cDate >= 0;
  const valueCols = mapping.columns.flatMap((c, i) => {
    if (c.role !== 'value') return [];
    const q = quantityById(c.quantity)!;
    return [{ index: i, q, unit: q.units.find((x) => x.id === c.unit)! }];
  });
  let knownZone: string | undefined;
  return (row, line) => {
    const errors: RowIssue[] = [];
    const cell = (i: number) => (i >= 0 ? (row[i] ?? '').trim() : '');
    // Time
    const zone = cZone >= 0 && cell(cZone) !== '' ? cell(cZone) : mapping.timeZone;
    // Rows of a file nearly always share one zone: check it once, not per row.
    if (zone !== knownZone) knownZone = isKnownTimeZone(zone) ? zone : undefined;
    if (knownZone === undefined) {
      errors.push(rowIssue(line, 'time-zone-unknown', `"${zone}" is not a time zone.`, header[cZone]));
    }
    const dateText = cTimestamp >= 0 ? cell(cTimestamp) : cell(cDate);
    const timeColumn = header[cTimestamp >= 0 ? cTimestamp : cDate];
    let takenAt: string | undefined;
    if (dateText === '') {
      if (hasTime || options.timeRequired)
        errors.push(rowIssue(line, 'time-missing', 'The sampling time is empty.', timeColumn));
    } else if (knownZone !== undefined) {
      const t = parseTimestamp(dateText, cTimestamp >= 0 ? undefined : cell(cTime), zone, mapping.dateOrder);
      if ('reason' in t) errors.push(rowIssue(line, 'time-unreadable', t.reason, timeColumn));
      else takenAt = new Date(t.epochMs).toISOString();
    }

    // Values: kept as written (quantity, number, unit); the id uses the converted engine values.
    const scaleText = cScale >= 0 ? cell(cScale).toLowerCase() : '';
    let scale = mapping.phScale;
    if (scaleText !== '') {
      if ((['total', 'free', 'seawater', 'nbs'] as const).some((x) => x === scaleText))
        scale = scaleText as typeof scale;
      else
        errors.push(
          rowIssue(
            line,
            'value-out-of-range',
            `"${scaleText}" is not a pH scale (total, free, seawater, nbs).`,
            header[cScale],
          ),
        );
    }
    const measured: MeasuredValue[] = [];
    const values: Record<string, number> = {};
    for (const { index, q, unit } of valueCols) {
      const raw = cell(index);
      if (raw === '') continue;
      const x = parseNumber(raw, decimalComma);
      if (x === undefined) {
        errors.push(
          rowIssue(
            line,
            'value-not-a-number',
            `"${raw}" is not a number${decimalComma ? ' (this file uses a decimal comma)' : ''}.`,
            header[index],
          ),
        );
        continue;
      }
      const k = unit.toKey(x);
      const [lo, hi] = q.limits;
      if (options.limits && (k < lo || k > hi)) {
        errors.push(
          rowIssue(
            line,
            'value-out-of-range',
            `${q.label} ${raw} ${unit.label} is outside ${lo}–${hi}.`,
            header[index],
          ),
        );
        continue;
      }
      const stored = storedForm(q, unit, x);
      if (q.id === 'ph' && scale) stored.unit = scale;
      measured.push({ quantity: q.id, value: stored.value, unit: stored.unit });
      values[unit.key] = k;
      // The pH scale is part of what the number means, so it is part of the content id.
      if (q.id === 'ph')
        values.ph_scale_code = ['ph', 'nbs', 'total', 'free', 'seawater'].indexOf(stored.unit);
    }
    if (valueCols.length > 0 && measured.length === 0 && errors.length === 0) {
      errors.push(rowIssue(line, 'row-no-values', 'This row has no measured values.'));
    }
    const read: RowRead = { zone, measured, values, notes: cell(cNotes), errors };
    if (takenAt !== undefined) read.takenAt = takenAt;
    return read;
  };
}
