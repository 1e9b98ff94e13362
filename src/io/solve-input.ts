/**
 * Builds the engine input of a stored reading: the site's defaults first (salinity, model,
 * constants), then the reading's own options and measured values, which win.
 */

import type { SolveInput, SolveResult } from '../chem/api';
import type { ReadingDoc, SiteDoc } from './docs';

export type Solver = (input: SolveInput) => SolveResult;

export function solveInputOf(reading: ReadingDoc, site: SiteDoc | undefined): SolveInput {
  return { ...(site?.defaults ?? {}), ...(reading.options ?? {}), ...reading.values };
}
