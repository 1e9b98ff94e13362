/**
 * Hydrogen sulfide (H2S, the toxic, volatile form) from total dissolved sulfide.
 *
 * H2S / (H2S + HS−) = h / (h + K1), S2− neglected (pK2 above 17; common practice). K1 and h on
 * one pH scale: the engine's own first sulfide constant of the model in use, fresh (Nordstrom et
 * al. 1990 thermodynamic constant made mixed by the fresh model's activity coefficients) or saline
 * (src/chem/saline/sulfide.ts, total scale).
 */

/** Molar masses, g/mol (IUPAC 2021: S 32.06, H 1.008). */
export const S_G_PER_MOL = 32.06;
export const H2S_G_PER_MOL = 34.076;

export interface HydrogenSulfide {
  /** H2S / total sulfide, 0–1. */
  fraction: number;
  /** H2S as sulfur, mg/L. */
  h2s_s_mg_l: number;
  /** H2S as the molecule, mg/L. */
  h2s_mg_l: number;
}

/**
 * @param totalSMgL total dissolved sulfide as S, mg/L
 * @param ph pH on the scale of `pk1`
 * @param pk1 −log10 K1 of H2S on that scale
 * Check: at pH = pK1 half the sulfide is H2S (definition).
 */
export function hydrogenSulfide(totalSMgL: number, ph: number, pk1: number): HydrogenSulfide {
  const fraction = 1 / (1 + 10 ** (ph - pk1));
  const s = totalSMgL * fraction;
  return { fraction, h2s_s_mg_l: s, h2s_mg_l: (s * H2S_G_PER_MOL) / S_G_PER_MOL };
}
