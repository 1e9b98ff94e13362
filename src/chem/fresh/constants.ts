/**
 * The fresh-water model: thermodynamic constants (infinite dilution) turned into the "mixed"
 * conditional constants the solver consumes, with H+ as activity (internal scale = NBS/activity)
 * and every other species as a concentration in mol/kg of water:
 *   K1' = K1·γCO2/γHCO3, K2' = K2·γHCO3/γCO3, Kw' = Kw/γOH, K0' = K0/γCO2, Ksp' = Ksp/(γCa·γCO3),
 * and likewise for the minor acids. γ of neutral species (CO2*, B(OH)3, NH3, ...) carries the
 * salting-out term log γ = 0.1 I unless `saltingOut: false` (see `logGammaNeutral`).
 * Constants on the FREE scale (KS, KF) divide by γH as well, since [H+]free = aH/γH.
 */

import { fail, type Issue, warning } from '../errors';
import { T0_K } from '../physical';
import type { Conditions, ConstantSet, MinorTotals } from '../types';
import {
  ACTIVITY_RANGE_MOL_KG,
  type ActivityCoefficients,
  type ActivityModel,
  activityCoefficientsInto,
  ION_NAMES,
} from './activity';
import {
  conditionalBetasInto,
  type FreeIons,
  logKspGypsumNordstrom1990,
  type PairAlphas,
  type PairBeta,
  type PairLogK,
  pairAlphasInto,
  pairKAt,
} from './ion-pairs';
import {
  BATES_PHOSPHATE_RANGE_C,
  BATES_PINCHING_1949_RANGE_C,
  DICKSON_1990_RANGE_C,
  fugacityFactorWeiss1974,
  HARNED_OWEN_1958_RANGE_C,
  logK1PlummerBusenberg1982,
  logK1pBates1951,
  logK2PlummerBusenberg1982,
  logK2pBatesAcree1943,
  logK3pNordstrom1990,
  logKbDickson1990S0,
  logKfNordstrom1990,
  logKh2sNordstrom1990,
  logKhPlummerBusenberg1982,
  logKnh4BatesPinching1949,
  logKsiNordstrom1990,
  logKsNordstrom1990,
  logKspAragonitePlummerBusenberg1982,
  logKspCalcitePlummerBusenberg1982,
  logKspDolomiteNordstrom1990,
  logKwHarnedOwen1958,
  PLUMMER_BUSENBERG_1982_RANGE_C,
  VANT_HOFF_RANGE_C,
  WEISS_1974_RANGE_C,
} from './thermo';
import { pushRange } from './validity';

const NO_PAIRS: PairAlphas = Object.freeze({ hco3: 1, co3: 1, oh: 1, so4: 1, ca: 1, mg: 1 });
const NO_GAMMA = Object.freeze(
  Object.fromEntries([...ION_NAMES, 'neutral'].map((n) => [n, 1])),
) as ActivityCoefficients;
const NO_BETAS: PairBeta = Object.freeze({
  caHco3: 0,
  caCo3: 0,
  caSo4: 0,
  caOh: 0,
  mgHco3: 0,
  mgCo3: 0,
  mgSo4: 0,
  mgOh: 0,
  naCo3: 0,
  naHco3: 0,
  naSo4: 0,
  kSo4: 0,
});

export interface FreshOptions {
  /** Ionic strength, mol/kg of water (≥ 0). */
  ionicStrength: number;
  /** Activity-coefficient equation; Davies by default. */
  activity?: ActivityModel;
  /** Salting-out of neutral species, log γ = 0.1 I (default true). */
  saltingOut?: boolean;
  /** Dolomite of Nordstrom et al. (1990): ordered (default) or disordered. */
  dolomite?: 'ordered' | 'disordered';
  /** Totals given by the user, mol/kg of water; all default to 0 in fresh water. */
  totalBoron?: number;
  totalSulfate?: number;
  totalFluoride?: number;
  calcium?: number;
  magnesium?: number;
  /** Minor acid totals, only used to decide which validity warnings apply. */
  minorTotals?: Partial<MinorTotals>;
  /**
   * Free Ca, Mg, Na, K and SO4 (mol/kg of water) of the current speciation: when given, the ion
   * pairs of `ion-pairs.ts` are folded into the constants (totals: `calcium`, `magnesium`,
   * `totalSulfate`); when absent every ion is free.
   */
  freeIons?: FreeIons | undefined;
}

/** Thermodynamic log10 K values before activity corrections (for output and tests). */
export interface ThermodynamicLogK {
  k0: number;
  k1: number;
  k2: number;
  kw: number;
  kb: number;
  ks: number;
  kf: number;
  k1p: number;
  k2p: number;
  k3p: number;
  ksi: number;
  knh4: number;
  kh2s: number;
  kspCalcite: number;
  kspAragonite: number;
  kspDolomite: number;
  kspGypsum: number;
}

/** The fresh ConstantSet plus what the fresh outputs need (kept out of the shared contract). */
export interface FreshConstantSet extends ConstantSet {
  model: 'fresh';
  ionicStrength: number;
  activityModel: ActivityModel;
  gamma: ActivityCoefficients;
  /** Conditional dolomite product for Ω = [Ca][Mg][CO3]² / Ksp', mol4 kg-4. */
  kspDolomite: number;
  /** Conditional gypsum product for Ω = [Ca]T[SO4]T / Ksp', mol2 kg-2 (pairs folded in). */
  kspGypsum: number;
  magnesium: number;
  thermodynamic: ThermodynamicLogK;
  /** The speciation the constants were built on, when ion pairs are in play. */
  pairs?: { betas: PairBeta; free: FreeIons; alphas: PairAlphas } | undefined;
}

const ACTIVITY_NAMES: Record<ActivityModel, string> = {
  davies: 'Davies (1962), A from Malmberg & Maryott (1956) permittivity',
  'debye-huckel': 'extended Debye–Hückel, ion sizes of Kielland (1937)',
  'truesdell-jones': 'Truesdell & Jones (1974), Kielland (1937) sizes where they give none',
};

/**
 * Formulation names per combination of options, built once: every row of a batch shares the
 * object (read-only), so a solve does not allocate it again.
 */
const FORMULATIONS = new Map<number, Readonly<Record<string, string>>>();
const ACTIVITY_KEY: Record<ActivityModel, number> = { davies: 0, 'debye-huckel': 1, 'truesdell-jones': 2 };
function formulationsFor(
  model: ActivityModel,
  saltingOut: boolean,
  dolomite: 'ordered' | 'disordered',
  pairs: boolean,
): Record<string, string> {
  // A number, not a template string: this runs on every pass of the ion-pair iteration.
  const key =
    ACTIVITY_KEY[model] + (saltingOut ? 4 : 0) + (dolomite === 'ordered' ? 8 : 0) + (pairs ? 16 : 0);
  let f = FORMULATIONS.get(key);
  if (f === undefined) {
    f = Object.freeze({
      k0: 'Plummer & Busenberg 1982',
      k1: 'Plummer & Busenberg 1982',
      k2: 'Plummer & Busenberg 1982',
      kw: 'Harned & Owen 1958',
      kb: 'Dickson 1990b at S = 0',
      ks: 'Nordstrom et al. 1990 (van t Hoff)',
      kf: 'Nordstrom et al. 1990 (van t Hoff)',
      k1p: 'Bates 1951',
      k2p: 'Bates & Acree 1943',
      k3p: 'Nordstrom et al. 1990 (van t Hoff)',
      ksi: 'Nordstrom et al. 1990 (van t Hoff)',
      knh4: 'Bates & Pinching 1949',
      kh2s: 'Nordstrom et al. 1990 (van t Hoff)',
      ksp_calcite: 'Plummer & Busenberg 1982',
      ksp_aragonite: 'Plummer & Busenberg 1982',
      ksp_dolomite: `Nordstrom et al. 1990, ${dolomite} (van t Hoff)`,
      fugacity: 'Weiss 1974',
      activity: ACTIVITY_NAMES[model],
      neutral_species: saltingOut ? 'log γ = 0.1 I (salting-out)' : 'γ = 1',
      ion_pairs: pairs
        ? 'CaHCO3+, CaCO3° (Plummer & Busenberg 1982); MgHCO3+, MgCO3° (Nordstrom et al. 1990, Siebert & Hostetler 1977); ' +
          'CaSO4°, MgSO4°, NaCO3-, NaHCO3°, NaSO4-, KSO4-, CaOH+, MgOH+ (Nordstrom et al. 1990, van t Hoff); ' +
          'solved with the ionic strength; saturation indices use free-ion activities'
        : // Said out loud: without Ca, Mg, Na, K or SO4 there is nothing to pair.
          'none: no Ca, Mg, Na, K or SO4 given, so the carbonate ions are free',
      ksp_gypsum: 'Nordstrom et al. 1990',
    });
    FORMULATIONS.set(key, f);
  }
  return f as Record<string, string>;
}

interface Thermodynamic {
  tK: number;
  dolomite: 'ordered' | 'disordered';
  th: ThermodynamicLogK;
  /** The same constants as K (10^log K). */
  K: ThermodynamicLogK;
  fugacity: number;
}
/**
 * The thermodynamic constants depend on temperature only, while the ionic-strength iteration
 * re-evaluates the constant set at one temperature several times: keep the last one.
 */
let lastThermo: Thermodynamic | undefined;
function thermodynamicAt(tK: number, dolomite: 'ordered' | 'disordered'): Thermodynamic {
  if (lastThermo !== undefined && lastThermo.tK === tK && lastThermo.dolomite === dolomite) return lastThermo;
  const th: ThermodynamicLogK = {
    k0: logKhPlummerBusenberg1982(tK),
    k1: logK1PlummerBusenberg1982(tK),
    k2: logK2PlummerBusenberg1982(tK),
    kw: logKwHarnedOwen1958(tK),
    kb: logKbDickson1990S0(tK),
    ks: logKsNordstrom1990(tK),
    kf: logKfNordstrom1990(tK),
    k1p: logK1pBates1951(tK),
    k2p: logK2pBatesAcree1943(tK),
    k3p: logK3pNordstrom1990(tK),
    ksi: logKsiNordstrom1990(tK),
    knh4: logKnh4BatesPinching1949(tK),
    kh2s: logKh2sNordstrom1990(tK),
    kspCalcite: logKspCalcitePlummerBusenberg1982(tK),
    kspAragonite: logKspAragonitePlummerBusenberg1982(tK),
    kspDolomite: logKspDolomiteNordstrom1990(tK, dolomite),
    kspGypsum: logKspGypsumNordstrom1990(tK),
  };
  const K: ThermodynamicLogK = {
    k0: 10 ** th.k0,
    k1: 10 ** th.k1,
    k2: 10 ** th.k2,
    kw: 10 ** th.kw,
    kb: 10 ** th.kb,
    ks: 10 ** th.ks,
    kf: 10 ** th.kf,
    k1p: 10 ** th.k1p,
    k2p: 10 ** th.k2p,
    k3p: 10 ** th.k3p,
    ksi: 10 ** th.ksi,
    knh4: 10 ** th.knh4,
    kh2s: 10 ** th.kh2s,
    kspCalcite: 10 ** th.kspCalcite,
    kspAragonite: 10 ** th.kspAragonite,
    kspDolomite: 10 ** th.kspDolomite,
    kspGypsum: 10 ** th.kspGypsum,
  };
  lastThermo = { tK, dolomite, th, K, fugacity: fugacityFactorWeiss1974(tK) };
  return lastThermo;
}

/** Builds the fresh-water ConstantSet at the given conditions and ionic strength. */
export function freshConstants(cond: Conditions, opts: FreshOptions): FreshConstantSet {
  const b = new FreshConstantsBuilder(cond, opts);
  b.at(opts.ionicStrength, opts.freeIons);
  return b.finish();
}

function checkIonicStrength(I: number): void {
  if (!Number.isFinite(I) || I < 0) {
    fail(
      'bad-ionic-strength',
      `Ionic strength must be a number ≥ 0 mol/kg (got ${String(I)}).`,
      'ionic_strength_mol_kg',
    );
  }
}

/**
 * One fresh constant set re-evaluated in place at a new ionic strength and speciation: the
 * passes of the ion-pair iteration (`solve-fresh.ts`) move only I and the free ions, so the
 * temperature terms (thermodynamic K, pair K, fugacity, formulation names) are computed once and
 * every pass rewrites the same objects (set, γ, β, α) instead of building new ones. `at` returns
 * the set (the same object each time: a caller keeping one pass's values must copy them);
 * `finish` adds the validity warnings for the last ionic strength and returns it.
 */
export class FreshConstantsBuilder {
  readonly set: FreshConstantSet;
  private readonly tC: number;
  private readonly model: ActivityModel;
  private readonly saltingOut: boolean;
  private readonly K: ThermodynamicLogK;
  private readonly pairK: PairLogK | undefined;
  private readonly opts: FreshOptions;
  private readonly g: ActivityCoefficients;
  private readonly betas: PairBeta | undefined;
  private readonly alphas: PairAlphas;

  constructor(cond: Conditions, opts: FreshOptions) {
    const tC = cond.temperatureC;
    if (!Number.isFinite(tC) || tC <= -T0_K) {
      fail(
        'bad-temperature',
        `Temperature must be a number above absolute zero (got ${String(tC)}).`,
        'temperature_c',
      );
    }
    checkIonicStrength(opts.ionicStrength);
    this.tC = tC;
    this.opts = opts;
    this.model = opts.activity ?? 'davies';
    this.saltingOut = opts.saltingOut ?? true;
    const tK = tC + T0_K;
    const dolomite = opts.dolomite ?? 'ordered';
    const { th, K, fugacity } = thermodynamicAt(tK, dolomite);
    this.K = K;
    const withPairs = opts.freeIons !== undefined;
    this.pairK = withPairs ? pairKAt(tK, th.kw) : undefined;
    this.g = { ...NO_GAMMA };
    this.betas = withPairs ? { ...NO_BETAS } : undefined;
    this.alphas = { ...NO_PAIRS };
    const totalSulfate = opts.totalSulfate ?? 0;
    const totalFluoride = opts.totalFluoride ?? 0;
    this.set = {
      model: 'fresh',
      conditions: cond,
      k0: 0,
      fugacityFactor: fugacity,
      k1: 0,
      k2: 0,
      kw: 0,
      kb: 0,
      ks: 0,
      kf: 0,
      k1p: 0,
      k2p: 0,
      k3p: 0,
      ksi: 0,
      knh4: 0,
      kh2s: 0,
      kspCalcite: 0,
      kspAragonite: 0,
      kspDolomite: 0,
      kspGypsum: 0,
      totalBoron: opts.totalBoron ?? 0,
      totalSulfate,
      totalFluoride,
      calcium: opts.calcium ?? 0,
      magnesium: opts.magnesium ?? 0,
      freeHFactor: 1,
      scaleFactor: { nbs: 1, free: 1, total: 1, seawater: 1 },
      ionicStrength: opts.ionicStrength,
      activityModel: this.model,
      gamma: this.g,
      thermodynamic: th,
      formulations: formulationsFor(this.model, this.saltingOut, dolomite, withPairs),
      warnings: [],
      pairs: undefined,
    };
  }

  /** The set at ionic strength I with free ions `free` (their pairs folded in; absent: all free). */
  at(I: number, free: FreeIons | undefined): FreshConstantSet {
    checkIonicStrength(I);
    const k = this.set;
    const g = this.g;
    activityCoefficientsInto(g, this.tC, I, this.model, this.saltingOut);
    const K = this.K;
    const gn = g.neutral;
    // Ion pairs folded into the constants (ion-pairs.ts): α = total / free for each family.
    let a: PairAlphas = NO_PAIRS;
    if (free !== undefined && this.betas !== undefined && this.pairK !== undefined) {
      conditionalBetasInto(this.betas, this.pairK, g);
      a = pairAlphasInto(this.alphas, this.betas, free, k.calcium, k.magnesium);
      const p = k.pairs;
      if (p === undefined) k.pairs = { betas: this.betas, free, alphas: a };
      else p.free = free;
    } else k.pairs = undefined;
    const ks = ((K.ks * g.HSO4) / (g.H * g.SO4)) * a.so4;
    const kf = (K.kf * gn) / (g.H * g.F);
    const fr = 1 / g.H;
    k.ionicStrength = I;
    k.k0 = K.k0 / gn;
    k.k1 = ((K.k1 * gn) / g.HCO3) * a.hco3;
    k.k2 = ((K.k2 * g.HCO3) / g.CO3) * (a.co3 / a.hco3);
    k.kw = (K.kw / g.OH) * a.oh;
    k.kb = (K.kb * gn) / g.BOH4;
    k.ks = ks;
    k.kf = kf;
    k.k1p = (K.k1p * gn) / g.H2PO4;
    k.k2p = (K.k2p * g.H2PO4) / g.HPO4;
    k.k3p = (K.k3p * g.HPO4) / g.PO4;
    k.ksi = (K.ksi * gn) / g.H3SiO4;
    k.knh4 = (K.knh4 * g.NH4) / gn;
    k.kh2s = (K.kh2s * gn) / g.HS;
    k.kspCalcite = (K.kspCalcite / (g.Ca * g.CO3)) * a.ca * a.co3;
    k.kspAragonite = (K.kspAragonite / (g.Ca * g.CO3)) * a.ca * a.co3;
    k.kspDolomite = (K.kspDolomite / (g.Ca * g.Mg * g.CO3 * g.CO3)) * a.ca * a.mg * a.co3 * a.co3;
    k.kspGypsum = (K.kspGypsum / (g.Ca * g.SO4)) * a.ca * a.so4;
    k.freeHFactor = fr;
    const sf = k.scaleFactor;
    sf.free = fr;
    sf.total = fr * (1 + k.totalSulfate / ks);
    sf.seawater = fr * (1 + k.totalSulfate / ks + k.totalFluoride / kf);
    return k;
  }

  /** The set with the validity warnings of its (last) ionic strength. */
  finish(): FreshConstantSet {
    const k = this.set;
    k.warnings = freshValidity(this.tC, k.conditions.pressureDbar, k.ionicStrength, this.model, this.opts);
    return k;
  }
}

const ACTIVITY_LABEL: Record<ActivityModel, string> = {
  davies: 'The Davies equation',
  'debye-huckel': 'The extended Debye–Hückel equation',
  'truesdell-jones': 'The Truesdell–Jones equation',
};

/** Validity warnings of every formulation the fresh model uses at these conditions. */
export function freshValidity(
  tC: number,
  pressureDbar: number,
  ionicStrength: number,
  model: ActivityModel,
  opts: Pick<FreshOptions, 'totalBoron' | 'totalSulfate' | 'totalFluoride' | 'magnesium' | 'minorTotals'>,
): Issue[] {
  const out: Issue[] = [];
  const T = 'temperature';
  const f = 'temperature_c';
  pushRange(out, 'Plummer & Busenberg (1982)', T, tC, PLUMMER_BUSENBERG_1982_RANGE_C, '°C', f);
  pushRange(out, 'Harned & Owen (1958) Kw', T, tC, HARNED_OWEN_1958_RANGE_C, '°C', f);
  pushRange(out, 'Weiss (1974) fugacity', T, tC, WEISS_1974_RANGE_C, '°C', f);
  pushRange(
    out,
    ACTIVITY_LABEL[model],
    'ionic strength',
    ionicStrength,
    ACTIVITY_RANGE_MOL_KG[model],
    'mol/kg',
    'ionic_strength_mol_kg',
  );
  if ((opts.totalBoron ?? 0) > 0)
    pushRange(out, 'Dickson (1990b) KB at S = 0', T, tC, DICKSON_1990_RANGE_C, '°C', f);
  if ((opts.totalSulfate ?? 0) > 0 || (opts.totalFluoride ?? 0) > 0 || (opts.magnesium ?? 0) > 0) {
    pushRange(
      out,
      'The van t Hoff extrapolations (Nordstrom et al. 1990)',
      T,
      tC,
      VANT_HOFF_RANGE_C,
      '°C',
      f,
    );
  }
  const m = opts.minorTotals ?? {};
  if ((m.phosphate ?? 0) > 0)
    pushRange(out, 'Bates (1951) / Bates & Acree (1943) phosphate', T, tC, BATES_PHOSPHATE_RANGE_C, '°C', f);
  if ((m.ammonia ?? 0) > 0)
    pushRange(out, 'Bates & Pinching (1949) ammonium', T, tC, BATES_PINCHING_1949_RANGE_C, '°C', f);
  if ((m.silicate ?? 0) > 0 || (m.sulfide ?? 0) > 0) {
    pushRange(
      out,
      'The van t Hoff extrapolations (Nordstrom et al. 1990)',
      T,
      tC,
      VANT_HOFF_RANGE_C,
      '°C',
      f,
    );
  }
  if (pressureDbar > 0) {
    out.push(
      warning(
        'fresh-pressure-ignored',
        'The fresh-water model has no pressure corrections: constants are for 1 atm, the applied pressure is ignored.',
        'pressure_dbar',
      ),
    );
  }
  return out;
}
