/**
 * `tufa convert`: one value (or a column of values on stdin) from one unit to another, and
 * salinity ↔ conductance ↔ density ↔ specific gravity of a water.
 * Errors print as `error [code]: message`; validity warnings as `warning [code]: message`.
 */

import { type Issue, TufaError, toIssue } from '../chem/errors';
import {
  type CompensationMethod,
  conductivityAtTemperature,
  conductivityFromSalinity,
  LINEAR_ALPHA_PER_C,
  salinityFromConductivity,
  salinityFromSpecificConductance,
  specificConductanceAt25,
  specificConductanceFromSalinity,
} from '../chem/seawater/conductance';
import { densityOneAtmEos80, eos80Validity, t68FromT90 } from '../chem/seawater/eos80';
import { pss78Validity } from '../chem/seawater/pss78';
import {
  salinityFromDensity,
  salinityFromSpecificGravity,
  specificGravityFromSalinity,
} from '../chem/seawater/specific-gravity';
import {
  ALKALINITY_UNITS,
  CONCENTRATION_UNITS,
  convertAlkalinity,
  convertConcentration,
  isAlkalinityUnit,
  isConcentrationUnit,
  SPECIES,
  type SpeciesName,
} from '../chem/units';

/** The streams `convert` uses; the project's `ConvertIo` (./io.ts) fits it. */
export interface ConvertIo {
  stdin: AsyncIterable<string | Uint8Array>;
  stdout: { write(s: string): unknown };
  stderr: { write(s: string): unknown };
}

export const WATER_QUANTITIES = ['salinity', 'sc25_us_cm', 'cond_us_cm', 'density_kg_m3', 'sg'] as const;
type WaterQuantity = (typeof WATER_QUANTITIES)[number];

export const CONVERT_HELP = `tufa convert — change the unit of a value, or turn salinity, conductance and density into one another

Usage:
  tufa convert <value> <from> <to> [options]
  tufa convert - <from> <to> [options]     convert every number read from stdin, one result a line

Alkalinity units (default quantity):
  ${ALKALINITY_UNITS.join(', ')}
Concentration units (with --ion):
  ${CONCENTRATION_UNITS.join(', ')}
Water properties (through PSS-78 and EOS-80):
  salinity        practical salinity (PSS-78; below 2 the Hill et al. 1986 extension)
  sc25_us_cm      specific conductance at 25 °C, µS/cm
  cond_us_cm      conductivity at --temp, µS/cm
  density_kg_m3   density at --temp and one atmosphere, kg/m3 (EOS-80)
  sg              specific gravity: density at --temp over pure water at --sg-ref

Options:
  --temp <°C>         water temperature (default 25)
  --sal <S>           salinity, sets the density used for per-litre units (default 0)
  --density <kg/m3>   density to use for per-litre units instead of --sal and --temp
  --ion <name>        convert a concentration of ${Object.keys(SPECIES).join(', ')}
  --sg-ref <°C>       reference temperature of the specific gravity (default 25; 60 °F is 15.56)
  --comp <method>     cond_us_cm ↔ sc25_us_cm: linear (default, ${LINEAR_ALPHA_PER_C * 100} %/°C, common practice)
                      or pss78 (exact for seawater composition)
  --alpha <1/°C>      slope of the linear compensation (default ${LINEAR_ALPHA_PER_C})
  --json              print one JSON object a line
  -h, --help          this text

Examples:
  tufa convert 7 dkh mg_l_caco3
  tufa convert 2300 umol_kg meq_l --sal 35 --temp 25
  tufa convert 52 mg_l mmol_l --ion calcium
  tufa convert 1.0245 sg salinity --temp 24 --sg-ref 25
  tufa convert 850 cond_us_cm sc25_us_cm --temp 11
`;

interface Options {
  temp: number;
  sal: number;
  density?: number;
  ion?: SpeciesName;
  sgRef: number;
  comp: CompensationMethod;
  alpha: number;
  json: boolean;
}

class UsageError extends Error {}

function parseNumber(s: string | undefined, what: string): number {
  if (s === undefined) throw new UsageError(`${what} needs a value.`);
  const v = Number(s.trim().replace(',', '.'));
  if (s.trim() === '' || !Number.isFinite(v))
    throw new TufaError('bad-number', `${what}: "${s}" is not a number.`);
  return v;
}

/** An option's number within the range where the formulations mean something, else a coded refusal. */
function inRange(v: number, lo: number, hi: number, code: string, what: string, unit: string): number {
  const u = unit === '' ? '' : ` ${unit}`;
  if (v < lo || v > hi) throw new TufaError(code, `${what} ${v}${u} is outside ${lo}–${hi}${u}.`);
  return v;
}

function parseArgs(args: string[]): { positional: string[]; opts: Options; help: boolean } {
  const opts: Options = {
    temp: 25,
    sal: 0,
    sgRef: 25,
    comp: 'linear',
    alpha: LINEAR_ALPHA_PER_C,
    json: false,
  };
  const positional: string[] = [];
  let help = false;
  for (let i = 0; i < args.length; i++) {
    const a = args[i]!;
    const next = (): string | undefined => args[++i];
    switch (a) {
      case '-h':
      case '--help':
        help = true;
        break;
      case '--temp':
        opts.temp = inRange(
          parseNumber(next(), '--temp'),
          -5,
          100,
          'temperature-out-of-range',
          '--temp',
          '°C',
        );
        break;
      case '--sal':
        opts.sal = inRange(parseNumber(next(), '--sal'), 0, 70, 'salinity-out-of-range', '--sal', '');
        break;
      case '--density':
        opts.density = inRange(
          parseNumber(next(), '--density'),
          900,
          1300,
          'density-out-of-range',
          '--density',
          'kg/m3',
        );
        break;
      case '--sg-ref':
        opts.sgRef = inRange(
          parseNumber(next(), '--sg-ref'),
          -5,
          100,
          'temperature-out-of-range',
          '--sg-ref',
          '°C',
        );
        break;
      case '--alpha':
        opts.alpha = inRange(parseNumber(next(), '--alpha'), 0, 0.1, 'alpha-out-of-range', '--alpha', '1/°C');
        break;
      case '--comp': {
        const m = next();
        if (m !== 'linear' && m !== 'pss78') throw new UsageError('--comp takes linear or pss78.');
        opts.comp = m;
        break;
      }
      case '--ion': {
        const n = next();
        if (n === undefined || !(n in SPECIES)) {
          throw new UsageError(`--ion takes one of ${Object.keys(SPECIES).join(', ')}.`);
        }
        opts.ion = n as SpeciesName;
        break;
      }
      case '--json':
        opts.json = true;
        break;
      default:
        if (a.startsWith('--')) throw new UsageError(`Unknown option ${a}.`);
        positional.push(a);
    }
  }
  return { positional, opts, help };
}

function isWater(u: string): u is WaterQuantity {
  return (WATER_QUANTITIES as readonly string[]).includes(u);
}

function toSalinity(v: number, q: WaterQuantity, o: Options): number {
  switch (q) {
    case 'salinity':
      if (!(v >= 0)) throw new TufaError('bad-salinity', `Salinity must be ≥ 0 (got ${v}).`, 'salinity');
      return v;
    case 'sc25_us_cm':
      return salinityFromSpecificConductance(v);
    case 'cond_us_cm':
      return salinityFromConductivity(v, o.temp);
    case 'density_kg_m3':
      return salinityFromDensity(v, o.temp);
    case 'sg':
      return salinityFromSpecificGravity(v, o.temp, o.sgRef);
  }
}

function fromSalinity(s: number, q: WaterQuantity, o: Options): number {
  switch (q) {
    case 'salinity':
      return s;
    case 'sc25_us_cm':
      return specificConductanceFromSalinity(s);
    case 'cond_us_cm':
      return conductivityFromSalinity(s, o.temp);
    case 'density_kg_m3':
      return densityOneAtmEos80(s, t68FromT90(o.temp));
    case 'sg':
      return specificGravityFromSalinity(s, o.temp, o.sgRef);
  }
}

interface Converted {
  value: number;
  result: number;
  note: string;
  warnings: Issue[];
}

function convertWater(v: number, from: WaterQuantity, to: WaterQuantity, o: Options): Converted {
  // Conductivity at temperature ↔ specific conductance is a compensation, not a salinity question.
  if ((from === 'cond_us_cm' && to === 'sc25_us_cm') || (from === 'sc25_us_cm' && to === 'cond_us_cm')) {
    const result =
      from === 'cond_us_cm'
        ? specificConductanceAt25(v, o.temp, o.comp, o.alpha)
        : conductivityAtTemperature(v, o.temp, o.comp, o.alpha);
    const note =
      o.comp === 'linear'
        ? `linear compensation ${(o.alpha * 100).toFixed(2)} %/°C (common practice) at ${o.temp} °C`
        : `PSS-78 compensation (seawater composition) at ${o.temp} °C`;
    return { value: v, result, note, warnings: [] };
  }
  const s = toSalinity(v, from, o);
  const result = fromSalinity(s, to, o);
  const usesPss = [from, to].some((q) => q === 'sc25_us_cm' || q === 'cond_us_cm');
  const usesEos = [from, to].some((q) => q === 'density_kg_m3' || q === 'sg');
  const warnings = [
    // Ranges are checked on the reading's own (ITS-90) temperature; IPTS-68 differs by < 0.01 °C.
    ...(usesPss ? pss78Validity(s, from === 'sc25_us_cm' || to === 'sc25_us_cm' ? 25 : o.temp, 0) : []),
    ...(usesEos ? eos80Validity(s, o.temp, 0) : []),
  ];
  const parts = [`salinity ${s.toPrecision(6)}`];
  if (usesPss) parts.push('PSS-78, seawater composition assumed');
  if (usesEos) parts.push(`EOS-80 at ${o.temp} °C`);
  if (from === 'sg' || to === 'sg') parts.push(`SG ${o.temp}/${o.sgRef} °C`);
  return { value: v, result, note: parts.join('; '), warnings };
}

function densityKgLFor(o: Options): { rho: number; note: string; warnings: Issue[] } {
  if (o.density !== undefined) {
    return { rho: o.density / 1000, note: `density ${o.density} kg/m3 (given)`, warnings: [] };
  }
  const rho = densityOneAtmEos80(o.sal, t68FromT90(o.temp));
  return {
    rho: rho / 1000,
    note: `density ${rho.toFixed(3)} kg/m3 (EOS-80, S ${o.sal}, ${o.temp} °C)`,
    warnings: eos80Validity(o.sal, o.temp, 0),
  };
}

function convertOne(v: number, from: string, to: string, o: Options): Converted {
  if (isWater(from) || isWater(to)) {
    if (!isWater(from) || !isWater(to)) {
      throw new UsageError(`${isWater(from) ? from : to} converts only to ${WATER_QUANTITIES.join(', ')}.`);
    }
    return convertWater(v, from, to, o);
  }
  const d = densityKgLFor(o);
  if (o.ion !== undefined) {
    if (!isConcentrationUnit(from) || !isConcentrationUnit(to)) {
      throw new UsageError(`With --ion the units are ${CONCENTRATION_UNITS.join(', ')}.`);
    }
    const result = convertConcentration(v, from, to, SPECIES[o.ion], d.rho);
    return { value: v, result, note: `${o.ion}; ${d.note}`, warnings: d.warnings };
  }
  if (!isAlkalinityUnit(from) || !isAlkalinityUnit(to)) {
    throw new UsageError(
      `Unknown unit "${isAlkalinityUnit(from) ? to : from}". Alkalinity units: ${ALKALINITY_UNITS.join(', ')} ` +
        '(add --ion for a concentration).',
    );
  }
  const result = convertAlkalinity(v, from, to, d.rho);
  return { value: v, result, note: `alkalinity; ${d.note}`, warnings: d.warnings };
}

function format(x: number): string {
  if (x === 0) return '0';
  const a = Math.abs(x);
  return a >= 1e-3 && a < 1e7 ? String(Number(x.toPrecision(7))) : x.toExponential(6);
}

async function readNumbers(stdin: ConvertIo['stdin']): Promise<string[]> {
  let text = '';
  const dec = new TextDecoder();
  for await (const chunk of stdin)
    text += typeof chunk === 'string' ? chunk : dec.decode(chunk, { stream: true });
  return text.split(/[\s;]+/).filter((s) => s !== '');
}

function writeIssue(io: ConvertIo, kind: 'error' | 'warning', issue: Issue): void {
  io.stderr.write(`${kind} [${issue.code}]: ${issue.message}\n`);
}

/** Runs `tufa convert`; returns the exit code (0 done, 1 bad value, 2 bad usage). */
export async function runConvert(args: string[], io: ConvertIo): Promise<number> {
  let parsed: ReturnType<typeof parseArgs>;
  try {
    parsed = parseArgs(args);
  } catch (e) {
    if (e instanceof UsageError) {
      io.stderr.write(`error [usage]: ${e.message} (tufa convert --help)\n`);
      return 2;
    }
    writeIssue(io, 'error', toIssue(e));
    return 1;
  }
  const { positional, opts, help } = parsed;
  if (help) {
    io.stdout.write(CONVERT_HELP);
    return 0;
  }
  if (positional.length !== 3) {
    io.stderr.write('error [usage]: tufa convert <value> <from> <to> (tufa convert --help)\n');
    return 2;
  }
  const [raw, from, to] = positional as [string, string, string];
  const inputs = raw === '-' ? await readNumbers(io.stdin) : [raw];
  let code = 0;
  const seen = new Set<string>();
  for (const s of inputs) {
    try {
      const c = convertOne(parseNumber(s, 'value'), from, to, opts);
      if (!Number.isFinite(c.result))
        throw new TufaError('result-not-finite', `${s} ${from} is too large to convert to ${to}.`);
      if (opts.json) {
        io.stdout.write(
          `${JSON.stringify({ value: c.value, from, to, result: c.result, note: c.note, warnings: c.warnings })}\n`,
        );
      } else {
        io.stdout.write(`${format(c.value)} ${from} = ${format(c.result)} ${to}   (${c.note})\n`);
      }
      for (const w of c.warnings) {
        if (seen.has(w.message)) continue;
        seen.add(w.message);
        writeIssue(io, 'warning', w);
      }
    } catch (e) {
      if (e instanceof UsageError) {
        io.stderr.write(`error [usage]: ${e.message} (tufa convert --help)\n`);
        return 2;
      }
      const issue = toIssue(e);
      if (opts.json) io.stdout.write(`${JSON.stringify({ value: s, from, to, error: issue })}\n`);
      writeIssue(io, 'error', issue);
      code = 1;
    }
  }
  return code;
}
