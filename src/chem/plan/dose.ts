/**
 * Adding (or removing) a chemical: the exact changes of TA, DIC and calcium from its
 * stoichiometry, kept as moles in the water's basis mass, then the water solved again.
 *
 * new c = (c · M + ν · n) / M', with M the basis mass (kg), n the moles added, ν the change per
 * mole, and M' = M + the water a stock brings + (saline basis only) the dissolved mass. So the
 * moles of TA, DIC and calcium change by exactly ν · n, which the tests check.
 * Salinity (when the water has one) follows the dissolved mass, as if it weighed like sea salt:
 * S' = (S_R·M_sol + Δm) / M'_sol / (S_R/S_P), an approximation that matters only for large doses.
 * Fresh waters: major ions in mg/L are updated per litre; otherwise the ionic strength is the one
 * solved before plus ½Σ c·z² of the ions added (given as ionic_strength_mol_kg, with a warning).
 */

import { fail, type Issue, warning } from '../errors';
import { MOLAR_MASS_G_PER_MOL } from '../physical';
import type { Amount } from './amount';
import type { Chemical } from './chemicals';
import {
  ION_MG_L_KEYS,
  inputWithTotals,
  kgPerLitre,
  type PlanWater,
  phOf,
  SR_PER_SP,
  solveOrFail,
  totalsOf,
  usesMajorIons,
} from './water';

/** What a dose changed, in moles and in the water's concentration units. */
export interface DoseChange {
  moles: number;
  mass_g: number;
  /** Moles of TA, DIC and calcium added to the water (negative: removed). */
  ta_mol: number;
  dic_mol: number;
  calcium_mol: number;
  /** After minus before, µmol/kg, and pH on the water's scale. */
  delta_alkalinity_umol_kg: number;
  delta_dic_umol_kg: number;
  delta_calcium_umol_kg: number | null;
  delta_ph: number;
  delta_salinity: number | null;
  volume_added_l: number;
  /** Grams of a carbonate mineral left undissolved because the water reached saturation. */
  undissolved_g?: number;
}

export interface DoseResult {
  water: PlanWater;
  change: DoseChange;
  warnings: Issue[];
}

const ION_OF: Record<
  (typeof ION_MG_L_KEYS)[number],
  { per: keyof Chemical['perMole']; molarMass: number; z: number }
> = {
  calcium_mg_l: { per: 'calcium', molarMass: MOLAR_MASS_G_PER_MOL.Ca, z: 2 },
  sodium_mg_l: { per: 'sodium', molarMass: MOLAR_MASS_G_PER_MOL.Na, z: 1 },
  chloride_mg_l: { per: 'chloride', molarMass: MOLAR_MASS_G_PER_MOL.Cl, z: 1 },
  sulfate_mg_l: { per: 'sulfate', molarMass: MOLAR_MASS_G_PER_MOL.SO4, z: 2 },
};

/** Bisection steps for the saturation point: 2^-50 of the dose, far below any balance's reading. */
const SATURATION_ITERATIONS = 50;

/**
 * Adding a chemical. Calcium carbonate (limestone, aragonite sand) dissolves only until the water
 * is saturated with calcite (Ω calcite = 1); beyond that it lies undissolved, so the dose that
 * changes the water stops there and the rest is reported as undissolved (Plummer & Busenberg
 * 1982 describe dissolution approaching saturation; the stop at Ω = 1 is its thermodynamic end).
 */
export function applyDose(w: PlanWater, chem: Chemical, amount: Amount): DoseResult {
  if (chem.id !== 'calcium_carbonate' || amount.moles <= 0) return applyExact(w, chem, amount);
  const omega0 = w.solved.omega_calcite;
  const part = (n: number): Amount => ({ ...amount, moles: n });
  const stop = (d: DoseResult, nDissolved: number): DoseResult => {
    const undissolved = (amount.moles - nDissolved) * chem.molarMassGPerMol;
    d.change.moles = amount.moles;
    d.change.mass_g = amount.moles * chem.molarMassGPerMol;
    d.change.undissolved_g = undissolved;
    d.warnings.push(
      warning(
        'carbonate-stops-at-saturation',
        `${chem.name} dissolves only until the water is saturated with calcite (Ω = 1): about ${formatG(undissolved)} of the ${formatG(d.change.mass_g)} stays undissolved, and the water shown is the saturated one. More of it changes nothing.`,
      ),
    );
    return d;
  };
  if (typeof omega0 !== 'number') return applyExact(w, chem, amount); // calcium unknown: warned below
  if (omega0 >= 1) return stop(applyExact(w, chem, part(0)), 0);
  // A dose so large the water cannot be described (it would leave the fresh model) is far past
  // saturation: count it as supersaturated rather than fail.
  const below = (n: number): DoseResult | undefined => {
    try {
      const d = applyExact(w, chem, part(n));
      return (d.water.solved.omega_calcite ?? 0) <= 1 ? d : undefined;
    } catch {
      return undefined;
    }
  };
  const full = below(amount.moles);
  if (full) return full;
  let lo = 0;
  let hi = amount.moles;
  for (let i = 0; i < SATURATION_ITERATIONS; i++) {
    const mid = (lo + hi) / 2;
    if (below(mid)) lo = mid;
    else hi = mid;
  }
  return stop(applyExact(w, chem, part(lo)), lo);
}

/** A mass in g, kg or t as a person weighs it. */
function formatG(g: number): string {
  const a = Math.abs(g);
  if (a >= 1e6) return `${(g / 1e6).toPrecision(3)} t`;
  if (a >= 1000) return `${(g / 1000).toPrecision(3)} kg`;
  return `${g.toPrecision(3)} g`;
}

function applyExact(w: PlanWater, chem: Chemical, amount: Amount): DoseResult {
  const n = amount.moles;
  const nu = chem.perMole;
  const saline = w.solved.model === 'saline';
  const dissolvedKg = (n * chem.dissolvedMassGPerMol) / 1000;
  const basisAfter = w.basisKg + amount.stockWaterKg + (saline ? dissolvedKg : 0);
  const volumeAfter = w.volumeL + amount.stockVolumeL;
  const before = totalsOf(w);
  const warnings: Issue[] = [...amount.warnings];

  const ta = (before.ta * w.basisKg + nu.ta * n) / basisAfter;
  const dic = (before.dic * w.basisKg + nu.dic * n) / basisAfter;
  if (ta < 0 && nu.ta * n < 0) {
    const maxMoles = (before.ta * w.basisKg) / -nu.ta;
    fail(
      'acid-exceeds-alkalinity',
      `${n.toPrecision(4)} mol of ${chem.formula} is more than all the alkalinity of this water can take (${maxMoles.toPrecision(4)} mol); the water would turn mineral-acid and lethal. Use far less.`,
      'moles',
    );
  }
  if (dic <= 0) {
    warnings.push(
      warning(
        'dose-removes-all-carbon',
        `This removes all the dissolved inorganic carbon (${chem.formula}); the water left is not described.`,
      ),
    );
  }
  const input = inputWithTotals(w.input, w.solved, ta, Math.max(dic, 1e-12));
  const dilution = w.basisKg / basisAfter;
  for (const key of ['phosphate_umol_kg', 'silicate_umol_kg', 'ammonia_umol_kg', 'sulfide_umol_kg']) {
    const v = input[key];
    if (typeof v === 'number') input[key] = v * dilution;
  }

  let calciumAfter: number | undefined;
  if (before.calcium !== undefined) {
    calciumAfter = (before.calcium * w.basisKg + nu.calcium * n) / basisAfter;
    if (calciumAfter < 0) {
      warnings.push(
        warning('calcium-exhausted', 'The planned precipitation needs more calcium than the water has.'),
      );
      calciumAfter = 1e-12;
    }
    const mgL = input.calcium_mg_l;
    if (typeof mgL === 'number') {
      // Kept per litre, as given: the same moles, since the basis mass is the volume times the
      // fresh model's kg of water per litre.
      const caMg = (mgL * w.volumeL + nu.calcium * n * MOLAR_MASS_G_PER_MOL.Ca * 1000) / volumeAfter;
      input.calcium_mg_l = Math.max(caMg, 1e-9);
    } else input.calcium_umol_kg = calciumAfter * 1e6;
  } else if (nu.calcium !== 0) {
    warnings.push(
      warning(
        'calcium-unknown',
        'The calcium of this water was not measured, so the calcium after the dose (and Ω) cannot be given; the calcium added is in the change.',
        'calcium_umol_kg',
      ),
    );
  }

  const salinity = input.salinity;
  let deltaSalinity: number | null = null;
  if (typeof salinity === 'number') {
    const solKg = w.volumeL * kgPerLitre(w.input, w.solved).solution;
    const saltG = salinity * SR_PER_SP * solKg + dissolvedKg * 1000;
    const solAfter = solKg + amount.stockWaterKg + dissolvedKg;
    input.salinity = Math.max(saltG / solAfter / SR_PER_SP, 0);
    deltaSalinity = (input.salinity as number) - salinity;
  }

  if (!saline) freshIons(input, w, chem, n, volumeAfter, dissolvedKg, warnings);

  const solved = solveOrFail(input, `After ${chem.formula}`);
  const water: PlanWater = { input, solved, volumeL: volumeAfter, basisKg: basisAfter };
  if (chem.perMole.ta < 0 && phOf(water) < 4.5) {
    warnings.push(
      warning(
        'acid-below-buffer',
        `This much ${chem.formula} takes the water below pH 4.5: its alkalinity is used up and the water is lethal to fish and corals.`,
      ),
    );
  }
  const caBefore = w.solved.totals_umol_kg.calcium;
  return {
    water,
    change: {
      moles: n,
      mass_g: n * chem.molarMassGPerMol,
      ta_mol: nu.ta * n,
      dic_mol: nu.dic * n,
      calcium_mol: nu.calcium * n,
      delta_alkalinity_umol_kg: solved.alkalinity_umol_kg - w.solved.alkalinity_umol_kg,
      delta_dic_umol_kg: solved.dic_umol_kg - w.solved.dic_umol_kg,
      delta_calcium_umol_kg: calciumAfter === undefined ? null : solved.totals_umol_kg.calcium - caBefore,
      delta_ph: phOf(water) - phOf(w),
      delta_salinity: deltaSalinity,
      volume_added_l: amount.stockVolumeL,
    },
    warnings,
  };
}

/**
 * ½Σ ν·z² of a dose per mole as its ions end up in a near-neutral water (bicarbonate the main
 * carbonate ion): NaOH and lime turn CO2 into HCO3-, acids turn HCO3- into CO2, so HCl swaps one
 * HCO3- for one Cl- (no change) and H2SO4 two HCO3- for one SO4-- (+1). An approximation.
 */
const IONIC_STRENGTH_PER_MOLE: Record<Chemical['id'], number> = {
  sodium_bicarbonate: 1,
  sodium_carbonate: 2,
  sodium_hydroxide: 1,
  calcium_hydroxide: 3,
  calcium_oxide: 3,
  calcium_carbonate: 3,
  calcium_chloride: 3,
  calcium_chloride_dihydrate: 3,
  hydrochloric_acid: 0,
  sulfuric_acid: 1,
  carbon_dioxide: 0,
};

/** Fresh waters: the ions the dose adds, in mg/L when the water lists major ions, else in its ionic strength. */
function freshIons(
  input: Record<string, unknown>,
  w: PlanWater,
  chem: Chemical,
  n: number,
  volumeAfter: number,
  dissolvedKg: number,
  warnings: Issue[],
): void {
  const tds = input.tds_mg_l;
  if (typeof tds === 'number') input.tds_mg_l = (tds * w.volumeL + dissolvedKg * 1e6) / volumeAfter;
  if (usesMajorIons(w.input)) {
    for (const key of ION_MG_L_KEYS) {
      if (key === 'calcium_mg_l') continue; // updated with the calcium balance
      const ion = ION_OF[key];
      const added = chem.perMole[ion.per] * n;
      const old = typeof input[key] === 'number' ? (input[key] as number) : undefined;
      if (old === undefined && added === 0) continue;
      // An ion the water did not list was 0 to the model; the added amount is what it now knows.
      input[key] = Math.max(((old ?? 0) * w.volumeL + added * ion.molarMass * 1000) / volumeAfter, 0);
    }
    return;
  }
  const iBefore = (w.solved as unknown as Record<string, unknown>).ionic_strength_mol_kg;
  if (typeof iBefore !== 'number') return;
  const dI = (IONIC_STRENGTH_PER_MOLE[chem.id] * n) / w.basisKg;
  input.ionic_strength_mol_kg = Math.max(
    (iBefore * w.basisKg) / (w.basisKg + (volumeAfter - w.volumeL)) + dI,
    0,
  );
  warnings.push(
    warning(
      'ionic-strength-estimated',
      'The ionic strength after the dose is the one before plus that of the ions added; give major ions for a better estimate.',
      'ionic_strength_mol_kg',
    ),
  );
}
