/** The user's preferences, stored one key per record in the `settings` store, with defaults. */

import {
  BORON_TOTAL_CHOICES,
  type BoronTotal,
  CARBONIC_CONSTANT_CHOICES,
  type CarbonicConstants,
  MODEL_CHOICES,
  type ModelChoice,
  PH_SCALE_CHOICES,
  type PhScaleName,
} from '../chem/api';

export type ThemeChoice = 'system' | 'light' | 'dark' | 'contrast';

export interface Settings {
  /** Preferred unit per quantity id (see `src/quantities`). */
  units: Record<string, string>;
  carbonic_constants: CarbonicConstants;
  boron_total: BoronTotal;
  /** Scale pH is entered on by default (most field and aquarium meters use NBS buffers). */
  ph_scale: PhScaleName;
  model: ModelChoice;
  /** Atmospheric pCO2 for air-equilibrium comparisons, µatm. */
  atmospheric_pco2_uatm: number;
  /** Standard uncertainty of a pH reading, propagated to every output on the reading page. */
  ph_uncertainty: number;
  theme: ThemeChoice;
  /** BCP 47 tag for number and date display; empty = the browser's. */
  locale: string;
}

export const DEFAULT_SETTINGS: Settings = {
  units: {},
  // Millero 2010 below S 19, Lueker et al. 2000 from S 25 (the engine's default, issue 12).
  carbonic_constants: 'auto',
  boron_total: 'lee2010',
  ph_scale: 'nbs',
  model: 'auto',
  // Order of today's global mean in dry air (common practice default; users set their own).
  atmospheric_pco2_uatm: 420,
  // A field meter after a two-point calibration (common practice figure; set your own).
  ph_uncertainty: 0.02,
  theme: 'system',
  locale: '',
};

export const SETTING_KEYS = Object.keys(DEFAULT_SETTINGS) as (keyof Settings)[];

/**
 * One check per setting: `undefined` when the value can be used, otherwise why not (in words).
 * Stored values come from this device, a restored backup or an older Tufa, so every read and every
 * write goes through these; a value that fails is replaced by its default and reported, never used.
 */
type SettingCheck = (v: unknown) => string | undefined;

const oneOf =
  (...allowed: readonly string[]): SettingCheck =>
  (v) =>
    typeof v === 'string' && allowed.includes(v) ? undefined : `must be one of ${allowed.join(', ')}`;

const finiteIn =
  (lo: number, hi: number, what: string): SettingCheck =>
  (v) =>
    typeof v === 'number' && Number.isFinite(v) && v >= lo && v <= hi
      ? undefined
      : `must be ${what} between ${lo} and ${hi}`;

/** A BCP 47 language tag that this browser's Intl accepts as it is (empty = the browser's own). */
export function checkLocale(v: unknown): string | undefined {
  if (v === '') return undefined;
  if (typeof v !== 'string' || v.length > 64) return 'must be a language tag such as en-GB';
  try {
    const [canonical] = Intl.getCanonicalLocales(v);
    // Constructing the formatters the screens use proves the tag works, not only that it parses.
    new Intl.NumberFormat(canonical).format(1.5);
    new Intl.DateTimeFormat(canonical).format(0);
    return undefined;
  } catch {
    return `"${v.slice(0, 40)}" is not a valid language tag (use a form such as en-GB or de-DE)`;
  }
}

const ID = /^[a-z0-9_]{1,40}$/;

export const SETTING_CHECKS: { [K in keyof Settings]: SettingCheck } = {
  units: (v) => {
    if (typeof v !== 'object' || v === null || Array.isArray(v)) return 'must be a map of quantity to unit';
    for (const [k, u] of Object.entries(v))
      if (!ID.test(k) || typeof u !== 'string' || !ID.test(u))
        return `has an invalid entry for "${k.slice(0, 40)}"`;
    return undefined;
  },
  carbonic_constants: oneOf(...CARBONIC_CONSTANT_CHOICES),
  boron_total: oneOf(...BORON_TOTAL_CHOICES),
  ph_scale: oneOf(...PH_SCALE_CHOICES),
  model: oneOf(...MODEL_CHOICES),
  // Bounds wide enough for any air a field team meets (indoor air, greenhouses), not a plausibility check.
  atmospheric_pco2_uatm: finiteIn(1, 100_000, 'a number of µatm'),
  ph_uncertainty: finiteIn(0, 2, 'a pH difference'),
  theme: oneOf('system', 'light', 'dark', 'contrast'),
  locale: checkLocale,
};

/** A setting that could not be used, with the reason in words. */
export interface RejectedSetting {
  key: string;
  reason: string;
}

export function isSettingKey(k: string): k is keyof Settings {
  return Object.hasOwn(SETTING_CHECKS, k);
}

/** Why `value` cannot be stored as setting `key` (unknown keys included), or undefined if it can. */
export function checkSetting(key: string, value: unknown): string | undefined {
  if (!isSettingKey(key)) return 'is not a Tufa setting';
  return SETTING_CHECKS[key](value);
}

/** Stored `{key, value}` rows to Settings: defaults where a value is missing or unusable (reported). */
export function readSettings(rows: readonly { key: unknown; value: unknown }[]): {
  settings: Settings;
  rejected: RejectedSetting[];
} {
  const settings: Settings = structuredClone(DEFAULT_SETTINGS);
  const target = settings as unknown as Record<string, unknown>;
  const rejected: RejectedSetting[] = [];
  for (const row of rows) {
    if (typeof row.key !== 'string' || !isSettingKey(row.key)) continue; // older or foreign keys: ignored
    const why = SETTING_CHECKS[row.key](row.value);
    if (why) rejected.push({ key: row.key, reason: why });
    else target[row.key] = structuredClone(row.value);
  }
  return { settings, rejected };
}

/** The words the app shows when stored settings could not be used. */
export function rejectedSettingsMessage(rejected: readonly RejectedSetting[]): string {
  const list = rejected.map((r) => `${r.key} ${r.reason}`).join('; ');
  return `Some stored settings could not be used and their defaults apply instead (${list}). Open Settings to choose them again; your readings are not affected.`;
}
