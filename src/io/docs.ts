/**
 * The document shapes that import, export, backup and sync read and write. They follow the store's
 * documents (`src/store`): every doc has our uuid as `id`, a `type`, `updatedAt`, a `deleted`
 * tombstone flag and the server revision `rev` once synced.
 */

export interface BaseDoc {
  id: string;
  type: string;
  /** ISO 8601 UTC instant of the last local change. */
  updatedAt: string;
  deleted: boolean;
  /** CouchDB revision of the version this device last saw on the server. */
  rev?: string;
  [key: string]: unknown;
}

export interface SiteDoc extends BaseDoc {
  type: 'site';
  name: string;
  /** IANA time zone of the site, used for local times in exports. */
  timeZone?: string;
  /** Solve inputs that hold for every reading of the site unless the reading gives them. */
  defaults?: Record<string, unknown>;
}

export interface ReadingDoc extends BaseDoc {
  type: 'reading';
  siteId: string;
  /** ISO 8601 UTC instant. */
  takenAt: string;
  /** IANA zone the reading was taken in. */
  timeZone: string;
  /** Measured values by engine input key, in that key's unit. */
  values: Record<string, number>;
  /** Options of the solve that are not measurements (e.g. `ph_scale`). */
  options?: Record<string, string>;
  notes?: string;
}

export function isReading(d: BaseDoc): d is ReadingDoc {
  return d.type === 'reading';
}
export function isSite(d: BaseDoc): d is SiteDoc {
  return d.type === 'site';
}
