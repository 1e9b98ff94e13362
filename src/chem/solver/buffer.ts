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

/**
 * The buffer factors of Egleston, Sabine & Morel (2010), Global Biogeochem. Cycles 24, GB1002,
 * eqs. (11)–(16), from the same analytic derivatives, in mol/kg:
 *   γDIC = (∂ln CO2* / ∂DIC)⁻¹ and βDIC = (∂ln h/∂DIC)⁻¹ and ωDIC = (∂ln Ω/∂DIC)⁻¹ at constant TA;
 *   γTA, βTA, ωTA the same with respect to TA at constant DIC.
 * Ω ∝ [CO3--] at constant calcium. γDIC = DIC / Revelle factor, which the tests use.
 * Signs: adding DIC raises CO2* and h and lowers Ω (γDIC, βDIC > 0, ωDIC < 0); adding TA does the
 * opposite (γTA, βTA < 0, ωTA > 0).
 */
export interface BufferFactors {
  gammaDic: number;
  betaDic: number;
  omegaDic: number;
  gammaTa: number;
  betaTa: number;
  omegaTa: number;
}

export function bufferFactors(s: CarbonateState, k: ConstantSet, t: MinorTotals): BufferFactors {
  const h = s.h;
  const den = h * h + k.k1 * h + k.k1 * k.k2;
  const slope = alkalinitySlopeH(h, s.dic, k, t);
  const dhdDic = -carbonateAlkalinityPerDic(h, k) / slope;
  const dhdTa = 1 / slope;
  // ln CO2* = ln DIC + ln(h²/den); ln CO3 = ln DIC + ln(K1K2/den).
  const gCo2 = 2 / h - (2 * h + k.k1) / den;
  const gCo3 = -(2 * h + k.k1) / den;
  return {
    gammaDic: 1 / (1 / s.dic + gCo2 * dhdDic),
    betaDic: 1 / (dhdDic / h),
    omegaDic: 1 / (1 / s.dic + gCo3 * dhdDic),
    gammaTa: 1 / (gCo2 * dhdTa),
    betaTa: 1 / (dhdTa / h),
    omegaTa: 1 / (gCo3 * dhdTa),
  };
}
