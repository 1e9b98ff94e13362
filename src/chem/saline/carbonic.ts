/**
 * First and second dissociation constants of carbonic acid in seawater, total pH scale,
 * mol kg-1 of solution.
 *
 * The optional trailing arguments (ln T, √S) let the entry point pass values it computed once;
 * callers that only have T and S leave them out.
 */

import { LN10 } from '../physical';
import type { ValidityRange } from './issues';

/** Lueker, Dickson & Keeling (2000): fitted for t 2–35 °C, S 19–43. */
export const K1K2_LUEKER2000_VALIDITY: ValidityRange = {
  label: 'K1 and K2 (Lueker et al. 2000)',
  temperatureC: [2, 35],
  salinity: [19, 43],
};

/**
 * K1 of carbonic acid, total scale.
 * Lueker, T. J., Dickson, A. G. & Keeling, C. D. (2000) Marine Chemistry 70, 105–119:
 * pK1 = 3633.86/T − 61.2172 + 9.6777 ln T − 0.011555 S + 0.0001152 S².
 * @param tK temperature, K
 * @param s practical salinity
 * @returns K1 in mol kg-1 (total scale)
 * Valid t 2–35 °C, S 19–43. Check: log10 K1 = −5.8472 at S 35, 25 °C (Dickson et al. 2007, ch. 5).
 */
export function k1Lueker2000(tK: number, s: number, lnT: number = Math.log(tK)): number {
  const pk = 3633.86 / tK - 61.2172 + 9.6777 * lnT - 0.011555 * s + 0.0001152 * s * s;
  return Math.exp(-pk * LN10);
}

/**
 * K2 of carbonic acid, total scale.
 * Lueker et al. (2000): pK2 = 471.78/T + 25.929 − 3.16967 ln T − 0.01781 S + 0.0001122 S².
 * @param tK temperature, K
 * @param s practical salinity
 * @returns K2 in mol kg-1 (total scale)
 * Valid t 2–35 °C, S 19–43. Check: log10 K2 = −8.9660 at S 35, 25 °C (Dickson et al. 2007, ch. 5).
 */
export function k2Lueker2000(tK: number, s: number, lnT: number = Math.log(tK)): number {
  const pk = 471.78 / tK + 25.929 - 3.16967 * lnT - 0.01781 * s + 0.0001122 * s * s;
  return Math.exp(-pk * LN10);
}

/** Millero (2010): fitted for t 0–50 °C, S 1–50 (estuarine to hypersaline). */
export const K1K2_MILLERO2010_VALIDITY: ValidityRange = {
  label: 'K1 and K2 (Millero 2010)',
  temperatureC: [0, 50],
  salinity: [1, 50],
};

/**
 * K1 of carbonic acid, total scale.
 * Millero, F. J. (2010) Carbonate constants for estuarine waters. Marine and Freshwater Research
 * 61, 139–142 (total-scale coefficient set):
 * pK1 = pK1° + A1 + B1/T + C1 ln T, with the pure-water part
 * pK1° = −126.34048 + 6320.813/T + 19.568224 ln T and
 * A1 = 13.4038 √S + 0.03206 S − 5.242e−5 S², B1 = −530.659 √S − 5.821 S, C1 = −2.0664 √S.
 * @param tK temperature, K
 * @param s practical salinity
 * @returns K1 in mol kg-1 (total scale)
 * Valid t 0–50 °C, S 1–50. Check: at S → 0 and 25 °C, pK1 = 6.351 (Harned & Davis 1943, as
 * quoted by Millero 2010; value from memory).
 */
export function k1Millero2010(
  tK: number,
  s: number,
  lnT: number = Math.log(tK),
  sqrtS: number = Math.sqrt(s),
): number {
  const pk0 = -126.34048 + 6320.813 / tK + 19.568224 * lnT;
  const a = 13.4038 * sqrtS + 0.03206 * s - 5.242e-5 * s * s;
  const b = -530.659 * sqrtS - 5.821 * s;
  const c = -2.0664 * sqrtS;
  return Math.exp(-(pk0 + a + b / tK + c * lnT) * LN10);
}

/**
 * K2 of carbonic acid, total scale.
 * Millero (2010), total-scale set: pK2 = pK2° + A2 + B2/T + C2 ln T with
 * pK2° = −90.18333 + 5143.692/T + 14.613358 ln T and
 * A2 = 21.3728 √S + 0.1218 S − 3.688e−4 S², B2 = −788.289 √S − 19.189 S, C2 = −3.374 √S.
 * @param tK temperature, K
 * @param s practical salinity
 * @returns K2 in mol kg-1 (total scale)
 * Valid t 0–50 °C, S 1–50. Check: at S → 0 and 25 °C, pK2 = 10.330 (Harned & Scholes 1941, as
 * quoted by Millero 2010; value from memory).
 */
export function k2Millero2010(
  tK: number,
  s: number,
  lnT: number = Math.log(tK),
  sqrtS: number = Math.sqrt(s),
): number {
  const pk0 = -90.18333 + 5143.692 / tK + 14.613358 * lnT;
  const a = 21.3728 * sqrtS + 0.1218 * s - 3.688e-4 * s * s;
  const b = -788.289 * sqrtS - 19.189 * s;
  const c = -3.374 * sqrtS;
  return Math.exp(-(pk0 + a + b / tK + c * lnT) * LN10);
}

/**
 * K1 on the seawater scale, Millero (2010) seawater-scale coefficient set (memory):
 * A1 = 13.4051 √S + 0.03185 S − 5.218e−5 S², B1 = −531.095 √S − 5.7789 S, C1 = −2.0663 √S,
 * same pure-water part as {@link k1Millero2010}. Not used by the model (it works on the total
 * scale); kept so the tests can compare the two printed sets. Converted to the total scale they
 * differ from the total-scale set by about 0.01 in pK1 at S 35 (the whole size of the scale
 * offset): see the consistency test and the issue note.
 * @param tK temperature, K
 * @param s practical salinity
 * @returns K1 in mol kg-1 (seawater scale)
 * Valid t 0–50 °C, S 1–50.
 */
export function k1Millero2010SeawaterScale(tK: number, s: number): number {
  const lnT = Math.log(tK);
  const r = Math.sqrt(s);
  const pk0 = -126.34048 + 6320.813 / tK + 19.568224 * lnT;
  return Math.exp(
    -(
      pk0 +
      13.4051 * r +
      0.03185 * s -
      5.218e-5 * s * s +
      (-531.095 * r - 5.7789 * s) / tK -
      2.0663 * r * lnT
    ) * LN10,
  );
}

/**
 * K2 on the seawater scale, Millero (2010) seawater-scale coefficient set (memory):
 * A2 = 21.5724 √S + 0.1212 S − 3.714e−4 S², B2 = −798.292 √S − 18.951 S, C2 = −3.403 √S.
 * Kept for the same comparison as {@link k1Millero2010SeawaterScale}.
 * @param tK temperature, K
 * @param s practical salinity
 * @returns K2 in mol kg-1 (seawater scale)
 * Valid t 0–50 °C, S 1–50.
 */
export function k2Millero2010SeawaterScale(tK: number, s: number): number {
  const lnT = Math.log(tK);
  const r = Math.sqrt(s);
  const pk0 = -90.18333 + 5143.692 / tK + 14.613358 * lnT;
  return Math.exp(
    -(
      pk0 +
      21.5724 * r +
      0.1212 * s -
      3.714e-4 * s * s +
      (-798.292 * r - 18.951 * s) / tK -
      3.403 * r * lnT
    ) * LN10,
  );
}

/**
 * The default choice of K1 and K2 (`carbonic_constants: auto`) by salinity: Millero (2010) below
 * S 19, Lueker et al. (2000) from S 25, and between them pK1 and pK2 (and the ln of their pressure
 * factors) blended as (1 − w)·Millero + w·Lueker with w rising smoothly (smoothstep, zero slope at
 * both ends) from 0 at S 19 to 1 at S 25.
 *
 * Why: Lueker et al. (2000) is fitted for S 19–43 only; extrapolated to S 2 it puts pCO2 46 % above
 * Millero (2010), the formulation built for estuaries (S 1–50). Between S 19 and 25 both are inside
 * their data yet differ by up to 0.014 in pK1 and 0.027 in pK2 over 2–35 °C (pCO2 about 1 % at
 * 15 °C, more in cold water), so a hard switch at S 19 would leave a step; the smoothstep spreads
 * it over six salinity units (the sweep test checks second differences of ln pCO2), while the open
 * ocean keeps the marine default every published check value refers to.
 */
export const CARBONIC_AUTO_BAND = { from: 19, to: 25 } as const;

/** Weight of Lueker et al. (2000) in the default blend at practical salinity `s` (0 to 1). */
export function luekerWeight(s: number): number {
  if (s <= CARBONIC_AUTO_BAND.from) return 0;
  if (s >= CARBONIC_AUTO_BAND.to) return 1;
  const x = (s - CARBONIC_AUTO_BAND.from) / (CARBONIC_AUTO_BAND.to - CARBONIC_AUTO_BAND.from);
  return x * x * (3 - 2 * x);
}
