/**
 * The saline (marine and brackish) water model: conditions in, a {@link ConstantSet} out.
 *
 * Acid constants are on the total scale (the internal scale), KS and KF on the free scale; all in
 * mol kg-1 of seawater. Pressure corrections are applied on the scale their coefficients belong to
 * (see `pressure.ts`). Formulations are evaluated outside their fitted ranges too, with a warning.
 *
 * Speed: this runs once per row in batch solves, so per call it allocates only the returned set,
 * its `conditions` copy and its `scaleFactor` record. `formulations` is one frozen object per
 * option combination, and `warnings` is one shared frozen empty array when there are none — copy
 * it before adding to it. When there are warnings the array is new but its Issue objects are shared
 * and frozen (see `issues.ts`).
 */

import type { BoronTotal, CarbonicConstants } from '../api';
import { fail, type Issue } from '../errors';
import { T0_K } from '../physical';
import type { Conditions, ConstantSet } from '../types';
import { KNH4_CLEGGWHITFIELD1995_VALIDITY, knh4CleggWhitfield1995 } from './ammonium';
import { KB_DICKSON1990B_VALIDITY, kbDickson1990b } from './boric';
import { KSP_MUCCI1983_VALIDITY, kspAragoniteMucci1983, kspCalciteMucci1983 } from './calcium-carbonate';
import {
  CARBONIC_AUTO_BAND,
  K1K2_LUEKER2000_VALIDITY,
  K1K2_MILLERO2010_VALIDITY,
  k1Lueker2000,
  k1Millero2010,
  k2Lueker2000,
  k2Millero2010,
  luekerWeight,
} from './carbonic';
import {
  FUGACITY_WEISS1974_VALIDITY,
  fugacityFactorWeiss1974,
  K0_WEISS1974_VALIDITY,
  k0PressureFactorWeiss1974,
  k0Weiss1974,
} from './co2-solubility';
import {
  KF_DICKSONRILEY1979_VALIDITY,
  KF_PEREZFRAGA1987_VALIDITY,
  kfDicksonRiley1979,
  kfPerezFraga1987,
} from './fluoride';
import {
  CALCIUM_INVALID,
  CONDITION_NOT_FINITE,
  CONDITION_OUT_OF_RANGE,
  checkValidity,
  FIELD_PRESSURE,
  FIELD_SALINITY,
  FIELD_TEMPERATURE,
  isInside,
  OPTION_UNKNOWN,
  type ValidityRange,
} from './issues';
import { KP_MILLERO1995_VALIDITY, k1pMillero1995, k2pMillero1995, k3pMillero1995 } from './phosphoric';
import {
  lnCarbonicPressureFactorMillero2010,
  lnPressureFactorMillero1995,
  PRESSURE_MILLERO1995_VALIDITY,
  PRESSURE_TERMS_MILLERO1995 as PT,
} from './pressure';
import {
  NBS_TAKAHASHI1982_VALIDITY,
  nbsActivityCoefficientTakahashi1982,
  salineScaleFactors,
} from './scales';
import { KSI_MILLERO1995_VALIDITY, ksiMillero1995 } from './silicic';
import { KS_DICKSON1990A_VALIDITY, ksDickson1990a } from './sulfate';
import { KH2S_MILLERO1988_VALIDITY, kh2sMillero1988 } from './sulfide';
import {
  calciumRileyTongudai1967,
  TOTALS_FROM_SALINITY_VALIDITY,
  totalBoronLee2010,
  totalBoronUppstrom1974,
  totalFluorideRiley1965,
  totalSulfateMorrisRiley1966,
} from './totals';
import { KW_MILLERO1995_VALIDITY, kwMillero1995 } from './water';

export type FluorideConstant = 'perezfraga1987' | 'dicksonriley1979';

export interface SalineOptions {
  /**
   * K1 and K2: `auto` (default: Millero 2010 below S 19, Lueker et al. 2000 from S 25, blended in
   * between, see `CARBONIC_AUTO_BAND`), or one formulation at every salinity: Lueker et al. 2000
   * (marine) or Millero 2010 (estuarine, brackish).
   */
  carbonic?: CarbonicConstants;
  /** Total boron from salinity: Lee et al. 2010 (default) or Uppström 1974. */
  boron?: BoronTotal;
  /** KF: Perez & Fraga 1987 (default) or Dickson & Riley 1979. */
  fluoride?: FluorideConstant;
  /** Measured calcium, mol kg-1; when absent it is estimated from salinity. */
  calcium_mol_kg?: number;
}

/** Outside these no formulation means anything (ice, steam, negative salt, suction). */
const HARD_LIMITS = {
  temperatureC: [-3, 100],
  salinity: [0, 100],
  pressureDbar: [0, 12000],
} as const;

/** True when `salineConstants` can be evaluated at this temperature (inside its hard limits). */
export function salineCanEvaluate(temperatureC: number): boolean {
  return temperatureC >= HARD_LIMITS.temperatureC[0] && temperatureC <= HARD_LIMITS.temperatureC[1];
}

const EMPTY_WARNINGS: Issue[] = Object.freeze([]) as unknown as Issue[];

/** The ranges checked for every set, whatever the options. */
const COMMON_RANGES: readonly ValidityRange[] = [
  K0_WEISS1974_VALIDITY,
  FUGACITY_WEISS1974_VALIDITY,
  KB_DICKSON1990B_VALIDITY,
  KW_MILLERO1995_VALIDITY,
  KS_DICKSON1990A_VALIDITY,
  KP_MILLERO1995_VALIDITY,
  KSI_MILLERO1995_VALIDITY,
  KNH4_CLEGGWHITFIELD1995_VALIDITY,
  KH2S_MILLERO1988_VALIDITY,
  KSP_MUCCI1983_VALIDITY,
  TOTALS_FROM_SALINITY_VALIDITY,
  PRESSURE_MILLERO1995_VALIDITY,
  NBS_TAKAHASHI1982_VALIDITY,
];

const formulationCache: (Readonly<Record<string, string>> | undefined)[] = [];

/** K1 and K2 as used: one formulation, or the default blend across S 19–25. */
type CarbonicUsed = 'lueker2000' | 'millero2010' | 'blend';

const CARBONIC_NAMES: Record<CarbonicUsed, string> = {
  lueker2000: 'Lueker et al. 2000 (total scale)',
  millero2010: 'Millero 2010 (total scale)',
  blend: `Millero 2010 and Lueker et al. 2000 (total scale), pK blended across S ${CARBONIC_AUTO_BAND.from}–${CARBONIC_AUTO_BAND.to}`,
};

function formulationsFor(
  used: CarbonicUsed,
  uppstrom: boolean,
  dicksonRiley: boolean,
  calciumGiven: boolean,
): Readonly<Record<string, string>> {
  const key =
    (used === 'millero2010' ? 1 : used === 'blend' ? 2 : 0) +
    (uppstrom ? 3 : 0) +
    (dicksonRiley ? 6 : 0) +
    (calciumGiven ? 12 : 0);
  const cached = formulationCache[key];
  if (cached !== undefined) return cached;
  const carbonic = CARBONIC_NAMES[used];
  const millero2010 = used !== 'lueker2000';
  const made = Object.freeze({
    model: 'saline: stoichiometric constants, total pH scale, mol/kg of seawater',
    k0: 'Weiss 1974, with its partial molar volume of CO2 for pressure',
    fugacityFactor: 'Weiss 1974 virial coefficients, at 1 atm total pressure',
    k1: carbonic,
    k2: carbonic,
    kb: 'Dickson 1990b',
    kw: 'Millero 1995',
    ks: 'Dickson 1990a (free scale)',
    kf: dicksonRiley ? 'Dickson & Riley 1979 (free scale)' : 'Perez & Fraga 1987 (free scale)',
    k1p: 'Millero 1995',
    k2p: 'Millero 1995',
    k3p: 'Millero 1995',
    ksi: 'Millero 1995',
    knh4: 'Clegg & Whitfield 1995',
    kh2s: 'Millero et al. 1988 (seawater scale, converted to total)',
    kspCalcite: 'Mucci 1983',
    kspAragonite: 'Mucci 1983',
    pressure: millero2010
      ? `Millero 1995 (K1 and K2: ${used === 'blend' ? 'Millero 2010 blended with Millero 1995 like K1 and K2' : 'Millero 2010'}); calcite and aragonite after Ingle 1975`
      : 'Millero 1995; calcite and aragonite after Ingle 1975',
    totalBoron: uppstrom ? 'Uppström 1974' : 'Lee et al. 2010',
    totalSulfate: 'Morris & Riley 1966',
    totalFluoride: 'Riley 1965',
    calcium: calciumGiven ? 'measured' : 'Riley & Tongudai 1967',
    nbs: 'Takahashi et al. 1982 apparent H+ activity coefficient (approximate in seawater)',
  });
  formulationCache[key] = made;
  return made;
}

function checkCondition(
  x: number,
  field: string,
  what: string,
  limits: readonly [number, number],
  unit: string,
  hint: string,
): void {
  if (typeof x !== 'number' || !Number.isFinite(x))
    fail(CONDITION_NOT_FINITE, `The ${what} is missing or not a number.`, field);
  if (x < limits[0] || x > limits[1])
    fail(
      CONDITION_OUT_OF_RANGE,
      `A ${what} of ${x}${unit} is outside ${limits[0]}–${limits[1]}${unit}, where the saline model cannot be evaluated (${hint}).`,
      field,
    );
}

/**
 * Every constant and total of the saline model at the given conditions.
 * @param cond temperature (°C), practical salinity, applied pressure (dbar, 0 at the surface)
 * @param opts formulation choices and a measured calcium
 * @throws TufaError `condition-not-finite`, `condition-out-of-range`, `calcium-invalid`, `option-unknown`
 */
export function salineConstants(cond: Conditions, opts?: SalineOptions): ConstantSet {
  const tC = cond.temperatureC;
  const s = cond.salinity;
  const pDbar = cond.pressureDbar;
  checkCondition(tC, FIELD_TEMPERATURE, 'temperature', HARD_LIMITS.temperatureC, ' °C', 'liquid water only');
  checkCondition(
    s,
    FIELD_SALINITY,
    'salinity',
    HARD_LIMITS.salinity,
    '',
    'practical salinity, 35 for the open ocean',
  );
  checkCondition(
    pDbar,
    FIELD_PRESSURE,
    'pressure',
    HARD_LIMITS.pressureDbar,
    ' dbar',
    'applied pressure, 0 at the surface',
  );

  const carbonic = opts?.carbonic ?? 'auto';
  const boron = opts?.boron ?? 'lee2010';
  const fluoride = opts?.fluoride ?? 'perezfraga1987';
  if (carbonic !== 'lueker2000' && carbonic !== 'millero2010' && carbonic !== 'auto')
    fail(
      OPTION_UNKNOWN,
      `Unknown carbonic acid constants "${carbonic}": use auto, lueker2000 or millero2010.`,
      'carbonic_constants',
    );
  if (boron !== 'lee2010' && boron !== 'uppstrom1974')
    fail(OPTION_UNKNOWN, `Unknown total boron ratio "${boron}": use lee2010 or uppstrom1974.`, 'boron_total');
  if (fluoride !== 'perezfraga1987' && fluoride !== 'dicksonriley1979')
    fail(
      OPTION_UNKNOWN,
      `Unknown HF constant "${fluoride}": use perezfraga1987 or dicksonriley1979.`,
      'fluoride_constant',
    );
  const calciumGiven = opts?.calcium_mol_kg;
  if (calciumGiven !== undefined && !(Number.isFinite(calciumGiven) && calciumGiven >= 0))
    fail(
      CALCIUM_INVALID,
      'The measured calcium must be a number of mol/kg, zero or more.',
      'calcium_umol_kg',
    );
  // Weight of Lueker et al. (2000): 1 or 0 for a named formulation, by salinity for the default.
  const wL = carbonic === 'auto' ? luekerWeight(s) : carbonic === 'lueker2000' ? 1 : 0;
  const used: CarbonicUsed = wL === 1 ? 'lueker2000' : wL === 0 ? 'millero2010' : 'blend';
  const dr1979 = fluoride === 'dicksonriley1979';

  const tK = tC + T0_K;
  const lnT = Math.log(tK);
  const sqrtS = Math.sqrt(s);

  const st = totalSulfateMorrisRiley1966(s);
  const ft = totalFluorideRiley1965(s);
  const ks0 = ksDickson1990a(tK, s, lnT);
  const kf0 = dr1979 ? kfDicksonRiley1979(tK, s) : kfPerezFraga1987(tK, s, sqrtS);

  let k0 = k0Weiss1974(tK, s);
  let k1 =
    wL === 1
      ? k1Lueker2000(tK, s, lnT)
      : wL === 0
        ? k1Millero2010(tK, s, lnT, sqrtS)
        : blend(k1Millero2010(tK, s, lnT, sqrtS), k1Lueker2000(tK, s, lnT), wL);
  let k2 =
    wL === 1
      ? k2Lueker2000(tK, s, lnT)
      : wL === 0
        ? k2Millero2010(tK, s, lnT, sqrtS)
        : blend(k2Millero2010(tK, s, lnT, sqrtS), k2Lueker2000(tK, s, lnT), wL);
  let kb = kbDickson1990b(tK, s, lnT, sqrtS);
  let kw = kwMillero1995(tK, s, lnT, sqrtS);
  let k1p = k1pMillero1995(tK, s, lnT, sqrtS);
  let k2p = k2pMillero1995(tK, s, lnT, sqrtS);
  let k3p = k3pMillero1995(tK, s, sqrtS);
  let ksi = ksiMillero1995(tK, s, lnT);
  let knh4 = knh4CleggWhitfield1995(tK, s, sqrtS);
  let kh2sSws = kh2sMillero1988(tK, s, lnT, sqrtS);
  let kspCalcite = kspCalciteMucci1983(tK, s, lnT, sqrtS);
  let kspAragonite = kspAragoniteMucci1983(tK, s, lnT, sqrtS);
  let ks = ks0;
  let kf = kf0;

  if (pDbar > 0) {
    const pBar = pDbar / 10;
    ks = ks0 * Math.exp(lnPressureFactorMillero1995(PT.ks, tC, pBar, tK));
    kf = kf0 * Math.exp(lnPressureFactorMillero1995(PT.kf, tC, pBar, tK));
    // Total-scale constants: to the seawater scale with KS, KF at the surface, pressure there,
    // back to the total scale with KS, KF at pressure. ln of the two scale ratios is folded into one.
    const totToSws0 = Math.log((1 + st / ks0 + ft / kf0) / (1 + st / ks0));
    const swsToTotP = Math.log((1 + st / ks) / (1 + st / ks + ft / kf));
    const scale = totToSws0 + swsToTotP;
    k0 *= k0PressureFactorWeiss1974(tK, pBar);
    // The pressure terms follow the K1 and K2 they belong to, blended with the same weight.
    const lnP1 =
      (wL < 1 ? (1 - wL) * lnCarbonicPressureFactorMillero2010(1, s, tC, pBar, tK) : 0) +
      (wL > 0 ? wL * lnPressureFactorMillero1995(PT.k1, tC, pBar, tK) : 0);
    const lnP2 =
      (wL < 1 ? (1 - wL) * lnCarbonicPressureFactorMillero2010(2, s, tC, pBar, tK) : 0) +
      (wL > 0 ? wL * lnPressureFactorMillero1995(PT.k2, tC, pBar, tK) : 0);
    k1 *= Math.exp(scale + lnP1);
    k2 *= Math.exp(scale + lnP2);
    kb *= Math.exp(scale + lnPressureFactorMillero1995(PT.kb, tC, pBar, tK));
    kw *= Math.exp(scale + lnPressureFactorMillero1995(PT.kw, tC, pBar, tK));
    k1p *= Math.exp(scale + lnPressureFactorMillero1995(PT.k1p, tC, pBar, tK));
    k2p *= Math.exp(scale + lnPressureFactorMillero1995(PT.k2p, tC, pBar, tK));
    k3p *= Math.exp(scale + lnPressureFactorMillero1995(PT.k3p, tC, pBar, tK));
    ksi *= Math.exp(scale + lnPressureFactorMillero1995(PT.ksi, tC, pBar, tK));
    knh4 *= Math.exp(scale + lnPressureFactorMillero1995(PT.knh4, tC, pBar, tK));
    kh2sSws *= Math.exp(lnPressureFactorMillero1995(PT.kh2s, tC, pBar, tK));
    kspCalcite *= Math.exp(lnPressureFactorMillero1995(PT.kspCalcite, tC, pBar, tK));
    kspAragonite *= Math.exp(lnPressureFactorMillero1995(PT.kspAragonite, tC, pBar, tK));
  }

  const scaleFactor = salineScaleFactors(st, ks, ft, kf, nbsActivityCoefficientTakahashi1982(tK, s));
  // scaleFactor.seawater = h_sws / h_total, so a seawater-scale constant divided by it is on the total scale.
  const kh2s = kh2sSws / scaleFactor.seawater;

  let warnings: Issue[] | undefined;
  for (const range of COMMON_RANGES) {
    if (!isInside(range, tC, s, pDbar)) warnings = checkValidity(range, tC, s, pDbar, warnings ?? []);
  }
  // In the blend both formulations are used, so both ranges are checked.
  if (wL < 1 && !isInside(K1K2_MILLERO2010_VALIDITY, tC, s, pDbar))
    warnings = checkValidity(K1K2_MILLERO2010_VALIDITY, tC, s, pDbar, warnings ?? []);
  if (wL > 0 && !isInside(K1K2_LUEKER2000_VALIDITY, tC, s, pDbar))
    warnings = checkValidity(K1K2_LUEKER2000_VALIDITY, tC, s, pDbar, warnings ?? []);
  const fluorideRange = dr1979 ? KF_DICKSONRILEY1979_VALIDITY : KF_PEREZFRAGA1987_VALIDITY;
  if (!isInside(fluorideRange, tC, s, pDbar))
    warnings = checkValidity(fluorideRange, tC, s, pDbar, warnings ?? []);

  return {
    model: 'saline',
    conditions: { temperatureC: tC, salinity: s, pressureDbar: pDbar },
    k0,
    fugacityFactor: fugacityFactorWeiss1974(tK),
    k1,
    k2,
    kw,
    kb,
    ks,
    kf,
    k1p,
    k2p,
    k3p,
    ksi,
    knh4,
    kh2s,
    kspCalcite,
    kspAragonite,
    totalBoron: boron === 'uppstrom1974' ? totalBoronUppstrom1974(s) : totalBoronLee2010(s),
    totalSulfate: st,
    totalFluoride: ft,
    calcium: calciumGiven ?? calciumRileyTongudai1967(s),
    freeHFactor: scaleFactor.free,
    scaleFactor,
    formulations: formulationsFor(used, boron === 'uppstrom1974', dr1979, calciumGiven !== undefined),
    warnings: warnings ?? EMPTY_WARNINGS,
  };
}

/** exp((1 − w) ln a + w ln b): the blend of two constants in log space. */
function blend(a: number, b: number, w: number): number {
  return a ** (1 - w) * b ** w;
}
