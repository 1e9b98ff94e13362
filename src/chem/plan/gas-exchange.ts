/**
 * CO2 exchange with a gas phase (degassing, aeration, or CO2 enrichment) at constant total
 * alkalinity: CO2 leaving or entering water changes DIC only (CO2 is at the zero level of TA).
 *
 * The equilibrium state is the water with the same TA and pCO2 = target, solved by `solve()` from
 * the pair TA–pCO2. "A fraction f of the way" means DIC = DIC0 + f·(DICeq − DIC0) at the same TA:
 * the DIC change, which is what a first-order gas transfer moves, so f = 1 − exp(−t/τ) for a
 * transfer time constant τ if a user has one. Default target: 420 µatm, about the global mean
 * atmospheric CO2 in 2024 (common practice; NOAA global marine surface mean, from memory).
 */

import { fail, type Issue, warning } from '../errors';
import { inputWithTotals, type PlanWater, solveOrFail, totalsOf } from './water';

export const DEFAULT_AIR_PCO2_UATM = 420;

export interface ExchangeResult {
  water: PlanWater;
  equilibrium: PlanWater;
  fraction: number;
  /** Moles of CO2 that leave (negative) or enter (positive) the water. */
  co2_mol: number;
  delta_dic_umol_kg: number;
  warnings: Issue[];
}

export function equilibrate(w: PlanWater, targetPco2Uatm: number, fraction: number): ExchangeResult {
  if (!Number.isFinite(targetPco2Uatm) || !(targetPco2Uatm > 0) || targetPco2Uatm > 1e6) {
    fail(
      'bad-target-pco2',
      `target_pco2_uatm must be between 0 and 1e6 µatm, got ${targetPco2Uatm}.`,
      'target_pco2_uatm',
    );
  }
  if (!Number.isFinite(fraction) || fraction < 0 || fraction > 1) {
    fail(
      'bad-fraction',
      `fraction must be between 0 and 1 (the share of the DIC change to equilibrium), got ${fraction}.`,
      'fraction',
    );
  }
  const t = totalsOf(w);
  const eqInput = inputWithTotals(w.input, w.solved, t.ta, t.dic);
  delete eqInput.dic_umol_kg;
  eqInput.pco2_uatm = targetPco2Uatm;
  const eqSolved = solveOrFail(eqInput, 'At equilibrium with the gas');
  const dicEq = eqSolved.dic_umol_kg * 1e-6;
  const equilibrium: PlanWater = {
    input: inputWithTotals(w.input, eqSolved, t.ta, dicEq),
    solved: eqSolved,
    volumeL: w.volumeL,
    basisKg: w.basisKg,
  };
  const dic = t.dic + fraction * (dicEq - t.dic);
  const input = inputWithTotals(w.input, w.solved, t.ta, dic);
  const solved = fraction === 1 ? eqSolved : solveOrFail(input, 'Part way to equilibrium');
  const warnings: Issue[] = [];
  if (t.ta <= 0) {
    warnings.push(
      warning('no-alkalinity', 'The water has no alkalinity: gas exchange sets its pH by CO2 alone.'),
    );
  }
  return {
    water: { input, solved, volumeL: w.volumeL, basisKg: w.basisKg },
    equilibrium,
    fraction,
    co2_mol: (dic - t.dic) * w.basisKg,
    delta_dic_umol_kg: (dic - t.dic) * 1e6,
    warnings,
  };
}
