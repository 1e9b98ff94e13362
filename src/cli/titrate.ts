/**
 * `tufa titrate`: reduces field titrations read as one JSON object or JSON Lines on stdin and
 * writes one JSON line per titration (the result, or `{ "error": {code, message} }`).
 * Exit code 0 when every titration reduced, 1 when any failed, 2 for a bad command line.
 */

import { readFileSync } from 'node:fs';
import { type Issue, toIssue } from '../chem/errors';
import { ACID_HANDLING_CAUTION } from '../chem/titration/acidCautions';
import { pointsFromTable } from '../chem/titration/pointsFromTable';
import { freshTitrationConstants } from '../chem/titration/reduceTitration';
import { titrate } from '../chem/titration/titrate';
import {
  TITRATION_METHODS,
  type TitrationInput,
  type TitrationMethod,
  type TitrationPoint,
} from '../chem/titration/types';
import { type CliIo, EXIT_OK, EXIT_ROW_FAILED, EXIT_USAGE, readAll } from './io';
import { deeperThan, keepFinite, type LineIssue, lineError, MAX_DEPTH, parseInputLine } from './json-lines';

/** Wraps text to 96 columns for the help screen. */
function wrap(text: string): string {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(' ')) {
    if (line !== '' && line.length + word.length + 1 > 96) {
      lines.push(line);
      line = word;
    } else line = line === '' ? word : `${line} ${word}`;
  }
  return [...lines, line].join('\n');
}

export const TITRATE_HELP = `Usage: npm run -s tufa -- titrate [options] < titration.json

Reduces acid titrations of a water sample to its alkalinity. Reads one JSON object, a JSON array
of them, or one titration per line (JSON Lines), from stdin; writes one JSON line per titration.
JSON Lines keep the batch contract of solve: one output line per input line, in order (blank
lines give {"skipped": {"code": "blank-line", "line": N}}, errors carry "line"); --every-method
writes one line per method.

Input fields:
  sample_volume_ml            volume of sample titrated, mL
  titrant_normality           acid concentration, eq/L
  titrant_correction_factor   multiplies the normality (default 1)
  temperature_c               sample temperature, °C
  points                      [{"volume_ml": 0, "ph": 7.9}, ...] cumulative acid added and pH
                              (or {"counts": ..., "ph": ...} with counts_per_ml for a digital titrator)
  method                      modified_gran (default) | gran | inflection | endpoint |
                              two_endpoint | curve_fit
                              (two_endpoint: for soft waters, endpoint_ph and 0.3 below it)
  endpoint_ph                 for methods endpoint and two_endpoint (default 4.5)
  ionic_strength_mol_kg or specific_conductance_us_cm   for activity corrections
  system                      modified_gran, curve_fit: closed (default) or open (sample
                              exchanging CO2 with air)
  curve_fit_ph_offset         curve_fit: true to fit a pH-meter offset as well (default false)
  uncertainty                 {"titrant_normality": 0.0005, "sample_volume_ml": 0.1, "ph": 0.01,
                               "volume_ml": 0.005, "ph_offset": 0.02} standard uncertainties

Output fields: alkalinity_meq_l, alkalinity_mg_l_caco3, alkalinity (every unit),
equivalence_volume_ml, method, species (HCO3-, CO3--, OH-, CO2*, DIC at the first reading),
fit (r2, residuals, rms, points_used, standard errors), confidence (high | medium | low with
standard errors), warnings, dic_umol_kg and dic_se_umol_kg (modified_gran closed, curve_fit),
uncertainty (when asked for).

Options:
  --method NAME       reduce with this method, overriding the input's
  --endpoint-ph X     endpoint pH for --method endpoint
  --every-method      reduce each titration by every method (one line per method)
  --points-csv FILE   take the points from a spreadsheet export (header: volume_ml or counts, ph;
                      comma-separated, or semicolons with decimal commas) instead of "points"
  --pretty            indent the JSON output
  --help              this text

${wrap(ACID_HANDLING_CAUTION)}
`;

interface Options {
  method?: TitrationMethod;
  pointsCsv?: string;
  endpointPh?: number;
  everyMethod: boolean;
  pretty: boolean;
  help: boolean;
}

function parseArgs(args: string[]): Options | string {
  const o: Options = { everyMethod: false, pretty: false, help: false };
  for (let i = 0; i < args.length; i++) {
    const a = args[i]!;
    if (a === '--help' || a === '-h') o.help = true;
    else if (a === '--pretty') o.pretty = true;
    else if (a === '--every-method') o.everyMethod = true;
    else if (a === '--points-csv') {
      const f = args[++i];
      if (f === undefined) return '--points-csv needs a file name';
      o.pointsCsv = f;
    } else if (a === '--method') {
      const m = args[++i];
      if (m === undefined || !(TITRATION_METHODS as readonly string[]).includes(m)) {
        return `--method needs one of ${TITRATION_METHODS.join(', ')}`;
      }
      o.method = m as TitrationMethod;
    } else if (a === '--endpoint-ph') {
      const v = Number(args[++i]);
      if (!Number.isFinite(v)) return '--endpoint-ph needs a number';
      o.endpointPh = v;
    } else return `unknown option ${a}`;
  }
  return o;
}

type Entry = { value: unknown; line?: number } | { error: LineIssue } | { skipped: LineIssue };

/**
 * The titrations on stdin. One line (or a document spread over lines that is not JSON Lines):
 * one object, or an array read like JSON Lines. Several lines that each hold JSON, or that do not
 * form one document: JSON Lines under the batch contract of json-lines.ts (one entry per line,
 * blank lines marked as skipped, every error with its line).
 */
function records(text: string): Entry[] {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const lines = body.split('\n').map((l) => (l.endsWith('\r') ? l.slice(0, -1) : l));
  if (lines.length > 0 && lines[lines.length - 1] === '') lines.pop();
  const parsed = lines.map((t, i) => parseInputLine({ line: i + 1, text: t }, 'input-not-json'));
  const filled = parsed.filter((p) => !('skipped' in p));
  const whole = (): Entry[] | undefined => {
    try {
      const v: unknown = JSON.parse(body);
      if (deeperThan(v, MAX_DEPTH + 1))
        return [lineError('input-too-deep', `The input nests values more than ${MAX_DEPTH} levels deep.`)];
      return Array.isArray(v) ? v.map((value: unknown) => ({ value })) : [{ value: v }];
    } catch {
      return undefined;
    }
  };
  if (filled.length === 0) return [];
  if (filled.length === 1 || filled.some((p) => 'error' in p)) {
    const w = whole();
    if (w) return w;
  }
  return parsed.map((p, i) => ('value' in p ? { value: p.value, line: i + 1 } : p));
}

export async function runTitrate(args: string[], io: CliIo): Promise<number> {
  const opts = parseArgs(args);
  if (typeof opts === 'string') {
    io.stderr.write(`tufa titrate: ${opts}\n\n${TITRATE_HELP}`);
    return EXIT_USAGE;
  }
  if (opts.help) {
    io.stdout.write(TITRATE_HELP);
    return EXIT_OK;
  }
  let tablePoints: TitrationPoint[] | { error: Issue } | undefined;
  if (opts.pointsCsv !== undefined) {
    let table: string;
    try {
      table = readFileSync(opts.pointsCsv, 'utf8');
    } catch {
      io.stderr.write(`tufa titrate: cannot read ${opts.pointsCsv}\n`);
      return EXIT_USAGE;
    }
    try {
      tablePoints = pointsFromTable(table);
    } catch (e) {
      tablePoints = { error: toIssue(e) };
    }
  }
  const text = await readAll(io.stdin);
  const entries = records(text);
  if (entries.length === 0) {
    io.stderr.write('tufa titrate: no titration on stdin (see --help)\n');
    return EXIT_USAGE;
  }
  const write = (obj: unknown) =>
    io.stdout.write(`${JSON.stringify(obj, null, opts.pretty ? 2 : undefined)}\n`);
  let failed = false;
  for (const entry of entries) {
    if ('skipped' in entry) {
      write(entry);
      continue;
    }
    if ('error' in entry) {
      write(entry);
      failed = true;
      continue;
    }
    const at = entry.line === undefined ? {} : { line: entry.line };
    if (typeof entry.value !== 'object' || entry.value === null || Array.isArray(entry.value)) {
      write({
        error: { code: 'titration-value-invalid', message: 'Each titration must be a JSON object.', ...at },
      });
      failed = true;
      continue;
    }
    if (tablePoints !== undefined && 'error' in tablePoints) {
      write({ error: { ...tablePoints.error, ...at } });
      failed = true;
      continue;
    }
    const input: TitrationInput = tablePoints
      ? { ...(entry.value as TitrationInput), points: tablePoints }
      : (entry.value as TitrationInput);
    const methods: (TitrationMethod | undefined)[] = opts.everyMethod
      ? [...TITRATION_METHODS]
      : [opts.method];
    for (const method of methods) {
      const record: TitrationInput = { ...input };
      if (method !== undefined) record.method = method;
      if (opts.endpointPh !== undefined) record.endpoint_ph = opts.endpointPh;
      let result: ReturnType<typeof titrate>;
      try {
        result = titrate(record, freshTitrationConstants);
      } catch (e) {
        result = { error: toIssue(e) };
      }
      if ('error' in result) {
        failed = true;
        const error = { ...result.error, ...at };
        write(opts.everyMethod ? { method, error } : { error });
      } else write(keepFinite(result as unknown as Record<string, unknown>));
    }
  }
  return failed ? EXIT_ROW_FAILED : EXIT_OK;
}
