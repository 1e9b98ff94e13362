/**
 * Ion pairs of the fresh-water model: formation constants from the free ions, their temperature
 * dependence, and the speciation of calcium, magnesium, sodium, potassium, sulfate and the
 * carbonate ions at given totals.
 *
 * How they reach the solver without it knowing (DEVELOPERS.md, "One mechanism for both waters"):
 * with the free cations fixed, every pair is proportional to its free anion, so
 * [HCO3-]T = [HCO3-]·αH, [CO3--]T = [CO3--]·αC, [OH-]T = [OH-]·αOH, [SO4--]T = [SO4--]·αS with
 * αH = 1 + β(CaHCO3+)[Ca++] + β(MgHCO3+)[Mg++] + β(NaHCO3°)[Na+] and so on. The constant set then
 * carries K1·αH, K2·αC/αH, Kw·αOH, KS·αS, and the solver's HCO3-, CO3-- and OH- are the totals
 * (a pair counts in TA like its anion: CaCO3° and NaCO3- twice, CaHCO3+ once, CaOH+ as OH-). The
 * saturation products carry αCa = [Ca]T/[Ca++] and αC, so Ω = [Ca]T[CO3]T/Ksp'' is the free-ion
 * activity product over Ksp. The free cations and the ionic strength are iterated with the solved
 * carbonate species (`solve-fresh.ts`).
 *
 * Conditional constants: β = K·γ(cation)·γ(anion)/γ(pair), concentrations in mol/kg of water;
 * charged pairs take the activity coefficient of HCO3- in the chosen activity model (charge 1,
 * 4 Å), neutral pairs γ = 1 (common practice in speciation models).
 */

import { LN10, R_J_PER_MOL_K } from '../physical';
import type { ActivityCoefficients } from './activity';
import { T25_K } from './thermo';

const J_PER_KCAL = 4184;

/** log K(T) = log K(25 °C) − ΔH/(R ln 10)·(1/T − 1/298.15), ΔH in kcal/mol. */
function vantHoff(logK25: number, deltaHKcal: number, tK: number): number {
  return logK25 - ((deltaHKcal * J_PER_KCAL) / (R_J_PER_MOL_K * LN10)) * (1 / tK - 1 / T25_K);
}

/**
 * CaHCO3+: Ca++ + HCO3- = CaHCO3+.
 * Plummer & Busenberg (1982), Geochim. Cosmochim. Acta 46, 1011–1040, Table 5 *(memory)*:
 * log K = 1209.120 + 0.31294 T − 34765.05/T − 478.782 log T. T in K; valid 0–90 °C.
 * Check: log K = 1.106 at 25 °C.
 */
export function logKCaHco3PlummerBusenberg1982(tK: number): number {
  return 1209.12 + 0.31294 * tK - 34765.05 / tK - 478.782 * Math.log10(tK);
}

/**
 * CaCO3°: Ca++ + CO3-- = CaCO3°.
 * Plummer & Busenberg (1982), Table 5 *(memory)*:
 * log K = −1228.732 − 0.299444 T + 35512.75/T + 485.818 log T. T in K; valid 0–90 °C.
 * Check: log K = 3.224 at 25 °C.
 */
export function logKCaCo3PlummerBusenberg1982(tK: number): number {
  return -1228.732 - 0.299444 * tK + 35512.75 / tK + 485.818 * Math.log10(tK);
}

/**
 * MgHCO3+: Mg++ + HCO3- = MgHCO3+. Nordstrom et al. (1990), ACS Symp. Ser. 416, Table III, the
 * analytic expression of Siebert & Hostetler (1977) *(memory)*:
 * log K = −59.215 + 2537.455/T + 20.92298 log T. T in K. Check: log K = 1.07 at 25 °C.
 */
export function logKMgHco3Nordstrom1990(tK: number): number {
  return -59.215 + 2537.455 / tK + 20.92298 * Math.log10(tK);
}

/**
 * MgCO3°: Mg++ + CO3-- = MgCO3°. Nordstrom et al. (1990), Table III, analytic expression of
 * Siebert & Hostetler (1977) *(memory)*: log K = 0.9910 + 0.00667 T. Check: log K = 2.98 at 25 °C.
 */
export function logKMgCo3Nordstrom1990(tK: number): number {
  return 0.991 + 0.00667 * tK;
}

/**
 * The other pairs and the hydrolysis of Ca++ and Mg++: Nordstrom et al. (1990), Table III, log K
 * at 25 °C and ΔH°r in kcal/mol, extrapolated with van 't Hoff *(memory, each value)*:
 * CaSO4° 2.30 / 1.65; MgSO4° 2.37 / 4.55; NaCO3- 1.27 / 8.91; NaHCO3° −0.25 / none given (ΔH 0
 * here); NaSO4- 0.70 / 1.12; KSO4- 0.85 / 2.25; CaOH+ (Ca++ + H2O = CaOH+ + H+) −12.78 / 14.535;
 * MgOH+ (Mg++ + H2O = MgOH+ + H+) −11.44 / 15.952. Valid about 0–50 °C (VANT_HOFF_RANGE_C).
 */
export const NORDSTROM_1990_PAIRS = {
  caSo4: [2.3, 1.65],
  mgSo4: [2.37, 4.55],
  naCo3: [1.27, 8.91],
  naHco3: [-0.25, 0],
  naSo4: [0.7, 1.12],
  kSo4: [0.85, 2.25],
  caOhHydrolysis: [-12.78, 14.535],
  mgOhHydrolysis: [-11.44, 15.952],
} as const satisfies Record<string, readonly [number, number]>;

/**
 * Gypsum, CaSO4·2H2O = Ca++ + SO4-- + 2 H2O. Nordstrom et al. (1990), Table III, analytic
 * expression *(memory)*: log K = 68.2401 − 3221.51/T − 25.0627 log T. Check: −4.58 at 25 °C.
 */
export function logKspGypsumNordstrom1990(tK: number): number {
  return 68.2401 - 3221.51 / tK - 25.0627 * Math.log10(tK);
}

/** Thermodynamic log K of formation of every pair from its free ions at one temperature. */
export interface PairLogK {
  caHco3: number;
  caCo3: number;
  caSo4: number;
  caOh: number;
  mgHco3: number;
  mgCo3: number;
  mgSo4: number;
  mgOh: number;
  naCo3: number;
  naHco3: number;
  naSo4: number;
  kSo4: number;
}

let lastPairs: { tK: number; logKw: number; k: PairLogK; K: PairLogK } | undefined;

/** The same constants as K = 10^log K, kept with the last temperature (the passes reuse them). */
function pairK(lk: PairLogK): PairLogK {
  if (lastPairs !== undefined && lastPairs.k === lk) return lastPairs.K;
  return powers(lk);
}
function powers(lk: PairLogK): PairLogK {
  return {
    caHco3: 10 ** lk.caHco3,
    caCo3: 10 ** lk.caCo3,
    caSo4: 10 ** lk.caSo4,
    caOh: 10 ** lk.caOh,
    mgHco3: 10 ** lk.mgHco3,
    mgCo3: 10 ** lk.mgCo3,
    mgSo4: 10 ** lk.mgSo4,
    mgOh: 10 ** lk.mgOh,
    naCo3: 10 ** lk.naCo3,
    naHco3: 10 ** lk.naHco3,
    naSo4: 10 ** lk.naSo4,
    kSo4: 10 ** lk.kSo4,
  };
}

/**
 * log K of formation at temperature tK; `logKw` (thermodynamic) turns the hydrolysis constants
 * into formation from OH-: log K(Ca++ + OH- = CaOH+) = log K(hydrolysis) − log Kw.
 */
export function pairLogK(tK: number, logKw: number): PairLogK {
  if (lastPairs !== undefined && lastPairs.tK === tK && lastPairs.logKw === logKw) return lastPairs.k;
  const n = NORDSTROM_1990_PAIRS;
  const k: PairLogK = {
    caHco3: logKCaHco3PlummerBusenberg1982(tK),
    caCo3: logKCaCo3PlummerBusenberg1982(tK),
    caSo4: vantHoff(n.caSo4[0], n.caSo4[1], tK),
    caOh: vantHoff(n.caOhHydrolysis[0], n.caOhHydrolysis[1], tK) - logKw,
    mgHco3: logKMgHco3Nordstrom1990(tK),
    mgCo3: logKMgCo3Nordstrom1990(tK),
    mgSo4: vantHoff(n.mgSo4[0], n.mgSo4[1], tK),
    mgOh: vantHoff(n.mgOhHydrolysis[0], n.mgOhHydrolysis[1], tK) - logKw,
    naCo3: vantHoff(n.naCo3[0], n.naCo3[1], tK),
    naHco3: vantHoff(n.naHco3[0], n.naHco3[1], tK),
    naSo4: vantHoff(n.naSo4[0], n.naSo4[1], tK),
    kSo4: vantHoff(n.kSo4[0], n.kSo4[1], tK),
  };
  lastPairs = { tK, logKw, k, K: powers(k) };
  return k;
}

/** The formation constants as K = 10^log K at temperature tK (see `pairLogK`). */
export function pairKAt(tK: number, logKw: number): PairLogK {
  return pairK(pairLogK(tK, logKw));
}

/** Conditional formation constants (concentrations, mol/kg of water) at one ionic strength. */
export type PairBeta = PairLogK;

/** Conditional formation constants from log K at activity coefficients g (a new record). */
export function conditionalBetas(lk: PairLogK, g: ActivityCoefficients): PairBeta {
  const K = pairK(lk);
  return conditionalBetasInto({ ...K }, K, g);
}

/**
 * The conditional constants at activity coefficients g, written into `b` (one record per solve,
 * rewritten on every pass of the pair iteration); K = 10^log K from `pairKAt`.
 */
export function conditionalBetasInto(b: PairBeta, K: PairLogK, g: ActivityCoefficients): PairBeta {
  const g1 = g.HCO3; // charged pairs: charge 1, the 4 Å of HCO3-
  b.caHco3 = (K.caHco3 * g.Ca * g.HCO3) / g1;
  b.caCo3 = K.caCo3 * g.Ca * g.CO3;
  b.caSo4 = K.caSo4 * g.Ca * g.SO4;
  b.caOh = (K.caOh * g.Ca * g.OH) / g1;
  b.mgHco3 = (K.mgHco3 * g.Mg * g.HCO3) / g1;
  b.mgCo3 = K.mgCo3 * g.Mg * g.CO3;
  b.mgSo4 = K.mgSo4 * g.Mg * g.SO4;
  b.mgOh = (K.mgOh * g.Mg * g.OH) / g1;
  b.naCo3 = (K.naCo3 * g.Na * g.CO3) / g1;
  b.naHco3 = K.naHco3 * g.Na * g.HCO3;
  b.naSo4 = (K.naSo4 * g.Na * g.SO4) / g1;
  b.kSo4 = (K.kSo4 * g.K * g.SO4) / g1;
  return b;
}

/** Free concentrations of the paired ions, mol/kg of water. */
export interface FreeIons {
  ca: number;
  mg: number;
  na: number;
  k: number;
  so4: number;
}

/** Totals / free for each anion family, and for Ca and Mg: what the constant set needs. */
export interface PairAlphas {
  hco3: number;
  co3: number;
  oh: number;
  so4: number;
  ca: number;
  mg: number;
}

/**
 * The factors α = total / free: anions from the free cations; Ca and Mg from their totals (the
 * cation factors carry the anions through the free cations the speciation settled on), written
 * into `a`.
 */
export function pairAlphasInto(
  a: PairAlphas,
  b: PairBeta,
  f: FreeIons,
  calcium: number,
  magnesium: number,
): PairAlphas {
  a.hco3 = 1 + b.caHco3 * f.ca + b.mgHco3 * f.mg + b.naHco3 * f.na;
  a.co3 = 1 + b.caCo3 * f.ca + b.mgCo3 * f.mg + b.naCo3 * f.na;
  a.oh = 1 + b.caOh * f.ca + b.mgOh * f.mg;
  a.so4 = 1 + b.caSo4 * f.ca + b.mgSo4 * f.mg + b.naSo4 * f.na + b.kSo4 * f.k;
  a.ca = f.ca > 0 ? calcium / f.ca : 1;
  a.mg = f.mg > 0 ? magnesium / f.mg : 1;
  return a;
}

/** Totals of the paired ions, mol/kg of water. */
export interface PairTotals {
  ca: number;
  mg: number;
  na: number;
  k: number;
  so4: number;
}

/** The free anions of the carbonate system from the solver's totals and the current α. */
export interface FreeAnions {
  hco3: number;
  co3: number;
  oh: number;
}

/**
 * One Gauss–Seidel sweep of the cation and sulfate mass balances at fixed free carbonate anions:
 * SO4 from its total with the current cations, then each cation from its total with the anions.
 * The outer loop in `solve-fresh.ts` repeats it with re-solved carbonate until nothing moves.
 */
export function speciate(b: PairBeta, t: PairTotals, a: FreeAnions, f: FreeIons): FreeIons {
  const so4 = t.so4 / (1 + b.caSo4 * f.ca + b.mgSo4 * f.mg + b.naSo4 * f.na + b.kSo4 * f.k);
  return {
    so4,
    ca: t.ca / (1 + b.caHco3 * a.hco3 + b.caCo3 * a.co3 + b.caSo4 * so4 + b.caOh * a.oh),
    mg: t.mg / (1 + b.mgHco3 * a.hco3 + b.mgCo3 * a.co3 + b.mgSo4 * so4 + b.mgOh * a.oh),
    na: t.na / (1 + b.naHco3 * a.hco3 + b.naCo3 * a.co3 + b.naSo4 * so4),
    k: t.k / (1 + b.kSo4 * so4),
  };
}

/**
 * The free carbonate anions at free cations `f` from their totals (the solver's HCO3-, CO3--,
 * OH-): each total over its α (`pairAlphasInto`).
 */
export function freeAnionsOf(b: PairBeta, f: FreeIons, hco3: number, co3: number, oh: number): FreeAnions {
  return {
    hco3: hco3 / (1 + b.caHco3 * f.ca + b.mgHco3 * f.mg + b.naHco3 * f.na),
    co3: co3 / (1 + b.caCo3 * f.ca + b.mgCo3 * f.mg + b.naCo3 * f.na),
    oh: oh / (1 + b.caOh * f.ca + b.mgOh * f.mg),
  };
}

/** ½ Σ z² m over the paired ions, free and charged pairs (the rest of I is added by the caller). */
export function pairedIonicStrengthTerms(b: PairBeta, f: FreeIons, a: FreeAnions): number {
  const charged =
    b.caHco3 * f.ca * a.hco3 +
    b.caOh * f.ca * a.oh +
    b.mgHco3 * f.mg * a.hco3 +
    b.mgOh * f.mg * a.oh +
    b.naCo3 * f.na * a.co3 +
    b.naSo4 * f.na * f.so4 +
    b.kSo4 * f.k * f.so4;
  return 0.5 * (4 * f.ca + 4 * f.mg + f.na + f.k + 4 * f.so4 + a.hco3 + 4 * a.co3 + a.oh + charged);
}
