/**
 * Single-ion activity coefficients for dilute natural waters: Davies (default), extended
 * Debye–Hückel and Truesdell–Jones, with temperature-dependent Debye–Hückel A and B.
 * All return log10 γ on the molal scale (mol/kg of water); I is the ionic strength in mol/kg.
 */

import { T0_K } from '../physical';
import { densitySmowUnesco1981, t68FromT90 } from '../seawater/eos80';
import type { Range } from './validity';

export type ActivityModel = 'davies' | 'debye-huckel' | 'truesdell-jones';

/** Ionic-strength ranges where each equation is commonly trusted (Stumm & Morgan 1996, Table 3.3, memory). */
export const ACTIVITY_RANGE_MOL_KG: Record<ActivityModel, Range> = {
  'debye-huckel': { min: 0, max: 0.1 },
  davies: { min: 0, max: 0.5 },
  'truesdell-jones': { min: 0, max: 2 },
};

/**
 * Relative permittivity (dielectric constant) of water at 1 atm.
 * Malmberg & Maryott (1956), J. Res. Natl. Bur. Stand. 56, 1–8 *(memory)*:
 * ε = 87.740 − 0.40008 t + 9.398e-4 t² − 1.410e-6 t³, t in °C, valid 0–100 °C.
 * Check: ε = 78.30 at 25 °C.
 */
export function dielectricWaterMalmbergMaryott1956(tC: number): number {
  return 87.74 + tC * (-0.40008 + tC * (9.398e-4 - tC * 1.41e-6));
}

/**
 * Debye–Hückel A and B from the permittivity and density of water (e.g. Truesdell & Jones 1974,
 * eqs. 4–5; Langmuir 1997, Aqueous Environmental Geochemistry, eq. 4.12 *(memory)*):
 * A = 1.82483e6 √ρ / (εT)^(3/2) in kg^½ mol^−½; B = 50.2916 √ρ / (εT)^(1/2) in kg^½ mol^−½ Å^−1,
 * ρ in g/cm3 (pure water, UNESCO 1981), ε from Malmberg & Maryott (1956), T in K.
 * Check: A = 0.5085–0.511, B = 0.3281–0.3291 at 25 °C (see tests for the tables compared).
 */
let lastAB: { tC: number; a: number; b: number } | undefined;
export function debyeHuckelAB(tC: number): { a: number; b: number } {
  // One temperature is evaluated several times in a row by the ionic-strength iteration.
  if (lastAB !== undefined && lastAB.tC === tC) return lastAB;
  lastAB = { tC, ...debyeHuckelABAt(tC) };
  return lastAB;
}

function debyeHuckelABAt(tC: number): { a: number; b: number } {
  const tK = tC + T0_K;
  const rho = densitySmowUnesco1981(t68FromT90(tC)) / 1000;
  const et = dielectricWaterMalmbergMaryott1956(tC) * tK;
  const sr = Math.sqrt(rho);
  return { a: (1.82483e6 * sr) / (et * Math.sqrt(et)), b: (50.2916 * sr) / Math.sqrt(et) };
}

/**
 * Davies (1938, 1962) equation, log γ = −A z² (√I/(1+√I) − 0.3 I).
 * Davies, Ion Association (1962) *(memory)*. Commonly used up to I ≈ 0.5 mol/kg.
 */
export function logGammaDavies(z: number, ionicStrength: number, a: number): number {
  const s = Math.sqrt(ionicStrength);
  return -a * z * z * (s / (1 + s) - 0.3 * ionicStrength);
}

/**
 * Extended Debye–Hückel equation, log γ = −A z² √I / (1 + B å √I), å the ion-size parameter in Å
 * (Kielland 1937). Commonly used up to I ≈ 0.1 mol/kg.
 */
export function logGammaDebyeHuckel(
  z: number,
  ionicStrength: number,
  a: number,
  b: number,
  sizeA: number,
): number {
  const s = Math.sqrt(ionicStrength);
  return (-a * z * z * s) / (1 + b * sizeA * s);
}

/**
 * Truesdell–Jones equation, log γ = −A z² √I / (1 + B å √I) + b I, with the ion-specific å and b
 * of Truesdell & Jones (1974), J. Res. U.S. Geol. Surv. 2, 233–248. Used up to I ≈ 2 mol/kg in
 * chloride waters.
 */
export function logGammaTruesdellJones(
  z: number,
  ionicStrength: number,
  a: number,
  b: number,
  sizeA: number,
  bDot: number,
): number {
  return logGammaDebyeHuckel(z, ionicStrength, a, b, sizeA) + bDot * ionicStrength;
}

/**
 * The ions the fresh model needs, with charge, Kielland (1937) ion size (J. Am. Chem. Soc. 59,
 * 1675, Table I *(memory)*) and, where published, the Truesdell & Jones (1974, Table 1 *(memory)*)
 * å and b. Ions Truesdell & Jones do not list fall back to the Kielland size with b = 0.
 * B(OH)4- and H3SiO4- are not in Kielland's table: they take 4 Å like the other singly charged
 * oxyanions (our assumption, stated in the formulations output).
 */
export const IONS = {
  H: { z: 1, kielland: 9, tj: [4.78, 0.24] },
  OH: { z: -1, kielland: 3.5, tj: [10.65, 0.21] },
  HCO3: { z: -1, kielland: 4, tj: [5.4, 0] },
  CO3: { z: -2, kielland: 4.5, tj: [5.4, 0] },
  Ca: { z: 2, kielland: 6, tj: [5.0, 0.165] },
  Mg: { z: 2, kielland: 8, tj: [5.5, 0.2] },
  Na: { z: 1, kielland: 4, tj: [4.0, 0.075] },
  K: { z: 1, kielland: 3, tj: [3.5, 0.015] },
  Cl: { z: -1, kielland: 3, tj: [3.5, 0.015] },
  SO4: { z: -2, kielland: 4, tj: [5.0, -0.04] },
  HSO4: { z: -1, kielland: 4, tj: null },
  F: { z: -1, kielland: 3.5, tj: null },
  BOH4: { z: -1, kielland: 4, tj: null },
  NH4: { z: 1, kielland: 2.5, tj: null },
  H2PO4: { z: -1, kielland: 4, tj: null },
  HPO4: { z: -2, kielland: 4, tj: null },
  PO4: { z: -3, kielland: 4, tj: null },
  H3SiO4: { z: -1, kielland: 4, tj: null },
  HS: { z: -1, kielland: 3.5, tj: null },
} as const satisfies Record<string, { z: number; kielland: number; tj: readonly [number, number] | null }>;

export type IonName = keyof typeof IONS;
export const ION_NAMES = Object.keys(IONS) as IonName[];

/**
 * Neutral species (CO2*, NH3, B(OH)3, H4SiO4, H2S, HF, H3PO4): log γ = 0.1 I, the Setchenow-type
 * salting-out term commonly used in geochemical models (common practice; e.g. Langmuir 1997 §4.4,
 * memory). Set `saltingOut: false` to take γ = 1.
 */
export function logGammaNeutral(ionicStrength: number, saltingOut: boolean): number {
  return saltingOut ? 0.1 * ionicStrength : 0;
}

/** log10 γ of one listed ion by the chosen equation at temperature tC and ionic strength I. */
export function logGammaIon(
  ion: IonName,
  model: ActivityModel,
  ionicStrength: number,
  ab: { a: number; b: number },
): number {
  const p = IONS[ion];
  switch (model) {
    case 'davies':
      return logGammaDavies(p.z, ionicStrength, ab.a);
    case 'debye-huckel':
      return logGammaDebyeHuckel(p.z, ionicStrength, ab.a, ab.b, p.kielland);
    case 'truesdell-jones':
      return p.tj === null
        ? logGammaDebyeHuckel(p.z, ionicStrength, ab.a, ab.b, p.kielland)
        : logGammaTruesdellJones(p.z, ionicStrength, ab.a, ab.b, p.tj[0], p.tj[1]);
  }
}

/** Activity coefficients (γ, not log) of every listed ion plus the neutral species. */
export type ActivityCoefficients = Record<IonName | 'neutral', number>;

let lastGamma:
  | { tC: number; i: number; model: ActivityModel; saltingOut: boolean; g: ActivityCoefficients }
  | undefined;

/**
 * Activity coefficients at (t, I): the last set is kept, because a solve asks for the same one
 * several times. Treat the returned object as read-only.
 */
export function activityCoefficients(
  tC: number,
  ionicStrength: number,
  model: ActivityModel,
  saltingOut: boolean,
): ActivityCoefficients {
  const c = lastGamma;
  if (
    c !== undefined &&
    c.tC === tC &&
    c.i === ionicStrength &&
    c.model === model &&
    c.saltingOut === saltingOut
  )
    return c.g;
  const g = activityCoefficientsAt(tC, ionicStrength, model, saltingOut);
  lastGamma = { tC, i: ionicStrength, model, saltingOut, g };
  return g;
}

/**
 * The same coefficients written into `g` (the ion-pair iteration rewrites one set per solve);
 * Davies fills every ion from three powers, the other equations go through `activityCoefficientsAt`.
 */
export function activityCoefficientsInto(
  g: ActivityCoefficients,
  tC: number,
  ionicStrength: number,
  model: ActivityModel,
  saltingOut: boolean,
): ActivityCoefficients {
  if (model !== 'davies') return Object.assign(g, activityCoefficients(tC, ionicStrength, model, saltingOut));
  const l1 = logGammaDavies(1, ionicStrength, debyeHuckelAB(tC).a);
  const g1 = 10 ** l1;
  const g2 = 10 ** (4 * l1);
  g.neutral = 10 ** logGammaNeutral(ionicStrength, saltingOut);
  g.PO4 = 10 ** (9 * l1);
  g.H = g1;
  g.OH = g1;
  g.HCO3 = g1;
  g.CO3 = g2;
  g.Ca = g2;
  g.Mg = g2;
  g.Na = g1;
  g.K = g1;
  g.Cl = g1;
  g.SO4 = g2;
  g.HSO4 = g1;
  g.F = g1;
  g.BOH4 = g1;
  g.NH4 = g1;
  g.H2PO4 = g1;
  g.HPO4 = g2;
  g.H3SiO4 = g1;
  g.HS = g1;
  return g;
}

function activityCoefficientsAt(
  tC: number,
  ionicStrength: number,
  model: ActivityModel,
  saltingOut: boolean,
): ActivityCoefficients {
  const ab = debyeHuckelAB(tC);
  const neutral = 10 ** logGammaNeutral(ionicStrength, saltingOut);
  if (model === 'davies') {
    // Davies depends on the charge only: three powers serve every ion (this sits in the solve loop).
    const l1 = logGammaDavies(1, ionicStrength, ab.a);
    const g1 = 10 ** l1;
    const g2 = 10 ** (4 * l1);
    const g3 = 10 ** (9 * l1);
    return {
      neutral,
      H: g1,
      OH: g1,
      HCO3: g1,
      CO3: g2,
      Ca: g2,
      Mg: g2,
      Na: g1,
      K: g1,
      Cl: g1,
      SO4: g2,
      HSO4: g1,
      F: g1,
      BOH4: g1,
      NH4: g1,
      H2PO4: g1,
      HPO4: g2,
      PO4: g3,
      H3SiO4: g1,
      HS: g1,
    };
  }
  const g = (ion: IonName): number => 10 ** logGammaIon(ion, model, ionicStrength, ab);
  return {
    neutral,
    H: g('H'),
    OH: g('OH'),
    HCO3: g('HCO3'),
    CO3: g('CO3'),
    Ca: g('Ca'),
    Mg: g('Mg'),
    Na: g('Na'),
    K: g('K'),
    Cl: g('Cl'),
    SO4: g('SO4'),
    HSO4: g('HSO4'),
    F: g('F'),
    BOH4: g('BOH4'),
    NH4: g('NH4'),
    H2PO4: g('H2PO4'),
    HPO4: g('HPO4'),
    PO4: g('PO4'),
    H3SiO4: g('H3SiO4'),
    HS: g('HS'),
  };
}
