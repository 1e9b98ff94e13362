/**
 * The trades' outputs of a solve (issue 12 §5), added to every solved water when their inputs
 * are given: unionized ammonia and hydrogen sulfide from totals, and the CO2 flux to or from the
 * air from k600 (given, or from a stream's slope, velocity and depth). Additive: a request
 * without these keys gets exactly the outputs it got before.
 */

import { fail, type Issue, warning } from '../errors';
import { numberAt } from '../read-fields';
import type { CarbonateState, ConstantSet, MinorTotals } from '../types';
import { densityKgL } from '../units';
import { EMERSON_1975_VALIDITY_C, N_G_PER_MOL, pkaAmmoniaEmerson1975, unionizedAmmonia } from './ammonia';
import { co2FluxMmolM2D, k600Raymond2012, kCo2FromK600, SCHMIDT_VALIDITY_C, schmidtCo2 } from './gasExchange';
import {
  type CalibrationRecord,
  type CalibrationResult,
  phCalibration,
  phUncertaintyFromCalibration,
} from './phCalibration';
import { hydrogenSulfide, S_G_PER_MOL } from './sulfide';

export const TRADE_INPUT_KEYS = [
  'total_ammonia_n_mg_l',
  'total_sulfide_s_mg_l',
  'k600_m_d',
  'stream_slope',
  'stream_velocity_m_s',
  'stream_depth_m',
  'ph_calibration',
] as const;
// air_pco2_uatm (default 420 µatm) is already a key of the solve contract (src/chem/fresh/request.ts).

/** Default air CO2, µatm (about the global mean of 2024; common practice, *memory*). */
export const DEFAULT_AIR_PCO2_UATM = 420;

export interface TradeOutputs {
  /** NH3 / total ammonia, and NH3 as N and as NH3, mg/L; the pK used (on the model's pH scale). */
  unionized_ammonia_fraction: number;
  unionized_ammonia_n_mg_l: number;
  unionized_ammonia_mg_l: number;
  ammonia_pk: number;
  /** H2S / total sulfide, H2S mg/L, and the pK1 used. */
  hydrogen_sulfide_fraction: number;
  hydrogen_sulfide_mg_l: number;
  sulfide_pk1: number;
  /** Gas exchange with the air (positive flux leaves the water). */
  schmidt_co2: number;
  k600_m_d: number;
  k_co2_m_d: number;
  air_pco2_uatm: number;
  co2_flux_mmol_m2_d: number;
  /** The day's pH meter calibration, when given, and the pH uncertainty it leaves. */
  ph_calibration: CalibrationResult & { ph_standard_uncertainty: number | null };
}

function nonNegative(raw: Readonly<Record<string, unknown>>, key: string): number | undefined {
  const v = numberAt(raw, key);
  if (v !== undefined && v < 0) fail('negative-value', `${key} cannot be negative, got ${v}.`, key);
  return v;
}

/**
 * Totals given in mg/L as N or S, added to the engine's minor totals (mol/kg) so that they count
 * in the alkalinity too, exactly like ammonia_umol_kg / sulfide_umol_kg. Both forms at once is an
 * error.
 */
export function addTradeTotals(
  minor: MinorTotals,
  raw: Readonly<Record<string, unknown>>,
  rhoKgL: number,
): void {
  const n = nonNegative(raw, 'total_ammonia_n_mg_l');
  if (n !== undefined) {
    if (minor.ammonia > 0) {
      fail(
        'ammonia-given-twice',
        'Give ammonia once: total_ammonia_n_mg_l or ammonia_umol_kg.',
        'total_ammonia_n_mg_l',
      );
    }
    minor.ammonia = n / 1000 / N_G_PER_MOL / rhoKgL;
  }
  const s = nonNegative(raw, 'total_sulfide_s_mg_l');
  if (s !== undefined) {
    if (minor.sulfide > 0) {
      fail(
        'sulfide-given-twice',
        'Give sulfide once: total_sulfide_s_mg_l or sulfide_umol_kg.',
        'total_sulfide_s_mg_l',
      );
    }
    minor.sulfide = s / 1000 / S_G_PER_MOL / rhoKgL;
  }
}

/** What the trade outputs need from the request. */
export interface TradeContext {
  raw: Readonly<Record<string, unknown>>;
  minor: MinorTotals;
  temperatureC: number;
  salinity: number;
}

/**
 * The ammonium constant on the internal scale of `k`: saline, the engine's own (Clegg & Whitfield
 * 1995, total scale); fresh, Emerson et al. (1975) corrected by the model's γNH4+/γNH3 (the ratio
 * of its mixed to its thermodynamic ammonium constant).
 */
function ammoniumK(k: ConstantSet, temperatureC: number): number {
  const thermo = (k as { thermodynamic?: { knh4?: number } }).thermodynamic?.knh4;
  if (k.model !== 'fresh' || thermo === undefined) return k.knh4;
  return 10 ** -pkaAmmoniaEmerson1975(temperatureC) * (k.knh4 / 10 ** thermo);
}

export function addTradeOutputs(
  water: object,
  s: CarbonateState,
  k: ConstantSet,
  ctx: TradeContext,
  warnings: Issue[],
): void {
  const o = water as Partial<TradeOutputs>;
  const rho = densityKgL(ctx.salinity, ctx.temperatureC);
  const ph = -Math.log10(s.h);
  if (ctx.minor.ammonia > 0) {
    const pk = -Math.log10(ammoniumK(k, ctx.temperatureC));
    const totalN = ctx.minor.ammonia * rho * N_G_PER_MOL * 1000;
    const a = unionizedAmmonia(totalN, ph, pk);
    o.unionized_ammonia_fraction = a.fraction;
    o.unionized_ammonia_n_mg_l = a.nh3_n_mg_l;
    o.unionized_ammonia_mg_l = a.nh3_mg_l;
    o.ammonia_pk = pk;
    const [lo, hi] = EMERSON_1975_VALIDITY_C;
    if (k.model === 'fresh' && (ctx.temperatureC < lo || ctx.temperatureC > hi)) {
      addOnce(
        warnings,
        warning(
          'ammonia-outside-validity',
          `The ammonia constant (Emerson et al. 1975) is fitted for ${lo}–${hi} °C; at ${ctx.temperatureC} °C it is extrapolated.`,
        ),
      );
    }
  }
  if (ctx.minor.sulfide > 0) {
    const pk1 = -Math.log10(k.kh2s);
    const totalS = ctx.minor.sulfide * rho * S_G_PER_MOL * 1000;
    const h2s = hydrogenSulfide(totalS, ph, pk1);
    o.hydrogen_sulfide_fraction = h2s.fraction;
    o.hydrogen_sulfide_mg_l = h2s.h2s_mg_l;
    o.sulfide_pk1 = pk1;
  }
  const cal = calibrationOf(ctx.raw);
  if (cal !== undefined) {
    const measured = numberAt(ctx.raw, 'ph');
    o.ph_calibration = {
      ...cal,
      ph_standard_uncertainty: measured === undefined ? null : phUncertaintyFromCalibration(cal, measured),
    };
    if (!cal.accepted) {
      addOnce(
        warnings,
        warning(
          'ph-calibration-refused',
          `The pH meter calibration fails the usual limits (${cal.reasons.join('; ')}): recalibrate before trusting the pH and everything computed from it.`,
          'ph_calibration',
        ),
      );
    }
  }
  const k600 = k600Of(ctx.raw);
  if (k600 !== undefined) {
    const air = nonNegative(ctx.raw, 'air_pco2_uatm') ?? DEFAULT_AIR_PCO2_UATM;
    const sc = schmidtCo2(ctx.temperatureC, ctx.salinity);
    const kCo2 = kCo2FromK600(k600, sc);
    const co2Eq = k.k0 * k.fugacityFactor * air * 1e-6;
    o.schmidt_co2 = sc;
    o.k600_m_d = k600;
    o.k_co2_m_d = kCo2;
    o.air_pco2_uatm = air;
    o.co2_flux_mmol_m2_d = co2FluxMmolM2D(kCo2, s.co2, co2Eq, rho);
    const [lo, hi] = SCHMIDT_VALIDITY_C;
    if (ctx.temperatureC < lo || ctx.temperatureC > hi) {
      addOnce(
        warnings,
        warning(
          'schmidt-outside-validity',
          `The Schmidt number fit (Wanninkhof 2014) covers ${lo}–${hi} °C.`,
        ),
      );
    }
  }
}

/** k600 given, or from stream slope, velocity and depth (all three), or none. */
function k600Of(raw: Readonly<Record<string, unknown>>): number | undefined {
  const given = nonNegative(raw, 'k600_m_d');
  const slope = nonNegative(raw, 'stream_slope');
  const v = nonNegative(raw, 'stream_velocity_m_s');
  const d = nonNegative(raw, 'stream_depth_m');
  const stream = [slope, v, d].filter((x) => x !== undefined).length;
  if (given !== undefined) {
    if (stream > 0) {
      fail(
        'k600-given-twice',
        'Give k600_m_d or the stream slope, velocity and depth, not both.',
        'k600_m_d',
      );
    }
    return given;
  }
  if (stream === 0) return undefined;
  if (stream < 3) {
    fail(
      'stream-incomplete',
      'k600 from a stream needs stream_slope, stream_velocity_m_s and stream_depth_m together.',
      'stream_slope',
    );
  }
  if (!(d! > 0)) fail('non-positive-value', 'stream_depth_m must be greater than zero.', 'stream_depth_m');
  return k600Raymond2012(slope!, v!, d!);
}

function addOnce(into: Issue[], w: Issue): void {
  if (!into.some((x) => x.code === w.code && x.message === w.message)) into.push(w);
}

function calibrationOf(raw: Readonly<Record<string, unknown>>): CalibrationResult | undefined {
  const c = raw.ph_calibration;
  if (c === undefined || c === null) return undefined;
  if (typeof c !== 'object')
    fail('ph-calibration-invalid', 'ph_calibration must be an object.', 'ph_calibration');
  return phCalibration(c as CalibrationRecord);
}

/**
 * The uncertainty request of a solve with the pH uncertainty taken from the day's calibration
 * when the request names none: the calibration's quality feeds the pH uncertainty.
 */
export function uncertaintyWithCalibration(
  plain: Readonly<Record<string, unknown>>,
  uncertainty: unknown,
): unknown {
  if (typeof uncertainty !== 'object' || uncertainty === null || 'ph' in uncertainty) return uncertainty;
  const cal = calibrationOf(plain);
  const ph = numberAt(plain, 'ph');
  if (cal === undefined || ph === undefined) return uncertainty;
  return { ...uncertainty, ph: phUncertaintyFromCalibration(cal, ph) };
}
