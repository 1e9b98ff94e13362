/**
 * A site's trade and what it sets: the units a reading is entered in, which quantities a new
 * reading starts with, and what is everyday for that water (the plausibility check with a one-tap
 * unit fix, and the check against the site's own history). The kind of site gives the trade;
 * the user can choose another one for a site (`defaults.trade`).
 *
 * The everyday ranges are common practice for each trade, written from memory, not from a
 * standard: they only decide when the form asks "did you mean …?", never what is stored.
 */

import type { SiteDefaults, SiteKind } from '../store/schema';
import { type QuantityDef, quantityById, unitOf } from './table';

export type Trade = 'field' | 'aquarium' | 'aquaculture';

export const TRADES: readonly { id: Trade; label: string }[] = [
  { id: 'field', label: 'Field hydrology' },
  { id: 'aquarium', label: 'Aquarium' },
  { id: 'aquaculture', label: 'Aquaculture' },
];

const KIND_TRADE: Record<SiteKind, Trade> = {
  spring: 'field',
  stream: 'field',
  well: 'field',
  lake: 'field',
  other: 'field',
  reef: 'aquarium',
  tank: 'aquarium',
  pond: 'aquaculture',
  raceway: 'aquaculture',
  recirculating: 'aquaculture',
};

export function tradeOfKind(kind: SiteKind): Trade {
  return KIND_TRADE[kind];
}

/** What the defaults of a reading depend on: the trade, and whether the water is sea water. */
export interface Profile {
  trade: Trade;
  /** Reef (or another salt-water site): salinity, Ω aragonite; else fresh water. */
  saline: boolean;
  /** The water in words for messages: "spring", "reef tank", "pond". */
  word: string;
}

const KIND_WORD: Record<SiteKind, string> = {
  spring: 'spring',
  stream: 'stream',
  well: 'well',
  lake: 'lake',
  other: 'water',
  reef: 'reef tank',
  tank: 'freshwater tank',
  pond: 'pond',
  raceway: 'raceway',
  recirculating: 'recirculating system',
};

export function siteProfile(site: { kind: SiteKind; defaults: SiteDefaults } | undefined): Profile {
  if (!site) return { trade: 'field', saline: false, word: 'water' };
  const d = site.defaults;
  const saline =
    site.kind === 'reef' || d.model === 'saline' || (d.salinity !== undefined && d.salinity >= 2);
  return {
    trade: d.trade ?? tradeOfKind(site.kind),
    saline,
    word: saline && site.kind === 'tank' ? 'reef tank' : KIND_WORD[site.kind],
  };
}

/** The unit each quantity is entered in by default, per trade (the site's own choice wins). */
export function tradeUnits(p: Profile): Record<string, string> {
  switch (p.trade) {
    case 'field':
      return { temperature: 'c', alkalinity: 'meq_l', conductance: 'us_cm', calcium: 'mg_l' };
    case 'aquarium':
      return { temperature: 'c', alkalinity: 'dkh', salinity: 'sg', calcium: 'mg_l', ammonia: 'mg_l_n' };
    case 'aquaculture':
      return { temperature: 'c', alkalinity: 'mg_l_caco3', calcium: 'mg_l_caco3', ammonia: 'mg_l_n' };
  }
}

/** The quantities a new reading of this water starts with, in order. */
export function tradeQuantities(p: Profile): string[] {
  if (p.trade === 'aquarium' && p.saline)
    return ['temperature', 'ph', 'alkalinity', 'salinity', 'calcium', 'magnesium'];
  if (p.trade === 'aquaculture') return ['temperature', 'ph', 'alkalinity', 'calcium', 'ammonia'];
  const base = ['temperature', 'ph', 'alkalinity', p.saline ? 'salinity' : 'conductance'];
  // Calcium gives a hydrologist the saturation index (and the degassing sentence its SI).
  return p.trade === 'field' ? [...base, 'calcium'] : base;
}

/**
 * Approximate conversions into each quantity's reference unit, for plausibility only (density
 * taken as 1 kg/L). 1 dKH = 10 mg/L CaO = 0.3566 meq/L; 1 meq/L = 50.04 mg/L as CaCO₃ (from the
 * IUPAC 2021 atomic weights); Ca 40.078 g/mol; N 14.0067 g/mol.
 */
const APPROX: Record<string, Record<string, (x: number) => number>> = {
  alkalinity: {
    umol_kg: (x) => x / 1000,
    mmol_kg: (x) => x,
    meq_l: (x) => x,
    mg_l_caco3: (x) => x / 50.04,
    dkh: (x) => x * 0.3566,
  },
  calcium: {
    mg_l: (x) => x,
    umol_kg: (x) => (x * 40.078) / 1000,
    mmol_kg: (x) => x * 40.078,
    mg_l_caco3: (x) => (x * 40.078) / 100.087,
  },
  ammonia: { mg_l_n: (x) => x, umol_kg: (x) => (x * 14.0067) / 1000 },
};

/** The reference unit of each checked quantity (the range's unit). */
const REF_UNIT: Record<string, string> = {
  temperature: 'c',
  ph: 'ph',
  alkalinity: 'meq_l',
  salinity: 'pss',
  conductance: 'us_cm',
  calcium: 'mg_l',
  magnesium: 'mg_l',
  ammonia: 'mg_l_n',
};

type Ranges = Partial<Record<string, [number, number]>>;

/** Everyday ranges in the reference units (common practice per trade, from memory). */
function everyday(p: Profile): Ranges {
  if (p.trade === 'field')
    return {
      temperature: [0, 40],
      ph: [5, 9.5],
      alkalinity: [0.05, 15],
      conductance: [10, 5000],
      calcium: [1, 500],
      salinity: [0, 2],
    };
  if (p.trade === 'aquarium' && p.saline)
    return {
      temperature: [20, 31],
      ph: [7.5, 8.7],
      alkalinity: [1.4, 5.4],
      salinity: [25, 40],
      calcium: [300, 550],
      magnesium: [1000, 1600],
    };
  if (p.trade === 'aquarium')
    return {
      temperature: [16, 32],
      ph: [5.5, 8.8],
      alkalinity: [0.1, 5.4],
      conductance: [20, 1500],
      calcium: [2, 150],
    };
  return {
    temperature: [0, 36],
    ph: [5.5, 10],
    alkalinity: [0.1, 8],
    conductance: [20, 5000],
    calcium: [1, 400],
    ammonia: [0, 20],
  };
}

/** A value in the quantity's reference unit, or undefined when it has none. */
export function inReferenceUnit(q: QuantityDef, unitId: string, x: number): number | undefined {
  const approx = APPROX[q.id]?.[unitId];
  if (approx) return approx(x);
  const ref = REF_UNIT[q.id];
  const unit = unitOf(q, unitId);
  const refUnit = ref ? unitOf(q, ref) : undefined;
  if (!unit || !refUnit || unit.key !== refUnit.key) return undefined;
  // Reference units here are the key's own unit, so the key's value is the reference value.
  return unit.toKey(x);
}

export interface Implausible {
  code: 'input-unusual-for-site';
  /** The value is below or above the trade's everyday range. */
  side: 'low' | 'high';
  /** A unit of the same quantity in which the number typed is everyday: the one-tap fix. */
  fixUnit?: string;
  message: string;
}

/** A number for a message (the UI passes its locale formatter). */
export type Fmt = (x: number) => string;

/**
 * Is this value everyday for this water? When it is not, the message says so in the trade's words
 * and offers the unit in which the same number would be everyday ("did you mean meq/L?").
 */
export function checkPlausible(
  p: Profile,
  quantityId: string,
  unitId: string,
  x: number,
  fmt: Fmt,
): Implausible | undefined {
  const q = quantityById(quantityId);
  const range = everyday(p)[quantityId];
  if (!q || !range) return undefined;
  const ref = inReferenceUnit(q, unitId, x);
  if (ref === undefined || !Number.isFinite(ref)) return undefined;
  if (ref >= range[0] && ref <= range[1]) return undefined;
  const side = ref < range[0] ? 'low' : 'high';
  const unit = unitOf(q, unitId)!;
  // The trade's own unit first: it is the one the user most likely meant.
  const own = tradeUnits(p)[q.id];
  const candidates = [...q.units].sort((a, b) => Number(b.id === own) - Number(a.id === own));
  const fix = candidates.find((u) => {
    if (u.id === unitId || u.options) return false;
    const r = inReferenceUnit(q, u.id, x);
    return r !== undefined && r >= range[0] && r <= range[1];
  });
  const typed = q.id === 'ph' ? `pH ${fmt(x)}` : `${fmt(x)} ${unit.label}`;
  const refLabel = q.id === 'ph' ? '' : ` ${unitOf(q, REF_UNIT[q.id]!)!.label}`;
  const message = fix
    ? `${typed} is very ${side} for a ${p.word}: did you mean ${fix.label}?`
    : `${typed} is very ${side} for a ${p.word} (usually ${fmt(range[0])}–${fmt(range[1])}${refLabel}): please check the value (it is kept as typed).`;
  return { code: 'input-unusual-for-site', side, ...(fix ? { fixUnit: fix.id } : {}), message };
}

export interface HistoryNote {
  code: 'input-unlike-site-history';
  message: string;
}

/**
 * A value far outside what this site has read before: at least five earlier readings, and the
 * value beyond their range by more than half that range (or 0.3 pH, or 20 % of the median for
 * other quantities, whichever is wider). A rule of our own to catch a drifting meter or a unit
 * slip, not a statistical test.
 */
export function checkHistory(
  p: Profile,
  quantityId: string,
  unitId: string,
  x: number,
  history: readonly { unit: string; value: number }[],
  fmt: Fmt,
): HistoryNote | undefined {
  const q = quantityById(quantityId);
  if (!q) return undefined;
  // Compare in the reference unit when the quantity has one, else only readings in this unit.
  const hasRef = REF_UNIT[q.id] !== undefined && inReferenceUnit(q, unitId, x) !== undefined;
  const shownUnit = hasRef ? REF_UNIT[q.id]! : unitId;
  const conv = (unit: string, v: number) =>
    hasRef ? inReferenceUnit(q, unit, v) : unit === unitId ? v : undefined;
  const now = conv(unitId, x)!;
  const past = history
    .map((h) => conv(h.unit, h.value))
    .filter((v): v is number => typeof v === 'number' && Number.isFinite(v));
  if (past.length < 5) return undefined;
  const sorted = [...past].sort((a, b) => a - b);
  const lo = sorted[0]!;
  const hi = sorted[sorted.length - 1]!;
  const median = sorted[Math.floor(sorted.length / 2)]!;
  const tol = Math.max((hi - lo) / 2, q.id === 'ph' ? 0.3 : Math.abs(median) * 0.2);
  if (now >= lo - tol && now <= hi + tol) return undefined;
  const label = (unit: string) => (q.id === 'ph' ? '' : ` ${unitOf(q, unit)?.label ?? ''}`);
  const name = q.id === 'ph' ? 'pH' : q.label;
  return {
    code: 'input-unlike-site-history',
    message: `${name} ${fmt(x)}${label(unitId)}: this ${p.word} has read ${fmt(lo)}–${fmt(hi)}${label(shownUnit)} in ${past.length} readings; check the meter.`,
  };
}
