/**
 * Moved to `src/quantities` (one table for the form, results, importer, exporter and CLI). This
 * re-export keeps other branches' imports working; new code imports `src/quantities`.
 */

export type { QuantityDef, UnitDef } from '../quantities';
export { QUANTITIES, quantityById as quantity, quantityForKey, unitOf } from '../quantities';
