/** The shape of a solver the importer and exporter are handed (the engine's `solve`, or a stub). */

import type { SolveInput, SolveResult } from '../chem/api';

export type Solver = (input: SolveInput) => SolveResult;
