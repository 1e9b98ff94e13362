/**
 * The document shapes import, export, backup and sync handle are the store's own (`src/store/schema.ts`).
 * This module names them for `src/io` and `src/sync` so those folders depend on one place.
 */

export type { MeasuredValue, ReadingDoc, SiteDoc, TufaDoc } from '../store/schema';
