/**
 * What an imported column can hold: a measured quantity in one of its units, each unit mapped to
 * the engine's input key (see `src/chem/api.ts` and the fresh-water keys of issue 3) with the
 * conversion into that key's unit. New quantities are rows here, not new code paths.
 *
 * `limits` are physical bounds in the key's unit: a value outside them cannot be a measurement
 * (negative concentration, pH 20) and is rejected. Values that are merely unusual are left to the
 * engine, which computes and warns.
 */

export interface UnitChoice {
  /** Stable id, stored in remembered mappings. */
  id: string;
  /** What the user sees. */
  label: string;
  /** Engine input key the value is stored under. */
  key: string;
  /** From the file's unit into the key's unit. */
  toKey: (x: number) => number;
  /** Engine options this unit implies (the pH scale is the "unit" of a pH value). */
  options?: Record<string, string>;
}

export interface QuantityDef {
  id: string;
  label: string;
  units: UnitChoice[];
  limits: [number, number];
}

const same = (x: number) => x;
const times = (f: number) => (x: number) => x * f;

function u(id: string, label: string, key: string, toKey: (x: number) => number = same): UnitChoice {
  return { id, label, key, toKey };
}

const umolKg = (key: string): UnitChoice[] => [
  u('umol_kg', 'µmol/kg', key),
  u('mmol_kg', 'mmol/kg', key, times(1000)),
];

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
  },
  {
    id: 'salinity',
    label: 'Salinity (practical)',
    units: [u('pss', 'PSS-78', 'salinity')],
    limits: [0, 100],
  },
  {
    id: 'pressure',
    label: 'Pressure (applied)',
    units: [u('dbar', 'dbar', 'pressure_dbar'), u('bar', 'bar', 'pressure_dbar', times(10))],
    limits: [0, 12000],
  },
  {
    id: 'ph',
    label: 'pH',
    // `ph`: scale from the site's defaults (as the reading form enters it); the others name it.
    units: [
      u('ph', 'pH (scale of the site)', 'ph'),
      ...(['nbs', 'total', 'free', 'seawater'] as const).map((scale) => ({
        ...u(scale, `pH (${scale === 'nbs' ? 'NBS' : scale} scale)`, 'ph'),
        options: { ph_scale: scale },
      })),
    ],
    limits: [0, 14],
  },
  {
    id: 'alkalinity',
    label: 'Alkalinity',
    units: [
      ...umolKg('alkalinity_umol_kg'),
      u('meq_l', 'meq/L', 'alkalinity_meq_l'),
      u('mg_l_caco3', 'mg/L as CaCO3', 'alkalinity_mg_l_caco3'),
      u('dkh', 'dKH', 'alkalinity_dkh'),
    ],
    limits: [0, 1e6],
  },
  { id: 'dic', label: 'DIC', units: umolKg('dic_umol_kg'), limits: [0, 1e6] },
  { id: 'pco2', label: 'pCO2', units: [u('uatm', 'µatm', 'pco2_uatm')], limits: [0, 1e7] },
  { id: 'fco2', label: 'fCO2', units: [u('uatm', 'µatm', 'fco2_uatm')], limits: [0, 1e7] },
  { id: 'co2', label: 'CO2*', units: umolKg('co2_umol_kg'), limits: [0, 1e6] },
  { id: 'hco3', label: 'HCO3-', units: umolKg('hco3_umol_kg'), limits: [0, 1e6] },
  { id: 'co3', label: 'CO3--', units: umolKg('co3_umol_kg'), limits: [0, 1e6] },
  {
    id: 'conductance',
    label: 'Specific conductance (25 °C)',
    units: [
      u('us_cm', 'µS/cm', 'specific_conductance_us_cm'),
      u('ms_cm', 'mS/cm', 'specific_conductance_us_cm', times(1000)),
    ],
    limits: [0, 1e6],
  },
  { id: 'tds', label: 'Dissolved solids', units: [u('mg_l', 'mg/L', 'tds_mg_l')], limits: [0, 1e6] },
  {
    id: 'calcium',
    label: 'Calcium',
    units: [u('mg_l', 'mg/L', 'calcium_mg_l'), ...umolKg('calcium_umol_kg')],
    limits: [0, 1e6],
  },
  { id: 'magnesium', label: 'Magnesium', units: [u('mg_l', 'mg/L', 'magnesium_mg_l')], limits: [0, 1e6] },
  { id: 'sodium', label: 'Sodium', units: [u('mg_l', 'mg/L', 'sodium_mg_l')], limits: [0, 1e6] },
  { id: 'potassium', label: 'Potassium', units: [u('mg_l', 'mg/L', 'potassium_mg_l')], limits: [0, 1e6] },
  { id: 'chloride', label: 'Chloride', units: [u('mg_l', 'mg/L', 'chloride_mg_l')], limits: [0, 1e6] },
  { id: 'sulfate', label: 'Sulfate', units: [u('mg_l', 'mg/L', 'sulfate_mg_l')], limits: [0, 1e6] },
  {
    id: 'phosphate',
    label: 'Phosphate',
    units: [u('umol_kg', 'µmol/kg', 'phosphate_umol_kg')],
    limits: [0, 1e5],
  },
  {
    id: 'silicate',
    label: 'Silicate',
    units: [u('umol_kg', 'µmol/kg', 'silicate_umol_kg')],
    limits: [0, 1e5],
  },
  { id: 'ammonia', label: 'Ammonia', units: [u('umol_kg', 'µmol/kg', 'ammonia_umol_kg')], limits: [0, 1e5] },
  { id: 'sulfide', label: 'Sulfide', units: [u('umol_kg', 'µmol/kg', 'sulfide_umol_kg')], limits: [0, 1e5] },
];

const byId = new Map(QUANTITIES.map((q) => [q.id, q]));

export function quantityById(id: string): QuantityDef | undefined {
  return byId.get(id);
}

export function unitOf(quantity: string, unit: string): UnitChoice | undefined {
  return byId.get(quantity)?.units.find((x) => x.id === unit);
}

/**
 * How an imported value is stored: as written when its unit feeds its key unchanged, else
 * converted exactly into the key's own unit (°F → °C, mmol/kg → µmol/kg, mS/cm → µS/cm, bar →
 * dbar), so stored readings use only the units the reading form knows.
 */
export function storedForm(q: QuantityDef, unit: UnitChoice, x: number): { value: number; unit: string } {
  if (unit.toKey === same) return { value: x, unit: unit.id };
  const base = q.units.find((b) => b.key === unit.key && b.toKey === same);
  return base ? { value: unit.toKey(x), unit: base.id } : { value: x, unit: unit.id };
}

/** Engine keys in catalogue order, each once (export column order). */
export const KEY_ORDER: readonly string[] = QUANTITIES.flatMap((q) => q.units.map((x) => x.key)).filter(
  (k, i, a) => a.indexOf(k) === i,
);
