/**
 * Engine messages name inputs by their JSON keys (`specific_conductance_us_cm`, `pk1`); on screen
 * a user should read the quantity and unit they type in the form instead.
 */

import { QUANTITIES } from '../quantities';

const KEY_WORDS: ReadonlyMap<string, string> = (() => {
  const m = new Map<string, string>();
  // The first unit listed with a key is the one the key is measured in (the others convert to it).
  for (const q of QUANTITIES)
    for (const u of q.units)
      if (!m.has(u.key))
        m.set(u.key, u.label === q.label || u.id === 'ph' ? q.label : `${q.label} (${u.label})`);
  return m;
})();

/** The planner's request keys, as the plan panel labels them. */
const PLAN_WORDS: Readonly<Record<string, string>> = {
  volume_l: 'Water volume (L)',
  mass_kg: 'Water mass (kg)',
  mass_g: 'Amount (g)',
  moles: 'Amount (mol)',
  purity_percent: 'Purity (%)',
  stock_volume_ml: 'Stock volume (mL)',
  stock_mol_l: 'Stock strength (mol/L)',
  target_pco2_uatm: 'Gas pCO₂ (µatm)',
  max_ph_step: 'Largest pH change per step',
  max_alkalinity_step_dkh: 'Largest alkalinity change per step (dKH)',
  max_alkalinity_step_umol_kg: 'Largest alkalinity change per step (µmol/kg)',
  gas_volume_l: 'Gas volume (L)',
  alkalinity_dkh: 'Alkalinity (dKH)',
  co2_mg_l: 'Dissolved CO₂ (mg/L)',
};

/** One engine input name in words: a known key, pH, or a constant such as pK1; others unchanged. */
export function plainKey(key: string): string {
  const known = KEY_WORDS.get(key) ?? PLAN_WORDS[key];
  if (known) return known;
  if (key === 'ph') return 'pH';
  const sp = /^pksp_(\w+)$/.exec(key);
  if (sp) return `${sp[1]} solubility`;
  const pk = /^pk(\w+)$/.exec(key);
  if (pk) return `pK${pk[1]}`;
  return key;
}

/** A message with every snake_case engine key in it put into words. */
export function plainWords(message: string): string {
  return message.replace(/\b[a-z][a-z0-9]*(?:_[a-z0-9]+)+\b/g, (key, at: number) => {
    const words = plainKey(key);
    // Mid-sentence a name such as "Specific conductance" reads lower-case; "pH" or "DIC" stay.
    const midSentence = at > 0 && !/[.:!?]\s*$/.test(message.slice(0, at));
    return midSentence && /^[A-Z][a-z]/.test(words) ? words[0]!.toLowerCase() + words.slice(1) : words;
  });
}

/**
 * A constant's or formulation's key as a row name: pK1, "calcite solubility (pKsp)", "K0",
 * "fugacity factor", "ion pairs" (never the snake_case key itself).
 */
export function constantName(key: string): string {
  const sp = /^p?ksp_(\w+)$/.exec(key);
  if (sp) return `${sp[1]} solubility${key.startsWith('p') ? ' (pK)' : ''}`;
  const k = /^(p?)k(\w+)$/.exec(key);
  if (k && !k[2]!.includes('_')) return `${k[1]}K${k[2]!.toUpperCase()}`;
  return key.replace(/_/g, ' ');
}
