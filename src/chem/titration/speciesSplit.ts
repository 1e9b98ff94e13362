/**
 * Splits the alkalinity of the original sample into bicarbonate, carbonate and hydroxide from its
 * first pH reading and the carbonate equilibria (rather than the old P/T endpoint rules, which
 * ignore that carbonate and bicarbonate coexist near pH 8.3).
 */

import { MOLAR_MASS_G_PER_MOL } from '../physical';
import type { ConstantSet } from '../types';
import { dicFromAlkalinityPh } from './titrationModel';
import type { SpeciesSplit } from './types';

/** Hydroxide, g/mol (IUPAC 2021 atomic weights: O 15.999 + H 1.008). */
const OH_G_PER_MOL = 17.007;

/** `alkalinity` in eq/L; `dic` in mol/L when known (curve fit), otherwise derived from pH. */
export function splitAlkalinity(alkalinity: number, ph: number, k: ConstantSet, dic?: number): SpeciesSplit {
  const h = 10 ** -ph;
  const ct = Math.max(dic ?? dicFromAlkalinityPh(alkalinity, ph, k), 0);
  const den = h * h + k.k1 * h + k.k1 * k.k2;
  const hco3 = (ct * k.k1 * h) / den;
  const co3 = (ct * k.k1 * k.k2) / den;
  const co2 = (ct * h * h) / den;
  const oh = k.kw / h;
  return {
    hco3_mmol_l: hco3 * 1e3,
    co3_mmol_l: co3 * 1e3,
    oh_mmol_l: oh * 1e3,
    co2_mmol_l: co2 * 1e3,
    dic_mmol_l: ct * 1e3,
    hco3_mg_l: hco3 * MOLAR_MASS_G_PER_MOL.HCO3 * 1e3,
    co3_mg_l: co3 * MOLAR_MASS_G_PER_MOL.CO3 * 1e3,
    oh_mg_l: oh * OH_G_PER_MOL * 1e3,
  };
}
