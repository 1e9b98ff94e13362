/**
 * Measurements that cannot coexist. Two carbonate parameters always give a solution of the
 * equations, but not always a water: pH 12 with 2 500 µmol/kg of alkalinity needs negative DIC
 * (hydroxide and borate alone carry more alkalinity than was measured), and pH 2 with the same
 * alkalinity needs thousands of atmospheres of CO2. Such a "result" is never returned: the solve
 * fails with `measurements-disagree`, naming the two measurements.
 *
 * Limits (our choice, stated here): any negative concentration or partial pressure is impossible;
 * a pCO2 above 10 atm (1e7 µatm) is refused — no water at the surface holds that much CO2 (it
 * would effervesce; carbonated drinks hold about 2–4 atm, common practice figure); between 1 and
 * 10 atm the result stands with the warning `pco2-above-one-atmosphere` (possible only under
 * pressure: deep groundwater, CO2-rich mineral springs at their source).
 */

import type { CarbonateKey } from './api';
import { fail, type Issue, warning } from './errors';
import type { CarbonateState } from './types';

/** µatm. */
export const PCO2_REFUSED_ABOVE_UATM = 1e7;
export const PCO2_WARNED_ABOVE_UATM = 1e6;

const LABEL: Record<CarbonateKey, (v: number) => string> = {
  alkalinity_umol_kg: (v) => `alkalinity ${round(v)} µmol/kg`,
  dic_umol_kg: (v) => `DIC ${round(v)} µmol/kg`,
  ph: (v) => `pH ${round(v)}`,
  pco2_uatm: (v) => `pCO2 ${round(v)} µatm`,
  fco2_uatm: (v) => `fCO2 ${round(v)} µatm`,
  co2_umol_kg: (v) => `CO2* ${round(v)} µmol/kg`,
  hco3_umol_kg: (v) => `bicarbonate ${round(v)} µmol/kg`,
  co3_umol_kg: (v) => `carbonate ${round(v)} µmol/kg`,
};

function round(v: number): string {
  return String(Number(v.toPrecision(5)));
}

function problem(s: CarbonateState): string | undefined {
  const negative = (
    [
      ['DIC', s.dic],
      ['CO2*', s.co2],
      ['bicarbonate', s.hco3],
      ['carbonate', s.co3],
    ] as const
  ).find(([, x]) => !(x >= 0));
  if (negative) return `they would need a negative ${negative[0]} (${round(negative[1] * 1e6)} µmol/kg)`;
  if (!(s.pco2 >= 0)) return `they would need a negative pCO2 (${round(s.pco2 * 1e6)} µatm)`;
  if (s.pco2 * 1e6 > PCO2_REFUSED_ABOVE_UATM)
    return `they would need a pCO2 of ${round(s.pco2 * 1e6)} µatm (${round(s.pco2)} atm), far beyond any water (limit ${PCO2_REFUSED_ABOVE_UATM / 1e6} atm)`;
  return undefined;
}

/**
 * The physically possible states among the roots of a pair; none left is a coded error that
 * says which two measurements disagree and why. `values` are the measured values as given.
 */
export function possibleStates(
  states: readonly CarbonateState[],
  pair: readonly [CarbonateKey, CarbonateKey],
  values: readonly [number, number],
): CarbonateState[] {
  const ok = states.filter((s) => problem(s) === undefined);
  if (ok.length > 0 || states.length === 0) return ok.length > 0 ? ok : [...states];
  const [a, b] = pair;
  const why = problem(states[0]!)!;
  fail(
    'measurements-disagree',
    `${LABEL[a](values[0])} and ${LABEL[b](values[1])} cannot both be right: ${why}. Check both measurements (and their units and pH scale).`,
    a === 'ph' ? 'ph' : b,
  );
}

/** A warning when the (possible) pCO2 is above one atmosphere. */
export function highPco2Warning(s: CarbonateState): Issue | undefined {
  const uatm = s.pco2 * 1e6;
  if (uatm <= PCO2_WARNED_ABOVE_UATM) return undefined;
  return warning(
    'pco2-above-one-atmosphere',
    `pCO2 ${round(uatm)} µatm is above one atmosphere: possible only under pressure (deep groundwater, a CO2-rich spring at its source); check the measurements.`,
    'pco2_uatm',
  );
}
