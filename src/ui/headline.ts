/**
 * The answer first: for each trade a few numbers computed from one `solve()` result, in the units
 * that trade writes them, and for field water one sentence on what the water will do in air.
 * Every number here is the engine's output converted with the engine's own unit functions and
 * density; nothing is estimated on the side.
 */

import type { SolveInput } from '../chem/api';
import { MOLAR_MASS_G_PER_MOL as M } from '../chem/physical';
import { specificGravityFromSalinity } from '../chem/seawater/specific-gravity';
import { alkalinityFromEqKg, densityKgL } from '../chem/units';
import type { Profile } from '../quantities';
import type { MeasuredValue } from '../store/schema';

export interface HeadRow {
  id: string;
  label: string;
  value: number;
  unit: string;
  /** Significant digits, or fixed decimals when set. */
  digits?: number;
  decimals?: number;
  /** Show a + on positive values (saturation indices). */
  signed?: boolean;
}

type Rec = Record<string, unknown>;
const num = (r: Rec, k: string): number | undefined =>
  typeof r[k] === 'number' && Number.isFinite(r[k]) ? (r[k] as number) : undefined;

function conditions(r: Rec): { t: number; s: number } {
  const c = (r.conditions ?? {}) as Rec;
  return { t: num(c, 'temperature_c') ?? 25, s: num(c, 'salinity') ?? 0 };
}

/**
 * kg/L of the water: the density the engine itself used for its per-litre alkalinity (mmol/L over
 * mmol/kg) when it reports both, else EOS-80 at the water's temperature and salinity.
 */
export function waterDensity(r: Rec): number {
  const perL = num(r, 'alkalinity_mmol_l');
  const perKg = num(r, 'alkalinity_mmol_kg');
  if (perL !== undefined && perKg !== undefined && perKg > 0) return perL / perKg;
  const { t, s } = conditions(r);
  return densityKgL(s, t);
}

/** µmol/kg → mg/L of a species of molar mass m (g/mol). */
const mgL = (umolKg: number, rho: number, m: number) => (umolKg / 1e6) * rho * m * 1000;

function measured(values: readonly MeasuredValue[] | undefined, q: string, unit: string): number | undefined {
  return values?.find((v) => v.quantity === q && v.unit === unit)?.value;
}

/** The alkalinity in the unit the trade writes it (the one the user typed, when it is a field unit). */
function alkalinityRow(r: Rec, rho: number, unit: 'meq_l' | 'mg_l_caco3' | 'dkh'): HeadRow | undefined {
  const ta = num(r, 'alkalinity_umol_kg');
  if (ta === undefined) return undefined;
  const label = { meq_l: 'meq/L', mg_l_caco3: 'mg/L as CaCO₃', dkh: 'dKH' }[unit];
  // The engine's own figure in that unit when it gives one (fresh water), else converted alike.
  return {
    id: `alkalinity-${unit}`,
    label: 'Alkalinity',
    value: num(r, `alkalinity_${unit}`) ?? alkalinityFromEqKg(ta / 1e6, unit, rho),
    unit: label,
    digits: 3,
  };
}

/** The headline numbers of a result for this water, in display order. */
export function headlineRows(
  p: Profile,
  r: Rec,
  values?: readonly MeasuredValue[],
  alkalinityUnit?: string,
): HeadRow[] {
  const rho = waterDensity(r);
  const out: (HeadRow | undefined)[] = [];
  const pco2 = num(r, 'pco2_uatm');
  const dic = num(r, 'dic_umol_kg');
  const co2 = num(r, 'co2_umol_kg');
  const totals = (r.totals_umol_kg ?? {}) as Rec;
  const ca = num(totals, 'calcium');
  const alkUnit = (['meq_l', 'mg_l_caco3', 'dkh'] as const).find((u) => u === alkalinityUnit);
  if (p.trade === 'field') {
    if (pco2 !== undefined) {
      out.push({ id: 'pco2', label: 'pCO₂', value: pco2, unit: 'µatm', digits: 3 });
      out.push({
        id: 'log-pco2',
        label: 'log pCO₂',
        value: Math.log10(pco2 / 1e6),
        unit: 'atm',
        decimals: 2,
      });
    }
    const ex = num(r, 'pco2_excess_ratio');
    if (ex !== undefined)
      out.push({ id: 'co2-excess', label: 'CO₂ over air', value: ex, unit: '×', digits: 3 });
    const si = num(r, 'saturation_index_calcite');
    if (si !== undefined)
      out.push({ id: 'si-calcite', label: 'SI calcite', value: si, unit: '', decimals: 2, signed: true });
    const sid = num(r, 'saturation_index_dolomite');
    if (sid !== undefined)
      out.push({ id: 'si-dolomite', label: 'SI dolomite', value: sid, unit: '', decimals: 2, signed: true });
    if (dic !== undefined) {
      const mmolL = (dic / 1000) * rho;
      out.push({ id: 'dic-mmol-l', label: 'DIC', value: mmolL, unit: 'mmol/L', digits: 3 });
      out.push({ id: 'dic-mg-c-l', label: 'DIC', value: mmolL * 12.011, unit: 'mg C/L', digits: 3 });
    }
    out.push(alkalinityRow(r, rho, alkUnit === 'mg_l_caco3' ? 'mg_l_caco3' : 'meq_l'));
  } else if (p.trade === 'aquarium') {
    out.push(alkalinityRow(r, rho, alkUnit === 'meq_l' ? 'meq_l' : 'dkh'));
    if (ca !== undefined && ca > 0)
      out.push({ id: 'calcium', label: 'Calcium', value: mgL(ca, rho, M.Ca), unit: 'mg/L', digits: 3 });
    const mg = measured(values, 'magnesium', 'mg_l');
    if (mg !== undefined)
      out.push({ id: 'magnesium', label: 'Magnesium', value: mg, unit: 'mg/L', digits: 4 });
    const phMeter = num(r, 'ph_nbs');
    if (phMeter !== undefined)
      out.push({ id: 'ph-meter', label: 'pH (meter, NBS scale)', value: phMeter, unit: '', decimals: 2 });
    if (p.saline) {
      const om = num(r, 'omega_aragonite');
      if (om !== undefined)
        out.push({ id: 'omega-aragonite', label: 'Ω aragonite', value: om, unit: '', decimals: 2 });
    } else if (co2 !== undefined) {
      out.push({ id: 'co2-mg-l', label: 'CO₂', value: mgL(co2, rho, M.CO2), unit: 'mg/L', digits: 2 });
    }
    const { s } = conditions(r);
    if (p.saline && s > 0) {
      out.push({ id: 'salinity', label: 'Salinity', value: s, unit: 'PSS-78', decimals: 1 });
      out.push({
        id: 'specific-gravity',
        label: 'Specific gravity (25/25 °C)',
        value: specificGravityFromSalinity(s, 25, 25),
        unit: '',
        decimals: 4,
      });
    }
  } else {
    out.push(alkalinityRow(r, rho, 'mg_l_caco3'));
    const hardness = hardnessMgLCaCO3(ca, rho, values);
    if (hardness !== undefined)
      out.push({ id: 'hardness', label: 'Hardness', value: hardness, unit: 'mg/L as CaCO₃', digits: 3 });
    if (co2 !== undefined)
      out.push({ id: 'co2-mg-l', label: 'Free CO₂', value: mgL(co2, rho, M.CO2), unit: 'mg/L', digits: 2 });
    // Unionized ammonia only when the engine reports it (never estimated here).
    const nh3 = num(r, 'unionized_ammonia_n_mg_l');
    if (nh3 !== undefined)
      out.push({ id: 'nh3', label: 'Unionized ammonia', value: nh3, unit: 'mg/L as N', digits: 2 });
  }
  return out.filter((x): x is HeadRow => x !== undefined);
}

/**
 * Total hardness as mg/L CaCO₃ from the calcium the engine used and the measured magnesium
 * (Ca and Mg each as mg/L CaCO₃ by molar mass ratio); calcium alone when no magnesium was given.
 */
export function hardnessMgLCaCO3(
  caUmolKg: number | undefined,
  rho: number,
  values?: readonly MeasuredValue[],
): number | undefined {
  if (caUmolKg === undefined || caUmolKg <= 0) return undefined;
  const caMgL = mgL(caUmolKg, rho, M.Ca);
  const mg = measured(values, 'magnesium', 'mg_l') ?? 0;
  return (caMgL * M.CaCO3) / M.Ca + (mg * M.CaCO3) / M.Mg;
}

/** Input keys of the carbonate system itself (any unit): replaced by the pair of the air state. */
const CARBONATE_INPUT = /^(alkalinity_|dic_|ph$|pco2_|fco2_|co2_|hco3_|co3_)/;

/**
 * The same water at equilibrium with air: the reading's own request (the one request function,
 * `src/reading/request.ts`, so model choice, ions, conductance and constants are the same), with
 * its carbonate measurements replaced by its alkalinity and the air's pCO2, at the result's
 * temperature. Undefined when the result has no alkalinity.
 */
export function airEquilibriumInput(
  request: SolveInput,
  r: Rec,
  airPco2Uatm: number,
): SolveInput | undefined {
  const ta = num(r, 'alkalinity_umol_kg');
  if (ta === undefined) return undefined;
  const input: SolveInput = {};
  for (const [k, v] of Object.entries(request))
    if (!CARBONATE_INPUT.test(k) && k !== 'uncertainty' && k !== 'output_temperature_c') input[k] = v;
  input.temperature_c = conditions(r).t;
  input.alkalinity_umol_kg = ta;
  input.pco2_uatm = airPco2Uatm;
  return input;
}

/**
 * What the water will do in air, in one sentence, from the air-equilibrium solve. The thresholds
 * of ±0.3 SI for "close to saturation" are common practice for field waters (rule of thumb).
 */
export function degassingSentence(
  r: Rec,
  air: Rec | undefined,
  fmt: (x: number, decimals: number) => string,
): string | undefined {
  const ex = num(r, 'pco2_excess_ratio');
  if (!air || ex === undefined) return undefined;
  const ph = num(air, 'ph_nbs') ?? num(air, 'ph');
  const si = num(air, 'saturation_index_calcite');
  if (ph === undefined) return undefined;
  const verb = ex > 1 ? 'losing CO₂ to air' : 'taking up CO₂ from air';
  const siText = si === undefined ? '' : ` and SI calcite ${si > 0 ? '+' : ''}${fmt(si, 1)}`;
  let then = '';
  if (si !== undefined) {
    if (si > 0.3) then = ': expect calcite to precipitate downstream';
    else if (si >= -0.3) then = ': close to calcite saturation, little precipitation expected';
    else then = ': still undersaturated, it would dissolve calcite rather than deposit it';
  }
  return `${verb[0]!.toUpperCase()}${verb.slice(1)}, this water would reach pH ${fmt(ph, 1)}${siText}${then}.`;
}

/** The local calendar date of an instant in a zone ("2026-12-02"); the device's zone if unknown. */
function localDate(iso: string, timeZone: string | undefined): string {
  const d = new Date(iso);
  try {
    return new Intl.DateTimeFormat('en-CA', {
      timeZone,
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
    }).format(d);
  } catch {
    return new Intl.DateTimeFormat('en-CA', { year: 'numeric', month: '2-digit', day: '2-digit' }).format(d);
  }
}

/**
 * The day's pH swing at a pond: the lowest and highest pH read on the reading's local day, when
 * at least two readings of that day have a pH (dawn and afternoon, as pond managers measure).
 */
export function dayPhSwing(
  reading: { id: string; takenAt: string; timeZone: string },
  sameSite: readonly { id: string; takenAt: string; deleted?: boolean; values: readonly MeasuredValue[] }[],
): { lo: number; hi: number; n: number } | undefined {
  const day = localDate(reading.takenAt, reading.timeZone);
  const phs = sameSite
    .filter((r) => !r.deleted && localDate(r.takenAt, reading.timeZone) === day)
    .map((r) => r.values.find((v) => v.quantity === 'ph')?.value)
    .filter((v): v is number => typeof v === 'number' && Number.isFinite(v));
  if (phs.length < 2) return undefined;
  return { lo: Math.min(...phs), hi: Math.max(...phs), n: phs.length };
}
