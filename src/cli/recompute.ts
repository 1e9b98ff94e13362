/**
 * `tufa recompute --csv FILE`: batch processing of logger and spreadsheet files with the same
 * column rules as the app's import (delimiter, decimal comma and BOM detected; columns guessed from
 * the header, overridable with --map). Writes one CSV row per good input row with the measured
 * values in engine units and what the engine computes; every bad row goes to stderr with its line,
 * column and reason. Nothing is stored.
 */

import { basename } from 'node:path';
import { isSolveError } from '../chem/api';
import { solve } from '../chem/solve';
import { csvField, csvRecord } from '../io/csv-write';
import { COMPUTED_COLUMNS } from '../io/export-csv';
import { formatNumber } from '../io/numbers';
import { formatWithOffset } from '../io/timestamps';
import { QUANTITIES } from '../quantities';
import { ByteOutput, type CliIo, EXIT_OK, EXIT_ROW_FAILED, EXIT_USAGE } from './io';
import { openTable, TABLE_OPTIONS_HELP, tableDefaults, tableOption } from './table';

export const RECOMPUTE_HELP = `tufa recompute — compute the carbonate system for every row of a logger or spreadsheet CSV

Usage:
  npm run -s tufa -- recompute --csv FILE [options] > results.csv

The file may start with a BOM, use , ; tab or | between fields and a decimal comma; all are
detected; a file that is not UTF-8 is read as Windows-1252 (with a warning). The file is read as
a stream: memory does not grow with its size. Times and sites are optional (a lab sheet of samples
is computed row by row). Columns are recognized from the header (e.g. "Temp (°C)", "pH", "Alkalinity (meq/L)",
"Cond (µS/cm)", "Date/Time", "Site"); name any other with --map.

Options:
  --csv FILE              the input file (required)
${TABLE_OPTIONS_HELP}
  --quantities            list quantities and units for --map

Output columns: line, site, taken_at (ISO 8601 with offset; empty without a time), time_zone,
the measured values in engine units (e.g. alkalinity_meq_l), computed_* results, computed_model,
computed_issues. Rows that cannot be read are reported on stderr with line, column and code.
Exit status: 0 every row computed, 1 some row was unreadable or could not be solved, 2 bad options.

Example:
  npm run -s tufa -- recompute --csv spring-logger.csv --tz Europe/Vienna --site "Quellhof spring"
`;

export async function runRecompute(args: string[], io: CliIo): Promise<number> {
  let file: string | undefined;
  const o = tableDefaults();
  const usage = (msg: string) => {
    io.stderr.write(`tufa recompute: ${msg}\n\n${RECOMPUTE_HELP}`);
    return EXIT_USAGE;
  };
  for (let i = 0; i < args.length; i++) {
    const a = args[i]!;
    if (a === '--help' || a === '-h') {
      io.stdout.write(RECOMPUTE_HELP);
      return EXIT_OK;
    }
    if (a === '--quantities') {
      for (const q of QUANTITIES)
        io.stdout.write(`${q.id.padEnd(12)} ${q.units.map((u) => `${u.id} (${u.label})`).join(', ')}\n`);
      return EXIT_OK;
    }
    if (a === '--csv') {
      file = args[++i];
      continue;
    }
    const used = tableOption(args, i, o);
    if (typeof used === 'string') return usage(used);
    if (used === 0) return usage(`unknown option ${a}`);
    i += used - 1;
  }
  if (!file) return usage('--csv FILE is required');
  if (o.siteName === undefined) o.siteName = basename(file);
  const out = new ByteOutput(io.stdout);
  let problems = 0;
  let rows = 0;
  const table = await openTable(
    file,
    o,
    (issue) => {
      if (issue.code !== 'csv-not-utf8') problems++;
      // The line a broken quote cost is a row that was not computed: it counts.
      if (issue.code === 'csv-unterminated-quote') rows++;
      io.stderr.write(`${where(issue)}: ${issue.code}: ${issue.message}\n`);
    },
    { limits: true },
  );
  if (typeof table === 'string') return usage(table);
  const header = [
    'line',
    'site',
    'taken_at',
    'time_zone',
    ...(table.hasPh ? ['ph_scale'] : []),
    ...table.valueKeys,
    ...COMPUTED_COLUMNS.map((c) => `computed_${c}`),
    'computed_model',
    'computed_issues',
  ];
  out.add(`${csvRecord(header)}\r\n`);
  let computed = 0;
  let failed = 0;
  // Output rows are written field by field (numbers need no quoting); cells that repeat from row
  // to row (times, measured values) are formatted once and looked up after.
  const text = csvField;
  const valueCells = table.valueKeys.map(() => memo(formatNumber));
  let takenText = '';
  let takenKey = '';
  // Rows in a run mostly carry the same warnings: their cell is made again only when they change.
  let lastWarnings: readonly { code: string; message: string }[] = [];
  let lastIssues = Buffer.from(',\r\n');
  const issuesCell = (warnings: readonly { code: string; message: string }[]) => {
    const same =
      warnings.length === lastWarnings.length &&
      warnings.every((w, i) => w.code === lastWarnings[i]!.code && w.message === lastWarnings[i]!.message);
    if (!same) {
      lastWarnings = warnings;
      lastIssues = Buffer.from(
        `,${csvField(warnings.map((w) => `${w.code}: ${w.message}`).join(' | '))}\r\n`,
      );
    }
    return lastIssues;
  };
  const noResult = `${','.repeat(COMPUTED_COLUMNS.length)},`;
  for await (const batch of table.rows)
    for (const r of batch) {
      rows++;
      if (r.errors.length > 0) {
        problems += r.errors.length;
        for (const e of r.errors) io.stderr.write(`${where(e)}: ${e.code}: ${e.message}\n`);
        continue;
      }
      const res = solve(r.input);
      if (r.takenAt === undefined) takenText = takenKey = '';
      else if (`${r.takenAt} ${r.zone}` !== takenKey) {
        takenKey = `${r.takenAt} ${r.zone}`;
        takenText = formatWithOffset(Date.parse(r.takenAt), r.zone);
      }
      let line = `${r.line},${text(r.site)},${takenText},${text(r.zone)}`;
      if (table.hasPh) line += `,${text(r.options.ph_scale ?? String(o.sets.ph_scale ?? ''))}`;
      for (let k = 0; k < valueCells.length; k++) line += `,${valueCells[k]!(r.values[table.valueKeys[k]!])}`;
      if (isSolveError(res)) {
        failed++;
        line += `${noResult},${csvField(`${res.error.code}: ${res.error.message}`)}`;
        io.stderr.write(`line ${r.line}: ${res.error.code}: ${res.error.message}\n`);
      } else {
        computed++;
        for (const c of COMPUTED_COLUMNS) {
          const v = res[c];
          line += `,${formatNumber(typeof v === 'number' ? v : undefined)}`;
        }
        out.add(`${line},${text(res.model)}`);
        if (out.addBytes(issuesCell(res.warnings))) await out.flush();
        continue;
      }
      if (out.add(`${line}\r\n`)) await out.flush();
    }
  await out.flush();
  const count = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
  io.stderr.write(
    `tufa recompute: ${computed} of ${count(rows, 'row', 'rows')} computed` +
      `${problems ? `, ${count(problems, 'problem', 'problems')} in the file` : ''}` +
      `${failed ? `, ${count(failed, 'row', 'rows')} not solvable` : ''}.\n`,
  );
  return problems > 0 || failed > 0 ? EXIT_ROW_FAILED : EXIT_OK;
}

/** A formatter with a bounded cache of its recent arguments. */
function memo<T>(f: (x: T) => string): (x: T) => string {
  const cache = new Map<T, string>();
  return (x) => {
    let s = cache.get(x);
    if (s === undefined) {
      s = f(x);
      if (cache.size >= 4096) cache.clear();
      cache.set(x, s);
    }
    return s;
  };
}

function where(i: { row: number; column?: string }): string {
  return `line ${i.row}${i.column ? `, column "${i.column}"` : ''}`;
}
