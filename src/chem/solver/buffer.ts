/**
 * Buffer factors of the carbonate system, from analytic derivatives of the solved state.
 *
 * Revelle factor R = (∂ ln pCO2 / ∂ ln DIC) at constant TA (Revelle & Suess 1957; in the form of
 * Egleston, Sabine & Morel 2010, Global Biogeochem. Cycles 24, GB1002, which includes every
 * alkalinity term through ∂TA/∂h).
 */

import type { CarbonateState, ConstantSet, MinorTotals } from '../types';
import { alkalinitySlopeH, carbonateAlkalinityPerDic } from './alkalinity';

export function revelleFactor(s: CarbonateState, k: ConstantSet, t: MinorTotals): number {
  const h = s.h;
  const den = h * h + k.k1 * h + k.k1 * k.k2;
  // At constant TA: dTA = (∂TA/∂DIC)_h dDIC + (∂TA/∂h)_DIC dh = 0.
  const dhdDic = -carbonateAlkalinityPerDic(h, k) / alkalinitySlopeH(h, s.dic, k, t);
  // CO2* = DIC·h²/den, and fCO2, pCO2 are proportional to it.
  const dlnCo2dh = 2 / h - (2 * h + k.k1) / den;
  return 1 + s.dic * dlnCo2dh * dhdDic;
}
