/** The user's preferences, stored one key per record in the `settings` store, with defaults. */

export type ThemeChoice = 'system' | 'light' | 'dark' | 'contrast';

export interface Settings {
  /** Preferred unit per quantity id (see `src/ui/quantities.ts`). */
  units: Record<string, string>;
  carbonic_constants: 'auto' | 'lueker2000' | 'millero2010';
  boron_total: 'lee2010' | 'uppstrom1974';
  /** Scale pH is entered on by default (most field and aquarium meters use NBS buffers). */
  ph_scale: 'total' | 'free' | 'seawater' | 'nbs';
  model: 'auto' | 'saline' | 'fresh';
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
