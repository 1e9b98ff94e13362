/**
 * EOS-80, the international equation of state of seawater (UNESCO 1981, Tenth report of the Joint
 * Panel on Oceanographic Tables and Standards, Tech. Pap. Mar. Sci. 36; algorithms in UNESCO 1983,
 * Tech. Pap. Mar. Sci. 44, Fofonoff & Millard). Temperatures are on IPTS-68 as in the standard;
 * use {@link t68FromT90} for ITS-90 readings. Practical salinity S (PSS-78), pressure in bar
 * (applied, i.e. 0 at the sea surface), density in kg/m3.
 * Validity: S 0–42, t −2–40 °C, p 0–1000 bar.
 */

import type { Issue } from '../errors';
import { pushRange, type Range } from '../fresh/validity';

export const EOS80_SALINITY_RANGE: Range = { min: 0, max: 42 };
export const EOS80_TEMPERATURE_RANGE_C: Range = { min: -2, max: 40 };
export const EOS80_PRESSURE_RANGE_BAR: Range = { min: 0, max: 1000 };

/** IPTS-68 from ITS-90 temperature (Saunders 1990): t68 = 1.00024 · t90, °C. */
export function t68FromT90(t90: number): number {
  return 1.00024 * t90;
}

/**
 * Density of Standard Mean Ocean Water at one atmosphere, the S = 0 limit of EOS-80.
 * UNESCO (1981), eq. for ρw (Bigg 1967 fit). Units: t68 in °C, result kg/m3.
 * Check: 999.96675 kg/m3 at 5 °C (UNESCO 1983 test value).
 */
export function densitySmowUnesco1981(t68: number): number {
  const t = t68;
  return (
    999.842594 +
    t * (6.793952e-2 + t * (-9.09529e-3 + t * (1.001685e-4 + t * (-1.120083e-6 + t * 6.536332e-9))))
  );
}

/**
 * One-atmosphere density of seawater, EOS-80 (UNESCO 1981).
 * Units: S practical salinity, t68 °C; kg/m3. Valid S 0–42, t −2–40 °C.
 * Check: 1027.67547 kg/m3 at S 35, 5 °C (UNESCO 1983 test value).
 */
export function densityOneAtmEos80(s: number, t68: number): number {
  const t = t68;
  const a = 0.824493 + t * (-4.0899e-3 + t * (7.6438e-5 + t * (-8.2467e-7 + t * 5.3875e-9)));
  const b = -5.72466e-3 + t * (1.0227e-4 - t * 1.6546e-6);
  return densitySmowUnesco1981(t) + a * s + b * s * Math.sqrt(s) + 4.8314e-4 * s * s;
}

/**
 * Secant bulk modulus of seawater, EOS-80 (UNESCO 1981).
 * Units: S, t68 °C, p applied pressure in bar; result in bar.
 * Check: 27108.94504 bar at S 35, 25 °C, 1000 bar (UNESCO 1983 test value).
 */
export function secantBulkModulusEos80(s: number, t68: number, pBar: number): number {
  const t = t68;
  const s15 = s * Math.sqrt(s);
  const kw = 19652.21 + t * (148.4206 + t * (-2.327105 + t * (1.360477e-2 - t * 5.155288e-5)));
  const aw = 3.239908 + t * (1.43713e-3 + t * (1.16092e-4 - t * 5.77905e-7));
  const bw = 8.50935e-5 + t * (-6.12293e-6 + t * 5.2787e-8);
  const k0 =
    kw +
    s * (54.6746 + t * (-0.603459 + t * (1.09987e-2 - t * 6.167e-5))) +
    s15 * (7.944e-2 + t * (1.6483e-2 - t * 5.3009e-4));
  const a = aw + s * (2.2838e-3 + t * (-1.0981e-5 - t * 1.6078e-6)) + 1.91075e-4 * s15;
  const b = bw + s * (-9.9348e-7 + t * (2.0816e-8 + t * 9.1697e-10));
  return k0 + pBar * (a + pBar * b);
}

/**
 * Density of seawater at pressure, EOS-80: ρ(S,t,p) = ρ(S,t,0) / (1 − p/K(S,t,p)).
 * Units: S, t68 °C, p applied pressure in bar; kg/m3.
 * Check: 1062.53817 kg/m3 at S 35, 25 °C, 1000 bar (UNESCO 1983 test value).
 */
export function densityEos80(s: number, t68: number, pBar: number): number {
  const rho0 = densityOneAtmEos80(s, t68);
  if (pBar === 0) return rho0;
  return rho0 / (1 - pBar / secantBulkModulusEos80(s, t68, pBar));
}

/** Warnings for EOS-80 inputs outside the published range (the value is still computed). */
export function eos80Validity(s: number, t68: number, pBar: number): Issue[] {
  const out: Issue[] = [];
  pushRange(out, 'EOS-80 (UNESCO 1981)', 'salinity', s, EOS80_SALINITY_RANGE, '', 'salinity');
  pushRange(
    out,
    'EOS-80 (UNESCO 1981)',
    'temperature',
    t68,
    EOS80_TEMPERATURE_RANGE_C,
    '°C',
    'temperature_c',
  );
  pushRange(out, 'EOS-80 (UNESCO 1981)', 'pressure', pBar, EOS80_PRESSURE_RANGE_BAR, 'bar', 'pressure_dbar');
  return out;
}
