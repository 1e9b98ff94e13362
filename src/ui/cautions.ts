/**
 * Plain-language cautions shown beside results a person might act on by dosing chemicals or
 * handling acids. They are general common-practice advice, not a procedure.
 */

import type { Profile } from '../quantities';

export const RESULT_CAUTION =
  'These are model estimates with stated validity ranges, not a dosing instruction. Before adding ' +
  'buffer, lime, acid or CO₂ to a tank or pond: change things slowly and in small steps, re-measure ' +
  'between steps, stay within published limits for your species, and follow the product label, ' +
  'local codes and licensed practice.';

export const ACID_CAUTION =
  'Titration acids burn skin and eyes: wear eye protection and gloves, add acid to water (never the ' +
  'reverse) and follow the reagent’s safety data sheet and your workplace rules.';

/** The caution under a result: about dosing where someone keeps animals, about models elsewhere. */
export function resultCaution(profile: Profile | undefined): string {
  if (profile?.trade === 'field')
    return 'These are model estimates with stated validity ranges. Before treating this water for any use, follow local codes and licensed practice.';
  return RESULT_CAUTION;
}

/** Extra cautions when a result suggests the water is far from what the animals in it tolerate. */
export function resultAlerts(r: Record<string, unknown>, profile?: Profile): string[] {
  const out: string[] = [];
  // No animals at a spring or a well: its high pCO₂ is the headline, not an alarm.
  if (profile?.trade === 'field') return out;
  const pco2 = r.pco2_uatm;
  if (typeof pco2 === 'number' && pco2 > 10000) {
    out.push(
      'pCO₂ is very high: fish held at this level are stressed. Aerate gradually and re-measure rather than chasing pH with chemicals.',
    );
  }
  const om = r.omega_aragonite;
  // A reef keeper's concern; in fresh water undersaturation is common and harmless to note.
  if (r.model === 'saline' && typeof om === 'number' && om < 1) {
    out.push('Ω aragonite is below 1: aragonite tends to dissolve. Raise alkalinity only slowly if at all.');
  }
  return out;
}
