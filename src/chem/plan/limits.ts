/**
 * Every plan checks the waters it predicts against the limits it lists (`./cautions.ts`) for the
 * trade it was made for, and warns at the first step or part-dose that leaves one: a caution list
 * that the plan itself breaks in silence is no caution. Field waters (springs, streams, wells)
 * have no animal limits. pH is compared on the NBS scale a meter reads.
 */

import type { SolveOutput } from '../api';
import { type Issue, warning } from '../errors';
import { MOLAR_MASS_G_PER_MOL } from '../physical';

export type PlanTrade = 'field' | 'aquarium' | 'aquaculture';

interface Checked {
  /** Where in the plan the water is: "step 2", "step 1, part 3 of 14", "the result". */
  where: string;
  water: SolveOutput;
}

type Rec = Record<string, unknown>;
const n = (w: SolveOutput, k: string): number | undefined => {
  const v = (w as unknown as Rec)[k];
  return typeof v === 'number' && Number.isFinite(v) ? v : undefined;
};

const EPA = 'US EPA (1976) Quality Criteria for Water (memory)';
const REEF = 'reef-keeping practice (common practice)';

/** The limit warnings for a plan: one per limit, at the first water that leaves it. */
export function checkLimits(trade: PlanTrade | undefined, before: SolveOutput, waters: Checked[]): Issue[] {
  if (trade === 'field') return [];
  const saline = before.model === 'saline';
  const reef = saline && trade !== 'aquaculture';
  const out: Issue[] = [];
  const first = (test: (w: SolveOutput) => string | undefined) => {
    for (const c of waters) {
      const why = test(c.water);
      if (why) {
        out.push(warning('plan-leaves-limits', `${c.where[0]!.toUpperCase()}${c.where.slice(1)}: ${why}`));
        return;
      }
    }
  };
  const [phLo, phHi] = saline ? [6.5, 8.5] : [6.5, 9.0];
  const ph0 = n(before, 'ph_nbs');
  first((w) => {
    const ph = n(w, 'ph_nbs');
    if (ph === undefined) return undefined;
    // A water already outside the range is only flagged when the plan moves it further out.
    const worse = ph0 === undefined || (ph > phHi && ph > ph0 + 0.005) || (ph < phLo && ph < ph0 - 0.005);
    if ((ph > phHi || ph < phLo) && worse)
      return `pH ${ph.toFixed(2)} is outside the ${phLo}–${phHi} this plan lists for ${saline ? 'marine' : 'freshwater'} life (${EPA}).`;
    return undefined;
  });
  if (ph0 !== undefined)
    first((w) => {
      const ph = n(w, 'ph_nbs');
      return ph !== undefined && Math.abs(ph - ph0) > 0.3
        ? `pH moves by ${Math.abs(ph - ph0).toFixed(2)} from ${ph0.toFixed(2)}; where animals live, change pH by no more than about 0.2–0.3 a day (common practice): spread the dose over days.`
        : undefined;
    });
  if (!saline) {
    const alk0 = n(before, 'alkalinity_mg_l_caco3');
    first((w) => {
      const alk = n(w, 'alkalinity_mg_l_caco3');
      return alk !== undefined && alk < 20 && alk0 !== undefined && alk < alk0 - 0.05
        ? `alkalinity falls to ${alk.toFixed(1)} mg/L as CaCO₃, below the 20 this plan lists (${EPA}).`
        : undefined;
    });
    const co2mgL = (w: SolveOutput) => {
      const c = n(w, 'co2_umol_kg');
      return c === undefined ? undefined : (c / 1000) * MOLAR_MASS_G_PER_MOL.CO2;
    };
    const co20 = co2mgL(before);
    first((w) => {
      const c = co2mgL(w);
      return c !== undefined && c > 20 && co20 !== undefined && c > co20 + 0.05
        ? `free CO₂ rises to ${c.toFixed(0)} mg/L, above the 10–20 mg/L most farmed fish tolerate (common practice).`
        : undefined;
    });
  }
  if (reef) {
    const dkh = (w: SolveOutput) => {
      const ta = n(w, 'alkalinity_umol_kg');
      // 1 dKH = 0.3566 meq/L; per kg at reef density ≈ 1.023 kg/L (EOS-80 at S 35, 25 °C).
      return ta === undefined ? undefined : ta / 1000 / (0.35663 / 1.0234);
    };
    const d0 = dkh(before);
    first((w) => {
      const d = dkh(w);
      return d !== undefined && d0 !== undefined && d - d0 > 1
        ? `alkalinity rises by ${(d - d0).toFixed(1)} dKH; raise it by no more than about 1 dKH a day (${REEF}).`
        : undefined;
    });
    first((w) => {
      const d = dkh(w);
      return d !== undefined && d > 11 && (d0 === undefined || d > d0)
        ? `alkalinity ${d.toFixed(1)} dKH is above the 7–11 dKH this plan lists for reef tanks (${REEF}).`
        : undefined;
    });
  }
  return out;
}
