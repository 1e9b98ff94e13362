/**
 * Choosing the water model for a request and evaluating its constant set. One entry point, so
 * the solver, the uncertainty propagation and the planners all get constants the same way.
 */

import { decideModel, freshContext } from './fresh/setup';
import { freshConstantsAt } from './fresh/solve-fresh';
import type { SolveRequest } from './input';
import { salineConstants } from './saline/constants';
import type { ConstantSet, WaterModel } from './types';

/** Shifts applied to constants for sensitivity and uncertainty work: p-value offsets and a boron factor. */
export interface ConstantShifts {
  pk0?: number;
  pk1?: number;
  pk2?: number;
  pkb?: number;
  pkw?: number;
  pkspCalcite?: number;
  pkspAragonite?: number;
  /** Multiplies the total boron (1 = unchanged). */
  totalBoronFactor?: number;
}

/**
 * The model for a request: `saline` and `fresh` are obeyed; `auto` decides from salinity or what
 * stands for it (see `fresh/model-choice.ts` for the rule and why). Use {@link decideModel} for
 * the reason and the brackish-water warning.
 */
export function resolveModel(req: SolveRequest): WaterModel {
  return decideModel(req).model;
}

/** The constant set at the given temperature and pressure, with shifts applied when asked. */
export function constantsFor(
  req: SolveRequest,
  model: WaterModel,
  temperatureC: number,
  pressureDbar: number,
  shifts?: ConstantShifts,
): ConstantSet {
  const cond = { temperatureC, salinity: req.salinity ?? 0, pressureDbar };
  const base = { carbonic: req.carbonic, boron: req.boron, fluoride: req.fluoride };
  const opts = req.calciumMolKg === undefined ? base : { ...base, calcium_mol_kg: req.calciumMolKg };
  // The fresh model at its first ionic-strength estimate; `solve()` iterates I where it depends on
  // the solved species (major ions), so callers wanting that exact value should go through solve().
  const k =
    model === 'saline'
      ? salineConstants(cond, opts)
      : (() => {
          const ctx = freshContext(req);
          return freshConstantsAt(cond, ctx.plan.initial, ctx);
        })();
  return shifts ? applyShifts(k, shifts) : k;
}

export function applyShifts(k: ConstantSet, s: ConstantShifts): ConstantSet {
  const p = (v: number, d: number | undefined) => (d ? v * 10 ** -d : v);
  return {
    ...k,
    k0: p(k.k0, s.pk0),
    k1: p(k.k1, s.pk1),
    k2: p(k.k2, s.pk2),
    kb: p(k.kb, s.pkb),
    kw: p(k.kw, s.pkw),
    kspCalcite: p(k.kspCalcite, s.pkspCalcite),
    kspAragonite: p(k.kspAragonite, s.pkspAragonite),
    totalBoron: k.totalBoron * (s.totalBoronFactor ?? 1),
  };
}
