/**
 * Thermodynamic (infinite-dilution) equilibrium constants for fresh water, one function per
 * published formulation. All return log10 K with K in molal units (mol/kg of water, activities)
 * and take the absolute temperature tK in kelvin. None of them know about activity coefficients:
 * `constants.ts` turns them into the conditional constants the solver consumes.
 *
 * Where a value below is marked *(memory)* it was written down from memory of the cited paper
 * and is checked in the tests against other published values where we have them.
 */

import { LN10, R_J_PER_MOL_K, T0_K } from '../physical';
import type { Range } from './validity';

/** 25 °C, the reference temperature of the van 't Hoff extrapolations. */
export const T25_K = T0_K + 25;
/** Thermochemical calorie, J. */
const J_PER_KCAL = 4184;

/** Plummer & Busenberg (1982) fits are published for 0–90 °C. */
export const PLUMMER_BUSENBERG_1982_RANGE_C: Range = { min: 0, max: 90 };

/**
 * First dissociation of carbonic acid, CO2* + H2O = H+ + HCO3-.
 * Plummer & Busenberg (1982), Geochim. Cosmochim. Acta 46, 1011–1040, Table 5 (log K1).
 * log K1 = −356.3094 − 0.06091964 T + 21834.37/T + 126.8339 log T − 1684915/T².
 * Units: T in K; K1 in mol/kg (activities). Valid 0–90 °C. Check: log K1 = −6.352 at 25 °C.
 */
export function logK1PlummerBusenberg1982(tK: number): number {
  return -356.3094 - 0.06091964 * tK + 21834.37 / tK + 126.8339 * Math.log10(tK) - 1684915 / (tK * tK);
}

/**
 * Second dissociation, HCO3- = H+ + CO3--.
 * Plummer & Busenberg (1982), Table 5 (log K2).
 * log K2 = −107.8871 − 0.03252849 T + 5151.79/T + 38.92561 log T − 563713.9/T².
 * Units: T in K; K2 in mol/kg. Valid 0–90 °C. Check: log K2 = −10.329 at 25 °C.
 */
export function logK2PlummerBusenberg1982(tK: number): number {
  return -107.8871 - 0.03252849 * tK + 5151.79 / tK + 38.92561 * Math.log10(tK) - 563713.9 / (tK * tK);
}

/**
 * CO2 solubility (Henry's law), CO2(g) = CO2*: KH = a(CO2*) / fCO2.
 * Plummer & Busenberg (1982), Table 5 (log KH).
 * log KH = 108.3865 + 0.01985076 T − 6919.53/T − 40.45154 log T + 669365/T².
 * Units: T in K; KH in mol kg-1 atm-1. Valid 0–90 °C (at 1 atm total pressure).
 * Check: log KH = −1.468 at 25 °C.
 */
export function logKhPlummerBusenberg1982(tK: number): number {
  return 108.3865 + 0.01985076 * tK - 6919.53 / tK - 40.45154 * Math.log10(tK) + 669365 / (tK * tK);
}

/**
 * Calcite solubility, CaCO3 = Ca++ + CO3--.
 * Plummer & Busenberg (1982), Table 5 (log Kc).
 * log Kc = −171.9065 − 0.077993 T + 2839.319/T + 71.595 log T.
 * Units: T in K; K in mol2 kg-2 (activities). Valid 0–90 °C. Check: log Kc = −8.480 at 25 °C.
 */
export function logKspCalcitePlummerBusenberg1982(tK: number): number {
  return -171.9065 - 0.077993 * tK + 2839.319 / tK + 71.595 * Math.log10(tK);
}

/**
 * Aragonite solubility, CaCO3 = Ca++ + CO3--.
 * Plummer & Busenberg (1982), Table 5 (log Ka).
 * log Ka = −171.9773 − 0.077993 T + 2903.293/T + 71.595 log T.
 * Units: T in K; K in mol2 kg-2. Valid 0–90 °C. Check: log Ka = −8.336 at 25 °C.
 */
export function logKspAragonitePlummerBusenberg1982(tK: number): number {
  return -171.9773 - 0.077993 * tK + 2903.293 / tK + 71.595 * Math.log10(tK);
}

/** Harned & Owen (1958) fit of Kw, published for 0–60 °C. */
export const HARNED_OWEN_1958_RANGE_C: Range = { min: 0, max: 60 };

/**
 * Ion product of water, H2O = H+ + OH-.
 * Harned & Owen (1958), The Physical Chemistry of Electrolytic Solutions, 3rd ed., eq. (15-6-5)
 * *(memory of the equation number)*: log Kw = −4470.99/T + 6.0875 − 0.01706 T.
 * Units: T in K; Kw in mol2 kg-2. Valid 0–60 °C. Check: log Kw = −13.995 at 25 °C.
 *
 * How well the fit holds its own table (issue 12 §4): against the pKw Harned & Owen tabulate from
 * 0 to 60 °C (tests/fixtures/harned-owen-1958.ts, memory) this equation (the Harned & Robinson 1940
 * form they quote) is 0.0003–0.0028 low in pKw, mean 0.0017. The one other published fit we had,
 * the S-free part of Millero (1995) (ln Kw = 148.9802 − 13847.26/T − 23.6521 ln T), is no closer
 * (0.0002–0.0024 low, mean 0.0017), so the equation is kept and the difference documented: 0.003
 * in pKw is 0.7 % in Kw, below 0.001 in any carbonate output under pH 9.5, and inside the 0.01 pKw
 * standard uncertainty the engine propagates (Orr et al. 2018). The test pins the residuals.
 */
export function logKwHarnedOwen1958(tK: number): number {
  return -4470.99 / tK + 6.0875 - 0.01706 * tK;
}

/**
 * van 't Hoff extrapolation of log K from 25 °C with a constant reaction enthalpy:
 * log K(T) = log K(298.15) − ΔH / (R ln 10) · (1/T − 1/298.15).
 * Units: ΔH in J/mol, T in K. Good to a few hundredths of a log unit within ±25 K of 25 °C.
 */
export function logKVantHoff(logK25: number, deltaHJPerMol: number, tK: number): number {
  return logK25 - (deltaHJPerMol / (R_J_PER_MOL_K * LN10)) * (1 / tK - 1 / T25_K);
}

/** The constant-ΔH extrapolations are trusted within ±25 K of 25 °C (common practice). */
export const VANT_HOFF_RANGE_C: Range = { min: 0, max: 50 };

/**
 * Dolomite solubility, CaMg(CO3)2 = Ca++ + Mg++ + 2 CO3--.
 * Nordstrom et al. (1990), "Revised chemical equilibrium data for major water–mineral reactions
 * and their limitations", ACS Symp. Ser. 416, Table III *(memory)*: ordered dolomite
 * log K = −17.09, ΔH°r = −9.436 kcal/mol; disordered dolomite log K = −16.54, ΔH°r = −11.09 kcal/mol.
 * Extrapolated with van 't Hoff. Units: T in K; K in mol4 kg-4. Valid 0–50 °C (see VANT_HOFF_RANGE_C).
 * Check: log K = −17.09 at 25 °C (ordered).
 */
export function logKspDolomiteNordstrom1990(tK: number, form: 'ordered' | 'disordered' = 'ordered'): number {
  return form === 'ordered'
    ? logKVantHoff(-17.09, -9.436 * J_PER_KCAL, tK)
    : logKVantHoff(-16.54, -11.09 * J_PER_KCAL, tK);
}

/**
 * Boric acid, B(OH)3 + H2O = B(OH)4- + H+, at infinite dilution.
 * Dickson (1990b), Deep-Sea Res. 37, 755–766, eq. 23 with S = 0: its salinity-free terms
 * ln K = −8966.90/T + 148.0248 − 24.4344 ln T carry the infinite-dilution constant of
 * Owen (1934) *(memory)*. Units: T in K. Valid 0–45 °C. Check: pK = 9.236 at 25 °C.
 */
export function logKbDickson1990S0(tK: number): number {
  return (-8966.9 / tK + 148.0248 - 24.4344 * Math.log(tK)) / LN10;
}
export const DICKSON_1990_RANGE_C: Range = { min: 0, max: 45 };

/**
 * Ammonium, NH4+ = NH3 + H+.
 * Bates & Pinching (1949), J. Res. Natl. Bur. Stand. 42, 419 *(memory)*: pK = 0.09018 + 2729.92/T.
 * Units: T in K. Valid 0–50 °C. Check: pK = 9.245 at 25 °C.
 */
export function logKnh4BatesPinching1949(tK: number): number {
  return -(0.09018 + 2729.92 / tK);
}
export const BATES_PINCHING_1949_RANGE_C: Range = { min: 0, max: 50 };

/**
 * Phosphoric acid, first step, H3PO4 = H2PO4- + H+.
 * Bates (1951), J. Res. Natl. Bur. Stand. 47, 127 *(memory)*: pK = 799.31/T − 4.5535 + 0.013486 T.
 * Units: T in K. Valid 0–60 °C. Check: pK = 2.148 at 25 °C.
 */
export function logK1pBates1951(tK: number): number {
  return -(799.31 / tK - 4.5535 + 0.013486 * tK);
}

/**
 * Phosphoric acid, second step, H2PO4- = HPO4-- + H+.
 * Bates & Acree (1943), J. Res. Natl. Bur. Stand. 30, 129 *(memory)*: pK = 2073.0/T − 5.9884 + 0.020912 T.
 * Units: T in K. Valid 0–60 °C. Check: pK = 7.199 at 25 °C.
 */
export function logK2pBatesAcree1943(tK: number): number {
  return -(2073.0 / tK - 5.9884 + 0.020912 * tK);
}
export const BATES_PHOSPHATE_RANGE_C: Range = { min: 0, max: 60 };

/**
 * Phosphoric acid, third step, HPO4-- = PO4--- + H+.
 * Nordstrom et al. (1990), Table III *(memory)*: log K = −12.346, ΔH°r = 14.5 kcal/mol; van 't Hoff.
 * Units: T in K. Valid 0–50 °C. Check: log K = −12.346 at 25 °C.
 */
export function logK3pNordstrom1990(tK: number): number {
  return logKVantHoff(-12.346, 14.5 * J_PER_KCAL, tK);
}

/**
 * Silicic acid, H4SiO4 = H3SiO4- + H+.
 * Nordstrom et al. (1990), Table III *(memory)*: log K = −9.83, ΔH°r = 6.12 kcal/mol; van 't Hoff.
 * Units: T in K. Valid 0–50 °C. Check: log K = −9.83 at 25 °C.
 */
export function logKsiNordstrom1990(tK: number): number {
  return logKVantHoff(-9.83, 6.12 * J_PER_KCAL, tK);
}

/**
 * Hydrogen sulfide, H2S = HS- + H+.
 * Nordstrom et al. (1990), Table III *(memory)*: log K = −6.994, ΔH°r = 5.30 kcal/mol; van 't Hoff.
 * Units: T in K. Valid 0–50 °C. Check: log K = −6.994 at 25 °C.
 */
export function logKh2sNordstrom1990(tK: number): number {
  return logKVantHoff(-6.994, 5.3 * J_PER_KCAL, tK);
}

/**
 * Bisulfate, HSO4- = SO4-- + H+ (free H+).
 * Nordstrom et al. (1990), Table III *(memory)*: association log K = 1.988, ΔH°r = 3.85 kcal/mol,
 * so dissociation log K = −1.988, ΔH°r = −3.85 kcal/mol; van 't Hoff.
 * Units: T in K. Valid 0–50 °C. Check: log K = −1.988 at 25 °C.
 */
export function logKsNordstrom1990(tK: number): number {
  return logKVantHoff(-1.988, -3.85 * J_PER_KCAL, tK);
}

/**
 * Hydrogen fluoride, HF = H+ + F- (free H+).
 * Nordstrom et al. (1990), Table III *(memory)*: association log K = 3.18, ΔH°r = 3.18 kcal/mol,
 * so dissociation log K = −3.18, ΔH°r = −3.18 kcal/mol; van 't Hoff.
 * Units: T in K. Valid 0–50 °C. Check: log K = −3.18 at 25 °C.
 */
export function logKfNordstrom1990(tK: number): number {
  return logKVantHoff(-3.18, -3.18 * J_PER_KCAL, tK);
}

/** Weiss (1974) virial terms are fitted for 265–320 K. */
export const WEISS_1974_RANGE_C: Range = { min: -8, max: 47 };

/**
 * fCO2 / pCO2 for CO2 in moist air at total pressure pAtm.
 * Weiss (1974), Mar. Chem. 2, 203–215, eqs. 6 and 9 *(memory)*: first virial coefficient of CO2
 * B = −1636.75 + 12.0408 T − 3.27957e-2 T² + 3.16528e-5 T³ (cm3/mol) and the CO2–air cross term
 * δ = 57.7 − 0.118 T (cm3/mol); fCO2 = pCO2 · exp((B + 2δ) P / (R T)), neglecting x(CO2)².
 * Units: T in K, P in atm; dimensionless. Check: 0.9968 at 25 °C, 1 atm.
 */
export function fugacityFactorWeiss1974(tK: number, pAtm = 1): number {
  const b = -1636.75 + 12.0408 * tK - 3.27957e-2 * tK * tK + 3.16528e-5 * tK * tK * tK;
  const delta = 57.7 - 0.118 * tK;
  // R in cm3 atm mol-1 K-1, so that (B + 2δ)·P/(R·T) is dimensionless.
  const rCm3Atm = 82.05736608;
  return Math.exp(((b + 2 * delta) * pAtm) / (rCm3Atm * tK));
}
