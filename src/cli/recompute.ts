/**
 * `tufa recompute --csv FILE`: batch processing of logger and spreadsheet files with the same
 * column rules as the app's import (delimiter, decimal comma and BOM detected; columns guessed from
 * the header, overridable with --map). Writes one CSV row per good input row with the measured
 * values in engine units and what the engine computes; every bad row goes to stderr with its line,
 * column and reason. Nothing is stored.
 */

import { readFileSync } from 'node:fs';
import { basename } from 'node:path';
import { isSolveError } from '../chem/api';
import { solve } from '../chem/solve';
import { type ColumnMapping, type ColumnRole, defaultMapping } from '../io/column-mapping';
import { type Delimiter, parseCsv } from '../io/csv-parse';
import { csvRecord } from '../io/csv-write';
import type { SiteDoc } from '../io/docs';
import { COMPUTED_COLUMNS } from '../io/export-csv';
import { planImport } from '../io/import-plan';
import { formatNumber } from '../io/numbers';
import { KEY_ORDER, QUANTITIES, quantityById } from '../io/quantities';
import { engineValues } from '../io/solve-input';
import { formatWithOffset, isKnownTimeZone } from '../io/timestamps';
import { readingRequest } from '../reading/request';
import { type CliIo, EXIT_OK, EXIT_ROW_FAILED, EXIT_USAGE } from './io';

export const RECOMPUTE_HELP = `tufa recompute — compute the carbonate system for every row of a logger or spreadsheet CSV

Usage:
  npm run -s tufa -- recompute --csv FILE [options] > results.csv

The file may start with a BOM, use , ; tab or | between fields and a decimal comma; all are
detected. Columns are recognized from the header (e.g. "Temp (°C)", "pH", "Alkalinity (meq/L)",
"Cond (µS/cm)", "Date/Time", "Site"); name any other with --map.

Options:
  --csv FILE              the input file (required)
  --tz ZONE               IANA time zone of times written without an offset (default UTC)
  --date-order ORDER      dmy (default), mdy or ymd for dates such as 03/06/2026
  --site NAME             site name for every row when the file has no site column
  --set KEY=VALUE         an engine input for every row, e.g. --set salinity=35 --set model=fresh
  --map "HEADER=ROLE"     map a column: ROLE is ignore, timestamp, date, time, time-zone, site,
                          notes, ph-scale, or QUANTITY:UNIT (see --quantities)
  --delimiter D           force the delimiter: , ; tab |
  --decimal-comma, --decimal-point   force the decimal mark
  --quantities            list quantities and units for --map

Output columns: line, site, taken_at (ISO 8601 with offset), time_zone, the measured values in
engine units (e.g. alkalinity_meq_l), computed_* results, computed_model, computed_issues.
Exit status: 0 every row computed, 1 some row was unreadable or could not be solved, 2 bad options.

Example:
  npm run -s tufa -- recompute --csv spring-logger.csv --tz Europe/Vienna --site "Quellhof spring"
`;

function parseRole(text: string): ColumnRole | undefined {
  const simple = ['ignore', 'timestamp', 'date', 'time', 'time-zone', 'site', 'notes', 'ph-scale'] as const;
  const s = simple.find((x) => x === text);
  if (s) return { role: s } as ColumnRole;
  const [quantity, unit] = text.split(':');
  const q = quantity ? quantityById(quantity) : undefined;
  if (!q || !unit || !q.units.some((u) => u.id === unit)) return undefined;
  return { role: 'value', quantity: q.id, unit };
}

function parseSetValue(v: string): unknown {
  const n = Number(v);
  return v.trim() !== '' && Number.isFinite(n) ? n : v;
}

export async function runRecompute(args: string[], io: CliIo): Promise<number> {
  let file: string | undefined;
  let tz = 'UTC';
  let dateOrder: ColumnMapping['dateOrder'] = 'dmy';
  let siteName: string | undefined;
  let delimiter: Delimiter | undefined;
  let decimalComma: boolean | undefined;
  const sets: Record<string, unknown> = {};
  const maps: [string, ColumnRole][] = [];
  const usage = (msg: string) => {
    io.stderr.write(`tufa recompute: ${msg}\n\n${RECOMPUTE_HELP}`);
    return EXIT_USAGE;
  };
  for (let i = 0; i < args.length; i++) {
    const a = args[i]!;
    const next = () => args[++i];
    if (a === '--help' || a === '-h') {
      io.stdout.write(RECOMPUTE_HELP);
      return EXIT_OK;
    }
    if (a === '--quantities') {
      for (const q of QUANTITIES)
        io.stdout.write(`${q.id.padEnd(12)} ${q.units.map((u) => `${u.id} (${u.label})`).join(', ')}\n`);
      return EXIT_OK;
    }
    if (a === '--csv') file = next();
    else if (a === '--tz') tz = next() ?? '';
    else if (a === '--date-order') {
      const o = next();
      if (o !== 'dmy' && o !== 'mdy' && o !== 'ymd') return usage('--date-order takes dmy, mdy or ymd');
      dateOrder = o;
    } else if (a === '--site') siteName = next();
    else if (a === '--set') {
      const kv = next() ?? '';
      const eq = kv.indexOf('=');
      if (eq <= 0) return usage(`--set needs KEY=VALUE, got "${kv}"`);
      sets[kv.slice(0, eq)] = parseSetValue(kv.slice(eq + 1));
    } else if (a === '--map') {
      const kv = next() ?? '';
      const eq = kv.lastIndexOf('=');
      const role = eq > 0 ? parseRole(kv.slice(eq + 1)) : undefined;
      if (!role) return usage(`--map needs "HEADER=ROLE" with a known role, got "${kv}"`);
      maps.push([kv.slice(0, eq), role]);
    } else if (a === '--delimiter') {
      const d = next();
      const dd = d === 'tab' ? '\t' : d;
      if (dd !== ',' && dd !== ';' && dd !== '\t' && dd !== '|')
        return usage('--delimiter takes , ; tab or |');
      delimiter = dd;
    } else if (a === '--decimal-comma') decimalComma = true;
    else if (a === '--decimal-point') decimalComma = false;
    else return usage(`unknown option ${a}`);
  }
  if (!file) return usage('--csv FILE is required');
  if (!isKnownTimeZone(tz))
    return usage(`"${tz}" is not a time zone (use an IANA name such as Europe/Vienna)`);
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (e) {
    return usage(`cannot read ${file}: ${(e as Error).message}`);
  }
  const opts: { delimiter?: Delimiter; decimalComma?: boolean } = {};
  if (delimiter) opts.delimiter = delimiter;
  if (decimalComma !== undefined) opts.decimalComma = decimalComma;
  const csv = parseCsv(text, opts);
  const mapping = defaultMapping(csv.table.header, tz);
  mapping.dateOrder = dateOrder;
  for (const [h, role] of maps) {
    const idx = csv.table.header.findIndex((x) => x.toLowerCase() === h.trim().toLowerCase());
    if (idx < 0) return usage(`--map: the file has no column "${h}"`);
    mapping.columns[idx] = role;
  }
  const site: SiteDoc = {
    id: 'cli-site',
    type: 'site',
    name: siteName ?? basename(file),
    kind: 'other',
    defaults: sets as SiteDoc['defaults'],
    notes: '',
    updatedAt: new Date(0).toISOString(),
    deleted: false,
  };
  if (!mapping.columns.some((c) => c.role === 'site')) mapping.siteId = site.id;
  const plan = await planImport(csv, mapping, [site]);
  const sitesById = new Map([site, ...plan.newSites].map((s) => [s.id, s]));
  for (const s of plan.newSites) s.defaults = { ...(sets as SiteDoc['defaults']) };

  const converted = plan.readings.map((r) => engineValues(r));
  const present = new Set(converted.flatMap((c) => Object.keys(c.values)));
  const keys = KEY_ORDER.filter((k) => present.has(k));
  const header = [
    'line',
    'site',
    'taken_at',
    'time_zone',
    ...(present.has('ph') ? ['ph_scale'] : []),
    ...keys,
    ...COMPUTED_COLUMNS.map((c) => `computed_${c}`),
    'computed_model',
    'computed_issues',
  ];
  io.stdout.write(`${csvRecord(header)}\r\n`);
  let failed = 0;
  plan.readings.forEach((r, i) => {
    const s = sitesById.get(r.siteId);
    const { values, options } = converted[i]!;
    const res = solve(readingRequest(r, s).input);
    const row = [
      String(plan.readingLines[i]),
      s?.name ?? '',
      formatWithOffset(Date.parse(r.takenAt), r.timeZone),
      r.timeZone,
      ...(present.has('ph') ? [options.ph_scale ?? s?.defaults.ph_scale ?? ''] : []),
      ...keys.map((k) => formatNumber(values[k])),
    ];
    if (isSolveError(res)) {
      failed++;
      row.push(...COMPUTED_COLUMNS.map(() => ''), '', `${res.error.code}: ${res.error.message}`);
      io.stderr.write(`line ${plan.readingLines[i]}: ${res.error.code}: ${res.error.message}\n`);
    } else {
      row.push(
        ...COMPUTED_COLUMNS.map((c) =>
          formatNumber(typeof res[c] === 'number' ? (res[c] as number) : undefined),
        ),
        res.model,
        res.warnings.map((w) => `${w.code}: ${w.message}`).join(' | '),
      );
    }
    io.stdout.write(`${csvRecord(row)}\r\n`);
  });
  const errors = [...plan.errors].sort((a, b) => a.row - b.row);
  for (const e of errors) {
    io.stderr.write(`line ${e.row}${e.column ? `, column "${e.column}"` : ''}: ${e.code}: ${e.message}\n`);
  }
  for (const d of plan.duplicateRows) io.stderr.write(`line ${d.row}: ${d.code}: ${d.message} (skipped)\n`);
  const count = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
  io.stderr.write(
    `tufa recompute: ${plan.readings.length - failed} of ${count(plan.rowCount, 'row', 'rows')} computed` +
      `${errors.length ? `, ${count(errors.length, 'problem', 'problems')} in the file` : ''}` +
      `${failed ? `, ${count(failed, 'row', 'rows')} not solvable` : ''}.\n`,
  );
  return errors.length > 0 || failed > 0 ? EXIT_ROW_FAILED : EXIT_OK;
}
