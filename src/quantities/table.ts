/**
 * The one table of what can be measured at a site: each quantity with its units, the engine input
 * key each unit feeds and the conversion into that key's unit. The reading form, the results, the
 * CSV importer and exporter and the CLI all read it; a new quantity or unit is one row here.
 *
 * `limits` are physical bounds in the key's unit: outside them a value cannot be a measurement
 * (negative concentration, pH 20) and the importer rejects it. `plausible` is the everyday range
 * in the first unit, for a note beside the form's field; what is plausible for one trade is
 * refined in `./trades.ts`. Units the engine converts itself (alkalinity in mg/L as CaCO₃, meq/L,
 * dKH, which need the water's density) map to their own keys; only exact conversions happen here.
 */

import { salinityFromSpecificGravity } from '../chem/seawater/specific-gravity';

export interface UnitDef {
  /** Stable id, stored with every reading value and in remembered CSV mappings. */
  id: string;
  /** What the user sees. */
  label: string;
  /** Engine input key the value feeds. */
  key: string;
  /** From this unit into the key's unit (`same` when the unit is the key's own). */
  toKey: (x: number) => number;
  /** Engine options this unit implies (the pH scale is the "unit" of a pH value). */
  options?: Record<string, string>;
}

export interface QuantityDef {
  id: string;
  label: string;
  units: UnitDef[];
  /** Physical bounds in the key's unit (the importer's rejection rule). */
  limits: [number, number];
  /** Everyday range in the first unit (a note beside the form's field, never a refusal). */
  plausible?: [number, number];
  /** Offered in the reading form's list of quantities (the others come from files). */
  form?: boolean;
}

/** The identity conversion: the unit is the key's own. */
export const same = (x: number): number => x;
const times = (f: number) => (x: number) => x * f;

function u(id: string, label: string, key: string, toKey: (x: number) => number = same): UnitDef {
  return { id, label, key, toKey };
}

const umolKg = (key: string): UnitDef[] => [
  u('umol_kg', 'µmol/kg', key),
  u('mmol_kg', 'mmol/kg', key, times(1000)),
];

/**
 * A refractometer or hydrometer reading as specific gravity at 25 °C against pure water at 25 °C
 * (how instruments with automatic temperature compensation are commonly read: common practice),
 * converted by EOS-80 (`salinityFromSpecificGravity`). An impossible reading becomes NaN, which
 * the engine refuses with its own code rather than this table throwing.
 */
function salinityFromSg(sg: number): number {
  try {
    return salinityFromSpecificGravity(sg, 25, 25);
  } catch {
    return Number.NaN;
  }
}

export const QUANTITIES: readonly QuantityDef[] = [
  {
    id: 'temperature',
    label: 'Temperature',
    units: [
      u('c', '°C', 'temperature_c'),
      u('f', '°F', 'temperature_c', (x) => ((x - 32) * 5) / 9),
      u('k', 'K', 'temperature_c', (x) => x - 273.15),
    ],
    limits: [-10, 150],
    plausible: [-2, 60],
    form: true,
  },
  {
    id: 'ph',
    label: 'pH',
    // `ph`: on the scale of the site (or Settings), as the reading form enters it; the others name
    // the scale, as imported files may.
    units: [
      u('ph', 'pH', 'ph'),
      ...(['nbs', 'total', 'free', 'seawater'] as const).map((scale) => ({
        ...u(scale, `pH (${scale === 'nbs' ? 'NBS' : scale} scale)`, 'ph'),
        options: { ph_scale: scale },
      })),
    ],
    limits: [0, 14],
    plausible: [2, 12],
    form: true,
  },
  {
    id: 'alkalinity',
    label: 'Alkalinity',
    units: [
      ...umolKg('alkalinity_umol_kg'),
      u('meq_l', 'meq/L', 'alkalinity_meq_l'),
      u('mg_l_caco3', 'mg/L as CaCO₃', 'alkalinity_mg_l_caco3'),
      u('dkh', 'dKH', 'alkalinity_dkh'),
    ],
    limits: [0, 1e6],
    form: true,
  },
  {
    id: 'salinity',
    label: 'Salinity',
    units: [u('pss', 'PSS-78', 'salinity'), u('sg', 'specific gravity', 'salinity', salinityFromSg)],
    limits: [0, 100],
    plausible: [0, 45],
    form: true,
  },
  {
    id: 'conductance',
    label: 'Specific conductance (25 °C)',
    units: [
      u('us_cm', 'µS/cm', 'specific_conductance_us_cm'),
      u('ms_cm', 'mS/cm', 'specific_conductance_us_cm', times(1000)),
    ],
    limits: [0, 1e6],
    plausible: [0, 60000],
    form: true,
  },
  { id: 'dic', label: 'DIC', units: umolKg('dic_umol_kg'), limits: [0, 1e6], form: true },
  { id: 'pco2', label: 'pCO₂', units: [u('uatm', 'µatm', 'pco2_uatm')], limits: [0, 1e7], form: true },
  { id: 'fco2', label: 'fCO₂', units: [u('uatm', 'µatm', 'fco2_uatm')], limits: [0, 1e7] },
  { id: 'co2', label: 'dissolved CO₂', units: umolKg('co2_umol_kg'), limits: [0, 1e6] },
  { id: 'hco3', label: 'bicarbonate', units: umolKg('hco3_umol_kg'), limits: [0, 1e6] },
  { id: 'co3', label: 'carbonate', units: umolKg('co3_umol_kg'), limits: [0, 1e6] },
  { id: 'tds', label: 'Dissolved solids', units: [u('mg_l', 'mg/L', 'tds_mg_l')], limits: [0, 1e6] },
  {
    id: 'calcium',
    label: 'Calcium',
    // Calcium hardness as mg/L CaCO₃ → mg/L Ca: × 40.078 / 100.087 (IUPAC 2021 atomic weights).
    units: [
      u('mg_l', 'mg/L', 'calcium_mg_l'),
      ...umolKg('calcium_umol_kg'),
      u('mg_l_caco3', 'mg/L as CaCO₃ (hardness)', 'calcium_mg_l', (x) => (x * 40.078) / 100.087),
    ],
    limits: [0, 1e6],
    form: true,
  },
  {
    id: 'magnesium',
    label: 'Magnesium',
    units: [u('mg_l', 'mg/L', 'magnesium_mg_l')],
    limits: [0, 1e6],
    form: true,
  },
  { id: 'sodium', label: 'Sodium', units: [u('mg_l', 'mg/L', 'sodium_mg_l')], limits: [0, 1e6] },
  { id: 'potassium', label: 'Potassium', units: [u('mg_l', 'mg/L', 'potassium_mg_l')], limits: [0, 1e6] },
  { id: 'chloride', label: 'Chloride', units: [u('mg_l', 'mg/L', 'chloride_mg_l')], limits: [0, 1e6] },
  { id: 'sulfate', label: 'Sulfate', units: [u('mg_l', 'mg/L', 'sulfate_mg_l')], limits: [0, 1e6] },
  {
    id: 'phosphate',
    label: 'Phosphate',
    units: [u('umol_kg', 'µmol/kg', 'phosphate_umol_kg')],
    limits: [0, 1e5],
    form: true,
  },
  {
    id: 'silicate',
    label: 'Silicate',
    units: [u('umol_kg', 'µmol/kg', 'silicate_umol_kg')],
    limits: [0, 1e5],
    form: true,
  },
  {
    id: 'ammonia',
    label: 'Total ammonia',
    // mg/L as N is how pond and aquarium kits report total ammonia nitrogen (TAN); 14.0067 g/mol
    // for N (IUPAC 2021 standard atomic weight), per litre taken as per kg (fresh water, < 0.3 %).
    units: [
      u('umol_kg', 'µmol/kg', 'ammonia_umol_kg'),
      u('mg_l_n', 'mg/L as N (TAN)', 'ammonia_umol_kg', (x) => (x / 14.0067) * 1000),
    ],
    limits: [0, 1e5],
    form: true,
  },
  { id: 'sulfide', label: 'Sulfide', units: [u('umol_kg', 'µmol/kg', 'sulfide_umol_kg')], limits: [0, 1e5] },
  {
    id: 'pressure',
    label: 'Depth pressure',
    units: [u('dbar', 'dbar', 'pressure_dbar'), u('bar', 'bar', 'pressure_dbar', times(10))],
    limits: [0, 12000],
    plausible: [0, 11000],
    form: true,
  },
];

const BY_ID = new Map(QUANTITIES.map((q) => [q.id, q]));

export function quantityById(id: string): QuantityDef | undefined {
  return BY_ID.get(id);
}

/** A unit of a quantity (given by id or by its row). */
export function unitOf(q: QuantityDef | string, unitId: string): UnitDef | undefined {
  const def = typeof q === 'string' ? BY_ID.get(q) : q;
  return def?.units.find((x) => x.id === unitId);
}

/** Which measured quantity a solve input key came from, to put engine warnings beside that row. */
export function quantityForKey(key: string): string | undefined {
  for (const q of QUANTITIES) if (q.units.some((x) => x.key === key)) return q.id;
  return undefined;
}

/**
 * How an imported value is stored: as written when its unit feeds its key unchanged, else
 * converted exactly into the key's own unit (°F → °C, mmol/kg → µmol/kg, mS/cm → µS/cm, bar →
 * dbar), so stored readings need no rounding-prone conversions later.
 */
export function storedForm(q: QuantityDef, unit: UnitDef, x: number): { value: number; unit: string } {
  if (unit.toKey === same) return { value: x, unit: unit.id };
  const base = q.units.find((b) => b.key === unit.key && b.toKey === same);
  return base ? { value: unit.toKey(x), unit: base.id } : { value: x, unit: unit.id };
}

/** Engine keys in table order, each once (export column order). */
export const KEY_ORDER: readonly string[] = QUANTITIES.flatMap((q) => q.units.map((x) => x.key)).filter(
  (k, i, a) => a.indexOf(k) === i,
);
