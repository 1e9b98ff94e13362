/**
 * The fresh-water keys of a solve request: major ions in mg/L, ionic strength or what stands for
 * it, alkalinity in field units, the air pCO2 for the equilibrium pH, and the model options.
 * Read from the raw JSON object, checked, and turned into mol/kg of water.
 */

import { fail, type Issue, warning } from '../errors';
import { numberAt, optionAt } from '../read-fields';
import { alkalinityToEqKg } from '../units';
import type { ActivityModel } from './activity';
import {
  hasMajorIons,
  type IonicStrengthMethod,
  ionicStrengthFromConductance,
  ionicStrengthFromIons,
  ionicStrengthFromTds,
  type MajorIonsMgL,
  type MajorIonsMolKg,
} from './ionic-strength';
import { ionicStrengthFromSalinity } from './model-choice';

/** Keys the fresh model reads; the solve contract lists them as known. */
export const FRESH_INPUT_KEYS = [
  'ionic_strength_mol_kg',
  'specific_conductance_us_cm',
  'tds_mg_l',
  'calcium_mg_l',
  'magnesium_mg_l',
  'sodium_mg_l',
  'potassium_mg_l',
  'chloride_mg_l',
  'sulfate_mg_l',
  'alkalinity_mg_l_caco3',
  'alkalinity_meq_l',
  'alkalinity_dkh',
  'air_pco2_uatm',
  'activity_model',
  'conductance_factor',
  'dolomite_form',
] as const;

/** Alkalinity in field units, each with the unit module's name for it. */
export const ALKALINITY_FIELD_KEYS = {
  alkalinity_mg_l_caco3: 'mg_l_caco3',
  alkalinity_meq_l: 'meq_l',
  alkalinity_dkh: 'dkh',
} as const;
type AlkalinityFieldKey = keyof typeof ALKALINITY_FIELD_KEYS;

/** Default atmospheric pCO2 for the air-equilibrium outputs, µatm (roughly the 2024 global mean, common practice). */
export const DEFAULT_AIR_PCO2_UATM = 420;

export interface FreshRequest {
  ions: MajorIonsMgL;
  ionicStrengthGiven: number | undefined;
  specificConductanceUsCm: number | undefined;
  tdsMgL: number | undefined;
  airPco2Uatm: number;
  activity: ActivityModel;
  conductanceFactor: 'russell-1976' | 'griffin-jurinak-1973';
  dolomite: 'ordered' | 'disordered';
  /** Fresh-only keys present, for the automatic model choice. */
  freshKeys: string[];
}

function nonNegative(raw: Readonly<Record<string, unknown>>, key: string): number | undefined {
  const v = numberAt(raw, key);
  if (v !== undefined && v < 0) fail('negative-value', `${key} cannot be negative, got ${v}.`, key);
  return v;
}

export function parseFreshInput(raw: Readonly<Record<string, unknown>>): FreshRequest {
  const ions: MajorIonsMgL = {};
  for (const name of ['calcium', 'magnesium', 'sodium', 'potassium', 'chloride', 'sulfate'] as const) {
    const v = nonNegative(raw, `${name}_mg_l`);
    if (v !== undefined) ions[name] = v;
  }
  const air = numberAt(raw, 'air_pco2_uatm') ?? DEFAULT_AIR_PCO2_UATM;
  if (!(air > 0) || air > 1e6) {
    fail('bad-air-pco2', `air_pco2_uatm must be between 0 and 1e6 µatm, got ${air}.`, 'air_pco2_uatm');
  }
  const freshOnly = FRESH_INPUT_KEYS.filter(
    (k) =>
      k !== 'air_pco2_uatm' && k !== 'specific_conductance_us_cm' && raw[k] !== undefined && raw[k] !== '',
  );
  return {
    ions,
    ionicStrengthGiven: nonNegative(raw, 'ionic_strength_mol_kg'),
    specificConductanceUsCm: nonNegative(raw, 'specific_conductance_us_cm'),
    tdsMgL: nonNegative(raw, 'tds_mg_l'),
    airPco2Uatm: air,
    activity: optionAt(
      raw,
      'activity_model',
      ['davies', 'debye-huckel', 'truesdell-jones'] as const,
      'davies',
    ),
    conductanceFactor: optionAt(
      raw,
      'conductance_factor',
      ['russell-1976', 'griffin-jurinak-1973'] as const,
      'russell-1976',
    ),
    dolomite: optionAt(raw, 'dolomite_form', ['ordered', 'disordered'] as const, 'ordered'),
    freshKeys: freshOnly,
  };
}

/**
 * Alkalinity given in field units, as µmol/kg (of water in the fresh model, of solution in the
 * saline one: `densityKgL` says which). Two alkalinity keys at once are refused, because the
 * solve could not say which one it used.
 */
export function alkalinityFromFieldUnits(
  raw: Readonly<Record<string, unknown>>,
  densityKgL: number,
  alreadyUmolKg: boolean,
): { key: AlkalinityFieldKey; umolKg: number } | undefined {
  const given = (Object.keys(ALKALINITY_FIELD_KEYS) as AlkalinityFieldKey[]).filter(
    (k) => numberAt(raw, k) !== undefined,
  );
  if (given.length === 0) return undefined;
  if (given.length > 1 || alreadyUmolKg) {
    const all = alreadyUmolKg ? ['alkalinity_umol_kg', ...given] : given;
    fail('alkalinity-given-twice', `Give alkalinity once; got ${all.join(' and ')}.`, given[0]);
  }
  const key = given[0]!;
  const v = numberAt(raw, key)!;
  if (v < 0)
    fail(
      'negative-alkalinity',
      `${key} is negative: acid waters with mineral acidity are outside this solver.`,
      key,
    );
  return { key, umolKg: alkalinityToEqKg(v, ALKALINITY_FIELD_KEYS[key], densityKgL) * 1e6 };
}

/** The conductance and TDS factors are fitted to natural waters below about 0.1 mol/kg (common practice). */
export const EMPIRICAL_I_LIMIT_MOL_KG = 0.1;

function empiricalRangeWarning(i: number, what: string, field: string): Issue[] {
  if (i <= EMPIRICAL_I_LIMIT_MOL_KG) return [];
  return [
    warning(
      'ionic-strength-estimate-out-of-range',
      `The ionic strength ${i.toPrecision(3)} mol/kg estimated from ${what} is beyond the ~${EMPIRICAL_I_LIMIT_MOL_KG} mol/kg ` +
        'for which the linear factors were fitted; give the major ions or ionic_strength_mol_kg for a better value.',
      field,
    ),
  ];
}

export interface IonicStrengthPlan {
  method: IonicStrengthMethod | 'salinity-seawater' | 'alkalinity-only';
  /** First estimate, mol/kg; the final value unless `iterate` is set. */
  initial: number;
  /** I depends on the solved species (major ions, or alkalinity only): the solve iterates. */
  iterate: boolean;
  warnings: Issue[];
}

/**
 * The ionic-strength estimate to use, in the order of preference of the fresh model: major ions
 * (iterated with the carbonate species by the solve), a given value, specific conductance, TDS,
 * salinity (as sea salt), else the alkalinity alone (I = TA, a sodium bicarbonate water: a lower
 * bound for most waters) with a warning.
 */
export function planIonicStrength(
  f: FreshRequest,
  salinity: number | undefined,
  alkalinityMolKg: number | undefined,
  ionsMolKg?: MajorIonsMolKg,
): IonicStrengthPlan {
  if (hasMajorIons(f.ions)) {
    // First guess: the ions given plus the alkalinity carried as HCO3- (the solve refines it).
    const hco3 = Math.max(alkalinityMolKg ?? 0, 0);
    return {
      method: 'major-ions',
      initial:
        ionsMolKg === undefined
          ? hco3 / 2
          : ionicStrengthFromIons(ionsMolKg, { hco3, co3: 0, oh: 0, hFree: 0 }),
      iterate: true,
      warnings: [],
    };
  }
  if (f.ionicStrengthGiven !== undefined) {
    return { method: 'given', initial: f.ionicStrengthGiven, iterate: false, warnings: [] };
  }
  if (f.specificConductanceUsCm !== undefined) {
    return {
      method:
        f.conductanceFactor === 'russell-1976'
          ? 'conductance-russell-1976'
          : 'conductance-griffin-jurinak-1973',
      initial: ionicStrengthFromConductance(f.specificConductanceUsCm, f.conductanceFactor),
      iterate: false,
      warnings: empiricalRangeWarning(
        ionicStrengthFromConductance(f.specificConductanceUsCm, f.conductanceFactor),
        'specific conductance',
        'specific_conductance_us_cm',
      ),
    };
  }
  if (f.tdsMgL !== undefined) {
    return {
      method: 'tds-langelier-1936',
      initial: ionicStrengthFromTds(f.tdsMgL),
      iterate: false,
      warnings: empiricalRangeWarning(ionicStrengthFromTds(f.tdsMgL), 'TDS', 'tds_mg_l'),
    };
  }
  if (salinity !== undefined && salinity > 0) {
    return {
      method: 'salinity-seawater',
      initial: ionicStrengthFromSalinity(salinity),
      iterate: false,
      warnings: [],
    };
  }
  return {
    method: 'alkalinity-only',
    initial: Math.max(alkalinityMolKg ?? 0, 0),
    iterate: true,
    warnings: [
      warning(
        'ionic-strength-from-alkalinity',
        'No ions, ionic strength, conductance, TDS or salinity was given: the ionic strength is taken as the ' +
          'alkalinity alone (a sodium bicarbonate water), a lower bound. Give specific_conductance_us_cm for a better estimate.',
        'ionic_strength_mol_kg',
      ),
    ],
  };
}
