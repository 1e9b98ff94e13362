/**
 * Reduces a raw titration by one method: equivalence volume, alkalinity in every unit,
 * bicarbonate/carbonate/hydroxide split, fit quality and warnings. Pure: the constants come from
 * the caller (`makeConstants`), so the same raw record re-reduces with any method or model.
 */

import { fail, type Issue, warning } from '../errors';
import { freshConstants } from '../fresh/constants';
import type { ConstantSet } from '../types';
import { type CurveFitParameters, reduceCurveFit } from './curveFitMethod';
import { reduceEndpoint } from './endpointMethod';
import { reduceGran } from './granMethod';
import { reduceInflection } from './inflectionMethod';
import { ionicStrengthForTitration } from './ionicStrengthForTitration';
import type { MethodResult } from './methodResult';
import { confidenceLevel, reduceModifiedGran } from './modifiedGranMethod';
import type { PointSensitivity } from './pointSensitivity';
import { splitAlkalinity } from './speciesSplit';
import { alkalinityInEveryUnit, dicUmolKg } from './titrationUnits';
import { reduceTwoEndpoint } from './twoEndpointMethod';
import {
  DEFAULT_TITRATION_METHOD,
  TITRATION_METHODS,
  type TitrationConfidence,
  type TitrationInput,
  type TitrationMethod,
  type TitrationResult,
} from './types';
import { checkTitration } from './validateTitration';

/** Builds the fresh-water constant set for the sample temperature and ionic strength. */
export type ConstantsMaker = (temperatureC: number, ionicStrength: number) => ConstantSet;

/** The default: the fresh-water model (Plummer & Busenberg 1982, Davies activities) at 1 atm. */
export const freshTitrationConstants: ConstantsMaker = (temperatureC, ionicStrength) =>
  freshConstants({ temperatureC, salinity: 0, pressureDbar: 0 }, { ionicStrength });

const DEFAULT_AIR_PCO2_UATM = 420;

function methodOf(input: TitrationInput): TitrationMethod {
  const m = input.method ?? DEFAULT_TITRATION_METHOD;
  if (!(TITRATION_METHODS as readonly string[]).includes(m)) {
    fail(
      'titration-method-unknown',
      `Unknown method "${m}"; use one of ${TITRATION_METHODS.join(', ')}.`,
      'method',
    );
  }
  return m;
}

/** Internal shortcuts that change how fast a reduction runs, never its result. */
export interface ReduceHints {
  curveFitStart?: CurveFitParameters;
  /** Modified Gran: keep the readings an earlier reduction selected. */
  pointsUsed?: readonly number[];
}

/** The reduction plus what a later reduction of nearly the same record can start from. */
export function reduceTitrationWithHints(
  input: TitrationInput,
  makeConstants: ConstantsMaker,
  hints: ReduceHints = {},
): { result: TitrationResult; hints: ReduceHints; sensitivity?: PointSensitivity } {
  const method = methodOf(input);
  const t = checkTitration(input);
  const warnings: Issue[] = [...t.warnings];
  const toEqL = (ve: number) => (t.titrantEqL * ve) / t.sampleVolumeMl;
  checkEndpointReached(t.curve.ph, t.endpointPh, method, warnings);

  let core: MethodResult;
  let ionic: ReturnType<typeof ionicStrengthForTitration>;
  let k: ConstantSet;
  const system = input.system ?? 'closed';
  if (system !== 'closed' && system !== 'open') {
    fail('titration-value-invalid', `system must be "closed" or "open"; got "${system}".`, 'system');
  }
  if (method === 'modified_gran') {
    const ionicOf = (ta: number) =>
      ionicStrengthForTitration(input.ionic_strength_mol_kg, input.specific_conductance_us_cm, ta);
    core = reduceModifiedGran(t.curve, {
      sampleVolumeMl: t.sampleVolumeMl,
      titrantEqL: t.titrantEqL,
      system,
      constantsAt: (i) => makeConstants(t.temperatureC, i),
      sampleIonicStrength: (ta) => ionicOf(ta).value,
      endpointPh: t.endpointPh,
      ...(hints.pointsUsed ? { pointsUsed: hints.pointsUsed } : {}),
    });
    ionic = ionicOf(core.alkalinityEqL!);
    k = makeConstants(t.temperatureC, ionic.value);
  } else if (method === 'curve_fit') {
    // Starting alkalinity from Gran (robust) or, failing that, the fixed endpoint or the acid added.
    let guess: number;
    try {
      guess = toEqL(
        reduceGran(t.curve, { sampleVolumeMl: t.sampleVolumeMl, maxPh: input.gran_max_ph })
          .equivalenceVolumeMl,
      );
    } catch {
      try {
        guess = toEqL(reduceEndpoint(t.curve, t.endpointPh).equivalenceVolumeMl);
      } catch {
        // Short of the endpoint the alkalinity exceeds the acid added so far.
        guess = 1.2 * toEqL(t.curve.volumeMl[t.curve.volumeMl.length - 1]!);
      }
    }
    ionic = ionicStrengthForTitration(input.ionic_strength_mol_kg, input.specific_conductance_us_cm, guess);
    k = makeConstants(t.temperatureC, ionic.value);
    const pco2 = input.air_pco2_uatm ?? DEFAULT_AIR_PCO2_UATM;
    if (typeof pco2 !== 'number' || !(pco2 > 0)) {
      fail('titration-value-invalid', 'air_pco2_uatm must be a positive number.', 'air_pco2_uatm');
    }
    core = reduceCurveFit(t.curve, k, {
      sampleVolumeMl: t.sampleVolumeMl,
      titrantEqL: t.titrantEqL,
      system,
      alkalinityGuess: guess,
      pco2GuessAtm: pco2 * 1e-6,
      fitPhOffset: offsetFlag(input.curve_fit_ph_offset),
      ...(hints.curveFitStart ? { start: hints.curveFitStart } : {}),
    });
  } else {
    if (method === 'gran') {
      core = reduceGran(t.curve, {
        sampleVolumeMl: t.sampleVolumeMl,
        maxPh: input.gran_max_ph,
        titrantEqL: t.titrantEqL,
      });
    } else if (method === 'inflection') {
      core = reduceInflection(t.curve);
    } else if (method === 'two_endpoint') {
      core = reduceTwoEndpoint(t.curve, t.sampleVolumeMl, t.endpointPh);
    } else {
      core = reduceEndpoint(t.curve, t.endpointPh);
    }
    ionic = ionicStrengthForTitration(
      input.ionic_strength_mol_kg,
      input.specific_conductance_us_cm,
      toEqL(core.equivalenceVolumeMl),
    );
    k = makeConstants(t.temperatureC, ionic.value);
  }
  warnings.push(...core.warnings, ...ionic.warnings, ...k.warnings);

  const alkalinityEqL = core.alkalinityEqL ?? toEqL(core.equivalenceVolumeMl);
  const meqL = alkalinityEqL * 1e3;
  const units = alkalinityInEveryUnit(meqL, t.temperatureC);
  const result: TitrationResult = {
    method,
    equivalence_volume_ml: core.equivalenceVolumeMl,
    alkalinity_meq_l: meqL,
    alkalinity_mg_l_caco3: units.mg_l_caco3!,
    alkalinity: units,
    species: splitAlkalinity(alkalinityEqL, core.initialPh ?? t.curve.ph[0]!, k, core.dicMolL),
    fit: core.fit,
    ionic_strength_mol_kg: ionic.value,
    ionic_strength_source: ionic.source,
    titrant_eq_l: t.titrantEqL,
    formulations: { ...k.formulations, titration: methodSource[method] },
    warnings,
    confidence: core.confidence ?? confidenceOf(core, alkalinityEqL, t),
  };
  if (core.dicMolL !== undefined) {
    result.dic_umol_kg = dicUmolKg(core.dicMolL, t.temperatureC);
    const se = result.confidence.dic_se_mmol_l;
    if (se !== undefined) result.dic_se_umol_kg = dicUmolKg(se * 1e-3, t.temperatureC);
  }
  return {
    result,
    hints: core.parameters
      ? { curveFitStart: core.parameters }
      : method === 'modified_gran'
        ? { pointsUsed: core.fit.points_used }
        : {},
    ...(core.sensitivity ? { sensitivity: core.sensitivity } : {}),
  };
}

export function reduceTitration(input: TitrationInput, makeConstants: ConstantsMaker): TitrationResult {
  return reduceTitrationWithHints(input, makeConstants).result;
}

/** Confidence of the methods that do not report their own, from the standard errors they give. */
function confidenceOf(
  core: MethodResult,
  alkalinityEqL: number,
  t: ReturnType<typeof checkTitration>,
): TitrationConfidence {
  const d = core.fit.details;
  let past = 0;
  for (let i = 0; i < t.curve.ph.length; i++) {
    if (t.curve.volumeMl[i]! > core.equivalenceVolumeMl && t.curve.ph[i]! < t.endpointPh) past++;
  }
  const seMeqL =
    d.alkalinity_se_meq_l ??
    (d.equivalence_volume_se_ml === undefined
      ? undefined
      : ((d.equivalence_volume_se_ml * t.titrantEqL) / t.sampleVolumeMl) * 1e3);
  const base = { points_used: core.fit.points_used.length, points_past_endpoint: past };
  if (seMeqL === undefined || !Number.isFinite(seMeqL)) return { level: 'not_estimated', ...base };
  return {
    level: confidenceLevel(seMeqL / (alkalinityEqL * 1e3), past),
    alkalinity_se_meq_l: seMeqL,
    ...(d.dic_se_mmol_l === undefined ? {} : { dic_se_mmol_l: d.dic_se_mmol_l }),
    ...base,
  };
}

function offsetFlag(v: unknown): boolean {
  if (v === undefined) return false;
  if (typeof v !== 'boolean') {
    fail('titration-value-invalid', 'curve_fit_ph_offset must be true or false.', 'curve_fit_ph_offset');
  }
  return v;
}

/** Fewer readings than this past the endpoint leave the acid excess poorly defined (common practice). */
const ENOUGH_POINTS_PAST_ENDPOINT = 4;

/**
 * A curve that never reaches the endpoint cannot give an equivalence volume, except to the curve
 * fit, which extrapolates the model and is therefore only warned.
 */
function checkEndpointReached(
  ph: Float64Array,
  endpointPh: number,
  method: TitrationMethod,
  warnings: Issue[],
): void {
  let past = 0;
  for (const p of ph) if (p < endpointPh) past++;
  if (past === 0) {
    const message = `The curve never reaches pH ${endpointPh} (lowest reading pH ${Math.min(...ph)}). Keep adding acid.`;
    if (method !== 'curve_fit') fail('titration-endpoint-not-crossed', message, 'points');
    warnings.push(
      warning('titration-endpoint-not-crossed', `${message} The curve fit extrapolates.`, 'points'),
    );
  } else if (past < ENOUGH_POINTS_PAST_ENDPOINT) {
    warnings.push(
      warning(
        'titration-few-points-past-endpoint',
        `Only ${past} readings lie below pH ${endpointPh}: take ${ENOUGH_POINTS_PAST_ENDPOINT} or more past the endpoint.`,
        'points',
      ),
    );
  }
}

const methodSource: Record<TitrationMethod, string> = {
  modified_gran:
    'modified Gran function corrected for carbonate, water and H+ activity at each point (Gran 1952; Hansson & Jagner 1973; Dickson 1981), weighted least squares',
  gran: 'Gran 1952 (F1 with dilution, linear fit past the endpoint)',
  inflection: 'maximum of dpH/dV, local quadratic smoothing (Savitzky & Golay 1964)',
  endpoint: 'fixed endpoint, linear interpolation in pH',
  two_endpoint:
    'two endpoints 0.3 pH apart, Gran line through them (Standard Methods 2320 B low-alkalinity case)',
  curve_fit: 'carbonate model fitted by Levenberg–Marquardt (Marquardt 1963)',
};
