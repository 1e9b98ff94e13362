/**
 * What a user can measure at a site, in which units, and which solve input key each unit feeds.
 * A reading's values are rows of (quantity, value, unit); adding a quantity or unit is one entry
 * here, not a new code path. Units the engine converts itself (alkalinity in mg/L as CaCO3, meq/L,
 * dKH, which need density) map to their own input keys; only exact conversions (°F) happen here.
 */

export interface UnitDef {
  id: string;
  label: string;
  /** The solve input key this unit feeds. */
  key: string;
  /** Exact conversion into the key's unit (identity when absent). */
  toKey?: (v: number) => number;
  /** Engine options the unit implies (a pH on a named scale sets `ph_scale` for that reading). */
  options?: Record<string, string>;
}

export interface QuantityDef {
  id: string;
  label: string;
  units: UnitDef[];
  /** Plausible range in the first unit; outside it the field shows a note (the engine decides errors). */
  plausible?: [number, number];
  /** Offered on a new reading form by default. */
  common?: boolean;
  hint?: string;
}

export const QUANTITIES: QuantityDef[] = [
  {
    id: 'temperature',
    label: 'Temperature',
    units: [
      { id: 'c', label: '°C', key: 'temperature_c' },
      { id: 'f', label: '°F', key: 'temperature_c', toKey: (f) => ((f - 32) * 5) / 9 },
    ],
    plausible: [-2, 60],
    common: true,
  },
  {
    id: 'ph',
    label: 'pH',
    // `ph`: on the scale of the site (or Settings), as the reading form enters it. The named scales
    // come from imported files that say which scale a column is on (same ids as `src/io/quantities.ts`).
    units: [
      { id: 'ph', label: 'pH', key: 'ph' },
      ...(['nbs', 'total', 'free', 'seawater'] as const).map((scale) => ({
        id: scale,
        label: `pH (${scale === 'nbs' ? 'NBS' : scale} scale)`,
        key: 'ph',
        options: { ph_scale: scale },
      })),
    ],
    plausible: [2, 12],
    common: true,
  },
  {
    id: 'alkalinity',
    label: 'Alkalinity',
    units: [
      { id: 'umol_kg', label: 'µmol/kg', key: 'alkalinity_umol_kg' },
      { id: 'meq_l', label: 'meq/L', key: 'alkalinity_meq_l' },
      { id: 'mg_l_caco3', label: 'mg/L as CaCO₃', key: 'alkalinity_mg_l_caco3' },
      { id: 'dkh', label: 'dKH', key: 'alkalinity_dkh' },
    ],
    common: true,
  },
  {
    id: 'salinity',
    label: 'Salinity',
    units: [{ id: 'pss', label: 'PSS-78', key: 'salinity' }],
    plausible: [0, 45],
    common: true,
  },
  {
    id: 'conductance',
    label: 'Specific conductance (25 °C)',
    units: [{ id: 'us_cm', label: 'µS/cm', key: 'specific_conductance_us_cm' }],
    plausible: [0, 60000],
  },
  {
    id: 'dic',
    label: 'DIC',
    units: [{ id: 'umol_kg', label: 'µmol/kg', key: 'dic_umol_kg' }],
  },
  {
    id: 'pco2',
    label: 'pCO₂',
    units: [{ id: 'uatm', label: 'µatm', key: 'pco2_uatm' }],
  },
  {
    id: 'calcium',
    label: 'Calcium',
    units: [
      { id: 'mg_l', label: 'mg/L', key: 'calcium_mg_l' },
      { id: 'umol_kg', label: 'µmol/kg', key: 'calcium_umol_kg' },
    ],
  },
  {
    id: 'magnesium',
    label: 'Magnesium',
    units: [{ id: 'mg_l', label: 'mg/L', key: 'magnesium_mg_l' }],
  },
  {
    id: 'phosphate',
    label: 'Phosphate',
    units: [{ id: 'umol_kg', label: 'µmol/kg', key: 'phosphate_umol_kg' }],
  },
  {
    id: 'silicate',
    label: 'Silicate',
    units: [{ id: 'umol_kg', label: 'µmol/kg', key: 'silicate_umol_kg' }],
  },
  {
    id: 'pressure',
    label: 'Depth pressure',
    units: [{ id: 'dbar', label: 'dbar', key: 'pressure_dbar' }],
    plausible: [0, 11000],
  },
];

const BY_ID = new Map(QUANTITIES.map((q) => [q.id, q]));

export function quantity(id: string): QuantityDef | undefined {
  return BY_ID.get(id);
}

export function unitOf(q: QuantityDef, unitId: string): UnitDef | undefined {
  return q.units.find((u) => u.id === unitId);
}

/** Which measured row a solve input key came from, to put engine warnings beside that row. */
export function quantityForKey(key: string): string | undefined {
  for (const q of QUANTITIES) if (q.units.some((u) => u.key === key)) return q.id;
  return undefined;
}
