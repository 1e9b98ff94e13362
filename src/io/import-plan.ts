/**
 * Turns a parsed CSV and a column mapping into the documents an import would write, and a report
 * of every problem by row and column. Nothing is written here: `import-commit.ts` writes the plan
 * in one transaction, and only when it has no errors.
 */

import { quantityById, storedForm } from '../quantities';
import { SITE_KINDS } from '../store/schema';
import type { ColumnMapping } from './column-mapping';
import { checkMapping } from './column-mapping';
import { contentId, normalizeName, readingCanonical, siteCanonical } from './content-id';
import type { ParsedCsv } from './csv-parse';
import type { MeasuredValue, ReadingDoc, SiteDoc } from './docs';
import { type RowIssue, rowIssue } from './io-issues';
import { parseNumber } from './numbers';
import { parseSiteDefaults } from './site-defaults-text';
import { isKnownTimeZone, parseTimestamp } from './timestamps';

/** Ids our devices make (uuid) and tests use: letters, digits and `.-_:`, at most 100 characters. */
const READING_ID = /^[A-Za-z0-9._:-]{1,100}$/;

export interface ImportPlan {
  readings: ReadingDoc[];
  /** File line of each planned reading (same order as `readings`). */
  readingLines: number[];
  /** Whether the file said when each reading last changed (same order); only those replace older copies. */
  updatedAtGiven: boolean[];
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
    updatedAtGiven: [],
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
  const createdById = new Map<string, SiteDoc>();
  const updatedAt = now.toISOString();
  const col = (role: string) => mapping.columns.findIndex((c) => c.role === role);
  const cSite = col('site');
  const cReadingId = col('reading-id');
  const cUpdatedAt = col('updated-at');
  const cSiteKind = col('site-kind');
  const cSiteId = col('site-id');
  const cSiteDefaults = col('site-defaults');
  const readRow = rowReader(header, mapping, csv.sniff.decimalComma);
  const seenIds = new Map<string, number>();

  for (let r = 0; r < rows.length; r++) {
    const row = rows[r]!;
    const line = lines[r]!;
    const rowErrors: RowIssue[] = [];
    const cell = (i: number) => (i >= 0 ? (row[i] ?? '').trim() : '');

    // Site: by its own id when the file carries it (our export does), else by name.
    let site = fixedSite;
    const siteIdText = cell(cSiteId);
    if (siteIdText !== '' && !READING_ID.test(siteIdText)) {
      rowErrors.push(
        rowIssue(line, 'reading-id-invalid', `"${siteIdText}" is not a site id.`, header[cSiteId]),
      );
    }
    const byGivenId =
      siteIdText !== '' ? (known.get(siteIdText.toLowerCase()) ?? createdById.get(siteIdText)) : undefined;
    if (byGivenId) site = byGivenId;
    else if (cSite >= 0) {
      const name = cell(cSite);
      if (name === '') {
        rowErrors.push(rowIssue(line, 'site-missing', 'No site is given in this row.', header[cSite]));
      } else {
        site =
          (siteIdText === '' ? known.get(name.toLowerCase()) : undefined) ??
          (siteIdText === '' ? known.get(normalizeName(name)) : undefined) ??
          (siteIdText === '' ? created.get(normalizeName(name)) : undefined);
        if (!site) {
          const kindText = cell(cSiteKind).toLowerCase();
          const defaults = parseSiteDefaults(cell(cSiteDefaults));
          if ('reason' in defaults)
            rowErrors.push(rowIssue(line, 'value-out-of-range', defaults.reason, header[cSiteDefaults]));
          site = {
            id: siteIdText !== '' ? siteIdText : contentId(siteCanonical(name)),
            type: 'site',
            name: name.replace(/\s+/g, ' '),
            kind: SITE_KINDS.find((k) => k === kindText) ?? 'other',
            defaults: 'reason' in defaults ? {} : defaults,
            notes: 'Created by CSV import.',
            updatedAt,
            deleted: false,
          };
          if (siteIdText !== '') createdById.set(siteIdText, site);
          else created.set(normalizeName(name), site);
        }
      }
    }

    const read = readRow(row, line);
    rowErrors.push(...read.errors);
    const { takenAt, zone, measured, values } = read;

    // Identity: the reading's own id when the file carries it (our export does), else its content.
    const givenId = cell(cReadingId);
    if (givenId !== '' && !READING_ID.test(givenId)) {
      rowErrors.push(
        rowIssue(line, 'reading-id-invalid', `"${givenId}" is not a reading id.`, header[cReadingId]),
      );
    }
    const changedText = cell(cUpdatedAt);
    const changed = changedText === '' ? undefined : Date.parse(changedText);
    if (changed !== undefined && !Number.isFinite(changed)) {
      rowErrors.push(
        rowIssue(line, 'time-unreadable', `"${changedText}" is not an ISO 8601 time.`, header[cUpdatedAt]),
      );
    }

    if (rowErrors.length > 0 || !site || !takenAt) {
      errors.push(...rowErrors);
      continue;
    }
    const id = givenId !== '' ? givenId : contentId(readingCanonical(site.id, takenAt, values));
    const earlier = seenIds.get(id);
    if (earlier !== undefined) {
      plan.duplicateRows.push(
        rowIssue(
          line,
          'row-duplicate',
          givenId !== ''
            ? `Same reading id as line ${earlier}.`
            : `Same site, time and values as line ${earlier}.`,
        ),
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
      updatedAt: changed !== undefined ? new Date(changed).toISOString() : updatedAt,
      deleted: false,
    };
    plan.readings.push(reading);
    plan.readingLines.push(line);
    plan.updatedAtGiven.push(changed !== undefined);
  }
  plan.newSites = [...created.values(), ...createdById.values()];
  return plan;
}

/** What one row says apart from its site: time, measured values (as written and in engine keys), notes. */
export interface RowRead {
  /** ISO 8601 instant, when the row has a time. */
  takenAt?: string;
  zone: string;
  measured: MeasuredValue[];
  /** Engine keys and values (plus `ph_scale_code`), as the content id sees them (empty without `contentValues`). */
  values: Record<string, number>;
  notes: string;
  errors: RowIssue[];
}

export interface RowReaderOptions {
  /** A row without a time is an error (true for storing into a log; a lab sheet for computing needs none). */
  timeRequired: boolean;
  /** Refuse values outside the quantity's physical limits (false leaves them to the engine's own codes). */
  limits: boolean;
  /** Fill `values` (engine keys as the content id sees them); a reader that does not store needs none. */
  contentValues?: boolean;
}

const PH_SCALES = ['total', 'free', 'seawater', 'nbs'] as const;
const PH_SCALE_CODES = ['ph', 'nbs', 'total', 'free', 'seawater'];

const cellOf = (row: readonly string[], i: number) => (i >= 0 ? (row[i] ?? '').trim() : '');

/**
 * `parseNumber` of a trimmed cell, with a short way for what loggers write (an optional minus,
 * digits, at most one decimal mark of the file's kind): the same number, without the text
 * replacements and pattern test. Anything else goes to `parseNumber`.
 */
export function cellNumber(raw: string, decimalComma: boolean): number | undefined {
  const mark = decimalComma ? 44 : 46;
  let at = -1;
  let digits = 0;
  for (let i = raw.charCodeAt(0) === 45 ? 1 : 0; i < raw.length; i++) {
    const c = raw.charCodeAt(i);
    if (c >= 48 && c <= 57) digits++;
    else if (c === mark && at < 0) at = i;
    else return parseNumber(raw, decimalComma);
  }
  if (digits === 0) return parseNumber(raw, decimalComma);
  const v = Number(decimalComma && at >= 0 ? `${raw.slice(0, at)}.${raw.slice(at + 1)}` : raw);
  return Number.isFinite(v) ? v : undefined;
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
    if (c.role !== 'value' && c.role !== 'titration-value') return [];
    const q = quantityById(c.quantity)!;
    return [
      { index: i, q, unit: q.units.find((x) => x.id === c.unit)!, titration: c.role === 'titration-value' },
    ];
  });
  const contentValues = options.contentValues ?? true;
  let knownZone: string | undefined;
  // Rows of a logger often share a time (one per station): the last time read is reused.
  let lastDate = '';
  let lastTime = '';
  let lastZone = '';
  let lastTaken: string | { reason: string } = { reason: '' };
  return (row, line) => {
    const errors: RowIssue[] = [];
    const cell = (i: number) => cellOf(row, i);
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
      const timeText = cTimestamp >= 0 ? '' : cell(cTime);
      if (dateText !== lastDate || timeText !== lastTime || zone !== lastZone) {
        const t = parseTimestamp(dateText, cTimestamp >= 0 ? undefined : timeText, zone, mapping.dateOrder);
        lastTaken = 'reason' in t ? t : new Date(t.epochMs).toISOString();
        lastDate = dateText;
        lastTime = timeText;
        lastZone = zone;
      }
      if (typeof lastTaken === 'string') takenAt = lastTaken;
      else errors.push(rowIssue(line, 'time-unreadable', lastTaken.reason, timeColumn));
    }

    // Values: kept as written (quantity, number, unit); the id uses the converted engine values.
    const scaleText = cScale >= 0 ? cell(cScale).toLowerCase() : '';
    let scale = mapping.phScale;
    if (scaleText !== '') {
      if (PH_SCALES.some((x) => x === scaleText)) scale = scaleText as typeof scale;
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
    for (const { index, q, unit, titration } of valueCols) {
      const raw = cell(index);
      if (raw === '') continue;
      const x = cellNumber(raw, decimalComma);
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
      if (titration) {
        // A titration's result: kept apart from typed values, and part of the content id as such.
        measured.push({ quantity: q.id, value: stored.value, unit: stored.unit, source: 'titration' });
        if (contentValues) values[`titration_${unit.key}`] = k;
        continue;
      }
      if (q.id === 'ph' && scale) stored.unit = scale;
      measured.push({ quantity: q.id, value: stored.value, unit: stored.unit });
      if (!contentValues) continue;
      values[unit.key] = k;
      // The pH scale is part of what the number means, so it is part of the content id.
      if (q.id === 'ph') values.ph_scale_code = PH_SCALE_CODES.indexOf(stored.unit);
    }
    if (valueCols.length > 0 && measured.length === 0 && errors.length === 0) {
      errors.push(rowIssue(line, 'row-no-values', 'This row has no measured values.'));
    }
    const read: RowRead = { zone, measured, values, notes: cell(cNotes), errors };
    if (takenAt !== undefined) read.takenAt = takenAt;
    return read;
  };
}
