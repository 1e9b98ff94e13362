/**
 * Alkalinity of a titration in every unit. Placeholder until the units module lands: trade
 * factors from chemistry.md (common practice): mg/L as CaCO3 = meq/L × 50.04; 1 dKH = 10 mg/L CaO.
 */

import { MOLAR_MASS_G_PER_MOL } from '../physical';

export function alkalinityInEveryUnit(meqL: number, _temperatureC: number): Record<string, number> {
  return {
    meq_l: meqL,
    mg_l_caco3: (meqL * MOLAR_MASS_G_PER_MOL.CaCO3) / 2,
    dkh: (meqL * MOLAR_MASS_G_PER_MOL.CaO) / 2 / 10,
  };
}

export function dicUmolKg(molL: number, _temperatureC: number): number {
  return molL * 1e6;
}
