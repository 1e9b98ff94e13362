/**
 * How much of a chemical: moles, a mass of the product (with its purity), a volume of a stock
 * solution of stated strength, or (for CO2) a volume of gas. Read from an action's JSON keys and
 * turned into moles plus the mass of water the stock brings with it, which dilutes the tank.
 *
 * Where volume meets mass the density is used and never taken as 1 in silence: a stock given as
 * % w/w needs its density; one given in mol/L or g/L without a density is taken as 1.000 kg/L
 * with a warning (a 1 mol/L NaHCO3 stock is about 1.06 kg/L, so the dilution water is then
 * over-estimated by a few percent of a small number).
 */

import { fail, type Issue, warning } from '../errors';
import { ATM_PA, R_J_PER_MOL_K, T0_K } from '../physical';
import type { Chemical } from './chemicals';

export const AMOUNT_KEYS = [
  'moles',
  'mass_g',
  'purity_percent',
  'stock_volume_ml',
  'stock_mol_l',
  'stock_g_l',
  'stock_percent_w_w',
  'stock_density_kg_l',
  'gas_volume_l',
  'gas_temperature_c',
] as const;

export interface Amount {
  /** Moles of the chemical; negative for a removal. */
  moles: number;
  /** kg of water that comes with a stock solution (0 for solids and gas). */
  stockWaterKg: number;
  /** Litres added to the water volume by a stock solution. */
  stockVolumeL: number;
  /** How the amount was given, for the report. */
  given: Record<string, number>;
  warnings: Issue[];
}

type Raw = Readonly<Record<string, unknown>>;

function num(raw: Raw, key: string): number | undefined {
  const v = raw[key];
  if (v === undefined || v === null || v === '') return undefined;
  if (typeof v !== 'number' || !Number.isFinite(v)) {
    fail('not-a-number', `${key} must be a finite number, got ${JSON.stringify(v)}.`, key);
  }
  return v;
}

function positive(raw: Raw, key: string): number | undefined {
  const v = num(raw, key);
  if (v !== undefined && !(v > 0))
    fail('non-positive-value', `${key} must be greater than zero, got ${v}.`, key);
  return v;
}

/** Moles of CO2 in a gas volume at 1 atm (ideal gas; CO2 is within 0.5 % of ideal there). */
export function molesOfGas(volumeL: number, temperatureC: number): number {
  return (ATM_PA * volumeL * 1e-3) / (R_J_PER_MOL_K * (temperatureC + T0_K));
}

export function readAmount(raw: Raw, chem: Chemical): Amount {
  const forms = ['moles', 'mass_g', 'stock_volume_ml', 'gas_volume_l'].filter(
    (k) => num(raw, k) !== undefined,
  );
  if (forms.length !== 1) {
    fail(
      forms.length === 0 ? 'missing-amount' : 'amount-given-twice',
      `Give the amount of ${chem.formula} once, as one of moles, mass_g, stock_volume_ml (with a strength) or gas_volume_l (CO2); got ${forms.length === 0 ? 'none' : forms.join(' and ')}.`,
      forms[0] ?? 'moles',
    );
  }
  const form = forms[0]!;
  const value = num(raw, form)!;
  if (value === 0) fail('zero-amount', `The amount of ${chem.formula} is zero: nothing would change.`, form);
  if (value < 0 && !chem.removable) {
    fail(
      'cannot-remove',
      `${chem.name} cannot be taken out of water; only CO2 (stripping) and CaCO3 (precipitation) take negative amounts.`,
      form,
    );
  }
  const warnings: Issue[] = [];
  if (form === 'moles')
    return { moles: value, stockWaterKg: 0, stockVolumeL: 0, given: { moles: value }, warnings };
  if (form === 'mass_g') {
    const purity = positive(raw, 'purity_percent') ?? 100;
    if (purity > 100)
      fail('bad-purity', `purity_percent must be at most 100, got ${purity}.`, 'purity_percent');
    const moles = (value * purity) / 100 / chem.molarMassGPerMol;
    return {
      moles,
      stockWaterKg: 0,
      stockVolumeL: 0,
      given: { mass_g: value, purity_percent: purity },
      warnings,
    };
  }
  if (form === 'gas_volume_l') {
    if (chem.id !== 'carbon_dioxide') {
      fail(
        'gas-volume-not-gas',
        `gas_volume_l is for CO2 only; give ${chem.formula} by mass, moles or stock solution.`,
        form,
      );
    }
    const t = num(raw, 'gas_temperature_c') ?? 20;
    if (t < -50 || t > 100)
      fail(
        'temperature-out-of-range',
        `gas_temperature_c ${t} is outside -50 to 100 °C.`,
        'gas_temperature_c',
      );
    return {
      moles: molesOfGas(value, t),
      stockWaterKg: 0,
      stockVolumeL: 0,
      given: { gas_volume_l: value, gas_temperature_c: t },
      warnings,
    };
  }
  // A stock solution.
  if (value < 0) fail('cannot-remove', 'A stock solution volume cannot be negative.', form);
  if (chem.id === 'carbon_dioxide') {
    fail('stock-not-gas', 'CO2 is given by mass_g, moles or gas_volume_l, not as a stock solution.', form);
  }
  const strengths = ['stock_mol_l', 'stock_g_l', 'stock_percent_w_w'].filter(
    (k) => num(raw, k) !== undefined,
  );
  if (strengths.length !== 1) {
    fail(
      'stock-strength',
      `A stock solution needs exactly one strength: stock_mol_l, stock_g_l or stock_percent_w_w (with stock_density_kg_l); got ${strengths.length === 0 ? 'none' : strengths.join(' and ')}.`,
      'stock_mol_l',
    );
  }
  const strengthKey = strengths[0]!;
  const strength = positive(raw, strengthKey)!;
  let density = positive(raw, 'stock_density_kg_l');
  if (density !== undefined && (density < 0.9 || density > 2)) {
    fail(
      'bad-density',
      `stock_density_kg_l must be between 0.9 and 2 kg/L, got ${density}.`,
      'stock_density_kg_l',
    );
  }
  if (density === undefined) {
    if (strengthKey === 'stock_percent_w_w') {
      fail(
        'missing-stock-density',
        'A stock given in % w/w needs stock_density_kg_l (from the product label or data sheet) to turn its volume into mass.',
        'stock_density_kg_l',
      );
    }
    density = 1;
    warnings.push(
      warning(
        'stock-density-assumed',
        'The stock density was not given and is taken as 1.000 kg/L; only the water it brings along depends on it.',
        'stock_density_kg_l',
      ),
    );
  }
  const volumeL = value / 1000;
  const solutionKg = volumeL * density;
  let moles: number;
  if (strengthKey === 'stock_mol_l') moles = volumeL * strength;
  else if (strengthKey === 'stock_g_l') moles = (volumeL * strength) / chem.molarMassGPerMol;
  else {
    if (strength > 100)
      fail('bad-purity', `stock_percent_w_w must be at most 100, got ${strength}.`, strengthKey);
    moles = (solutionKg * 1000 * strength) / 100 / chem.molarMassGPerMol;
  }
  const soluteKg = (moles * chem.molarMassGPerMol) / 1000;
  if (soluteKg >= solutionKg) {
    fail(
      'stock-too-strong',
      `The stock strength gives more ${chem.formula} than the solution weighs; check the units.`,
      strengthKey,
    );
  }
  return {
    moles,
    stockWaterKg: solutionKg - soluteKg,
    stockVolumeL: volumeL,
    given: { stock_volume_ml: value, [strengthKey]: strength, stock_density_kg_l: density },
    warnings,
  };
}
