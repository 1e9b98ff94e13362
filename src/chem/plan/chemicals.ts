/**
 * The chemicals a plan can add or remove, each as an exact change of the conserved quantities per
 * mole: total alkalinity (Dickson 1981 proton reference level), DIC, calcium, and the ions that
 * only move the ionic strength or the salinity (sodium, chloride, sulfate).
 *
 * Alkalinity per mole follows from the proton reference level (H2O, CO2, SO4--, Cl-, Na+, Ca++ are
 * at zero level): HCO3- +1, CO3-- +2, OH- +1, CaO + H2O -> Ca(OH)2 gives 2 OH-, HCl gives one
 * excess proton (−1), H2SO4 two (−2). For sulfuric acid the −2 is exact under this definition
 * whatever the bisulfate share, because HSO4- is itself a −1 term of TA; what bisulfate changes is
 * the pH the acid reaches, and the saline model takes its sulfate total from salinity, so the
 * added sulfate is not part of it. That neglect is below 0.1 % of the added acid while the free
 * [H+] stays under 1e-4 mol/kg (KS ≈ 0.1 mol/kg, Dickson 1990a): the plan warns below pH 4.5.
 */

import { fail } from '../errors';

/** IUPAC 2021 standard atomic weights (abridged, conventional values), g/mol. */
const ATOMIC_WEIGHT = {
  H: 1.008,
  C: 12.011,
  O: 15.999,
  Na: 22.98977,
  Ca: 40.078,
  Cl: 35.453,
  S: 32.06,
} as const;
type Element = keyof typeof ATOMIC_WEIGHT;

/** Molar mass from an element count, so each formula is written once and checked in tests. */
export function molarMassOf(formula: Partial<Record<Element, number>>): number {
  let m = 0;
  for (const [el, n] of Object.entries(formula) as [Element, number][]) m += ATOMIC_WEIGHT[el] * n;
  return m;
}

export const CHEMICAL_IDS = [
  'sodium_bicarbonate',
  'sodium_carbonate',
  'sodium_hydroxide',
  'calcium_hydroxide',
  'calcium_oxide',
  'calcium_carbonate',
  'calcium_chloride',
  'calcium_chloride_dihydrate',
  'hydrochloric_acid',
  'sulfuric_acid',
  'carbon_dioxide',
] as const;
export type ChemicalId = (typeof CHEMICAL_IDS)[number];

/** Change per mole of chemical, in moles. */
export interface Stoichiometry {
  ta: number;
  dic: number;
  calcium: number;
  sodium: number;
  chloride: number;
  sulfate: number;
}

export interface Chemical {
  id: ChemicalId;
  /** Name a person buys it under. */
  name: string;
  formula: string;
  molarMassGPerMol: number;
  perMole: Stoichiometry;
  /**
   * Mass left dissolved per mole, g (the salinity change in saline water): the formula mass less
   * any water of hydration, plus the water CaO takes up when it slakes.
   */
  dissolvedMassGPerMol: number;
  /** Negative amounts allowed: CO2 removed (stripping), CaCO3 precipitated. */
  removable: boolean;
  /** Hazards in plain words. */
  hazards: string;
}

const zero: Stoichiometry = { ta: 0, dic: 0, calcium: 0, sodium: 0, chloride: 0, sulfate: 0 };
const per = (s: Partial<Stoichiometry>): Stoichiometry => ({ ...zero, ...s });
const H2O = molarMassOf({ H: 2, O: 1 });

function chem(
  id: ChemicalId,
  name: string,
  formula: string,
  elements: Partial<Record<Element, number>>,
  perMole: Partial<Stoichiometry>,
  hazards: string,
  opts: { removable?: boolean; dissolvedMass?: number } = {},
): Chemical {
  const m = molarMassOf(elements);
  return {
    id,
    name,
    formula,
    molarMassGPerMol: m,
    perMole: per(perMole),
    dissolvedMassGPerMol: opts.dissolvedMass ?? m,
    removable: opts.removable ?? false,
    hazards,
  };
}

export const CHEMICALS: Readonly<Record<ChemicalId, Chemical>> = {
  sodium_bicarbonate: chem(
    'sodium_bicarbonate',
    'sodium bicarbonate (baking soda)',
    'NaHCO3',
    { Na: 1, H: 1, C: 1, O: 3 },
    { ta: 1, dic: 1, sodium: 1 },
    'Low hazard; the dust irritates eyes. It raises alkalinity with little pH change.',
  ),
  sodium_carbonate: chem(
    'sodium_carbonate',
    'sodium carbonate (soda ash, washing soda anhydrous)',
    'Na2CO3',
    { Na: 2, C: 1, O: 3 },
    { ta: 2, dic: 1, sodium: 2 },
    'Irritant: causes serious eye irritation. It raises pH much more than bicarbonate does.',
  ),
  sodium_hydroxide: chem(
    'sodium_hydroxide',
    'sodium hydroxide (caustic soda, lye)',
    'NaOH',
    { Na: 1, O: 1, H: 1 },
    { ta: 1, sodium: 1 },
    'Corrosive: burns skin and eyes severely and can blind. Dissolving it gets hot; always add the solid to water, never water to the solid. A local overdose raises pH to lethal levels.',
  ),
  calcium_hydroxide: chem(
    'calcium_hydroxide',
    'calcium hydroxide (slaked lime, limewater)',
    'Ca(OH)2',
    { Ca: 1, O: 2, H: 2 },
    { ta: 2, calcium: 1 },
    'Causes serious eye damage and irritates skin and lungs. Its solution has pH above 12: drip it slowly where the water mixes well.',
  ),
  calcium_oxide: chem(
    'calcium_oxide',
    'calcium oxide (quicklime)',
    'CaO',
    { Ca: 1, O: 1 },
    { ta: 2, calcium: 1 },
    'Reacts with water and gets very hot; causes serious eye damage and skin burns. Slake it in a separate container, never in the tank or pond.',
    // CaO + H2O -> Ca(OH)2: the dissolved mass includes the water it takes up.
    { dissolvedMass: molarMassOf({ Ca: 1, O: 1 }) + H2O },
  ),
  calcium_carbonate: chem(
    'calcium_carbonate',
    'calcium carbonate (limestone, aragonite sand)',
    'CaCO3',
    { Ca: 1, C: 1, O: 3 },
    { ta: 2, dic: 1, calcium: 1 },
    'Low hazard. It dissolves only in water undersaturated with calcite (acid or CO2-rich water), slowly; in saturated water it does not dissolve at all.',
    { removable: true },
  ),
  calcium_chloride: chem(
    'calcium_chloride',
    'calcium chloride (anhydrous)',
    'CaCl2',
    { Ca: 1, Cl: 2 },
    { calcium: 1, chloride: 2 },
    'Causes serious eye irritation; dissolving the anhydrous salt gets hot. It raises calcium and lowers nothing else but adds chloride.',
  ),
  calcium_chloride_dihydrate: chem(
    'calcium_chloride_dihydrate',
    'calcium chloride dihydrate',
    'CaCl2·2H2O',
    { Ca: 1, Cl: 2, H: 4, O: 2 },
    { calcium: 1, chloride: 2 },
    'Causes serious eye irritation. It raises calcium and adds chloride.',
    { dissolvedMass: molarMassOf({ Ca: 1, Cl: 2 }) },
  ),
  hydrochloric_acid: chem(
    'hydrochloric_acid',
    'hydrochloric acid (muriatic acid)',
    'HCl',
    { H: 1, Cl: 1 },
    { ta: -1, chloride: 1 },
    'Corrosive: burns skin and eyes; its fumes damage the lungs. Always add acid to water, never water to acid, with ventilation. It drives CO2 out of the water, and a local overdose kills fish.',
  ),
  sulfuric_acid: chem(
    'sulfuric_acid',
    'sulfuric acid (battery acid when dilute)',
    'H2SO4',
    { H: 2, S: 1, O: 4 },
    { ta: -2, sulfate: 1 },
    'Corrosive: severe burns to skin and eyes. Diluting it releases much heat and can spatter: always add the acid slowly to water, never water to acid. A local overdose kills fish.',
  ),
  carbon_dioxide: chem(
    'carbon_dioxide',
    'carbon dioxide gas',
    'CO2',
    { C: 1, O: 2 },
    { dic: 1 },
    'Cylinders hold gas at high pressure: secure them upright and use a regulator. CO2 displaces air in closed rooms and can suffocate people. Too much CO2 in the water suffocates fish, most of all at night when plants also give off CO2.',
    { removable: true },
  ),
};

export function chemicalById(id: unknown): Chemical {
  if (typeof id !== 'string' || !(CHEMICAL_IDS as readonly string[]).includes(id)) {
    fail(
      'unknown-chemical',
      `chemical must be one of ${CHEMICAL_IDS.join(', ')}; got ${JSON.stringify(id)}.`,
      'chemical',
    );
  }
  return CHEMICALS[id as ChemicalId];
}
