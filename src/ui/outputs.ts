/** How each solve output is shown: label, unit, digits. Unknown numeric outputs are shown by key. */

export interface OutputDef {
  key: string;
  label: string;
  unit: string;
  digits?: number;
  decimals?: number;
  /** Shown in the live panel of the entry screen (the rest in the detail screen). */
  headline?: boolean;
}

export const OUTPUTS: OutputDef[] = [
  { key: 'dic_umol_kg', label: 'DIC', unit: 'µmol/kg', digits: 4, headline: true },
  { key: 'alkalinity_umol_kg', label: 'Alkalinity', unit: 'µmol/kg', digits: 4, headline: true },
  { key: 'co2_umol_kg', label: 'Dissolved CO₂', unit: 'µmol/kg', digits: 3, headline: true },
  { key: 'pco2_uatm', label: 'pCO₂', unit: 'µatm', digits: 4, headline: true },
  { key: 'fco2_uatm', label: 'fCO₂', unit: 'µatm', digits: 4 },
  { key: 'hco3_umol_kg', label: 'Bicarbonate', unit: 'µmol/kg', digits: 4 },
  { key: 'co3_umol_kg', label: 'Carbonate', unit: 'µmol/kg', digits: 3 },
  { key: 'omega_calcite', label: 'Ω calcite', unit: '', digits: 3, headline: true },
  { key: 'omega_aragonite', label: 'Ω aragonite', unit: '', digits: 3 },
  { key: 'saturation_index_calcite', label: 'SI calcite', unit: '', decimals: 2, headline: true },
  { key: 'saturation_index_aragonite', label: 'SI aragonite', unit: '', decimals: 2 },
  { key: 'saturation_index_dolomite', label: 'SI dolomite', unit: '', decimals: 2 },
  { key: 'saturation_index_gypsum', label: 'SI gypsum', unit: '', decimals: 2 },
  { key: 'unionized_ammonia_n_mg_l', label: 'Unionized ammonia', unit: 'mg/L as N', digits: 2 },
  { key: 'unionized_ammonia_mg_l', label: 'Unionized ammonia', unit: 'mg/L as NH₃', digits: 2 },
  { key: 'unionized_ammonia_fraction', label: 'Unionized share of ammonia', unit: '', digits: 2 },
  { key: 'ammonia_pk', label: 'Ammonium acid constant (pK)', unit: '', decimals: 3 },
  { key: 'hydrogen_sulfide_mg_l', label: 'Hydrogen sulfide', unit: 'mg/L', digits: 2 },
  { key: 'hydrogen_sulfide_fraction', label: 'Share of sulfide as H₂S', unit: '', digits: 2 },
  { key: 'sulfide_pk1', label: 'Hydrogen sulfide acid constant (pK)', unit: '', decimals: 3 },
  { key: 'co2_flux_mmol_m2_d', label: 'CO₂ flux to air', unit: 'mmol/m²/d', digits: 3 },
  { key: 'k600_m_d', label: 'Gas transfer velocity k600', unit: 'm/d', digits: 3 },
  { key: 'k_co2_m_d', label: 'Gas transfer velocity of CO₂', unit: 'm/d', digits: 3 },
  { key: 'schmidt_co2', label: 'Schmidt number of CO₂', unit: '', digits: 4 },
  { key: 'ph_total', label: 'pH (total scale)', unit: '', decimals: 3 },
  { key: 'ph_free', label: 'pH (free scale)', unit: '', decimals: 3 },
  { key: 'ph_seawater', label: 'pH (seawater scale)', unit: '', decimals: 3 },
  { key: 'ph_nbs', label: 'pH (NBS scale)', unit: '', decimals: 3 },
  { key: 'ph', label: 'pH (activity)', unit: '', decimals: 3 },
  { key: 'revelle_factor', label: 'Revelle factor', unit: '', decimals: 2 },
  { key: 'ionic_strength_mol_kg', label: 'Ionic strength', unit: 'mol/kg', digits: 3 },
  { key: 'langelier_index', label: 'Langelier index', unit: '', decimals: 2 },
  { key: 'ryznar_index', label: 'Ryznar index', unit: '', decimals: 2 },
  { key: 'ccpp_mg_l_caco3', label: 'CaCO₃ precipitation potential', unit: 'mg/L as CaCO₃', digits: 3 },
  { key: 'charge_balance_error_percent', label: 'Charge balance error', unit: '%', decimals: 1 },
  { key: 'pco2_excess_ratio', label: 'pCO₂ / air', unit: '×', digits: 3, headline: true },
  { key: 'ph_air_equilibrium', label: 'pH at equilibrium with air', unit: '', decimals: 2 },
  { key: 'dic_air_equilibrium_umol_kg', label: 'DIC at equilibrium with air', unit: 'µmol/kg', digits: 4 },
  { key: 'air_pco2_uatm', label: 'Air pCO₂ used', unit: 'µatm', digits: 4 },
  { key: 'ph_saturation_calcite', label: 'pH of calcite saturation', unit: '', decimals: 2 },
  { key: 'ph_after_ccpp', label: 'pH after CaCO₃ precipitation', unit: '', decimals: 2 },
  { key: 'pksp_dolomite', label: 'Dolomite solubility product (pK)', unit: '', decimals: 3 },
  { key: 'alkalinity_mmol_kg', label: 'Alkalinity', unit: 'mmol/kg', digits: 4 },
  { key: 'alkalinity_mmol_l', label: 'Alkalinity', unit: 'mmol/L', digits: 4 },
  { key: 'alkalinity_mg_l_hco3', label: 'Alkalinity', unit: 'mg/L as HCO₃⁻', digits: 4 },
  { key: 'alkalinity_ppm_caco3', label: 'Alkalinity', unit: 'ppm as CaCO₃', digits: 4 },
  { key: 'alkalinity_meq_l', label: 'Alkalinity', unit: 'meq/L', digits: 4 },
  { key: 'alkalinity_mg_l_caco3', label: 'Alkalinity', unit: 'mg/L as CaCO₃', digits: 4 },
  { key: 'alkalinity_dkh', label: 'Alkalinity', unit: 'dKH', digits: 3 },
  { key: 'calcium_total_umol_kg', label: 'Calcium', unit: 'µmol/kg', digits: 4 },
  { key: 'boron_total_umol_kg', label: 'Total boron', unit: 'µmol/kg', digits: 4 },
  { key: 'sulfate_total_umol_kg', label: 'Total sulfate', unit: 'µmol/kg', digits: 4 },
  { key: 'fluoride_total_umol_kg', label: 'Total fluoride', unit: 'µmol/kg', digits: 4 },
];

const BY_KEY = new Map(OUTPUTS.map((o) => [o.key, o]));

export function outputDef(key: string): OutputDef {
  return BY_KEY.get(key) ?? { key, label: key.replace(/_/g, ' '), unit: '', digits: 4 };
}

/** Numeric outputs of a result in display order: known ones first, then any others by key. */
export function numericOutputs(result: Record<string, unknown>): { def: OutputDef; value: number }[] {
  const out: { def: OutputDef; value: number }[] = [];
  for (const def of OUTPUTS) {
    const v = result[def.key];
    if (typeof v === 'number') out.push({ def, value: v });
  }
  for (const [k, v] of Object.entries(result).sort(([a], [b]) => a.localeCompare(b))) {
    if (typeof v === 'number' && !BY_KEY.has(k)) out.push({ def: outputDef(k), value: v });
  }
  return out;
}

/**
 * Outputs that mean nothing for this water: seawater pH scales in fresh water (the fresh model
 * reports pH as activity; total, free and seawater coincide there) and seawater totals that are
 * zero because fresh water has no assumed boron, sulfate or fluoride.
 */
export function visibleOutput(
  row: { def: OutputDef; value: number },
  result: Record<string, unknown>,
): boolean {
  if (result.model === 'fresh' && ['ph_total', 'ph_free', 'ph_seawater'].includes(row.def.key)) return false;
  if (row.def.key.endsWith('_total_umol_kg') && row.value === 0) return false;
  return true;
}

const PAIR_LABELS: Record<string, string> = {
  alkalinity_umol_kg: 'alkalinity',
  dic_umol_kg: 'DIC',
  ph: 'pH',
  pco2_uatm: 'pCO₂',
  fco2_uatm: 'fCO₂',
  co2_umol_kg: 'dissolved CO₂',
  hco3_umol_kg: 'bicarbonate',
  co3_umol_kg: 'carbonate',
};

/** "alkalinity + pH" for the pair a result was solved from. */
export function pairLabel(pair: readonly string[]): string {
  return pair.map((k) => PAIR_LABELS[k] ?? k).join(' + ');
}
