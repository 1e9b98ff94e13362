/**
 * The one place the app picks up the carbonate engine. Swapped to the real solver in one line once
 * `src/chem/solve.ts` exists on main.
 */

import type { SolveInput, SolveResult } from '../chem/api';

export function solve(_input: SolveInput): SolveResult {
  return {
    error: { code: 'engine-unavailable', message: 'The carbonate engine is not part of this build yet.' },
  };
}
