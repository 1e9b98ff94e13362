/**
 * `tufa solve`: JSON Lines in, one JSON object per line out, in order; or `--csv FILE` in and CSV
 * out. A line that cannot be solved becomes `{"error": {...}}` and the batch goes on.
 */

import { isSolveError, type SolveResult } from '../chem/api';
import { solve } from '../chem/solve';
import { csvRecord } from '../io/csv-write';
import { type CliIo, EXIT_OK, EXIT_ROW_FAILED, EXIT_USAGE, type InputLine, inputLines, Output } from './io';
import { keepFinite, lineError, parseFields, parseInputLine, pickFields } from './json-lines';
import {
  openTable,
  PASSTHROUGH,
  TABLE_OPTIONS_HELP,
  type TableOptions,
  tableDefaults,
  tableOption,
} from './table';

export const SOLVE_HELP = `tufa solve — the carbonate system of each water, from any two measured parameters

Usage:
  npx tufa solve [--fields LIST] < waters.jsonl > results.jsonl
  npx tufa solve --csv FILE [--fields LIST] [table options] > results.csv

Options:
  --fields LIST           only these outputs, e.g. --fields line,ph_total,pco2_uatm,constants.pk1
                          (names below; "line" is the input line; nested ones with a dot)
  --csv FILE              read a table instead of JSON Lines: the same reader as recompute (BOM,
                          delimiter, decimal comma and Windows-1252 detected; columns named as
                          below or as recompute recognizes them, e.g. "Temp (°C)"; id and label
                          are copied to the output; times and sites are not needed)
${TABLE_OPTIONS_HELP}

Batch contract (JSON Lines): one output line per input line, in order, streamed. A leading BOM
is ignored, a line ends at LF only (CRLF too; a lone CR does not end a line), a blank line gives
{"skipped": {"code": "blank-line", "line": N}}, and a failed line {"error": {"code", "message",
"line"}} (codes include invalid-json, input-too-deep, line-too-long). Every number in the output
is finite: one that overflowed is left out and named in warnings (value-not-finite).

Input: one JSON object per line (or a table whose header row uses the same names).
  temperature_c          required, °C
  salinity               practical salinity (required for the saline model)
  pressure_dbar          applied pressure, default 0
  two or more of:
    alkalinity_umol_kg   total alkalinity, µmol/kg
    dic_umol_kg          dissolved inorganic carbon, µmol/kg
    ph                   pH on ph_scale (total default; free, seawater, nbs)
    pco2_uatm, fco2_uatm, co2_umol_kg   (one family: never a pair on their own)
    hco3_umol_kg, co3_umol_kg
  optional: phosphate_umol_kg silicate_umol_kg ammonia_umol_kg sulfide_umol_kg calcium_umol_kg
            carbonic_constants (auto | lueker2000 | millero2010)   boron_total (lee2010 | uppstrom1974)
            fluoride_constant (perezfraga1987 | dicksonriley1979)
            output_temperature_c output_pressure_dbar   pair (e.g. "ph+alkalinity_umol_kg")
            root (high-ph | low-ph: which root of a two-root pair is reported first)
            uncertainty: {"<input key>": standard uncertainty, ..., "constants": true} (JSON only)
              adds "uncertainty": {"<output>": {standard_uncertainty, dominant_input, contributions}}
  model                  saline | fresh | auto (default). auto: fresh below salinity 2, from salinity,
                         else specific conductance, ionic strength or TDS; S 0.5–5 warns (brackish);
                         below S 2 without major ions the saline constants are blended in (no jump at 2)
  fresh water (ph is the activity pH, ph_scale nbs, unless ph_scale is given):
    alkalinity_mg_l_caco3 | alkalinity_meq_l | alkalinity_dkh   (instead of alkalinity_umol_kg)
    calcium_mg_l magnesium_mg_l sodium_mg_l potassium_mg_l chloride_mg_l sulfate_mg_l
    ionic_strength_mol_kg specific_conductance_us_cm (at 25 °C) tds_mg_l
      ionic strength from, in order: the major ions, the value given, conductance, TDS
    air_pco2_uatm (partial pressure, default 420)   activity_model (davies | debye-huckel | truesdell-jones)
    conductance_factor (russell-1976 | griffin-jurinak-1973)   dolomite_form (ordered | disordered)

Output (at output conditions): alkalinity_umol_kg dic_umol_kg ph_total ph_free ph_seawater ph_nbs
  pco2_uatm fco2_uatm co2_umol_kg hco3_umol_kg co3_umol_kg omega_calcite omega_aragonite
  revelle_factor constants model model_reason formulations warnings pair [alternatives] [misfit]
  fresh model adds: ph (activity) ionic_strength_mol_kg ionic_strength_method activity_coefficients
    constants_infinite_dilution (the constants above are conditional, activity-corrected)
    saturation_index_calcite/_aragonite/_dolomite ph_saturation_calcite langelier_index ryznar_index
    ccpp_mg_l_caco3 ph_after_ccpp charge_balance_error_percent pco2_excess_ratio air_pco2_uatm
    ph_air_equilibrium dic_air_equilibrium_umol_kg alkalinity_{mmol_kg,mmol_l,meq_l,mg_l_caco3,
    mg_l_hco3,ppm_caco3,dkh} treatment_caution (omega_* are null without calcium)
  A failed line: {"error": {"code": "...", "message": "...", "line": N}}.

Exit status: 0 every line solved (blank lines skipped), 1 some line failed, 2 unusable arguments.

Example:
  echo '{"temperature_c":25,"salinity":35,"alkalinity_umol_kg":2300,"dic_umol_kg":2000}' \\
    | npx tufa solve --fields ph_total,pco2_uatm,omega_aragonite
`;

/** Scalar outputs written as CSV columns, in this order. */
const CSV_OUTPUTS = [
  'alkalinity_umol_kg',
  'dic_umol_kg',
  'ph_total',
  'ph_free',
  'ph_seawater',
  'ph_nbs',
  'pco2_uatm',
  'fco2_uatm',
  'co2_umol_kg',
  'hco3_umol_kg',
  'co3_umol_kg',
  'omega_calcite',
  'omega_aragonite',
  'revelle_factor',
] as const;
/** Fresh-model columns (empty for saline rows and where calcium, magnesium or ions were not given). */
const CSV_FRESH = [
  'ph',
  'ionic_strength_mol_kg',
  'ionic_strength_method',
  'saturation_index_calcite',
  'saturation_index_aragonite',
  'saturation_index_dolomite',
  'ph_saturation_calcite',
  'langelier_index',
  'ryznar_index',
  'ccpp_mg_l_caco3',
  'charge_balance_error_percent',
  'pco2_excess_ratio',
  'ph_air_equilibrium',
  'alkalinity_meq_l',
  'alkalinity_mg_l_caco3',
  'alkalinity_dkh',
] as const;
const CSV_CONSTANTS = ['pk0', 'pk1', 'pk2', 'pkw', 'pkb', 'pksp_calcite', 'pksp_aragonite'] as const;
export async function runSolve(args: string[], io: CliIo): Promise<number> {
  let file: string | undefined;
  let fields: string[][] | undefined;
  const table = tableDefaults();
  for (let i = 0; i < args.length; i++) {
    const a = args[i]!;
    let problem: string | undefined;
    if (a === '--help' || a === '-h') {
      io.stdout.write(SOLVE_HELP);
      return EXIT_OK;
    } else if (a === '--csv') {
      file = args[++i];
      if (file === undefined) problem = '--csv needs a file name';
    } else if (a === '--fields') {
      const f = parseFields(args[++i]);
      if (typeof f === 'string') problem = f;
      else fields = f;
    } else {
      const used = tableOption(args, i, table);
      if (typeof used === 'string') problem = used;
      else if (used === 0) problem = `unknown argument ${a}`;
      else i += used - 1;
    }
    if (problem !== undefined) {
      io.stderr.write(`tufa solve: ${problem}\nRun "npx tufa solve --help" for usage.\n`);
      return EXIT_USAGE;
    }
  }
  const seen = new Set<string>();
  const code =
    file !== undefined ? await solveCsv(file, table, io, fields) : await solveJsonLines(io, fields, seen);
  if (fields && file === undefined) {
    const never = fields.map((f) => f.join('.')).filter((f) => !seen.has(f));
    if (never.length > 0)
      io.stderr.write(`tufa solve: no result had ${never.join(', ')} (see --help for the output names)\n`);
  }
  return code;
}

/** One input line's output line (without the line end): the result, narrowed to `fields` if given. */
export function solveLine(
  l: InputLine,
  fields: readonly string[][] | undefined,
  seen: Set<string>,
): { text: string; failed: boolean } {
  const parsed = parseInputLine(l);
  if (!('value' in parsed)) return { text: JSON.stringify(parsed), failed: 'error' in parsed };
  let result: SolveResult;
  try {
    result = solve(parsed.value);
  } catch (e) {
    return {
      text: JSON.stringify(lineError('internal-error', String((e as Error).message ?? e), l.line)),
      failed: true,
    };
  }
  if (isSolveError(result))
    return { text: JSON.stringify({ error: { ...result.error, line: l.line } }), failed: true };
  // Narrowed first, so only what is written is checked (a left-out value is named in `warnings`).
  const all = result as unknown as Record<string, unknown>;
  return {
    text: JSON.stringify(keepFinite(fields ? pickFields(all, fields, l.line, seen) : all)),
    failed: false,
  };
}

async function solveJsonLines(
  io: CliIo,
  fields: readonly string[][] | undefined,
  seen: Set<string>,
): Promise<number> {
  let failed = false;
  const out = new Output(io.stdout);
  for await (const batch of inputLines(io.stdin)) {
    for (const l of batch) {
      const r = solveLine(l, fields, seen);
      if (r.failed) failed = true;
      if (out.add(`${r.text}\n`)) await out.flush();
    }
  }
  await out.flush();
  return failed ? EXIT_ROW_FAILED : EXIT_OK;
}

async function solveCsv(
  file: string,
  o: TableOptions,
  io: CliIo,
  fields: readonly string[][] | undefined,
): Promise<number> {
  let failed = false;
  const table = await openTable(
    file,
    o,
    (issue) => {
      if (issue.code !== 'csv-not-utf8') failed = true;
      io.stderr.write(`tufa solve: line ${issue.row}: ${issue.code}: ${issue.message}\n`);
    },
    { limits: false },
  );
  if (typeof table === 'string') {
    io.stderr.write(`tufa solve: ${table}\n`);
    return EXIT_USAGE;
  }
  const names = fields?.map((f) => f.join('.'));
  const columns = names ?? [...CSV_OUTPUTS, ...CSV_CONSTANTS.map((k) => `constants.${k}`), ...CSV_FRESH];
  const out = new Output(io.stdout);
  out.add(
    csvLine([
      ...PASSTHROUGH,
      'line',
      ...(names ?? [...CSV_OUTPUTS, ...CSV_CONSTANTS, ...CSV_FRESH]),
      ...(names ? [] : ['model', 'pair', 'warnings']),
      'error_code',
      'error_message',
    ]),
  );
  const blank = columns.map(() => '');
  const seen = new Set<string>();
  for await (const batch of table.rows)
    for (const row of batch) {
      const pass = PASSTHROUGH.map((k) => row.passthrough[k]);
      const r: SolveResult =
        row.errors.length > 0
          ? { error: { code: row.errors[0]!.code, message: row.errors.map((e) => e.message).join(' ') } }
          : solve(row.input);
      let line: string;
      if (isSolveError(r)) {
        failed = true;
        line = csvLine([
          ...pass,
          row.line,
          ...blank,
          ...(names ? [] : ['', '', '']),
          r.error.code,
          r.error.message,
        ]);
      } else {
        const finite = keepFinite(r as unknown as Record<string, unknown>);
        const picked = pickFields(
          finite,
          columns.map((c) => c.split('.')),
          row.line,
          seen,
        );
        line = csvLine([
          ...pass,
          row.line,
          ...columns.map((c) => picked[c]),
          ...(names
            ? []
            : [r.model, r.pair.join('+'), r.warnings.map((w) => `${w.code}: ${w.message}`).join(' | ')]),
          '',
          '',
        ]);
      }
      if (out.add(line)) await out.flush();
    }
  await out.flush();
  return failed ? EXIT_ROW_FAILED : EXIT_OK;
}

/** One CSV line; numbers in full precision, absent values as empty fields. */
function csvLine(values: readonly unknown[]): string {
  return `${csvRecord(values.map((v) => (v === undefined || v === null ? '' : String(v))))}\r\n`;
}
