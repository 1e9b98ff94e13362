/**
 * Moved to `src/quantities` (one table for the form, results, importer, exporter and CLI). This
 * re-export keeps other branches' imports working; new code imports `src/quantities`.
 */

export type { QuantityDef, SolveContext, UnitDef } from '../quantities';
export { QUANTITIES, quantityById as quantity, quantityForKey, toSolveInput, unitOf } from '../quantities';
