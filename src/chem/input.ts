/**
 * Reading a solve request: the snake_case JSON of `src/chem/api.ts` checked and turned into
 * internal units. Every refusal is a TufaError with a stable code, so the CLI, the app and the
 * tests report the same thing. Values outside a formulation's validity range are not refused
 * here: the constant sets warn about those. Refused are values no water can have.
 */

import {
  CARBONATE_KEYS,
  CARBONIC_CONSTANT_CHOICES,
  type CarbonateKey,
  type CarbonicConstants,
  type ModelChoice,
} from './api';
import { fail, type Issue, warning } from './errors';
import { alkalinityFromFieldUnits, FRESH_INPUT_KEYS } from './fresh/request';
import { MOLAR_MASS_G_PER_MOL } from './physical';
import { numberAt, optionAt } from './read-fields';
import { salinityFromSpecificConductance } from './seawater/conductance';
import { addTradeTotals, TRADE_INPUT_KEYS } from './trades/solveOutputs';
import type { MinorTotals, PhScale } from './types';
import { densityKgL } from './units';

export interface SolveRequest {
  temperatureC: number;
  /** Practical salinity; undefined when not given (the fresh model may not need it). */
  salinity: number | undefined;
  pressureDbar: number;
  model: ModelChoice;
  /** Measured carbonate parameters in input units (µmol/kg, µatm, pH on `phScale`). */
  measured: Partial<Record<CarbonateKey, number>>;
  phScale: PhScale;
  /** Minor acid totals, mol/kg. */
  minor: MinorTotals;
  /** Measured calcium, mol/kg, when given. */
  calciumMolKg: number | undefined;
  carbonic: CarbonicConstants;
  boron: 'lee2010' | 'uppstrom1974';
  fluoride: 'perezfraga1987' | 'dicksonriley1979';
  outTemperatureC: number;
  outPressureDbar: number;
  /** The pair to solve from when more than two parameters are given. */
  pair: [CarbonateKey, CarbonateKey] | undefined;
  /** Which root of a two-root pair is reported first. */
  root: 'high-ph' | 'low-ph';
  warnings: Issue[];
  /** The input as given, for capabilities that read further keys. */
  raw: Readonly<Record<string, unknown>>;
}

/**
 * Every key the solve contract knows. Capabilities that read more keys add them here, so a typo
 * in a column name becomes a warning instead of a silently ignored value.
 */
export const KNOWN_INPUT_KEYS: ReadonlySet<string> = new Set([
  'temperature_c',
  'salinity',
  'pressure_dbar',
  'model',
  ...CARBONATE_KEYS,
  'ph_scale',
  'phosphate_umol_kg',
  'silicate_umol_kg',
  'ammonia_umol_kg',
  'sulfide_umol_kg',
  'calcium_umol_kg',
  'carbonic_constants',
  'boron_total',
  'fluoride_constant',
  'output_temperature_c',
  'output_pressure_dbar',
  ...FRESH_INPUT_KEYS,
  ...TRADE_INPUT_KEYS,
  'pair',
  'root',
  // Standard uncertainties to propagate (read by solve(), see uncertainty/solveUncertainty.ts).
  'uncertainty',
  // Free-text keys that travel with a row (CSV ids, notes) and are passed through untouched.
  'id',
  'label',
  'notes',
]);

/** The CO2 family: three expressions of one quantity. */
export const CO2_FAMILY: ReadonlySet<CarbonateKey> = new Set(['pco2_uatm', 'fco2_uatm', 'co2_umol_kg']);

/** Priority for choosing the pair when more than two parameters are measured: conserved first. */
const PAIR_PRIORITY: readonly CarbonateKey[] = [
  'alkalinity_umol_kg',
  'dic_umol_kg',
  'ph',
  'pco2_uatm',
  'fco2_uatm',
  'co2_umol_kg',
  'co3_umol_kg',
  'hco3_umol_kg',
];

function inRange(key: string, v: number, lo: number, hi: number, code: string, what: string): void {
  if (v < lo || v > hi) fail(code, `${what} ${v} is outside ${lo} to ${hi}: no natural water has it.`, key);
}

export function parseSolveInput(input: unknown): SolveRequest {
  if (typeof input !== 'object' || input === null || Array.isArray(input)) {
    fail('input-not-object', 'Each input must be a JSON object of named values.');
  }
  const raw = input as Record<string, unknown>;
  const warnings: Issue[] = [];
  for (const key of Object.keys(raw)) {
    if (!KNOWN_INPUT_KEYS.has(key)) {
      warnings.push(warning('unknown-key', `The key ${key} is not used; check its spelling.`, key));
    }
  }

  const temperatureC = numberAt(raw, 'temperature_c');
  if (temperatureC === undefined) fail('missing-temperature', 'temperature_c is required.', 'temperature_c');
  inRange('temperature_c', temperatureC, -5, 100, 'temperature-out-of-range', 'Temperature (°C)');

  const salinity = numberAt(raw, 'salinity');
  if (salinity !== undefined) inRange('salinity', salinity, 0, 70, 'salinity-out-of-range', 'Salinity');

  const pressureDbar = numberAt(raw, 'pressure_dbar') ?? 0;
  inRange('pressure_dbar', pressureDbar, 0, 12000, 'pressure-out-of-range', 'Pressure (dbar)');

  const outTemperatureC = numberAt(raw, 'output_temperature_c') ?? temperatureC;
  inRange(
    'output_temperature_c',
    outTemperatureC,
    -5,
    100,
    'temperature-out-of-range',
    'Output temperature (°C)',
  );
  const outPressureDbar = numberAt(raw, 'output_pressure_dbar') ?? pressureDbar;
  inRange(
    'output_pressure_dbar',
    outPressureDbar,
    0,
    12000,
    'pressure-out-of-range',
    'Output pressure (dbar)',
  );

  const measured: Partial<Record<CarbonateKey, number>> = {};
  for (const key of CARBONATE_KEYS) {
    const v = numberAt(raw, key);
    if (v === undefined) continue;
    if (key === 'ph') inRange(key, v, 0, 14, 'ph-out-of-range', 'pH');
    else if (key === 'alkalinity_umol_kg') {
      if (v < 0) {
        fail(
          'negative-alkalinity',
          `Alkalinity ${v} µmol/kg is negative: acid waters with mineral acidity are outside this solver.`,
          key,
        );
      }
    } else if (!(v > 0)) fail('non-positive-value', `${key} must be greater than zero, got ${v}.`, key);
    measured[key] = v;
  }

  // Alkalinity in field units (mg/L as CaCO3, meq/L, dKH) becomes µmol/kg with the density of the
  // water (EOS-80 at the given salinity, or the one implied by the specific conductance, else 0).
  const scRaw = raw.specific_conductance_us_cm;
  const salinityForDensity =
    salinity ?? (typeof scRaw === 'number' && scRaw >= 0 ? salinityFromSpecificConductance(scRaw) : 0);
  const field = alkalinityFromFieldUnits(
    raw,
    densityKgL(salinityForDensity, temperatureC),
    measured.alkalinity_umol_kg !== undefined,
  );
  if (field !== undefined) measured.alkalinity_umol_kg = field.umolKg;

  const minorAt = (key: string): number => {
    const v = numberAt(raw, key) ?? 0;
    if (v < 0) fail('negative-value', `${key} cannot be negative, got ${v}.`, key);
    return v * 1e-6;
  };
  const minor: MinorTotals = {
    phosphate: minorAt('phosphate_umol_kg'),
    silicate: minorAt('silicate_umol_kg'),
    ammonia: minorAt('ammonia_umol_kg'),
    sulfide: minorAt('sulfide_umol_kg'),
  };
  addTradeTotals(minor, raw, densityKgL(salinityForDensity, temperatureC));
  const calcium = numberAt(raw, 'calcium_umol_kg');
  if (calcium !== undefined && !(calcium > 0)) {
    fail(
      'non-positive-value',
      `calcium_umol_kg must be greater than zero, got ${calcium}.`,
      'calcium_umol_kg',
    );
  }
  // Calcium in mg/L (how test kits and labs report it): per kg with the density of the water.
  const calciumMgL = numberAt(raw, 'calcium_mg_l');
  if (calciumMgL !== undefined) {
    if (calcium !== undefined) {
      fail('calcium-given-twice', 'Give calcium once: calcium_mg_l or calcium_umol_kg.', 'calcium_mg_l');
    }
    if (!(calciumMgL > 0)) {
      fail(
        'non-positive-value',
        `calcium_mg_l must be greater than zero, got ${calciumMgL}.`,
        'calcium_mg_l',
      );
    }
  }
  const calciumMolKg =
    calcium !== undefined
      ? calcium * 1e-6
      : calciumMgL !== undefined
        ? calciumMgL / 1000 / MOLAR_MASS_G_PER_MOL.Ca / densityKgL(salinityForDensity, temperatureC)
        : undefined;

  const pairRaw = raw.pair;
  let pair: [CarbonateKey, CarbonateKey] | undefined;
  if (pairRaw !== undefined && pairRaw !== null && pairRaw !== '') {
    const parts = typeof pairRaw === 'string' ? pairRaw.split(/[+,;\s]+/) : pairRaw;
    if (
      !Array.isArray(parts) ||
      parts.length !== 2 ||
      !parts.every((p) => (CARBONATE_KEYS as readonly unknown[]).includes(p))
    ) {
      fail('unknown-option', `pair must name two of ${CARBONATE_KEYS.join(', ')}.`, 'pair');
    }
    pair = parts as [CarbonateKey, CarbonateKey];
    for (const p of pair) {
      if (measured[p] === undefined)
        fail('pair-not-given', `pair names ${p}, but no value for it is given.`, 'pair');
    }
  }

  return {
    temperatureC,
    salinity,
    pressureDbar,
    model: optionAt(raw, 'model', ['saline', 'fresh', 'auto'] as const, 'auto'),
    measured,
    phScale: optionAt(raw, 'ph_scale', ['total', 'free', 'seawater', 'nbs'] as const, 'total'),
    minor,
    calciumMolKg,
    carbonic: optionAt(raw, 'carbonic_constants', CARBONIC_CONSTANT_CHOICES, 'auto'),
    boron: optionAt(raw, 'boron_total', ['lee2010', 'uppstrom1974'] as const, 'lee2010'),
    fluoride: optionAt(
      raw,
      'fluoride_constant',
      ['perezfraga1987', 'dicksonriley1979'] as const,
      'perezfraga1987',
    ),
    outTemperatureC,
    outPressureDbar,
    pair,
    root: optionAt(raw, 'root', ['high-ph', 'low-ph'] as const, 'high-ph'),
    warnings,
    raw,
  };
}

/**
 * The pair to solve from: the one asked for, else the first two measured parameters in
 * {@link PAIR_PRIORITY} order that do not both belong to the CO2 family.
 */
export function choosePair(req: SolveRequest): [CarbonateKey, CarbonateKey] {
  const given = PAIR_PRIORITY.filter((k) => req.measured[k] !== undefined);
  if (req.pair) {
    const [a, b] = req.pair;
    if (a === b) fail('pair-not-independent', `pair names ${a} twice.`, 'pair');
    if (CO2_FAMILY.has(a) && CO2_FAMILY.has(b)) sameFamily(a, b);
    return req.pair;
  }
  if (given.length < 2) {
    fail(
      'too-few-parameters',
      `Two carbonate parameters are needed (any two of alkalinity, DIC, pH, pCO2/fCO2/CO2*, HCO3-, CO3--); got ${given.length}.`,
    );
  }
  const first = given[0]!;
  const second = given.slice(1).find((k) => !(CO2_FAMILY.has(first) && CO2_FAMILY.has(k)));
  if (second === undefined) sameFamily(first, given[1]!);
  return [first, second];
}

function sameFamily(a: string, b: string): never {
  return fail(
    'pair-same-family',
    `${a} and ${b} both measure dissolved CO2 (pCO2, fCO2 and CO2* are one quantity): give a second, independent parameter such as alkalinity, DIC or pH.`,
    b,
  );
}
