/**
 * A water inside a plan: its solve input, the solved result, and how much of it there is.
 *
 * The planner works only through `solve()`'s JSON, so it serves whichever model the water uses.
 * Amounts are kept as moles in a known mass of the model's concentration basis: kg of solution in
 * the saline model (stoichiometric constants are per kg of seawater), kg of water in the fresh
 * model. A changed water is written back as a solve input with TA and DIC (the conserved pair) at
 * the water's own temperature and pressure, and solved again.
 */

import { CARBONATE_KEYS, isSolveError, type SolveOutput } from '../api';
import { fail } from '../errors';
import { hasMajorIons } from '../fresh/ionic-strength';
import { salinityFromSpecificConductance } from '../seawater/conductance';
import { solve } from '../solve';
import { densityKgL } from '../units';

export type WaterInput = Readonly<Record<string, unknown>>;

export interface PlanWater {
  /** The water as a solve input at its own conditions. */
  input: WaterInput;
  solved: SolveOutput;
  volumeL: number;
  /** kg of the concentration basis (solution for saline, water for fresh) in `volumeL`. */
  basisKg: number;
}

/** Reference-composition salinity per practical salinity unit: S_R = 35.16504/35 · S_P, g/kg (Millero et al. 2008). */
export const SR_PER_SP = 35.16504 / 35;

/** Keys that describe the carbonate measurement of a sample; a planned water replaces them by TA and DIC. */
const MEASUREMENT_KEYS: readonly string[] = [
  ...CARBONATE_KEYS,
  'alkalinity_mg_l_caco3',
  'alkalinity_meq_l',
  'alkalinity_dkh',
  'pair',
  'root',
  'output_temperature_c',
  'output_pressure_dbar',
];

export const ION_MG_L_KEYS = ['calcium_mg_l', 'sodium_mg_l', 'chloride_mg_l', 'sulfate_mg_l'] as const;

/** Solves or throws the solve's own coded error, so plan errors keep the codes users know. */
export function solveOrFail(input: WaterInput, what: string): SolveOutput {
  const r = solve(input);
  if (isSolveError(r)) fail(r.error.code, `${what}: ${r.error.message}`, r.error.field);
  return r;
}

function numberKey(input: WaterInput, key: string): number | undefined {
  const v = input[key];
  return typeof v === 'number' && Number.isFinite(v) ? v : undefined;
}

/** Salinity for densities: given, else from specific conductance (PSS-78), else 0. */
export function salinityForDensity(input: WaterInput): number {
  const s = numberKey(input, 'salinity');
  if (s !== undefined) return s;
  const sc = numberKey(input, 'specific_conductance_us_cm');
  return sc !== undefined && sc >= 0 ? salinityFromSpecificConductance(sc) : 0;
}

/** kg of solution and kg of the concentration basis per litre of this water (EOS-80 density). */
export function kgPerLitre(input: WaterInput, solved: SolveOutput): { solution: number; basis: number } {
  const s = salinityForDensity(input);
  const rho = densityKgL(s, solved.conditions.temperature_c);
  if (solved.model === 'saline') return { solution: rho, basis: rho };
  const tds = numberKey(input, 'tds_mg_l');
  // The fresh model counts per kg of water: the density less the dissolved solids when known.
  return { solution: rho, basis: tds === undefined ? rho : rho - tds * 1e-6 };
}

/**
 * The amounts of water a plan accepts, in L or kg: from a drop (1 µL) to a large reservoir
 * (10 million m³). Outside, the arithmetic of doses leaves the range of doubles (issue 15 §3).
 */
export const WATER_AMOUNT_RANGE = [1e-6, 1e10] as const;

/** How much water: exactly one of volume_l or mass_kg (of solution). */
export function readQuantity(
  raw: Readonly<Record<string, unknown>>,
  where: string,
): { volumeL?: number; massKg?: number } {
  const v = raw.volume_l;
  const m = raw.mass_kg;
  const given = [v, m].filter((x) => x !== undefined && x !== null && x !== '');
  if (given.length !== 1) {
    fail(
      given.length === 0 ? 'missing-volume' : 'volume-given-twice',
      `${where}: give the amount of water once, as volume_l or mass_kg.`,
      'volume_l',
    );
  }
  const key = v !== undefined && v !== null && v !== '' ? 'volume_l' : 'mass_kg';
  const x = key === 'volume_l' ? v : m;
  if (typeof x !== 'number' || !Number.isFinite(x) || !(x > 0)) {
    fail('bad-volume', `${where}: ${key} must be a number greater than zero, got ${JSON.stringify(x)}.`, key);
  }
  if (x < WATER_AMOUNT_RANGE[0] || x > WATER_AMOUNT_RANGE[1]) {
    fail(
      'volume-out-of-range',
      `${where}: ${key} must be between 1e-6 and 1e10 ${key === 'volume_l' ? 'L (1 µL to 10 million m³)' : 'kg'}, got ${x}.`,
      key,
    );
  }
  return key === 'volume_l' ? { volumeL: x } : { massKg: x };
}

export function planWater(
  input: unknown,
  quantity: { volumeL?: number; massKg?: number },
  what: string,
): PlanWater {
  if (typeof input !== 'object' || input === null || Array.isArray(input)) {
    fail('input-not-object', `${what}: the water must be a JSON object in the solve input format.`, 'water');
  }
  const w = input as WaterInput;
  const solved = solveOrFail(w, what);
  const perL = kgPerLitre(w, solved);
  const volumeL = quantity.volumeL ?? (quantity.massKg ?? 0) / perL.solution;
  return { input: w, solved, volumeL, basisKg: volumeL * perL.basis };
}

/** Totals of a planned water in mol/kg of its basis. */
export interface Totals {
  ta: number;
  dic: number;
  /** Undefined when the water's calcium is not known (a fresh water without calcium). */
  calcium: number | undefined;
}

export function totalsOf(w: PlanWater): Totals {
  const ca = w.solved.totals_umol_kg.calcium;
  const known =
    w.solved.model === 'saline' ||
    numberKey(w.input, 'calcium_umol_kg') !== undefined ||
    numberKey(w.input, 'calcium_mg_l') !== undefined;
  return {
    ta: w.solved.alkalinity_umol_kg * 1e-6,
    dic: w.solved.dic_umol_kg * 1e-6,
    calcium: known && ca > 0 ? ca * 1e-6 : undefined,
  };
}

/**
 * The solve input of a water whose conserved totals are known: measurement keys dropped, TA and
 * DIC (µmol/kg) at the water's own conditions, everything else carried over.
 */
export function inputWithTotals(
  base: WaterInput,
  solved: SolveOutput,
  ta: number,
  dic: number,
): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(base)) if (!MEASUREMENT_KEYS.includes(k)) out[k] = v;
  out.temperature_c = solved.conditions.temperature_c;
  if (solved.conditions.pressure_dbar !== 0 || base.pressure_dbar !== undefined) {
    out.pressure_dbar = solved.conditions.pressure_dbar;
  }
  out.alkalinity_umol_kg = ta * 1e6;
  out.dic_umol_kg = dic * 1e6;
  return out;
}

export function usesMajorIons(input: WaterInput): boolean {
  const ion = (k: string) => numberKey(input, k);
  return hasMajorIons({
    calcium: ion('calcium_mg_l'),
    magnesium: ion('magnesium_mg_l'),
    sodium: ion('sodium_mg_l'),
    potassium: ion('potassium_mg_l'),
    chloride: ion('chloride_mg_l'),
    sulfate: ion('sulfate_mg_l'),
  });
}

/** The pH scale a plan reports and targets for this water: the one it was measured on, else its model's usual one. */
export function phScaleOf(w: PlanWater): 'total' | 'free' | 'seawater' | 'nbs' {
  const s = w.input.ph_scale;
  if (s === 'total' || s === 'free' || s === 'seawater' || s === 'nbs') return s;
  return w.solved.model === 'fresh' ? 'nbs' : 'total';
}

export function phOf(w: PlanWater): number {
  return w.solved[`ph_${phScaleOf(w)}`];
}
