/**
 * The planning panel's logic without the DOM: turning what the user typed into a plan request,
 * and a plan result into before/after rows and speciation fractions. Kept apart so it is tested
 * in Node and the component only draws.
 */

import type { SolveOutput } from '../../chem/api';
import type { ChemicalId } from '../../chem/plan/chemicals';
import type { TargetQuantity } from '../../chem/plan/inverse';
import { denoise } from '../numbers';
import { OUTPUTS, outputDef } from '../outputs';

export type PanelAction = 'add' | 'equilibrate' | 'reach' | 'mix';
export type AmountUnit = 'g' | 'mol' | 'ml_stock';

/** The panel's fields as typed (text, so "7,5" survives), with the chosen options. */
export interface PanelForm {
  action: PanelAction;
  volumeL: string;
  chemical: ChemicalId;
  amount: string;
  amountUnit: AmountUnit;
  stockMolL: string;
  purityPercent: string;
  targetPco2: string;
  fractionPercent: string;
  targetQuantity: TargetQuantity;
  targetValue: string;
  maxPhStep: string;
  maxAlkStepDkh: string;
  mixVolumeL: string;
  mixTemperatureC: string;
  mixSalinity: string;
  mixAlkalinity: string;
  mixPh: string;
  /** Ponds: surface area (m²) and mean depth (m) give the volume and a dose per hectare. */
  areaM2: string;
  depthM: string;
}

export const DEFAULT_FORM: PanelForm = {
  action: 'reach',
  volumeL: '100',
  chemical: 'sodium_bicarbonate',
  amount: '10',
  amountUnit: 'g',
  stockMolL: '1',
  purityPercent: '100',
  targetPco2: '420',
  fractionPercent: '100',
  targetQuantity: 'alkalinity_dkh',
  targetValue: '8',
  // Common practice (no single source): about 0.2 pH and 1 dKH per step where animals live.
  maxPhStep: '0.2',
  maxAlkStepDkh: '1',
  mixVolumeL: '50',
  mixTemperatureC: '',
  mixSalinity: '',
  mixAlkalinity: '',
  mixPh: '',
  areaM2: '',
  depthM: '',
};

export class FieldError extends Error {
  constructor(
    readonly field: keyof PanelForm,
    message: string,
  ) {
    super(message);
  }
}

/** A decimal typed with a point or a comma; empty gives undefined; anything else is a field error. */
export function parseDecimal(text: string, field: keyof PanelForm, label: string): number | undefined {
  const t = text.trim().replace(/\s/g, '');
  if (t === '') return undefined;
  const n = Number(t.replace(',', '.'));
  if (!Number.isFinite(n) || !/^[-+]?(\d+([.,]\d*)?|[.,]\d+)([eE][-+]?\d+)?$/.test(t)) {
    throw new FieldError(field, `${label}: "${text}" is not a number.`);
  }
  return n;
}

function need(text: string, field: keyof PanelForm, label: string): number {
  const v = parseDecimal(text, field, label);
  if (v === undefined) throw new FieldError(field, `${label} is needed.`);
  return v;
}

/** The plan request for the reading and the form; throws FieldError for a field that cannot be read. */
export function planRequest(
  reading: Readonly<Record<string, unknown>>,
  f: PanelForm,
): Record<string, unknown> {
  const area = parseDecimal(f.areaM2, 'areaM2', 'Pond area (m²)');
  const depth = parseDecimal(f.depthM, 'depthM', 'Mean depth (m)');
  if ((area === undefined) !== (depth === undefined))
    throw new FieldError(
      area === undefined ? 'areaM2' : 'depthM',
      'Give both the pond area and its mean depth.',
    );
  if (area !== undefined && depth !== undefined && (area <= 0 || depth <= 0))
    throw new FieldError(area <= 0 ? 'areaM2' : 'depthM', 'Pond area and depth must be greater than zero.');
  // 1 m³ = 1000 L: area × depth is the pond's volume.
  const volume =
    area !== undefined && depth !== undefined
      ? area * depth * 1000
      : need(f.volumeL, 'volumeL', 'Water volume (L)');
  let action: Record<string, unknown>;
  switch (f.action) {
    case 'add': {
      const amount = need(f.amount, 'amount', 'Amount');
      action = { action: 'add', chemical: f.chemical };
      if (f.amountUnit === 'g') {
        action.mass_g = amount;
        const purity = parseDecimal(f.purityPercent, 'purityPercent', 'Purity (%)');
        if (purity !== undefined) action.purity_percent = purity;
      } else if (f.amountUnit === 'mol') action.moles = amount;
      else {
        action.stock_volume_ml = amount;
        action.stock_mol_l = need(f.stockMolL, 'stockMolL', 'Stock strength (mol/L)');
      }
      break;
    }
    case 'equilibrate':
      action = {
        action: 'equilibrate',
        target_pco2_uatm: need(f.targetPco2, 'targetPco2', 'Gas pCO2 (µatm)'),
        fraction: need(f.fractionPercent, 'fractionPercent', 'Share of the way (%)') / 100,
      };
      break;
    case 'reach': {
      action = {
        action: 'reach',
        chemical: f.chemical,
        target: { [f.targetQuantity]: need(f.targetValue, 'targetValue', 'Target') },
      };
      const ph = parseDecimal(f.maxPhStep, 'maxPhStep', 'Largest pH step');
      const dkh = parseDecimal(f.maxAlkStepDkh, 'maxAlkStepDkh', 'Largest alkalinity step (dKH)');
      if (ph !== undefined) action.max_ph_step = ph;
      if (dkh !== undefined) action.max_alkalinity_step_dkh = dkh;
      if (f.amountUnit === 'ml_stock')
        action.stock_mol_l = need(f.stockMolL, 'stockMolL', 'Stock strength (mol/L)');
      else {
        // Dosed by weighing the product: its purity scales the mass (the engine refuses > 100 %).
        const purity = parseDecimal(f.purityPercent, 'purityPercent', 'Purity (%)');
        if (purity !== undefined) action.purity_percent = purity;
      }
      break;
    }
    case 'mix': {
      const other: Record<string, unknown> = {
        temperature_c: need(f.mixTemperatureC, 'mixTemperatureC', 'Other water temperature (°C)'),
        alkalinity_umol_kg: need(f.mixAlkalinity, 'mixAlkalinity', 'Other water alkalinity (µmol/kg)'),
        ph: need(f.mixPh, 'mixPh', 'Other water pH'),
      };
      const s = parseDecimal(f.mixSalinity, 'mixSalinity', 'Other water salinity');
      if (s !== undefined) other.salinity = s;
      if (reading.ph_scale !== undefined) other.ph_scale = reading.ph_scale;
      action = {
        action: 'mix',
        waters: [{ water: other, volume_l: need(f.mixVolumeL, 'mixVolumeL', 'Other water volume (L)') }],
      };
      break;
    }
  }
  return { water: reading, volume_l: volume, actions: [action] };
}

export interface CompareRow {
  key: string;
  label: string;
  before: number | undefined;
  after: number | undefined;
}

/** "Label (unit)" from the app's one table of output names. */
function outputLabel(key: string): string {
  const def = outputDef(key);
  return def.unit ? `${def.label} (${def.unit})` : def.label;
}

/** Every numeric output of either water (top level and totals), labelled ones first. */
export function compareRows(
  before: SolveOutput,
  after: SolveOutput,
  /** Keys the reader looks at first (the trade's own quantities), in this order. */
  first: readonly string[] = [],
): CompareRow[] {
  const flat = (o: SolveOutput): Record<string, number> => {
    const out: Record<string, number> = {};
    for (const [k, v] of Object.entries(o)) if (typeof v === 'number' && Number.isFinite(v)) out[k] = v;
    for (const [k, v] of Object.entries(o.totals_umol_kg)) out[`${k}_total_umol_kg`] = v;
    return out;
  };
  const a = flat(before);
  const b = flat(after);
  const keys = [...new Set([...Object.keys(a), ...Object.keys(b)])];
  const order = [...first, ...OUTPUTS.map((o) => o.key).filter((k) => !first.includes(k))];
  keys.sort((x, y) => {
    const ix = order.indexOf(x);
    const iy = order.indexOf(y);
    if (ix >= 0 || iy >= 0) return (ix < 0 ? 99 : ix) - (iy < 0 ? 99 : iy);
    return x.localeCompare(y);
  });
  const fresh = before.model === 'fresh' && after.model === 'fresh';
  return (
    keys
      // Zero before and after (no boron or sulfate in a fresh water, calcium not measured) says
      // nothing; seawater pH scales mean nothing in fresh water.
      .filter((k) => !(a[k] === 0 && b[k] === 0) && !(a[k] === undefined && b[k] === 0))
      .filter((k) => !(fresh && ['ph_total', 'ph_free', 'ph_seawater'].includes(k)))
      .map((k) => ({ key: k, label: outputLabel(k), before: a[k], after: b[k] }))
  );
}

/** A change after − before, with rounding noise of the two values taken as zero. */
export function change(before: number, after: number): number {
  return denoise(after - before, Math.max(Math.abs(before), Math.abs(after)));
}

/** A mass as a person weighs it: g below 1 kg, kg below 1 t, then t. */
export function massText(g: number): string {
  const a = Math.abs(g);
  if (a >= 1e6) return `${show(g / 1e6)} t`;
  if (a >= 1000) return `${show(g / 1000)} kg`;
  return `${show(g)} g`;
}

/** A volume of liquid: mL below 1 L, then L (and m³ above 10 000 L). */
export function volumeText(ml: number): string {
  const a = Math.abs(ml);
  if (a >= 1e7) return `${show(ml / 1e6)} m³`;
  if (a >= 1000) return `${show(ml / 1000)} L`;
  return `${show(ml)} mL`;
}

/** Fractions of DIC as CO2*, HCO3- and CO3--. */
export function speciation(s: SolveOutput): { co2: number; hco3: number; co3: number } {
  const dic = s.co2_umol_kg + s.hco3_umol_kg + s.co3_umol_kg;
  return { co2: s.co2_umol_kg / dic, hco3: s.hco3_umol_kg / dic, co3: s.co3_umol_kg / dic };
}

/** A number for a table cell: four significant figures, never NaN, no float noise (1e-11 → 0). */
export function show(x: number | undefined): string {
  if (x === undefined || !Number.isFinite(x)) return '—';
  if (Math.abs(x) < 1e-9) return '0';
  const a = Math.abs(x);
  return a >= 1000 ? x.toFixed(0) : x.toPrecision(4);
}
