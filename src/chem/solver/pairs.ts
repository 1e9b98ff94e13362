/**
 * Solving the carbonate system from any two of its parameters.
 *
 * The CO2 family (pCO2, fCO2, CO2*) is collapsed to CO2* by the caller, so the solver sees six
 * parameters: TA, DIC, pH, CO2*, HCO3-, CO3--. Of their 15 pairs, those with pH, and those between
 * two carbonate species, are closed-form; DIC with a species is a quadratic in h (DIC–HCO3- has
 * two positive roots where it has any); TA with DIC is monotonic and solved by safeguarded
 * Newton; TA with a species may be non-monotonic in h (TA–CO3-- has a minimum) and is scanned
 * for every root. Roots are returned from the highest pH to the lowest; the first is the default.
 */

import { fail } from '../errors';
import type { CarbonateState, ConstantSet, MinorTotals } from '../types';
import {
  alkalinityFromHDic,
  alkalinitySlopeH,
  carbonateAlkalinityPerDic,
  nonCarbonateAlkalinity,
} from './alkalinity';
import { allRoots, newtonBracketed, PH_SEARCH_MAX, PH_SEARCH_MIN } from './roots';

export type Param = 'ta' | 'dic' | 'ph' | 'co2' | 'hco3' | 'co3';

/** Bracket used for TA–DIC: wide enough that the residual changes sign for any valid input. */
const TA_DIC_PH_LO = -1;
const TA_DIC_PH_HI = 16;

/** The complete state from h (internal scale) and DIC. */
export function stateFromHDic(h: number, dic: number, k: ConstantSet, t: MinorTotals): CarbonateState {
  const k1h = k.k1 * h;
  const k1k2 = k.k1 * k.k2;
  const den = h * h + k1h + k1k2;
  const co2 = (dic * h * h) / den;
  const fco2 = co2 / k.k0;
  return {
    h,
    dic,
    ta: alkalinityFromHDic(h, dic, k, t),
    co2,
    hco3: (dic * k1h) / den,
    co3: (dic * k1k2) / den,
    fco2,
    pco2: fco2 / k.fugacityFactor,
  };
}

/** DIC from h and one carbonate species (CO2*, HCO3- or CO3--). */
function dicFromHSpecies(species: 'co2' | 'hco3' | 'co3', value: number, h: number, k: ConstantSet): number {
  const k1 = k.k1;
  const k2 = k.k2;
  switch (species) {
    case 'co2':
      return value * (1 + k1 / h + (k1 * k2) / (h * h));
    case 'hco3':
      return value * (h / k1 + 1 + k2 / h);
    case 'co3':
      return value * ((h * h) / (k1 * k2) + h / k2 + 1);
  }
}

/** DIC from h and TA: TA minus the non-carbonate alkalinity, over carbonate alkalinity per DIC. */
function dicFromHTa(h: number, ta: number, k: ConstantSet, t: MinorTotals): number {
  return (ta - nonCarbonateAlkalinity(h, k, t)) / carbonateAlkalinityPerDic(h, k);
}

const scratch = new Float64Array(2);

/**
 * h from TA and DIC. First guess from the carbonate-only quadratic
 * TA·h² + (TA − DIC)·K1·h + (TA − 2·DIC)·K1·K2 = 0, corrected once for borate and water
 * alkalinity at that guess; then safeguarded Newton in pH (typically 3–4 iterations).
 */
export function hFromTaDic(ta: number, dic: number, k: ConstantSet, t: MinorTotals): number {
  let x0 = 8;
  const h0 = carbonateOnlyH(ta, dic, k);
  if (h0 > 0) {
    const taCarb = ta - (k.totalBoron * k.kb) / (k.kb + h0) - k.kw / h0 + h0 * k.freeHFactor;
    const h1 = carbonateOnlyH(taCarb, dic, k);
    const h = h1 > 0 ? h1 : h0;
    x0 = Math.min(13, Math.max(2, -Math.log10(h)));
  }
  const residual = (x: number, out: Float64Array): void => {
    const h = 10 ** -x;
    out[0] = alkalinityFromHDic(h, dic, k, t) - ta;
    // d/dx of TA(h(x)) = dTA/dh · (−ln10 · h); TA falls with h, so the residual rises with pH.
    out[1] = -Math.LN10 * h * alkalinitySlopeH(h, dic, k, t);
  };
  const { x } = newtonBracketed(residual, x0, TA_DIC_PH_LO, TA_DIC_PH_HI, scratch);
  return 10 ** -x;
}

/** Positive root of the carbonate-only TA–DIC quadratic, or 0 when TA is outside (0, 2·DIC). */
function carbonateOnlyH(ta: number, dic: number, k: ConstantSet): number {
  if (!(ta > 0 && ta < 2 * dic)) return 0;
  const b = (ta - dic) * k.k1;
  const c = (ta - 2 * dic) * k.k1 * k.k2;
  // −c > 0 here, so the root is written without cancellation.
  return (-2 * c) / (b + Math.sqrt(b * b - 4 * ta * c));
}

function noRoot(pair: string, why: string): never {
  return fail('no-solution', `No water has this ${pair} combination: ${why}`);
}

/** Positive roots of the quadratic in h for DIC with a species; throws when there is none. */
function hFromDicSpecies(
  species: 'co2' | 'hco3' | 'co3',
  dic: number,
  value: number,
  k: ConstantSet,
): number[] {
  const k1 = k.k1;
  const k2 = k.k2;
  const r = dic / value;
  if (species === 'co2') {
    if (!(r > 1)) noRoot('DIC–CO2', 'DIC must exceed CO2*.');
    // (r−1)h² − K1·h − K1·K2 = 0, the positive root written without cancellation.
    return [(k1 + Math.sqrt(k1 * k1 + 4 * (r - 1) * k1 * k2)) / (2 * (r - 1))];
  }
  if (species === 'co3') {
    if (!(r > 1)) noRoot('DIC–CO3', 'DIC must exceed carbonate.');
    // h² + K1·h − (r−1)·K1·K2 = 0.
    const c = (r - 1) * k1 * k2;
    return [(2 * c) / (k1 + Math.sqrt(k1 * k1 + 4 * c))];
  }
  // HCO3-: h²/K1 + (1 − r)·h + K2 = 0; the two roots multiply to K1·K2.
  if (!(r > 1)) noRoot('DIC–HCO3', 'DIC must exceed bicarbonate.');
  const b = r - 1;
  const disc = b * b - (4 * k2) / k1;
  if (disc < 0) noRoot('DIC–HCO3', 'bicarbonate is larger than any pH allows for this DIC.');
  const hLow = (k1 * (b + Math.sqrt(disc))) / 2; // the larger h: the low-pH root
  const hHigh = (k1 * k2) / hLow;
  return disc === 0 ? [hLow] : [hHigh, hLow];
}

/** h from TA and a carbonate species: scan pH for every root of TA(h, DIC(h, species)) − TA. */
function hFromTaSpecies(
  species: 'co2' | 'hco3' | 'co3',
  ta: number,
  value: number,
  k: ConstantSet,
  t: MinorTotals,
): number[] {
  const f = (x: number): number => {
    const h = 10 ** -x;
    return alkalinityFromHDic(h, dicFromHSpecies(species, value, h, k), k, t) - ta;
  };
  // A double root is accepted when the residual touches zero to ~1e-13 of the alkalinity scale.
  const roots = allRoots(f, 1e-13 * (Math.abs(ta) + value));
  if (roots.length === 0) {
    noRoot(
      `TA–${species.toUpperCase()}`,
      `no pH between ${PH_SEARCH_MIN} and ${PH_SEARCH_MAX} satisfies both.`,
    );
  }
  return roots.map((x) => 10 ** -x);
}

/** h from two carbonate species. */
function hFromTwoSpecies(
  a: 'co2' | 'hco3' | 'co3',
  va: number,
  b: 'co2' | 'hco3' | 'co3',
  vb: number,
  k: ConstantSet,
) {
  const v: Record<string, number> = { [a]: va, [b]: vb };
  if (v.co2 !== undefined && v.hco3 !== undefined) return (k.k1 * v.co2) / v.hco3;
  if (v.hco3 !== undefined && v.co3 !== undefined) return (k.k2 * v.hco3) / v.co3;
  return Math.sqrt((k.k1 * k.k2 * v.co2!) / v.co3!);
}

const isSpecies = (p: Param): p is 'co2' | 'hco3' | 'co3' => p === 'co2' || p === 'hco3' || p === 'co3';

/**
 * Every state consistent with the two given parameters (internal units: mol/kg, pH on the
 * internal scale), highest pH first. Throws `no-solution` when none exists and
 * `pair-not-independent` for a parameter given twice.
 */
export function solvePair(
  a: Param,
  va: number,
  b: Param,
  vb: number,
  k: ConstantSet,
  t: MinorTotals,
): CarbonateState[] {
  if (a === b) fail('pair-not-independent', `The pair repeats one parameter (${a}).`);
  // Order the pair so that the cases below need one spelling each.
  const order: Param[] = ['ph', 'ta', 'dic', 'co2', 'hco3', 'co3'];
  if (order.indexOf(a) > order.indexOf(b)) [a, va, b, vb] = [b, vb, a, va];

  let hs: number[];
  if (a === 'ph') {
    const h = 10 ** -va;
    if (b === 'ta') return [stateFromHDic(h, dicFromHTa(h, vb, k, t), k, t)];
    if (b === 'dic') return [stateFromHDic(h, vb, k, t)];
    return [stateFromHDic(h, dicFromHSpecies(b as 'co2' | 'hco3' | 'co3', vb, h, k), k, t)];
  }
  if (a === 'ta' && b === 'dic') return [stateFromHDic(hFromTaDic(va, vb, k, t), vb, k, t)];
  if (a === 'ta' && isSpecies(b)) hs = hFromTaSpecies(b, va, vb, k, t);
  else if (a === 'dic' && isSpecies(b)) hs = hFromDicSpecies(b, va, vb, k);
  else if (isSpecies(a) && isSpecies(b)) hs = [hFromTwoSpecies(a, va, b, vb, k)];
  else return fail('pair-not-independent', `Cannot solve from ${a} and ${b}.`);

  // Rebuild each state from h and the species given, so the given value is reproduced exactly.
  const given = isSpecies(b) ? b : (a as 'co2' | 'hco3' | 'co3');
  const value = isSpecies(b) ? vb : va;
  const states = hs.map((h) => stateFromHDic(h, dicFromHSpecies(given, value, h, k), k, t));
  const physical = states.filter((s) => s.dic > 0 && Number.isFinite(s.dic));
  if (physical.length === 0) noRoot(`${a}–${b}`, 'the only roots need negative DIC.');
  return physical;
}
