/**
 * PSS-78, the Practical Salinity Scale 1978 (UNESCO 1981, Tech. Pap. Mar. Sci. 36 and 37;
 * algorithms and check values in UNESCO 1983, Tech. Pap. Mar. Sci. 44, Fofonoff & Millard),
 * with the low-salinity extension of Hill, Dauphinee & Woods (1986), IEEE J. Oceanic Eng. 11, 109.
 * Temperatures on IPTS-68 as in the standard (convert ITS-90 with `t68FromT90`), pressure in dbar,
 * R = C(S,t,p) / C(35,15,0), C(35,15,0) = 42.914 mS/cm (Culkin & Smith 1980).
 * Validity of PSS-78: S 2–42, t −2–35 °C, p 0–10000 dbar; Hill et al. extend it down to S 0.
 */

import type { Issue } from '../errors';
import { pushRange, type Range } from '../fresh/validity';

/** Conductivity of standard seawater S 35 at 15 °C, 0 dbar (Culkin & Smith 1980), mS/cm. */
export const C35_15_0_MS_CM = 42.914;

export const PSS78_SALINITY_RANGE: Range = { min: 2, max: 42 };
export const PSS78_TEMPERATURE_RANGE_C: Range = { min: -2, max: 35 };
export const PSS78_PRESSURE_RANGE_DBAR: Range = { min: 0, max: 10000 };

const A = [0.008, -0.1692, 25.3851, 14.0941, -7.0261, 2.7081] as const;
const B = [0.0005, -0.0056, -0.0066, -0.0375, 0.0636, -0.0144] as const;
const K = 0.0162;

/**
 * rt(t) = C(35,t,0) / C(35,15,0), PSS-78 (UNESCO 1983, eq. for rt). t68 in °C; dimensionless.
 * Check: rt(15) = 1 to within 1e-6 (by construction of the scale).
 */
export function rtPss78(t68: number): number {
  const t = t68;
  return 0.6766097 + t * (2.00564e-2 + t * (1.104259e-4 + t * (-6.9698e-7 + t * 1.0031e-9)));
}

/** Rp = C(S,t,p)/C(S,t,0), PSS-78 pressure term. R ratio, t68 °C, p dbar; dimensionless. */
export function rpPss78(r: number, t68: number, pDbar: number): number {
  const p = pDbar;
  const t = t68;
  return (
    1 +
    (p * (2.07e-5 + p * (-6.37e-10 + p * 3.989e-15))) /
      (1 + t * (3.426e-2 + t * 4.464e-4) + r * (0.4215 - 3.107e-3 * t))
  );
}

/** The salinity polynomial of PSS-78 in Rt, with the Hill et al. (1986) term below S 2. */
function salinityFromRt(rt: number, t68: number): number {
  const x = Math.sqrt(Math.max(rt, 0));
  const ft = (t68 - 15) / (1 + K * (t68 - 15));
  let sa = 0;
  let sb = 0;
  let xp = 1;
  for (let i = 0; i < 6; i++) {
    sa += A[i]! * xp;
    sb += B[i]! * xp;
    xp *= x;
  }
  const s = sa + ft * sb;
  if (s >= 2) return s;
  // Hill, Dauphinee & Woods (1986): subtract terms that take S to exactly 0 at Rt = 0.
  const u = 400 * rt;
  const y = 100 * rt;
  const sy = Math.sqrt(y);
  return s - A[0] / (1 + 1.5 * u + u * u) - (B[0] * ft) / (1 + sy + y + y * sy);
}

/**
 * Practical salinity from the conductivity ratio R = C(S,t,p)/C(35,15,0), PSS-78.
 * Units: t68 °C, p dbar; S dimensionless. Below S 2 the Hill et al. (1986) extension applies.
 * Check: S = 35.000 at R 1, 15 °C, 0 dbar; S = 40.0000 at R 1.888091, 40 °C, 10000 dbar (UNESCO 1983).
 */
export function salinityPss78(r: number, t68: number, pDbar: number): number {
  if (r <= 0) return 0;
  const rt = r / (rpPss78(r, t68, pDbar) * rtPss78(t68));
  return salinityFromRt(rt, t68);
}

/**
 * Conductivity ratio R for a given salinity, temperature and pressure: the inverse of
 * {@link salinityPss78}, by Newton iteration on √Rt (tolerance 1e-10 in S, at most 30 steps),
 * then a fixed-point step for the pressure term Rp. Units as {@link salinityPss78}.
 * Check: R = 1.888091 at S 40, 40 °C, 10000 dbar (UNESCO 1983).
 */
export function conductivityRatioPss78(s: number, t68: number, pDbar: number): number {
  if (s <= 0) return 0;
  // Solve salinityFromRt(x², t) = s for x = √Rt; start from the leading behaviour S ≈ 35 Rt.
  let x = Math.sqrt(s / 35);
  for (let i = 0; i < 30; i++) {
    const f = salinityFromRt(x * x, t68) - s;
    const h = 1e-7 * Math.max(x, 1e-6);
    const d = (salinityFromRt((x + h) * (x + h), t68) - salinityFromRt((x - h) * (x - h), t68)) / (2 * h);
    const step = f / d;
    x -= step;
    if (x <= 0) x = 1e-8;
    if (Math.abs(f) < 1e-10) break;
  }
  const rtVal = x * x;
  const rtT = rtPss78(t68);
  // R = Rt·rt·Rp(R): Rp depends weakly on R, so iterate (contracts fast: ∂Rp/∂R ≈ 1e-3 at full depth).
  let r = rtVal * rtT;
  for (let i = 0; i < 20; i++) {
    const next = rtVal * rtT * rpPss78(r, t68, pDbar);
    if (Math.abs(next - r) < 1e-14) {
      r = next;
      break;
    }
    r = next;
  }
  return r;
}

/** Warnings for PSS-78 inputs outside the published range (the salinity is still computed). */
export function pss78Validity(s: number, t68: number, pDbar: number): Issue[] {
  const out: Issue[] = [];
  if (s < PSS78_SALINITY_RANGE.min) {
    // Below S 2 the Hill et al. (1986) extension is used; say so rather than call it out of range.
    out.push({
      code: 'pss78-low-salinity-extension',
      message: `Salinity ${s.toFixed(3)} is below 2, where PSS-78 hands over to the Hill et al. (1986) extension.`,
      field: 'salinity',
    });
  } else {
    pushRange(out, 'PSS-78', 'salinity', s, PSS78_SALINITY_RANGE, '', 'salinity');
  }
  pushRange(out, 'PSS-78', 'temperature', t68, PSS78_TEMPERATURE_RANGE_C, '°C', 'temperature_c');
  pushRange(out, 'PSS-78', 'pressure', pDbar, PSS78_PRESSURE_RANGE_DBAR, 'dbar', 'pressure_dbar');
  return out;
}
