/**
 * The one batch reader for tables, behind `solve --csv` and `recompute --csv`: streams a file
 * (memory bounded by one record, whatever the file's size) through src/io's record splitter,
 * detection (BOM, delimiter, decimal comma), column mapping and row reader. A file that is not
 * UTF-8 is read as Windows-1252, with a warning. Times and sites are optional: a lab sheet of
 * samples without either is computed row by row (they are needed only for storing into a log).
 * Columns named like engine inputs that the mapping does not cover (`model`, `pair`,
 * `carbonic_constants`, ...) and `id`/`label` are passed to the engine as they are.
 */

import { accessSync, constants, createReadStream } from 'node:fs';
import { KNOWN_INPUT_KEYS } from '../chem/input';
import { type ColumnMapping, type ColumnRole, checkMapping, defaultMapping } from '../io/column-mapping';
import { type Delimiter, detectDecimalComma, detectDelimiter } from '../io/csv-parse';
import { CsvSplitter } from '../io/csv-records';
import { rowReader } from '../io/import-plan';
import { type RowIssue, rowIssue } from '../io/io-issues';
import { parseNumber } from '../io/numbers';
import { isKnownTimeZone } from '../io/timestamps';
import { KEY_ORDER, quantityById } from '../quantities';
import { readingRequest, typedValues } from '../reading/request';

export interface TableOptions {
  delimiter?: Delimiter;
  decimalComma?: boolean;
  tz: string;
  dateOrder: ColumnMapping['dateOrder'];
  maps: [string, ColumnRole][];
  /** Engine inputs for every row (`--set KEY=VALUE`). */
  sets: Record<string, unknown>;
  /** Site for every row when the file has no site column. */
  siteName?: string;
}

export function tableDefaults(): TableOptions {
  return { tz: 'UTC', dateOrder: 'dmy', maps: [], sets: {} };
}

export const TABLE_OPTIONS_HELP = `  --tz ZONE               IANA time zone of times written without an offset (default UTC)
  --date-order ORDER      dmy (default), mdy or ymd for dates such as 03/06/2026
  --site NAME             site name for every row when the file has no site column
  --set KEY=VALUE         an engine input for every row, e.g. --set salinity=35 --set model=fresh
  --map "HEADER=ROLE"     map a column: ROLE is ignore, timestamp, date, time, time-zone, site,
                          notes, ph-scale, or QUANTITY:UNIT (see recompute --quantities)
  --delimiter D           force the delimiter: , ; tab |
  --decimal-comma, --decimal-point   force the decimal mark`;

function parseRole(text: string): ColumnRole | undefined {
  const simple = ['ignore', 'timestamp', 'date', 'time', 'time-zone', 'site', 'notes', 'ph-scale'] as const;
  const s = simple.find((x) => x === text);
  if (s) return { role: s } as ColumnRole;
  const [quantity, unit] = text.split(':');
  const q = quantity ? quantityById(quantity) : undefined;
  if (!q || !unit || !q.units.some((u) => u.id === unit)) return undefined;
  return { role: 'value', quantity: q.id, unit };
}

/**
 * Reads one table option at args[i] into `o`: the number of arguments used, 0 when args[i] is
 * not a table option, or the problem as text.
 */
export function tableOption(args: readonly string[], i: number, o: TableOptions): number | string {
  const a = args[i]!;
  const v = args[i + 1];
  switch (a) {
    case '--tz':
      if (v === undefined || !isKnownTimeZone(v))
        return `"${v ?? ''}" is not a time zone (use an IANA name such as Europe/Vienna)`;
      o.tz = v;
      return 2;
    case '--date-order':
      if (v !== 'dmy' && v !== 'mdy' && v !== 'ymd') return '--date-order takes dmy, mdy or ymd';
      o.dateOrder = v;
      return 2;
    case '--site':
      if (v === undefined) return '--site needs a name';
      o.siteName = v;
      return 2;
    case '--set': {
      const eq = (v ?? '').indexOf('=');
      if (v === undefined || eq <= 0) return `--set needs KEY=VALUE, got "${v ?? ''}"`;
      const raw = v.slice(eq + 1);
      const n = Number(raw);
      o.sets[v.slice(0, eq)] = raw.trim() !== '' && Number.isFinite(n) ? n : raw;
      return 2;
    }
    case '--map': {
      const eq = (v ?? '').lastIndexOf('=');
      const role = v !== undefined && eq > 0 ? parseRole(v.slice(eq + 1)) : undefined;
      if (!role || v === undefined) return `--map needs "HEADER=ROLE" with a known role, got "${v ?? ''}"`;
      o.maps.push([v.slice(0, eq), role]);
      return 2;
    }
    case '--delimiter': {
      const d = v === 'tab' ? '\t' : v;
      if (d !== ',' && d !== ';' && d !== '\t' && d !== '|') return '--delimiter takes , ; tab or |';
      o.delimiter = d;
      return 2;
    }
    case '--decimal-comma':
      o.decimalComma = true;
      return 1;
    case '--decimal-point':
      o.decimalComma = false;
      return 1;
    default:
      return 0;
  }
}

/** Engine keys whose cells are text; every other engine key is read as a number. */
const TEXT_KEYS = new Set([
  'model',
  'ph_scale',
  'carbonic_constants',
  'boron_total',
  'fluoride_constant',
  'pair',
  'root',
  'activity_model',
  'conductance_factor',
  'dolomite_form',
  'notes',
]);
export const PASSTHROUGH = ['id', 'label'] as const;

export interface TableRow {
  line: number;
  /** The engine request: --set values, engine-named columns, then the mapped measured values. */
  input: Record<string, unknown>;
  /** Measured values in engine keys and units, and the options their units imply (ph_scale). */
  values: Record<string, number>;
  options: Record<string, string>;
  site: string;
  takenAt?: string;
  zone: string;
  /** `id` and `label` cells, when the file has those columns. */
  passthrough: Record<string, string>;
  /** Why the row cannot be read; empty when it can be computed. */
  errors: RowIssue[];
}

export interface Table {
  header: string[];
  delimiter: Delimiter;
  decimalComma: boolean;
  /** Engine keys of the mapped value columns, in catalogue order. */
  valueKeys: string[];
  hasPh: boolean;
  /** The rows, in batches as they are read; each row is made when its batch is iterated. */
  rows: AsyncGenerator<Iterable<TableRow>>;
}

/** Decoded text of a file in pieces: UTF-8, or Windows-1252 from the first piece that is not UTF-8. */
async function* decoded(file: string, onIssue: (i: RowIssue) => void): AsyncGenerator<string> {
  let decoder = new TextDecoder('utf-8', { fatal: true });
  let utf8 = true;
  let offset = 0;
  for await (const piece of createReadStream(file, { highWaterMark: 1 << 18 })) {
    const bytes = piece as Buffer;
    if (utf8) {
      try {
        yield decoder.decode(bytes, { stream: true });
        offset += bytes.length;
        continue;
      } catch {
        utf8 = false;
        decoder = new TextDecoder('windows-1252');
        onIssue(
          rowIssue(
            1,
            'csv-not-utf8',
            `The file is not UTF-8 (from byte ${offset}); it is read as Windows-1252 (Western European). Check the names and units in the output.`,
          ),
        );
      }
    }
    yield decoder.decode(bytes, { stream: true });
  }
  const tail = decoder.decode();
  if (tail !== '') yield tail;
}

/** Records of the file, each with its line, after the BOM and with the delimiter found in the first 64 KB. */
async function* records(
  file: string,
  forced: Delimiter | undefined,
  onIssue: (i: RowIssue) => void,
  found: (d: Delimiter) => void,
): AsyncGenerator<[string[], number][]> {
  const queue: [string[], number][] = [];
  let splitter: CsvSplitter | undefined;
  let sample = '';
  const start = (text: string) => {
    const t = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
    const d = forced ?? detectDelimiter(t);
    found(d);
    splitter = new CsvSplitter(d, { record: (f, l) => queue.push([f, l]), issue: onIssue });
    splitter.push(t);
  };
  for await (const text of decoded(file, onIssue)) {
    if (splitter) splitter.push(text);
    else {
      sample += text;
      if (sample.length < 64 * 1024) continue;
      start(sample);
      sample = '';
    }
    if (queue.length > 0) yield queue.splice(0);
  }
  if (!splitter) start(sample);
  splitter!.end();
  if (queue.length > 0) yield queue.splice(0);
}

/**
 * Opens a table: reads its header and first rows (to detect the decimal mark), then streams the
 * rest. File-level problems (stray quotes, encoding) go to `onIssue` as they are met; problems of
 * a row come with the row. Returns a message instead when the file or the header is unusable.
 */
export async function openTable(
  file: string,
  o: TableOptions,
  onIssue: (i: RowIssue) => void,
  readerOptions: { limits: boolean },
): Promise<Table | string> {
  try {
    accessSync(file, constants.R_OK);
  } catch (e) {
    return `cannot read ${file}: ${(e as Error).message}`;
  }
  let delimiter: Delimiter = ',';
  const it = records(file, o.delimiter, onIssue, (d) => {
    delimiter = d;
  });
  // Records in batches; `pending` holds what was read ahead for the header and the decimal mark.
  const pending: [string[], number][] = [];
  let ended = false;
  const fill = async (n: number) => {
    while (!ended && pending.length < n) {
      const b = await it.next();
      if (b.done) ended = true;
      else pending.push(...b.value);
    }
  };
  await fill(1);
  const first = pending.shift();
  if (!first) return `${file} has no header row`;
  const header = first[0].map((h) => h.trim());
  const seen = new Set<string>();
  for (const h of header) {
    if (h !== '' && seen.has(h.toLowerCase()))
      onIssue(rowIssue(1, 'csv-duplicate-header', `The column name "${h}" appears twice in the header.`, h));
    seen.add(h.toLowerCase());
  }
  const mapping = defaultMapping(header, o.tz);
  mapping.dateOrder = o.dateOrder;
  for (const [h, role] of o.maps) {
    const idx = header.findIndex((x) => x.toLowerCase() === h.trim().toLowerCase());
    if (idx < 0) return `--map: the file has no column "${h}"`;
    mapping.columns[idx] = role;
  }
  // Times and sites are for storing; here a missing one is no problem.
  const bad = checkMapping(header, mapping).filter(
    (i) => i.code !== 'map-no-timestamp' && i.code !== 'map-no-site',
  );
  if (bad.length > 0) return bad.map((i) => `${i.code}: ${i.message}`).join('\n');
  const extras: [number, string][] = [];
  mapping.columns.forEach((c, i) => {
    const name = header[i]!;
    if (
      c.role === 'ignore' &&
      (KNOWN_INPUT_KEYS.has(name) || (PASSTHROUGH as readonly string[]).includes(name))
    )
      extras.push([i, name]);
  });
  const cSite = mapping.columns.findIndex((c) => c.role === 'site');
  const valueKeys = new Set<string>();
  let hasPh = false;
  for (const c of mapping.columns) {
    if (c.role !== 'value') continue;
    const unit = quantityById(c.quantity)?.units.find((u) => u.id === c.unit);
    if (unit) valueKeys.add(unit.key);
    if (c.quantity === 'ph') hasPh = true;
  }

  // The first data rows decide the decimal mark, then everything streams.
  await fill(200);
  const decimalComma =
    o.decimalComma ??
    detectDecimalComma(
      pending
        .slice(0, 200)
        .filter(([r]) => r.length === header.length)
        .map(([r]) => r),
      delimiter,
    );
  const read = rowReader(header, mapping, decimalComma, {
    timeRequired: false,
    limits: readerOptions.limits,
    contentValues: false,
  });
  const sets = Object.entries(o.sets);
  const isPassthrough = extras.map(([, name]) => (PASSTHROUGH as readonly string[]).includes(name));

  const toRow = ([cells, line]: [string[], number]): TableRow => {
    if (cells.length !== header.length) {
      return {
        line,
        input: {},
        values: {},
        options: {},
        site: '',
        zone: '',
        passthrough: {},
        errors: [
          rowIssue(
            line,
            'csv-ragged-row',
            `This row has ${cells.length} fields but the header has ${header.length}.`,
          ),
        ],
      };
    }
    const r = read(cells, line);
    // The app's one request function; --set and extra engine columns fill what the row leaves open.
    const req = readingRequest({ values: r.measured }, undefined);
    // The request is made afresh for this row, so its input is completed in place.
    const input: Record<string, unknown> = req.input;
    const sources = req.sources;
    // The measured values in engine keys, and the options their units imply (ph_scale), as typed.
    const { values, options } = typedValues(req);
    for (const [k, v] of sets) if (sources[k] !== 'typed' && sources[k] !== 'titration') input[k] = v;
    const passthrough: Record<string, string> = {};
    for (let e = 0; e < extras.length; e++) {
      const [i, name] = extras[e]!;
      const cell = cells[i]!.trim();
      if (cell === '') continue;
      if (isPassthrough[e]) passthrough[name] = cell;
      else if (sources[name] !== 'typed' && sources[name] !== 'titration')
        input[name] = TEXT_KEYS.has(name) ? cell : (parseNumber(cell, decimalComma) ?? cell);
    }
    const row: TableRow = {
      line,
      input,
      values,
      options,
      site: cSite >= 0 ? cells[cSite]!.trim() : (o.siteName ?? ''),
      zone: r.takenAt !== undefined ? r.zone : '',
      passthrough,
      errors: r.errors,
    };
    if (r.takenAt !== undefined) row.takenAt = r.takenAt;
    return row;
  };

  // Rows are made as they are used, not a batch (thousands) ahead: each row's objects then die
  // young, which the garbage collector handles at a fraction of the cost.
  function* each(batch: [string[], number][]): Generator<TableRow> {
    for (const record of batch) yield toRow(record);
  }
  async function* rows(): AsyncGenerator<Iterable<TableRow>> {
    if (pending.length > 0) yield each(pending);
    if (ended) return;
    for await (const batch of it) yield each(batch);
  }
  return {
    header,
    delimiter,
    decimalComma,
    valueKeys: KEY_ORDER.filter((k) => valueKeys.has(k)),
    hasPh,
    rows: rows(),
  };
}
