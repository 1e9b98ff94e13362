/**
 * A site's defaults (the engine keys a reading of it starts from) as one CSV cell and back:
 * `model=fresh;salinity=0.3;ph_scale=nbs`. The export writes it so that a file imported on another
 * device creates the site with the defaults its readings were computed with. Display preferences
 * (`units`) stay on the device.
 */

import { BORON_TOTAL_CHOICES, CARBONIC_CONSTANT_CHOICES, MODEL_CHOICES, PH_SCALE_CHOICES } from '../chem/api';
import type { SiteDefaults } from '../store/schema';

const CHOICES: Record<string, readonly string[]> = {
  model: MODEL_CHOICES,
  carbonic_constants: CARBONIC_CONSTANT_CHOICES,
  boron_total: BORON_TOTAL_CHOICES,
  ph_scale: PH_SCALE_CHOICES,
};
/** Numeric defaults with their physical bounds (as the importer's quantity limits). */
const NUMBERS: Record<string, [number, number]> = {
  salinity: [0, 100],
  specific_conductance_us_cm: [0, 1e6],
};

export function siteDefaultsText(d: SiteDefaults): string {
  return Object.entries(d)
    .filter(([k, v]) => k !== 'units' && v !== undefined && (k in CHOICES || k in NUMBERS))
    .map(([k, v]) => `${k}=${String(v)}`)
    .join(';');
}

/** The defaults a cell describes, or the reason it cannot be read. */
export function parseSiteDefaults(text: string): SiteDefaults | { reason: string } {
  const out: Record<string, string | number> = {};
  for (const part of text.split(';')) {
    if (part.trim() === '') continue;
    const eq = part.indexOf('=');
    const key = part.slice(0, eq).trim();
    const value = part.slice(eq + 1).trim();
    if (eq <= 0) return { reason: `"${part}" is not key=value.` };
    const choices = CHOICES[key];
    const bounds = NUMBERS[key];
    if (choices) {
      if (!choices.includes(value)) return { reason: `${key} must be one of ${choices.join(', ')}.` };
      out[key] = value;
    } else if (bounds) {
      const x = Number(value);
      if (value === '' || !Number.isFinite(x) || x < bounds[0] || x > bounds[1])
        return { reason: `${key} must be a number from ${bounds[0]} to ${bounds[1]}.` };
      out[key] = x;
    } else return { reason: `"${key}" is not a site default.` };
  }
  return out as SiteDefaults;
}
