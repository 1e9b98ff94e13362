/**
 * The cautions that go with every plan: the hazards of each chemical, how to add it, and limits
 * for fish and corals. Each limit says where it comes from: `sourced` names a publication (from
 * memory where marked), `common-practice` is advice of the trade with no single source. Nothing
 * here replaces a product label, local codes or licensed practice, and every plan says so.
 */

import type { Chemical } from './chemicals';
import type { PlanTrade } from './limits';

export interface Limit {
  what: string;
  /** sourced: from a named publication; common-practice: advice of the trade. */
  basis: 'sourced' | 'common-practice';
  source: string;
}

export interface Cautions {
  general: string[];
  chemicals: { chemical: string; hazards: string }[];
  limits: Limit[];
  defer: string;
}

export const GENERAL_CAUTIONS: readonly string[] = [
  'These results are estimates from a chemical model with stated validity ranges, not a guarantee: the real water can respond differently.',
  'Dissolve solids in a bucket of the same water first and add the solution slowly where the water mixes well, never onto animals.',
  'Dose in steps: add part of the dose, wait for it to mix, re-measure pH and alkalinity, and only then add the next part.',
  'Wear eye protection and gloves; keep chemicals away from children and out of food containers; know where the nearest water tap is for rinsing eyes and skin.',
  'Never add water to concentrated acid or to caustic soda: add the acid or the solid slowly to water.',
];

export const LIMITS: readonly Limit[] = [
  {
    what: 'pH 6.5 to 9.0 for freshwater aquatic life; 6.5 to 8.5 for marine life',
    basis: 'sourced',
    source: 'US EPA (1976) Quality Criteria for Water ("Red Book"), pH criteria (memory)',
  },
  {
    what: 'Alkalinity at least 20 mg/L as CaCO3 for freshwater aquatic life, except where the water is naturally lower',
    basis: 'sourced',
    source: 'US EPA (1976) Quality Criteria for Water ("Red Book"), alkalinity criterion (memory)',
  },
  {
    what: 'Free CO2 below about 10 to 20 mg/L for most farmed fish; stress rises above it, most of all at low oxygen',
    basis: 'common-practice',
    source: 'aquaculture extension advice, no single source',
  },
  {
    what: 'Change pH by no more than about 0.2 to 0.3 units a day where animals live',
    basis: 'common-practice',
    source: 'aquarium and hatchery practice, no single source',
  },
  {
    what: 'Reef tanks: alkalinity about 7 to 11 dKH (2.5 to 3.9 meq/L), calcium about 380 to 450 mg/L, pH about 7.9 to 8.4; raise alkalinity by no more than about 1 dKH a day',
    basis: 'common-practice',
    source: 'reef-keeping practice, no single source',
  },
  {
    what: 'Coral reefs are found where the aragonite saturation Ω is about 3 or more',
    basis: 'sourced',
    source: 'Kleypas et al. (1999) Science 284, 118–120 (memory)',
  },
];

export const DEFER =
  'Follow the product label and safety data sheet of each chemical, local codes and rules for discharges, and the advice of a licensed or qualified professional (veterinarian, water treatment operator) where one is required. Species limits differ: check those for your animals.';

/** Chemicals that come as a solid (the rest are acids in solution or CO₂ gas). */
const NOT_SOLID = new Set(['hydrochloric_acid', 'sulfuric_acid', 'carbon_dioxide']);

/**
 * The limits that fit the water: none where no animals live (field hydrology), reef and marine
 * ones for a salt-water aquarium, freshwater ones for fresh tanks and ponds; all when the trade
 * is not given.
 */
function limitsFor(trade: PlanTrade | undefined, saline: boolean | undefined): Limit[] {
  if (trade === 'field') return [];
  if (trade === undefined) return [...LIMITS];
  const [fresh, marineOnly] = [LIMITS.slice(0, 4), LIMITS.slice(4)];
  if (saline) return [LIMITS[0]!, LIMITS[3]!, ...marineOnly];
  return trade === 'aquarium' ? [LIMITS[0]!, LIMITS[3]!] : fresh;
}

export function cautionsFor(
  chems: readonly Chemical[],
  context: { trade?: PlanTrade; saline?: boolean } = {},
): Cautions {
  const seen = new Set<string>();
  const chemicals: Cautions['chemicals'] = [];
  for (const c of chems) {
    if (seen.has(c.id)) continue;
    seen.add(c.id);
    chemicals.push({ chemical: c.name, hazards: c.hazards });
  }
  // Aeration or mixing alone handles no chemical: no advice about buckets, gloves or acids.
  const general =
    chems.length === 0
      ? [GENERAL_CAUTIONS[0]!]
      : GENERAL_CAUTIONS.filter(
          (_g, i) =>
            (i !== 1 || chems.some((c) => !NOT_SOLID.has(c.id))) &&
            (i !== 4 ||
              chems.some((c) => ['hydrochloric_acid', 'sulfuric_acid', 'sodium_hydroxide'].includes(c.id))),
        );
  return {
    general,
    chemicals,
    limits: limitsFor(context.trade, context.saline),
    defer: context.trade === 'field' ? DEFER_FIELD : DEFER,
  };
}

export const DEFER_FIELD =
  'Follow local codes and rules for the water and any discharge, and the advice of a qualified professional where one is required.';
