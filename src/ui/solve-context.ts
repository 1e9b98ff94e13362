/** Builds the solve input of a reading from its values, its site's defaults and the user's settings. */

import type { SolveInput } from '../chem/api';
import type { MeasuredValue, SiteDoc } from '../store/schema';
import type { Settings } from '../store/settings';
import { type SolveContext, toSolveInput } from './quantities';

export function solveContext(site: SiteDoc | undefined, settings: Settings): SolveContext {
  const d = site?.defaults ?? {};
  const ctx: SolveContext = {
    model: d.model ?? settings.model,
    ph_scale: d.ph_scale ?? settings.ph_scale,
    carbonic_constants: d.carbonic_constants ?? settings.carbonic_constants,
    boron_total: d.boron_total ?? settings.boron_total,
  };
  if (d.salinity !== undefined) ctx.salinity = d.salinity;
  if (d.specific_conductance_us_cm !== undefined)
    ctx.specific_conductance_us_cm = d.specific_conductance_us_cm;
  return ctx;
}

export function readingInput(
  values: MeasuredValue[],
  site: SiteDoc | undefined,
  settings: Settings,
): { input: SolveInput; unknown: string[] } {
  const out = toSolveInput(values, solveContext(site, settings));
  // The air the water is compared with (equilibrium pH, excess pCO2), from Settings.
  out.input.air_pco2_uatm = settings.atmospheric_pco2_uatm;
  return out;
}
