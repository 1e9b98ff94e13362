/**
 * `solve()`: the carbonate system of one water from a JSON request (see `api.ts`).
 *
 * Steps: read and check the request; evaluate the constants at input conditions; turn the
 * measured values into internal units (mol/kg, atm, h on the model's internal scale); solve from
 * the chosen pair; carry TA and DIC (and the minor totals) to the output conditions and solve
 * there again; report every output, the misfit of extra measurements, warnings and formulations.
 */

import type { CarbonateKey, FreshWaterOutputs, SolvedWater, SolveOutput, SolveResult } from './api';
import { highPco2Warning, possibleStates } from './consistency';
import { type Issue, toIssue, warning } from './errors';
import type { FreshConstantSet } from './fresh/constants';
import { decideModel, freshContext } from './fresh/setup';
import {
  assignFreshOutputs,
  type FreshContext,
  freshIterates,
  freshOutputs,
  solveAtIonicStrength,
} from './fresh/solve-fresh';
import { choosePair, parseSolveInput, type SolveRequest } from './input';
import { applyShifts, type ConstantShifts, constantsFor } from './models';
import { bufferFactors, revelleFactor } from './solver/buffer';
import { type Param, solvePair } from './solver/pairs';
import { addTradeOutputs, type TradeContext, uncertaintyWithCalibration } from './trades/solveOutputs';
import type { CarbonateState, ConstantSet, MinorTotals, PhScale, WaterModel } from './types';
import { solveUncertainty } from './uncertainty/solveUncertainty';

export interface SolveOptions {
  /** Offsets of constants (p-units) and factors, for uncertainty propagation. */
  shifts?: ConstantShifts;
}

/** Never throws: a request that cannot be solved becomes `{ error: { code, message } }`. */
export function solve(input: unknown, options: SolveOptions = {}): SolveResult {
  try {
    if (
      typeof input === 'object' &&
      input !== null &&
      (input as { uncertainty?: unknown }).uncertainty !== undefined
    ) {
      return solveWithUncertainty(input as Record<string, unknown>, options);
    }
    return solveRequest(parseSolveInput(input), options);
  } catch (e) {
    return { error: toIssue(e) };
  }
}

/**
 * A solve whose input carries `uncertainty`: the plain solve, plus the standard uncertainty of
 * every numeric output by derivatives of this same solver (../uncertainty/solveUncertainty.ts),
 * one extra solve per uncertain input or constant.
 */
function solveWithUncertainty(input: Record<string, unknown>, options: SolveOptions): SolveOutput {
  const { uncertainty, ...plain } = input;
  const out = solveRequest(parseSolveInput(plain), options);
  out.uncertainty = solveUncertainty(plain, uncertaintyWithCalibration(plain, uncertainty), out, (i, o) =>
    solve(i, o.shifts ? { ...options, shifts: { ...options.shifts, ...o.shifts } } : options),
  );
  return out;
}

const PARAM_OF: Record<CarbonateKey, Param> = {
  alkalinity_umol_kg: 'ta',
  dic_umol_kg: 'dic',
  ph: 'ph',
  pco2_uatm: 'co2',
  fco2_uatm: 'co2',
  co2_umol_kg: 'co2',
  hco3_umol_kg: 'hco3',
  co3_umol_kg: 'co3',
};

/** A measured value in the solver's internal units (mol/kg; pH on the internal scale). */
function toInternal(key: CarbonateKey, v: number, scale: PhScale, k: ConstantSet): number {
  switch (key) {
    case 'ph':
      // h on scale X = h_internal · scaleFactor[X].
      return v + Math.log10(k.scaleFactor[scale]);
    case 'pco2_uatm':
      return k.k0 * k.fugacityFactor * v * 1e-6;
    case 'fco2_uatm':
      return k.k0 * v * 1e-6;
    default:
      return v * 1e-6;
  }
}

/** The value of an input key computed from a state, in that key's units. */
function fromState(key: CarbonateKey, s: CarbonateState, scale: PhScale, k: ConstantSet): number {
  switch (key) {
    case 'alkalinity_umol_kg':
      return s.ta * 1e6;
    case 'dic_umol_kg':
      return s.dic * 1e6;
    case 'ph':
      return -Math.log10(s.h * k.scaleFactor[scale]);
    case 'pco2_uatm':
      return s.pco2 * 1e6;
    case 'fco2_uatm':
      return s.fco2 * 1e6;
    case 'co2_umol_kg':
      return s.co2 * 1e6;
    case 'hco3_umol_kg':
      return s.hco3 * 1e6;
    case 'co3_umol_kg':
      return s.co3 * 1e6;
  }
}

export function solveRequest(reqIn: SolveRequest, options: SolveOptions = {}): SolveOutput {
  const decision = decideModel(reqIn);
  const model = decision.model;
  const req: SolveRequest =
    model === 'saline' && reqIn.salinity === undefined ? { ...reqIn, salinity: decision.salinity } : reqIn;
  // In the fresh model `ph` is the activity pH unless a scale is named.
  const phScale: PhScale = model === 'fresh' && req.raw.ph_scale === undefined ? 'nbs' : req.phScale;
  const fresh = model === 'fresh' ? freshContext(req, decision.fresh) : undefined;

  const [a, b] = choosePair(req);
  const solveIn = (k: ConstantSet): CarbonateState[] => {
    const va = toInternal(a, req.measured[a]!, phScale, k);
    const vb = toInternal(b, req.measured[b]!, phScale, k);
    // Roots that are no water (negative DIC, absurd pCO2) are dropped; none left is a coded error.
    return possibleStates(
      solvePair(PARAM_OF[a], va, PARAM_OF[b], vb, k, req.minor),
      [a, b],
      [req.measured[a]!, req.measured[b]!],
    );
  };
  const sameConditions = req.outTemperatureC === req.temperatureC && req.outPressureDbar === req.pressureDbar;
  const warnings: Issue[] = [...req.warnings, ...decision.warnings, ...(fresh?.plan.warnings ?? [])];
  if (model === 'saline') {
    // The saline model takes its ion ratios from salinity: say which fresh-water keys it did not use.
    const unused = decision.fresh.freshKeys.filter((k) => !SALINE_USES.has(k));
    if (unused.length > 0) {
      warnings.push(
        warning(
          'fresh-keys-unused',
          `The saline model does not use ${unused.join(', ')} (its ions come from salinity); set model to fresh to use them.`,
        ),
      );
    }
  }

  // Each root carries its own constants: in the fresh model the ionic strength may depend on the
  // species, so two roots of one pair can sit at two ionic strengths.
  let kIns: ConstantSet[];
  let kOuts: ConstantSet[];
  let roots: CarbonateState[];
  let outStates: CarbonateState[];
  if (fresh === undefined) {
    const kIn = constantsFor(req, model, req.temperatureC, req.pressureDbar, options.shifts);
    roots = solveIn(kIn);
    if (req.root === 'low-ph') roots = [...roots].reverse();
    const kOut = sameConditions
      ? kIn
      : constantsFor(req, model, req.outTemperatureC, req.outPressureDbar, options.shifts);
    outStates = sameConditions
      ? roots
      : roots.map((s) => solvePair('ta', s.ta, 'dic', s.dic, kOut, req.minor)[0]!);
    kIns = roots.map(() => kIn);
    kOuts = roots.map(() => kOut);
  } else {
    const shift = (k: FreshConstantSet): FreshConstantSet =>
      options.shifts ? { ...k, ...applyShifts(k, options.shifts), model: 'fresh' } : k;
    const condIn = {
      temperatureC: req.temperatureC,
      salinity: req.salinity ?? 0,
      pressureDbar: req.pressureDbar,
    };
    const nearest = (states: CarbonateState[], h: number): CarbonateState =>
      states.reduce((best, x) => (Math.abs(Math.log(x.h / h)) < Math.abs(Math.log(best.h / h)) ? x : best));
    const first = solveAtIonicStrength(
      condIn,
      fresh,
      (k) => solveIn(shift(k)),
      (r) => r[0]!,
    );
    addUnique(warnings, first.warnings);
    let perRoot = first.result.map((s0, j) => {
      if (j === 0 || !freshIterates(fresh)) return { k: shift(first.k), s: s0 };
      // Follow this root through the ionic-strength iteration.
      let own: ReturnType<typeof solveAtIonicStrength<CarbonateState[]>>;
      try {
        own = solveAtIonicStrength(
          condIn,
          fresh,
          (k) => solveIn(shift(k)),
          (r) => nearest(r, s0.h),
        );
      } catch {
        // Two roots that nearly meet (DIC–HCO3- at its largest ratio) can lose each other while
        // the speciation settles: keep this one at the first root's constants, and say so.
        addUnique(warnings, [ROOT_AT_FIRST_CONSTANTS]);
        return { k: shift(first.k), s: s0 };
      }
      addUnique(warnings, own.warnings);
      return { k: shift(own.k), s: nearest(own.result, s0.h) };
    });
    if (req.root === 'low-ph') perRoot = [...perRoot].reverse();
    roots = perRoot.map((r) => r.s);
    kIns = perRoot.map((r) => r.k);
    if (sameConditions) {
      outStates = roots;
      kOuts = kIns;
    } else {
      // TA and DIC are conserved; I is re-iterated at output conditions when it depends on species.
      const condOut = {
        temperatureC: req.outTemperatureC,
        salinity: condIn.salinity,
        pressureDbar: req.outPressureDbar,
      };
      const outs = roots.map((s) =>
        solveAtIonicStrength(
          condOut,
          fresh,
          (k) => solvePair('ta', s.ta, 'dic', s.dic, shift(k), req.minor)[0]!,
          (x) => x,
        ),
      );
      for (const o of outs) addUnique(warnings, o.warnings);
      outStates = outs.map((o) => o.result);
      kOuts = outs.map((o) => shift(o.k));
    }
  }
  const kIn = kIns[0]!;
  const kOut = kOuts[0]!;

  addUnique(warnings, kIn.warnings);
  if (!sameConditions) addUnique(warnings, kOut.warnings);
  const high = highPco2Warning(roots[0]!);
  if (high) addUnique(warnings, [high]);
  if (roots.length > 1) {
    warnings.push(
      warning(
        'two-roots',
        `Two waters fit ${a} with ${b}; the ${req.root === 'low-ph' ? 'lower' : 'higher'}-pH one is reported and the other is under alternatives (choose with root: high-ph | low-ph).`,
      ),
    );
  }

  const outputs = outStates.map((out, j) => {
    const k = kOuts[j]!;
    const o = describe(out, k, req.minor, model, [a, b], warnings);
    o.model_reason = decision.reason;
    if (fresh !== undefined) addFreshOutputs(o, out, k as FreshConstantSet, fresh, warnings);
    addTradeOutputs(o, out, k, tradeContext(req), warnings);
    return o;
  });
  const primary: SolveOutput = outputs[0]!;

  const misfit: Partial<Record<CarbonateKey, number>> = {};
  let anyMisfit = false;
  for (const key of Object.keys(req.measured) as CarbonateKey[]) {
    if (key === a || key === b) continue;
    misfit[key] = req.measured[key]! - fromState(key, roots[0]!, phScale, kIn);
    anyMisfit = true;
  }
  if (anyMisfit) primary.misfit = misfit;
  if (outputs.length > 1) primary.alternatives = outputs.slice(1);
  if (!sameConditions) {
    primary.input_conditions = {
      temperature_c: req.temperatureC,
      pressure_dbar: req.pressureDbar,
      salinity: req.salinity ?? 0,
    };
  }
  return primary;
}

/** Ammonia, sulfide and gas exchange (src/chem/trades) at the output conditions. */
function tradeContext(req: SolveRequest): TradeContext {
  return { raw: req.raw, minor: req.minor, temperatureC: req.outTemperatureC, salinity: req.salinity ?? 0 };
}

const ROOT_AT_FIRST_CONSTANTS = warning(
  'second-root-approximate',
  'The second root could not be followed through the ion-pair iteration; it is reported at the constants of the first.',
);

/** Fresh-water keys the saline model uses as well (alkalinity in field units, calcium in mg/L). */
const SALINE_USES: ReadonlySet<string> = new Set([
  'alkalinity_mg_l_caco3',
  'alkalinity_meq_l',
  'alkalinity_dkh',
  'calcium_mg_l',
]);

/** Common practice for water analyses: a charge-balance error beyond ±5 % points to a missing ion or a bad value. */
const CHARGE_BALANCE_LIMIT_PERCENT = 5;

function addFreshOutputs(
  o: SolvedWater & Partial<FreshWaterOutputs>,
  s: CarbonateState,
  k: FreshConstantSet,
  ctx: FreshContext,
  warnings: Issue[],
): void {
  const found: Issue[] = [];
  assignFreshOutputs(o, freshOutputs(s, k, ctx, found));
  addUnique(warnings, found);
  if (ctx.calciumMolKg === undefined) {
    // Without calcium there is no saturation state: null, never a made-up zero.
    o.omega_calcite = null;
    o.omega_aragonite = null;
  }
  const cbe = o.charge_balance_error_percent;
  if (typeof cbe === 'number' && Math.abs(cbe) > CHARGE_BALANCE_LIMIT_PERCENT) {
    addUnique(warnings, [
      warning(
        'charge-balance',
        `The ions given balance to ${cbe.toFixed(1)} % (more than ±${CHARGE_BALANCE_LIMIT_PERCENT} %, common practice): an ion is missing or a value is off, so the ionic strength is uncertain.`,
      ),
    ]);
  }
}

function addUnique(into: Issue[], from: readonly Issue[]): void {
  for (const w of from) {
    if (!into.some((x) => x.code === w.code && x.message === w.message)) into.push(w);
  }
}

const p = (x: number): number => -Math.log10(x);

function bufferFactorsMmolKg(
  s: CarbonateState,
  k: ConstantSet,
  minor: MinorTotals,
): SolvedWater['buffer_factors_mmol_kg'] {
  const b = bufferFactors(s, k, minor);
  return {
    gamma_dic: b.gammaDic * 1e3,
    beta_dic: b.betaDic * 1e3,
    omega_dic: b.omegaDic * 1e3,
    gamma_ta: b.gammaTa * 1e3,
    beta_ta: b.betaTa * 1e3,
    omega_ta: b.omegaTa * 1e3,
  };
}

/** The output object for one state at output conditions. */
function describe(
  s: CarbonateState,
  k: ConstantSet,
  minor: MinorTotals,
  model: WaterModel,
  pair: [CarbonateKey, CarbonateKey],
  warnings: Issue[],
): SolvedWater {
  return {
    alkalinity_umol_kg: s.ta * 1e6,
    dic_umol_kg: s.dic * 1e6,
    ph_total: -Math.log10(s.h * k.scaleFactor.total),
    ph_free: -Math.log10(s.h * k.scaleFactor.free),
    ph_seawater: -Math.log10(s.h * k.scaleFactor.seawater),
    ph_nbs: -Math.log10(s.h * k.scaleFactor.nbs),
    pco2_uatm: s.pco2 * 1e6,
    fco2_uatm: s.fco2 * 1e6,
    co2_umol_kg: s.co2 * 1e6,
    hco3_umol_kg: s.hco3 * 1e6,
    co3_umol_kg: s.co3 * 1e6,
    omega_calcite: (k.calcium * s.co3) / k.kspCalcite,
    omega_aragonite: (k.calcium * s.co3) / k.kspAragonite,
    revelle_factor: revelleFactor(s, k, minor),
    buffer_factors_mmol_kg: bufferFactorsMmolKg(s, k, minor),
    constants: {
      pk0: p(k.k0),
      pk1: p(k.k1),
      pk2: p(k.k2),
      pkw: p(k.kw),
      pkb: p(k.kb),
      pks: p(k.ks),
      pkf: p(k.kf),
      pk1p: p(k.k1p),
      pk2p: p(k.k2p),
      pk3p: p(k.k3p),
      pksi: p(k.ksi),
      pknh4: p(k.knh4),
      pkh2s: p(k.kh2s),
      pksp_calcite: p(k.kspCalcite),
      pksp_aragonite: p(k.kspAragonite),
      fugacity_factor: k.fugacityFactor,
    },
    totals_umol_kg: {
      boron: k.totalBoron * 1e6,
      sulfate: k.totalSulfate * 1e6,
      fluoride: k.totalFluoride * 1e6,
      calcium: k.calcium * 1e6,
    },
    conditions: {
      temperature_c: k.conditions.temperatureC,
      salinity: k.conditions.salinity,
      pressure_dbar: k.conditions.pressureDbar,
    },
    model,
    formulations: k.formulations,
    warnings,
    pair,
  };
}
