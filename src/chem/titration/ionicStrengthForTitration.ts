/**
 * The ionic strength used for the activity corrections of a titrated sample, and where it came
 * from, in order of preference: given; from specific conductance (Russell 1976, I ≈ 1.6e-5 × SC in
 * µS/cm at 25 °C, through the fresh model's `ionicStrengthFromConductance`); or, as a last
 * resort, from the alkalinity itself as if calcium balanced it (I = 1.5 × alkalinity in eq/L,
 * since Ca(HCO3)2 gives ½(4·TA/2 + TA)).
 */

import { fail, type Issue, warning } from '../errors';
import { ionicStrengthFromConductance } from '../fresh/ionic-strength';

export interface IonicStrengthChoice {
  value: number;
  source: 'given' | 'conductance-russell-1976' | 'alkalinity-as-calcium-bicarbonate';
  warnings: Issue[];
}

export function ionicStrengthForTitration(
  given: unknown,
  conductanceUsCm: unknown,
  alkalinityEqL: number,
): IonicStrengthChoice {
  if (given !== undefined) {
    if (typeof given !== 'number' || !Number.isFinite(given) || given < 0 || given > 1) {
      fail(
        'titration-value-invalid',
        'ionic_strength_mol_kg must be a number from 0 to 1.',
        'ionic_strength_mol_kg',
      );
    }
    return { value: given, source: 'given', warnings: [] };
  }
  if (conductanceUsCm !== undefined) {
    if (typeof conductanceUsCm !== 'number' || !Number.isFinite(conductanceUsCm) || conductanceUsCm < 0) {
      fail(
        'titration-value-invalid',
        'specific_conductance_us_cm must be a non-negative number.',
        'specific_conductance_us_cm',
      );
    }
    return {
      value: ionicStrengthFromConductance(conductanceUsCm, 'russell-1976'),
      source: 'conductance-russell-1976',
      warnings: [],
    };
  }
  return {
    value: 1.5 * Math.max(alkalinityEqL, 0),
    source: 'alkalinity-as-calcium-bicarbonate',
    warnings: [
      warning(
        'ionic-strength-estimated',
        'No ionic strength or conductance given: estimated from the alkalinity as if calcium balanced it. ' +
          'Give specific_conductance_us_cm for a better carbonate split.',
        'ionic_strength_mol_kg',
      ),
    ],
  };
}
