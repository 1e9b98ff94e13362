/**
 * Modified Gran reduction (the default): the proton condition of every reading, written so that
 * it is linear in the unknowns, fitted by weighted least squares. After V mL of acid (C eq/L) in
 * V0 mL of sample, with D = V0 + V and h the H+ activity read by the meter,
 *   D·h·f − D·Kw/h − V0·BT·KB/(KB + h)  =  s·V + b + c·gᵢ
 *   closed vessel: gᵢ = V0·(K1h + 2K1K2)/(h² + K1h + K1K2),  c = DIC of the sample
 *   open vessel:   gᵢ = D·(K1/h + 2K1K2/h²),                  c = CO2* held by the air
 * with f = 1/γH from the ionic strength *at that reading* (the sample's, diluted, plus the free
 * acid), and s ≈ C, b = −s·Ve. The plain Gran function is the first term alone; the extra terms
 * are the carbonate still present and the other bases, so points on both sides of the endpoint
 * can be used and the titration may stop at pH 3.9. Leaving s free (rather than fixing it at C)
 * keeps Gran's tolerance of a meter offset: an offset scales h, hence s, b and c alike, and
 * Ve = −b/s is unchanged to first order.
 * Sources: Gran (1952) Analyst 77, 661; the carbonate-corrected ("modified") Gran functions of
 * Hansson & Jagner (1973) Anal. Chim. Acta 65, 363 and Dickson (1981) Deep-Sea Res. 28A, 609,
 * iterated here by reweighting instead of by successive endpoints (same fixed point).
 *
 * Weights are 1/(∂rᵢ/∂pH)², i.e. every reading is trusted to the same pH, refreshed until Ve moves
 * by less than 1e-12 relative (iteratively reweighted least squares). Constants come from the
 * caller per ionic strength (interpolated between exact sets 0.5 % apart in I).
 */

import { fail, type Issue, warning } from '../errors';
import type { ConstantSet } from '../types';
import type { MethodResult } from './methodResult';
import { invertSmall, type PointSensitivity, parameterSensitivities } from './pointSensitivity';
import type { TitrationCurve, TitrationSystem } from './types';

/** Readings in this pH window are used: below 2 the acid itself dominates (common practice). */
export const MODIFIED_GRAN_MIN_PH = 2.0;
/** Above about 6.5 other weak bases (organics, phosphate, borate) start to matter (common practice). */
export const MODIFIED_GRAN_MAX_PH = 6.5;
const MIN_POINTS = 5;
const MAX_REWEIGHTS = 40;
const MAX_IONIC_PASSES = 8;
const VE_TOLERANCE = 1e-12;

/** Relative standard error of the alkalinity at or below which a result is called "high" / "medium". */
export const CONFIDENCE_HIGH = 0.003;
export const CONFIDENCE_MEDIUM = 0.01;

/** The confidence word from the relative standard error and the readings past the endpoint. */
export function confidenceLevel(relativeSe: number, pastEndpoint: number): 'high' | 'medium' | 'low' {
  if (relativeSe <= CONFIDENCE_HIGH && pastEndpoint >= 3) return 'high';
  if (relativeSe <= CONFIDENCE_MEDIUM && pastEndpoint >= 1) return 'medium';
  return 'low';
}

export interface ModifiedGranOptions {
  sampleVolumeMl: number;
  titrantEqL: number;
  system: TitrationSystem;
  /** Constants at an ionic strength (mol/kg), sample temperature fixed by the caller. */
  constantsAt: (ionicStrength: number) => ConstantSet;
  /** The same, interpolated (see interpolatedConstants); built from constantsAt when absent. */
  pointConstantsAt?: (ionicStrength: number) => PointConstants;
  /** The sample's ionic strength, possibly estimated from the alkalinity (eq/L). */
  sampleIonicStrength: (alkalinityEqL: number) => number;
  /** pH at which the endpoint is expected (for counting points past it); default 4.5. */
  endpointPh?: number;
  /**
   * Use exactly these readings (the selection of an earlier reduction of nearly the same record,
   * so that a reading moved across the window edge by a derivative step is not dropped).
   */
  pointsUsed?: readonly number[];
}

/** The constants a reading needs, at its own ionic strength. */
export interface PointConstants {
  k1: number;
  k2: number;
  kw: number;
  kb: number;
  totalBoron: number;
  freeHFactor: number;
}

/** Knots per unit of ln(I + 1e-6): 0.5 % steps, where ln K is straight to better than 1e-6. */
const KNOTS_PER_UNIT = 200;

/**
 * The constants at any ionic strength by linear interpolation of ln K (and ln 1/γH) between
 * constant sets computed exactly on a grid in ln(I + 1e-6), 0.5 % apart. Continuous in I, so
 * the derivatives taken through it are smooth, and a 20 000-point titration costs a few hundred
 * constant sets instead of one per reading.
 */
export function interpolatedConstants(make: (i: number) => ConstantSet): (i: number) => PointConstants {
  const cache = new Map<number, PointConstants>();
  const at = (knot: number): PointConstants => {
    let c = cache.get(knot);
    if (c === undefined) {
      const k = make(Math.max(Math.exp(knot / KNOTS_PER_UNIT) - 1e-6, 0));
      c = {
        k1: Math.log(k.k1),
        k2: Math.log(k.k2),
        kw: Math.log(k.kw),
        kb: Math.log(k.kb),
        totalBoron: k.totalBoron,
        freeHFactor: Math.log(k.freeHFactor),
      };
      cache.set(knot, c);
    }
    return c;
  };
  return (i) => {
    const u = Math.log(Math.max(i, 0) + 1e-6) * KNOTS_PER_UNIT;
    const lo = Math.floor(u);
    const f = u - lo;
    const a = at(lo);
    const b = at(lo + 1);
    const mix = (x: number, y: number) => Math.exp(x + f * (y - x));
    return {
      k1: mix(a.k1, b.k1),
      k2: mix(a.k2, b.k2),
      kw: mix(a.kw, b.kw),
      kb: mix(a.kb, b.kb),
      totalBoron: a.totalBoron,
      freeHFactor: mix(a.freeHFactor, b.freeHFactor),
    };
  };
}

/** Left side y and carbonate basis g of one reading with the constants at its ionic strength. */
function row(
  ph: number,
  volume: number,
  v0: number,
  k: PointConstants,
  open: boolean,
): { y: number; g: number } {
  const h = 10 ** -ph;
  const d = v0 + volume;
  const k1 = k.k1;
  const k1k2 = k1 * k.k2;
  const boron = k.totalBoron > 0 ? v0 * k.totalBoron * (k.kb / (k.kb + h)) : 0;
  const y = d * h * k.freeHFactor - (d * k.kw) / h - boron;
  const g = open ? d * (k1 / h + (2 * k1k2) / (h * h)) : (v0 * (k1 * h + 2 * k1k2)) / (h * h + k1 * h + k1k2);
  return { y, g };
}

export interface ModifiedGranResult extends MethodResult {
  sensitivity: PointSensitivity;
}

export function reduceModifiedGran(curve: TitrationCurve, opts: ModifiedGranOptions): ModifiedGranResult {
  const { sampleVolumeMl: v0, titrantEqL: c, system } = opts;
  const open = system === 'open';
  const warnings: Issue[] = [];
  const used: number[] = [];
  if (opts.pointsUsed) used.push(...opts.pointsUsed.filter((i) => i < curve.ph.length));
  else {
    for (let i = 0; i < curve.ph.length; i++) {
      const p = curve.ph[i]!;
      if (p >= MODIFIED_GRAN_MIN_PH && p <= MODIFIED_GRAN_MAX_PH) used.push(i);
    }
  }
  const m = used.length;
  if (m < MIN_POINTS) {
    fail(
      'modified-gran-too-few-points',
      `The modified Gran reduction needs at least ${MIN_POINTS} readings between pH ${MODIFIED_GRAN_MIN_PH} and ${MODIFIED_GRAN_MAX_PH}; got ${m}. Take readings every 0.1–0.2 pH through the endpoint.`,
      'points',
    );
  }
  const vol = new Float64Array(m);
  const phs = new Float64Array(m);
  for (let j = 0; j < m; j++) {
    vol[j] = curve.volumeMl[used[j]!]!;
    phs[j] = curve.ph[used[j]!]!;
  }
  // Starting alkalinity: the acid added to the lowest reading less the free acid there.
  const last = m - 1;
  let ta = (c * vol[last]! - (v0 + vol[last]!) * 10 ** -phs[last]!) / v0;
  if (!(ta > 0)) ta = (c * vol[last]!) / v0;

  const kAt = opts.pointConstantsAt ?? interpolatedConstants(opts.constantsAt);
  const ks: PointConstants[] = new Array(m);
  const y = new Float64Array(m);
  const g = new Float64Array(m);
  const w = new Float64Array(m);
  const drPh = new Float64Array(m);
  const drV = new Float64Array(m);
  let p = [c, -c * ((ta * v0) / c), ta]; // s, b, c
  let inverse: number[][] | null = null;
  let ionic0 = Number.NaN;
  let reweights = 0;
  let settled = false;
  const DPH = 1e-6;
  const DV = 1e-6;
  for (let pass = 0; pass < MAX_IONIC_PASSES; pass++) {
    const i0 = opts.sampleIonicStrength(ta);
    if (Math.abs(i0 - ionic0) <= 1e-9 * Math.max(i0, 1e-9)) break;
    ionic0 = i0;
    // Ionic strength at each reading: the sample's, diluted (acid replacing bicarbonate by
    // chloride leaves it unchanged), plus the free strong acid; two passes settle γH.
    for (let j = 0; j < m; j++) {
      const h = 10 ** -phs[j]!;
      const base = (i0 * v0) / (v0 + vol[j]!);
      let k = kAt(base + h);
      k = kAt(base + h * k.freeHFactor);
      k = kAt(base + h * k.freeHFactor);
      ks[j] = k;
      const r = row(phs[j]!, vol[j]!, v0, k, open);
      y[j] = r.y;
      g[j] = r.g;
    }
    let ve = -p[1]! / p[0]!;
    settled = false;
    for (let it = 0; it < MAX_REWEIGHTS; it++) {
      reweights++;
      const cc = p[2]!;
      for (let j = 0; j < m; j++) {
        const r = row(phs[j]! + DPH, vol[j]!, v0, ks[j]!, open);
        drPh[j] = (r.y - y[j]! - cc * (r.g - g[j]!)) / DPH;
        w[j] = 1 / (drPh[j]! * drPh[j]! + 1e-300);
      }
      // Weighted normal equations for the basis [V, 1, g].
      let a00 = 0;
      let a01 = 0;
      let a02 = 0;
      let a11 = 0;
      let a12 = 0;
      let a22 = 0;
      let b0 = 0;
      let b1 = 0;
      let b2 = 0;
      for (let j = 0; j < m; j++) {
        const wj = w[j]!;
        const x0 = vol[j]!;
        const x2 = g[j]!;
        const yj = y[j]!;
        a00 += wj * x0 * x0;
        a01 += wj * x0;
        a02 += wj * x0 * x2;
        a11 += wj;
        a12 += wj * x2;
        a22 += wj * x2 * x2;
        b0 += wj * x0 * yj;
        b1 += wj * yj;
        b2 += wj * x2 * yj;
      }
      inverse = invertSmall([
        [a00, a01, a02],
        [a01, a11, a12],
        [a02, a12, a22],
      ]);
      if (inverse === null) {
        fail(
          'modified-gran-singular',
          'The readings do not separate the endpoint from the carbonate: take readings on both sides of pH 4.5.',
          'points',
        );
      }
      const q = [0, 1, 2].map((r) => inverse![r]![0]! * b0 + inverse![r]![1]! * b1 + inverse![r]![2]! * b2);
      p = q;
      const veNext = -q[1]! / q[0]!;
      const done = Math.abs(veNext - ve) <= VE_TOLERANCE * Math.abs(veNext) && it > 0;
      ve = veNext;
      if (done) {
        settled = true;
        break;
      }
    }
    ta = (c * ve) / v0;
  }
  const [s, b, cc] = p as [number, number, number];
  if (!settled) {
    warnings.push(
      warning(
        'modified-gran-not-converged',
        `The reweighted fit did not settle within ${MAX_REWEIGHTS} passes; treat the result with care.`,
      ),
    );
  }
  if (!(s > 0)) {
    fail(
      'gran-no-slope',
      'The corrected Gran function does not rise with added acid past the endpoint.',
      'points',
    );
  }
  const ve = -b / s;
  if (!(ve > 0)) {
    fail(
      'gran-no-endpoint',
      'The corrected Gran line crosses zero at or before the first point: no alkalinity found.',
      'points',
    );
  }
  const alkalinity = (c * ve) / v0;
  const carbon = (cc * c) / s; // an offset scales c like s

  // Residuals (in the unit of y) and their weighted scatter.
  const residuals: number[] = new Array(m);
  let chi2 = 0;
  let ymean = 0;
  let wsum = 0;
  for (let j = 0; j < m; j++) {
    const r = y[j]! - (s * vol[j]! + b + cc * g[j]!);
    residuals[j] = r;
    chi2 += w[j]! * r * r;
    ymean += w[j]! * y[j]!;
    wsum += w[j]!;
  }
  ymean /= wsum;
  let sst = 0;
  for (let j = 0; j < m; j++) sst += w[j]! * (y[j]! - ymean) ** 2;
  const s2 = m > 3 ? chi2 / (m - 3) : 0;
  const inv = inverse!;
  // Alkalinity = C·(−b/s)/V0 and DIC = c·C/s: gradients for the delta method.
  const gTa = [(c / v0) * (b / (s * s)), -(c / v0) / s, 0];
  const gDic = [-(cc * c) / (s * s), 0, c / s];
  const quad = (u: number[], v: number[]) => {
    let t = 0;
    for (let a = 0; a < 3; a++) for (let d = 0; d < 3; d++) t += u[a]! * inv[a]![d]! * v[d]!;
    return t;
  };
  const taSe = Math.sqrt(Math.max(s2 * quad(gTa, gTa), 0));
  const dicSe = Math.sqrt(Math.max(s2 * quad(gDic, gDic), 0));
  // Per-point sensitivities (pointSensitivity.ts): r = y − s·V − b − c·g, so J = −[V, 1, g].
  const jac = [new Float64Array(m), new Float64Array(m), new Float64Array(m)];
  for (let j = 0; j < m; j++) {
    jac[0]![j] = -vol[j]!;
    jac[1]![j] = -1;
    jac[2]![j] = -g[j]!;
    const r = row(phs[j]!, vol[j]! + DV, v0, ks[j]!, open);
    drV[j] = (r.y - y[j]! - s * DV - cc * (r.g - g[j]!)) / DV;
  }
  const n = curve.ph.length;
  const k0 = opts.constantsAt(ionic0);
  const h0 = 10 ** -curve.ph[0]!;
  // Open vessel: DIC of the sample = CO2*·(1 + K1/h0 + K1K2/h0²) at its first reading.
  const openFactor = open ? 1 + k0.k1 / h0 + (k0.k1 * k0.k2) / (h0 * h0) : 1;
  const toPoints = (byParam: Float64Array[]) => {
    const ta = new Float64Array(n);
    const dic = new Float64Array(n);
    for (let j = 0; j < m; j++) {
      let dta = 0;
      let ddic = 0;
      for (let a = 0; a < 3; a++) {
        dta += gTa[a]! * byParam[a]![j]!;
        ddic += gDic[a]! * byParam[a]![j]!;
      }
      ta[used[j]!] = dta;
      dic[used[j]!] = ddic * openFactor;
    }
    return { alkalinity: ta, dic };
  };
  const sensitivity: PointSensitivity = {
    ph: toPoints(parameterSensitivities(inv, jac, w, drPh)),
    volume_ml: toPoints(parameterSensitivities(inv, jac, w, drV)),
  };

  const endpointPh = opts.endpointPh ?? 4.5;
  let past = 0;
  for (let j = 0; j < m; j++) if (vol[j]! > ve && phs[j]! < endpointPh) past++;
  const rel = taSe / alkalinity;
  const level = confidenceLevel(rel, past);
  if (level === 'low') {
    warnings.push(
      warning(
        'titration-low-confidence',
        `The alkalinity is uncertain (standard error ${(rel * 100).toFixed(2)} %, ${past} readings past the endpoint): take more readings below pH 4.5, or try method curve_fit.`,
        'points',
      ),
    );
  }
  const slopeRatio = s / c;
  if (Math.abs(slopeRatio - 1) > 0.1) {
    warnings.push(
      warning(
        'gran-slope-unexpected',
        `The corrected Gran slope is ${slopeRatio.toFixed(3)} × the titrant normality: check the pH meter calibration and the titrant normality.`,
      ),
    );
  }
  const dic = carbon * openFactor;
  const rmsValue = Math.sqrt(residuals.reduce((t, r) => t + r * r, 0) / m);
  const details: Record<string, number> = {
    slope: s,
    intercept: b,
    slope_ratio: slopeRatio,
    carbonate_coefficient: cc,
    equivalence_volume_se_ml: (taSe * v0) / c,
    alkalinity_se_meq_l: taSe * 1e3,
    points_past_endpoint: past,
    reweights,
    min_ph: MODIFIED_GRAN_MIN_PH,
    max_ph: MODIFIED_GRAN_MAX_PH,
  };
  details.dic_se_mmol_l = dicSe * openFactor * 1e3;
  return {
    equivalenceVolumeMl: ve,
    alkalinityEqL: alkalinity,
    dicMolL: dic,
    fit: { r2: sst > 0 ? 1 - chi2 / sst : 1, residuals, rms: rmsValue, points_used: used, details },
    warnings,
    sensitivity,
    confidence: {
      level,
      alkalinity_se_meq_l: taSe * 1e3,
      dic_se_mmol_l: dicSe * openFactor * 1e3,
      points_used: m,
      points_past_endpoint: past,
    },
  };
}
