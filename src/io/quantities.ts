/**
 * Moved to `src/quantities` (one table for the form, results, importer, exporter and CLI). This
 * re-export keeps other branches' imports working; new code imports `src/quantities`.
 */

export type { QuantityDef, UnitDef as UnitChoice } from '../quantities';
export { KEY_ORDER, QUANTITIES, quantityById, storedForm, unitOf } from '../quantities';
