/**
 * Mixing waters by volume or mass. TA, DIC, calcium and the minor acid totals are conservative:
 * the moles of each add up, and the mix has them per kg of its own basis. Salinity mixes by mass
 * of solution (practical salinity is conservative to within its definition for waters of one
 * composition; across compositions it is an approximation). The mixed water gets the model
 * `solve()` chooses for its salinity (or conductance), unless every water named the same model.
 *
 * Temperature: the mass-weighted mean unless the mix names one (equal heat capacities: within
 * about 4 % between fresh and sea water, an approximation). Pressure: that of the waters if they
 * agree, else 0 dbar unless given. Fresh-water keys (major ions in mg/L, TDS) mix by volume;
 * conductance and ionic strength by mass, an approximation because neither is strictly
 * conservative; a key is carried only when every water has it.
 */

import { fail, type Issue, warning } from '../errors';
import {
  inputWithTotals,
  kgPerLitre,
  type PlanWater,
  SR_PER_SP,
  salinityForDensity,
  solveOrFail,
  totalsOf,
} from './water';

export interface MixOptions {
  temperatureC?: number;
  pressureDbar?: number;
}

export interface MixResult {
  water: PlanWater;
  /** Share of each water in the mix by mass of solution. */
  mass_fractions: number[];
  warnings: Issue[];
}

const BY_VOLUME = [
  'calcium_mg_l',
  'magnesium_mg_l',
  'sodium_mg_l',
  'potassium_mg_l',
  'chloride_mg_l',
  'sulfate_mg_l',
  'tds_mg_l',
];
const BY_MASS = ['specific_conductance_us_cm', 'ionic_strength_mol_kg'];
const MINOR = ['phosphate_umol_kg', 'silicate_umol_kg', 'ammonia_umol_kg', 'sulfide_umol_kg'];

const num = (x: unknown): number | undefined => (typeof x === 'number' && Number.isFinite(x) ? x : undefined);

export function mixWaters(waters: readonly PlanWater[], opts: MixOptions = {}): MixResult {
  if (waters.length < 2) fail('mix-needs-two', 'A mix needs at least two waters.', 'mix');
  const warnings: Issue[] = [];
  const solKg = waters.map((w) => w.volumeL * kgPerLitre(w.input, w.solved).solution);
  const totalSol = solKg.reduce((a, b) => a + b, 0);
  const totalVol = waters.reduce((a, w) => a + w.volumeL, 0);
  const first = waters[0]!;

  const base: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(first.input)) base[k] = v;
  for (const k of [
    ...BY_VOLUME,
    ...BY_MASS,
    ...MINOR,
    'salinity',
    'calcium_umol_kg',
    'model',
    'id',
    'label',
    'notes',
  ])
    delete base[k];

  const tMix =
    opts.temperatureC ??
    waters.reduce((a, w, i) => a + w.solved.conditions.temperature_c * solKg[i]!, 0) / totalSol;
  base.temperature_c = tMix;
  const pressures = waters.map((w) => w.solved.conditions.pressure_dbar);
  const samePressure = pressures.every((p) => p === pressures[0]);
  base.pressure_dbar = opts.pressureDbar ?? (samePressure ? pressures[0] : 0);
  if (!samePressure && opts.pressureDbar === undefined) {
    warnings.push(
      warning(
        'mix-pressure',
        'The waters are at different pressures; the mix is taken at the surface (0 dbar).',
        'pressure_dbar',
      ),
    );
  }

  const models = waters.map((w) => w.input.model);
  if (models.every((m) => m === models[0]) && (models[0] === 'saline' || models[0] === 'fresh'))
    base.model = models[0];

  if (waters.some((w) => num(w.input.salinity) !== undefined)) {
    const salt = waters.reduce((a, w, i) => a + salinityForDensity(w.input) * SR_PER_SP * solKg[i]!, 0);
    base.salinity = salt / totalSol / SR_PER_SP;
    if (waters.some((w) => num(w.input.salinity) === undefined)) {
      warnings.push(
        warning(
          'mix-salinity-estimated',
          'Some waters have no salinity: theirs was taken from the specific conductance (PSS-78), or as 0.',
          'salinity',
        ),
      );
    }
  }
  for (const key of BY_VOLUME) {
    const vals = waters.map((w) => num(w.input[key]));
    if (vals.every((v) => v !== undefined))
      base[key] = vals.reduce((a, v, i) => a! + v! * waters[i]!.volumeL, 0)! / totalVol;
  }
  for (const key of BY_MASS) {
    const vals = waters.map((w) => num(w.input[key]));
    if (vals.every((v) => v !== undefined))
      base[key] = vals.reduce((a, v, i) => a! + v! * solKg[i]!, 0)! / totalSol;
  }

  // The model's basis (solution or water) decides the per-kg totals, so solve once to learn it.
  const amounts = waters.map((w) => ({ t: totalsOf(w), kg: w.basisKg }));
  const build = (basisKgs: number[]): Record<string, unknown> => {
    const totalBasis = basisKgs.reduce((a, b) => a + b, 0);
    const moles = (f: (i: number) => number) => waters.reduce((a, _w, i) => a + f(i), 0) / totalBasis;
    const ta = moles((i) => amounts[i]!.t.ta * amounts[i]!.kg);
    const dic = moles((i) => amounts[i]!.t.dic * amounts[i]!.kg);
    const input = inputWithTotals(
      base,
      {
        ...first.solved,
        conditions: { temperature_c: tMix, salinity: 0, pressure_dbar: base.pressure_dbar as number },
      },
      ta,
      dic,
    );
    for (const key of MINOR) {
      const total = moles((i) => (num(waters[i]!.input[key]) ?? 0) * amounts[i]!.kg);
      if (total > 0) input[key] = total;
    }
    if (amounts.every((a) => a.t.calcium !== undefined) && base.calcium_mg_l === undefined) {
      input.calcium_umol_kg = moles((i) => amounts[i]!.t.calcium! * amounts[i]!.kg) * 1e6;
    }
    return input;
  };
  const trial = build(amounts.map((a) => a.kg));
  const trialSolved = solveOrFail(trial, 'The mix');
  const perL = (i: number) => kgPerLitre(waters[i]!.input, waters[i]!.solved);
  // Moles per kg of the mix's basis: saline counts kg of solution, fresh kg of water.
  const basisKgs = waters.map((w, i) => {
    const p = perL(i);
    const water =
      w.solved.model === 'saline'
        ? p.solution * (1 - (salinityForDensity(w.input) * SR_PER_SP) / 1000)
        : p.basis;
    return w.volumeL * (trialSolved.model === 'saline' ? p.solution : water);
  });
  const input = build(basisKgs);
  const solved = solveOrFail(input, 'The mix');
  if (amounts.some((a) => a.t.calcium === undefined) && base.calcium_mg_l === undefined) {
    warnings.push(
      warning(
        'mix-calcium-unknown',
        'Not every water has a known calcium, so the mix has none and no Ω.',
        'calcium_umol_kg',
      ),
    );
  }
  if (new Set(waters.map((w) => w.solved.model)).size > 1) {
    warnings.push(
      warning(
        'mix-models-differ',
        `The waters were solved with different models; the mix is solved with the ${solved.model} model.`,
        'model',
      ),
    );
  }
  return {
    water: { input, solved, volumeL: totalVol, basisKg: basisKgs.reduce((a, b) => a + b, 0) },
    mass_fractions: solKg.map((m) => m / totalSol),
    warnings,
  };
}
