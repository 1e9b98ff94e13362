/**
 * Total alkalinity after Dickson (1981), proton reference level:
 *   TA = [HCO3-] + 2[CO3--] + [B(OH)4-] + [OH-] + [HPO4--] + 2[PO4---] + [SiO(OH)3-] + [NH3] + [HS-]
 *        − [H+]free − [HSO4-] − [HF] − [H3PO4]
 * Dickson, A. G. (1981) Deep-Sea Research 28A, 609–623, eq. (6).
 *
 * All concentrations in mol/kg, h on the internal scale of the constant set. The same function
 * serves the saline and the fresh model: only the ConstantSet differs.
 */

import type { ConstantSet, MinorTotals } from '../types';

/** Carbonate alkalinity per unit DIC, i.e. (K1·h + 2·K1·K2) / (h² + K1·h + K1·K2). */
export function carbonateAlkalinityPerDic(h: number, k: ConstantSet): number {
  const k1h = k.k1 * h;
  const k1k2 = k.k1 * k.k2;
  return (k1h + 2 * k1k2) / (h * h + k1h + k1k2);
}

/**
 * Everything in TA except the carbonate terms, in mol/kg, and its derivative with respect to h.
 * Written out without allocation because it sits in every solver iteration.
 */
export function nonCarbonateAlkalinity(h: number, k: ConstantSet, t: MinorTotals): number {
  const hf = h * k.freeHFactor;
  let a = (k.totalBoron * k.kb) / (k.kb + h) + k.kw / h - hf;
  a -= (k.totalSulfate * hf) / (hf + k.ks);
  a -= (k.totalFluoride * hf) / (hf + k.kf);
  if (t.phosphate > 0) {
    const h2 = h * h;
    const h3 = h2 * h;
    const k12 = k.k1p * k.k2p;
    const k123 = k12 * k.k3p;
    a += (t.phosphate * (k12 * h + 2 * k123 - h3)) / (h3 + k.k1p * h2 + k12 * h + k123);
  }
  if (t.silicate > 0) a += (t.silicate * k.ksi) / (k.ksi + h);
  if (t.ammonia > 0) a += (t.ammonia * k.knh4) / (k.knh4 + h);
  if (t.sulfide > 0) a += (t.sulfide * k.kh2s) / (k.kh2s + h);
  return a;
}

/** d(nonCarbonateAlkalinity)/dh, mol/kg per mol/kg. Always negative. */
export function nonCarbonateAlkalinitySlope(h: number, k: ConstantSet, t: MinorTotals): number {
  const f = k.freeHFactor;
  const hf = h * f;
  const kbh = k.kb + h;
  let d = (-k.totalBoron * k.kb) / (kbh * kbh) - k.kw / (h * h) - f;
  const ksh = hf + k.ks;
  d -= (k.totalSulfate * k.ks * f) / (ksh * ksh);
  const kfh = hf + k.kf;
  d -= (k.totalFluoride * k.kf * f) / (kfh * kfh);
  if (t.phosphate > 0) {
    const h2 = h * h;
    const h3 = h2 * h;
    const k12 = k.k1p * k.k2p;
    const k123 = k12 * k.k3p;
    const n = k12 * h + 2 * k123 - h3;
    const dn = k12 - 3 * h2;
    const den = h3 + k.k1p * h2 + k12 * h + k123;
    const dden = 3 * h2 + 2 * k.k1p * h + k12;
    d += (t.phosphate * (dn * den - n * dden)) / (den * den);
  }
  if (t.silicate > 0) d -= (t.silicate * k.ksi) / ((k.ksi + h) * (k.ksi + h));
  if (t.ammonia > 0) d -= (t.ammonia * k.knh4) / ((k.knh4 + h) * (k.knh4 + h));
  if (t.sulfide > 0) d -= (t.sulfide * k.kh2s) / ((k.kh2s + h) * (k.kh2s + h));
  return d;
}

/** TA from h and DIC (mol/kg). */
export function alkalinityFromHDic(h: number, dic: number, k: ConstantSet, t: MinorTotals): number {
  return dic * carbonateAlkalinityPerDic(h, k) + nonCarbonateAlkalinity(h, k, t);
}

/** d TA / d h at constant DIC. */
export function alkalinitySlopeH(h: number, dic: number, k: ConstantSet, t: MinorTotals): number {
  const k1 = k.k1;
  const k1k2 = k1 * k.k2;
  const den = h * h + k1 * h + k1k2;
  const num = k1 * h + 2 * k1k2;
  const dCarb = (dic * (k1 * den - num * (2 * h + k1))) / (den * den);
  return dCarb + nonCarbonateAlkalinitySlope(h, k, t);
}

/** Alkalinity contributions by species (mol/kg), for reports and for tests of the sum. */
export interface AlkalinityParts {
  carbonate: number;
  borate: number;
  hydroxide: number;
  phosphate: number;
  silicate: number;
  ammonia: number;
  sulfide: number;
  hFree: number;
  bisulfate: number;
  hydrogenFluoride: number;
}

export function alkalinityParts(h: number, dic: number, k: ConstantSet, t: MinorTotals): AlkalinityParts {
  const hf = h * k.freeHFactor;
  const h2 = h * h;
  const h3 = h2 * h;
  const k12 = k.k1p * k.k2p;
  const k123 = k12 * k.k3p;
  return {
    carbonate: dic * carbonateAlkalinityPerDic(h, k),
    borate: (k.totalBoron * k.kb) / (k.kb + h),
    hydroxide: k.kw / h,
    phosphate: (t.phosphate * (k12 * h + 2 * k123 - h3)) / (h3 + k.k1p * h2 + k12 * h + k123),
    silicate: (t.silicate * k.ksi) / (k.ksi + h),
    ammonia: (t.ammonia * k.knh4) / (k.knh4 + h),
    sulfide: (t.sulfide * k.kh2s) / (k.kh2s + h),
    hFree: hf,
    bisulfate: (k.totalSulfate * hf) / (hf + k.ks),
    hydrogenFluoride: (k.totalFluoride * hf) / (hf + k.kf),
  };
}
