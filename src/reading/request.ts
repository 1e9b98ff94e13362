/**
 * The one function that turns a stored reading into the engine's request. Every consumer — the
 * reading page, the reading form's preview, the planner's "before", the site chart, CSV export,
 * import previews and checks, `tufa recompute` — asks here, so a reading is computed from the
 * same inputs wherever it is looked at.
 *
 * Order of precedence, lowest first: the user's settings, the site's defaults, then what the
 * reading says: its typed values win; a field titration fills alkalinity (and DIC when its method
 * gives it) only where nothing was typed. Every input key records where it came from.
 *
 * Pure: no DOM, no IndexedDB. It reduces the titration with the engine, so it runs in the engine
 * and import workers, the CLI and the tests — not in the page's shell (which asks the worker).
 */

import type { SolveInput } from '../chem/api';
import type { Issue } from '../chem/errors';
import { freshTitrationConstants } from '../chem/titration/reduceTitration';
import { type TitrateOutcome, titrate } from '../chem/titration/titrate';
import type { TitrationInput, TitrationMethod, TitrationResult } from '../chem/titration/types';
import { unitOf } from '../quantities';
import type { MeasuredValue, ReadingDoc, SiteDoc, TitrationRecord } from '../store/schema';
import { DEFAULT_SETTINGS, type Settings } from '../store/settings';

/** Where an input of the engine came from. */
export type InputSource = 'typed' | 'titration' | 'site default' | 'settings';

/** The settings a request depends on (the rest of Settings is presentation). */
export type RequestSettings = Pick<
  Settings,
  'model' | 'ph_scale' | 'carbonic_constants' | 'boron_total' | 'atmospheric_pco2_uatm' | 'ph_uncertainty'
>;

/** The parts of a reading a request is made from (a draft in the form has no id yet). */
export type ReadingFacts = Pick<ReadingDoc, 'values'> & Partial<Pick<ReadingDoc, 'titration'>>;

export interface ReadingRequest {
  /** The engine's solve input, without `uncertainty` (bulk consumers do not want its cost). */
  input: SolveInput;
  /** Standard uncertainties of the inputs (pH from Settings, the titration's own) plus the constants. */
  uncertainty: Record<string, number | boolean>;
  /** Input key → where its value came from. */
  sources: Record<string, InputSource>;
  /** Values whose quantity or unit is not known (reported, never guessed). */
  unknown: string[];
  /** The titration's reduction (or why it failed), when the reading has one. */
  titration?: TitrateOutcome;
}

const SETTING_KEYS = ['model', 'ph_scale', 'carbonic_constants', 'boron_total'] as const;

/** The engine's titration input from the stored record and the reading's temperature and conductance. */
export function titrationInput(
  record: TitrationRecord,
  values: readonly MeasuredValue[],
): TitrationInput | Issue {
  const t = values.find((v) => v.quantity === 'temperature' && v.source === undefined);
  const tUnit = t && unitOf('temperature', t.unit);
  if (!t || !tUnit)
    return {
      code: 'titration-needs-temperature',
      message: 'Enter the sample temperature to reduce the titration.',
    };
  const input: TitrationInput = {
    sample_volume_ml: record.sampleVolumeMl,
    titrant_normality: record.titrantNormality,
    temperature_c: tUnit.toKey(t.value),
    method: (record.method as TitrationMethod | undefined) ?? 'gran',
    points: record.points.map((p) => ({ volume_ml: p.volumeMl, ph: p.ph })),
  };
  if (record.correctionFactor !== undefined) input.titrant_correction_factor = record.correctionFactor;
  if (record.endpointPh !== undefined) input.endpoint_ph = record.endpointPh;
  const k = values.find((v) => v.quantity === 'conductance' && v.source === undefined);
  const kUnit = k && unitOf('conductance', k.unit);
  if (k && kUnit) input.specific_conductance_us_cm = kUnit.toKey(k.value);
  return input;
}

/** Reduces a stored titration with its chosen method (pure; throws nothing). */
export function reduceStoredTitration(
  record: TitrationRecord,
  values: readonly MeasuredValue[],
): TitrateOutcome {
  const ti = titrationInput(record, values);
  return 'code' in ti ? { error: ti } : titrate(ti, freshTitrationConstants);
}

/**
 * Standard uncertainties a titration gives its results: propagated ones when the reduction
 * carries them, else the curve fit's standard errors from its residuals (mmol/L taken as
 * mmol/kg for DIC: the density of fresh water is within 0.3 % of 1 kg/L, a stated approximation).
 */
function titrationUncertainties(r: TitrationResult): { alk?: number; dic?: number } {
  const alk = r.uncertainty?.alkalinity_meq_l?.standard_uncertainty ?? r.fit.details.alkalinity_se_meq_l;
  const dicSe = r.fit.details.dic_se_mmol_l;
  const out: { alk?: number; dic?: number } = {};
  if (alk !== undefined && Number.isFinite(alk) && alk > 0) out.alk = alk;
  if (dicSe !== undefined && Number.isFinite(dicSe) && dicSe > 0) out.dic = dicSe * 1000;
  return out;
}

export function readingRequest(
  reading: ReadingFacts,
  site: Pick<SiteDoc, 'defaults'> | undefined,
  settings: RequestSettings = DEFAULT_SETTINGS,
): ReadingRequest {
  const input: SolveInput = {};
  const sources: Record<string, InputSource> = {};
  const set = (key: string, value: unknown, source: InputSource) => {
    input[key] = value;
    sources[key] = source;
  };
  for (const k of SETTING_KEYS) set(k, settings[k], 'settings');
  const d = site?.defaults ?? {};
  // Every default of the site is an engine key (model, salinity, constants, ...); `units` is display.
  for (const [k, v] of Object.entries(d))
    if (k !== 'units' && v !== undefined && v !== '') set(k, v, 'site default');

  const unknown: string[] = [];
  const carried: { key: string; value: number }[] = [];
  for (const v of reading.values) {
    const u = unitOf(v.quantity, v.unit);
    if (!u || !Number.isFinite(v.value)) {
      unknown.push(`${v.quantity} (${v.unit})`);
      continue;
    }
    // A titration's result carried by a file (no raw points): used like a live reduction.
    if (v.source === 'titration') {
      carried.push({ key: u.key, value: u.toKey(v.value) });
      continue;
    }
    set(u.key, u.toKey(v.value), 'typed');
    for (const [k, o] of Object.entries(u.options ?? {})) set(k, o, 'typed');
  }

  const typed = (prefix: string) =>
    Object.keys(input).some((k) => k.startsWith(prefix) && sources[k] === 'typed');
  const uncertainty: Record<string, number | boolean> = { constants: true };
  let titration: TitrateOutcome | undefined;
  if (reading.titration) {
    titration = reduceStoredTitration(reading.titration, reading.values);
    if (!('error' in titration)) {
      const u = titrationUncertainties(titration);
      if (!typed('alkalinity_')) {
        set('alkalinity_meq_l', titration.alkalinity_meq_l, 'titration');
        if (u.alk !== undefined) uncertainty.alkalinity_meq_l = u.alk;
      }
      if (titration.dic_umol_kg !== undefined && !typed('dic_')) {
        set('dic_umol_kg', titration.dic_umol_kg, 'titration');
        if (u.dic !== undefined) uncertainty.dic_umol_kg = u.dic;
      }
    }
  }
  for (const c of carried) {
    const family = c.key.startsWith('alkalinity_') ? 'alkalinity_' : c.key;
    if (Object.keys(input).some((k) => k.startsWith(family) && sources[k] !== 'site default')) continue;
    set(c.key, c.value, 'titration');
  }
  if (typeof input.ph === 'number') uncertainty.ph = settings.ph_uncertainty;
  // The air the water is compared with (equilibrium pH, excess pCO2).
  set('air_pco2_uatm', settings.atmospheric_pco2_uatm, 'settings');
  const out: ReadingRequest = { input, uncertainty, sources, unknown };
  if (titration) out.titration = titration;
  return out;
}

/**
 * The reading's typed values in engine keys, and the options their units imply (`ph_scale`), read
 * off its request: what the value columns of an export or a recompute show.
 */
export function typedValues(req: Pick<ReadingRequest, 'input' | 'sources'>): {
  values: Record<string, number>;
  options: Record<string, string>;
} {
  const values: Record<string, number> = {};
  const options: Record<string, string> = {};
  for (const k in req.sources) {
    if (req.sources[k] !== 'typed') continue;
    const v = req.input[k];
    if (typeof v === 'number') values[k] = v;
    else if (typeof v === 'string') options[k] = v;
  }
  return { values, options };
}

/** The request's input with its uncertainties, for a consumer that shows ± (the reading page). */
export function withUncertainty(req: ReadingRequest): SolveInput {
  return { ...req.input, uncertainty: req.uncertainty };
}

/**
 * Where the inputs came from, as one line for a CSV cell and the reading page:
 * `alkalinity_meq_l=titration;ph=typed;salinity=site default`. Settings-only keys are left out
 * (they are the device's, not the reading's).
 */
export function sourcesText(req: Pick<ReadingRequest, 'sources'>): string {
  return Object.entries(req.sources)
    .filter(([, s]) => s !== 'settings')
    .map(([k, s]) => `${k}=${s}`)
    .join(';');
}
