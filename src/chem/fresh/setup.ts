/**
 * From a checked solve request to what the fresh model needs: the fresh keys read, the ions in
 * mol/kg of water, calcium and magnesium, the ionic-strength plan, and the kilograms of water per
 * litre used wherever a mg/L or meq/L value meets a per-kg one.
 */

import { fail, warning } from '../errors';
import type { SolveRequest } from '../input';
import { MOLAR_MASS_G_PER_MOL } from '../physical';
import { salinityFromSpecificConductance } from '../seawater/conductance';
import { densityKgL } from '../units';
import { handoverWeight } from './handover';
import { majorIonsToMolKg, mgLToMolKgWater } from './ionic-strength';
import { chooseModel, type ModelDecision } from './model-choice';
import { type FreshRequest, parseFreshInput, planIonicStrength } from './request';
import type { FreshContext } from './solve-fresh';

/** Salinity the density and the model choice rest on: given, else from specific conductance. */
export function salinityEvidence(req: SolveRequest, fresh: FreshRequest): number | undefined {
  if (req.salinity !== undefined) return req.salinity;
  if (fresh.specificConductanceUsCm !== undefined)
    return salinityFromSpecificConductance(fresh.specificConductanceUsCm);
  return undefined;
}

/**
 * The model decision plus the salinity the saline model would use: given, else derived from the
 * specific conductance (PSS-78). A saline choice with neither is refused with `missing-salinity`.
 */
export function decideModel(
  req: SolveRequest,
): ModelDecision & { salinity: number | undefined; fresh: FreshRequest } {
  const fresh = parseFreshInput(req.raw);
  const fromSc =
    fresh.specificConductanceUsCm === undefined
      ? undefined
      : salinityFromSpecificConductance(fresh.specificConductanceUsCm);
  const d = chooseModel(req.model, {
    salinity: req.salinity,
    salinityFromConductance: fromSc,
    ionicStrength: fresh.ionicStrengthGiven,
    tdsMgL: fresh.tdsMgL,
    freshKeys: fresh.freshKeys,
  });
  const salinity = req.salinity ?? fromSc;
  if (d.model === 'saline' && salinity === undefined) {
    fail(
      'missing-salinity',
      'The saline model needs salinity (or specific_conductance_us_cm). For fresh water set model to fresh, ' +
        'or give specific conductance, TDS or major ions.',
      'salinity',
    );
  }
  if (d.model === 'saline' && req.salinity === undefined && fromSc !== undefined) {
    d.warnings.push(
      warning(
        'salinity-from-conductance',
        `Salinity ${fromSc.toFixed(3)} was derived from the specific conductance with PSS-78 (seawater composition assumed).`,
        'salinity',
      ),
    );
  }
  return { ...d, salinity, fresh };
}

/**
 * kg of water per litre of a fresh sample: the density of water of that salinity (EOS-80, S from
 * conductance when only that is known) less the dissolved solids when TDS is given.
 */
export function kgWaterPerLitre(req: SolveRequest, fresh: FreshRequest): number {
  const rho = densityKgL(salinityEvidence(req, fresh) ?? 0, req.temperatureC);
  return fresh.tdsMgL === undefined ? rho : rho - fresh.tdsMgL * 1e-6;
}

/** `fresh` may be passed when the request's fresh keys were already read (by {@link decideModel}). */
export function freshContext(
  req: SolveRequest,
  fresh: FreshRequest = parseFreshInput(req.raw),
): FreshContext {
  const kgw = kgWaterPerLitre(req, fresh);
  const ionsMolKg = majorIonsToMolKg(fresh.ions, kgw);
  // calcium_mg_l is taken per kg of water here (the request read it per kg of solution).
  const calcium = fresh.ions.calcium !== undefined ? ionsMolKg.ca : req.calciumMolKg;
  const magnesium =
    fresh.ions.magnesium === undefined
      ? undefined
      : mgLToMolKgWater(fresh.ions.magnesium, MOLAR_MASS_G_PER_MOL.Mg, kgw);
  const ta = req.measured.alkalinity_umol_kg;
  const ions = { ...ionsMolKg, ca: calcium ?? 0, mg: magnesium ?? 0 };
  const plan = planIonicStrength(fresh, req.salinity, ta === undefined ? undefined : ta * 1e-6, ions);
  // The automatic choice hands a water known only by its salinity over to the saline model
  // gradually (handover.ts); a water with its major ions, or a named model, is not blended.
  const s = salinityEvidence(req, fresh);
  const weight =
    req.model === 'auto' && plan.method !== 'major-ions' && s !== undefined ? handoverWeight(s) : 0;
  const handover =
    weight > 0 && s !== undefined
      ? { salinity: s, weight, saline: { carbonic: req.carbonic, boron: req.boron, fluoride: req.fluoride } }
      : undefined;
  return {
    fresh,
    plan,
    ionsMolKg: ions,
    calciumMolKg: calcium,
    magnesiumMolKg: magnesium,
    kgWaterPerL: kgw,
    minor: req.minor,
    handover,
  };
}
