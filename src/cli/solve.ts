/**
 * `tufa solve`: JSON Lines in, one JSON object per line out, in order; or `--csv FILE` in and CSV
 * out. A line that cannot be solved becomes `{"error": {...}}` and the batch goes on.
 */

import { readFileSync } from 'node:fs';
import { createInterface } from 'node:readline';
import { isSolveError, type SolveResult } from '../chem/api';
import { KNOWN_INPUT_KEYS } from '../chem/input';
import { solve } from '../chem/solve';
import { splitRecords, stripBom } from '../io/csv-parse';
import { csvRecord } from '../io/csv-write';
import { type CliIo, EXIT_OK, EXIT_ROW_FAILED, EXIT_USAGE } from './io';

export const SOLVE_HELP = `tufa solve — the carbonate system of each water, from any two measured parameters

Usage:
  npm run -s tufa -- solve < waters.jsonl > results.jsonl
  npm run -s tufa -- solve --csv waters.csv > results.csv

Input: one JSON object per line (or a CSV whose header row uses the same names).
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
  A failed line: {"error": {"code": "...", "message": "..."}}.

Exit status: 0 every line solved, 1 some line failed, 2 unusable arguments.

Example:
  echo '{"temperature_c":25,"salinity":35,"alkalinity_umol_kg":2300,"dic_umol_kg":2000}' \\
    | npm run -s tufa -- solve
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
const CSV_PASSTHROUGH = ['id', 'label'] as const;
/** Keys whose CSV cells are text; every other known key is a number. */
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
  ...CSV_PASSTHROUGH,
  'notes',
]);

export async function runSolve(args: string[], io: CliIo): Promise<number> {
  if (args.includes('--help') || args.includes('-h')) {
    io.stdout.write(SOLVE_HELP);
    return EXIT_OK;
  }
  const csvAt = args.indexOf('--csv');
  const unknown = args.filter((a, i) => a !== '--csv' && !(csvAt >= 0 && i === csvAt + 1));
  if (unknown.length > 0 || (csvAt >= 0 && args[csvAt + 1] === undefined)) {
    io.stderr.write(
      unknown.length > 0
        ? `tufa solve: unknown argument ${unknown[0]}\n`
        : 'tufa solve: --csv needs a file name\n',
    );
    io.stderr.write('Run "npm run -s tufa -- solve --help" for usage.\n');
    return EXIT_USAGE;
  }
  if (csvAt >= 0) return solveCsv(args[csvAt + 1]!, io);
  return solveJsonLines(io);
}

async function solveJsonLines(io: CliIo): Promise<number> {
  let failed = false;
  const lines = createInterface({ input: io.stdin, crlfDelay: Number.POSITIVE_INFINITY });
  for await (const line of lines) {
    if (line.trim() === '') continue;
    let result: SolveResult;
    try {
      result = solve(JSON.parse(line));
    } catch (e) {
      result = { error: { code: 'invalid-json', message: `The line is not JSON: ${(e as Error).message}` } };
    }
    if (isSolveError(result)) failed = true;
    io.stdout.write(`${JSON.stringify(result)}\n`);
  }
  return failed ? EXIT_ROW_FAILED : EXIT_OK;
}

function solveCsv(file: string, io: CliIo): number {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (e) {
    io.stderr.write(`tufa solve: cannot read ${file}: ${(e as Error).message}\n`);
    return EXIT_USAGE;
  }
  // Plain RFC 4180 with the contract's own column names: comma-separated, BOM tolerated.
  const [header, ...rows] = splitRecords(stripBom(text).text, ',').records;
  if (!header) {
    io.stderr.write(`tufa solve: ${file} has no header row\n`);
    return EXIT_USAGE;
  }
  const names = header.map((h) => h.trim());
  io.stdout.write(
    csvLine([
      ...CSV_PASSTHROUGH,
      ...CSV_OUTPUTS,
      ...CSV_CONSTANTS,
      ...CSV_FRESH,
      'model',
      'pair',
      'warnings',
      'error_code',
      'error_message',
    ]),
  );
  let failed = false;
  for (const cells of rows) {
    const input: Record<string, unknown> = {};
    names.forEach((name, i) => {
      const cell = (cells[i] ?? '').trim();
      if (cell === '') return;
      input[name] = TEXT_KEYS.has(name) || !KNOWN_INPUT_KEYS.has(name) ? cell : cellNumber(cell);
    });
    const r = solve(input);
    const pass = CSV_PASSTHROUGH.map((k) => input[k]);
    if (isSolveError(r)) {
      failed = true;
      io.stdout.write(
        csvLine([
          ...pass,
          ...CSV_OUTPUTS.map(() => ''),
          ...CSV_CONSTANTS.map(() => ''),
          ...CSV_FRESH.map(() => ''),
          '',
          '',
          '',
          r.error.code,
          r.error.message,
        ]),
      );
      continue;
    }
    io.stdout.write(
      csvLine([
        ...pass,
        ...CSV_OUTPUTS.map((k) => r[k]),
        ...CSV_CONSTANTS.map((k) => r.constants[k]),
        ...CSV_FRESH.map((k) => r[k]),
        r.model,
        r.pair.join('+'),
        r.warnings.map((w) => `${w.code}: ${w.message}`).join(' | '),
        '',
        '',
      ]),
    );
  }
  return failed ? EXIT_ROW_FAILED : EXIT_OK;
}

/** One CSV line; numbers in full precision, absent values as empty fields. */
function csvLine(values: readonly unknown[]): string {
  return `${csvRecord(values.map((v) => (v === undefined || v === null ? '' : String(v))))}\r\n`;
}

/** A CSV cell as a number; text that is not one stays text so the solver reports `not-a-number`. */
function cellNumber(cell: string): number | string {
  const n = Number(cell);
  return Number.isFinite(n) ? n : cell;
}
