/**
 * The one typed schema of Tufa's IndexedDB database (latest version). Opening, upgrading and
 * migrating it is the job of `./database.ts`; the UI and sync use `./repository.ts`, never raw stores.
 *
 * Documents (`SiteDoc`, `ReadingDoc`) are what syncs: each has a uuid `id`, an ISO `updatedAt`, a
 * `deleted` tombstone flag and the server revision `rev` once sync has seen it. Everything else
 * (settings, outbox, checkpoints, conflicts, CSV layouts) stays on this device.
 */

import type { DBSchema } from 'idb';

export const DB_NAME = 'tufa';

/** Our own list of kinds of water a site can be. */
export const SITE_KINDS = [
  'stream',
  'spring',
  'well',
  'lake',
  'pond',
  'tank',
  'other',
  'reef',
  'raceway',
  'recirculating',
] as const;
export type SiteKind = (typeof SITE_KINDS)[number];

export type DocType = 'site' | 'reading';

export interface DocBase {
  /** uuid (crypto.randomUUID). */
  id: string;
  type: DocType;
  /** ISO 8601 UTC instant of the last local or remote change. */
  updatedAt: string;
  /** Tombstone: deleted documents stay so that sync and undo can see the deletion. */
  deleted: boolean;
  /** Server revision, set only by sync. */
  rev?: string;
  /** Team servers: the user who created the doc and who changed it last (set when pushed). */
  created_by?: string;
  changed_by?: string;
}

export interface SiteLocation {
  /** WGS 84 decimal degrees. */
  latitude: number;
  longitude: number;
  /** Horizontal accuracy in metres when the device reported one. */
  accuracyM?: number;
  source: 'device' | 'typed';
}

/** Defaults a new reading of this site starts from; keys follow the solve input names. */
export interface SiteDefaults {
  model?: 'saline' | 'fresh' | 'auto';
  salinity?: number;
  specific_conductance_us_cm?: number;
  carbonic_constants?: 'auto' | 'lueker2000' | 'millero2010';
  boron_total?: 'lee2010' | 'uppstrom1974';
  ph_scale?: 'total' | 'free' | 'seawater' | 'nbs';
  /** The site's trade when the user chose one over the kind's (see `src/quantities/trades.ts`). */
  trade?: 'field' | 'aquarium' | 'aquaculture';
  /** Preferred unit per quantity id (see `src/quantities`), e.g. `{ alkalinity: 'dkh' }`. */
  units?: Record<string, string>;
}

export interface SiteDoc extends DocBase {
  type: 'site';
  name: string;
  kind: SiteKind;
  location?: SiteLocation;
  defaults: SiteDefaults;
  notes: string;
}

/** One measured quantity as entered: the quantity id, the number, and the unit it was entered in. */
export interface MeasuredValue {
  quantity: string;
  value: number;
  unit: string;
  /**
   * `titration`: a titration's result carried without its raw points (a re-imported CSV); the
   * reading's request uses it only where nothing was typed. Absent for typed values.
   */
  source?: 'titration';
}

/** Raw titration data, kept raw so it can be re-reduced by another method later. */
export interface TitrationRecord {
  sampleVolumeMl: number;
  titrantNormality: number;
  correctionFactor?: number;
  method?: string;
  endpointPh?: number;
  points: { volumeMl: number; ph: number }[];
}

export interface ReadingDoc extends DocBase {
  type: 'reading';
  siteId: string;
  /** ISO 8601 UTC instant the sample was taken. */
  takenAt: string;
  /** IANA zone the reading was entered in, to show local time later (e.g. `Europe/Vienna`). */
  timeZone: string;
  values: MeasuredValue[];
  titration?: TitrationRecord;
  notes: string;
  /** A saved treatment plan (planning capability); opaque to the store. */
  plan?: unknown;
}

export type TufaDoc = SiteDoc | ReadingDoc;

/** One pending push: at most one per document, replaced when the document changes again. */
export interface OutboxEntry {
  docId: string;
  type: DocType;
  /** The `updatedAt` of the change queued; ack removes the entry only if it still matches. */
  updatedAt: string;
}

/** A losing revision kept after sync resolved a conflict, so nothing a user typed is lost. */
export interface ConflictRecord {
  /** `${docId}@${rev}`. */
  id: string;
  docId: string;
  rev: string;
  doc: TufaDoc;
  keptAt: string;
}

/** A remembered CSV column mapping (from the CSV header to quantity/unit or document field). */
export interface CsvLayout {
  id: string;
  name: string;
  /** Normalised header line the layout was made for; used to offer it again. */
  headerSignature: string;
  /** CSV column name -> target (free-form string owned by the CSV importer). */
  columns: Record<string, string>;
  delimiter?: string;
  decimalComma?: boolean;
  updatedAt: string;
}

export interface KeyValue {
  key: string;
  value: unknown;
}

/**
 * Readings are stored in pages: one page per site and calendar month (UTC) of `takenAt`, so that
 * a logger's 100 000 readings are a few dozen records, not 100 000 (IndexedDB costs ~0.1 ms per
 * record in Chromium; see tests/bench/browser.ts). `ReadingPageMeta` is small (for counts and
 * ranges); `ReadingPageData` holds the documents, sorted by takenAt then id.
 */
export interface ReadingPageMeta {
  /** `${siteId}|${YYYY-MM}`. */
  id: string;
  siteId: string;
  /** `YYYY-MM` of takenAt (UTC). */
  month: string;
  /** Readings in the page, tombstones included, and those not deleted. */
  total: number;
  live: number;
}

export interface ReadingPageData {
  id: string;
  readings: ReadingDoc[];
}

/** Where each reading lives: readings are spread over 256 buckets by a hash of their id. */
export interface LocatorBucket {
  bucket: number;
  /** reading id -> page id. */
  pages: Record<string, string>;
}

/** Pending pushes, spread over 256 buckets by a hash of the document id (one entry per doc). */
export interface OutboxBucket {
  bucket: number;
  entries: Record<string, OutboxEntry>;
}

export interface TufaDB extends DBSchema {
  sites: { key: string; value: SiteDoc; indexes: { byUpdatedAt: string } };
  /** v3: reading pages (meta and data), where each reading is, and the outbox. */
  readingPages: { key: string; value: ReadingPageMeta; indexes: { bySiteMonth: [string, string] } };
  readingPageData: { key: string; value: ReadingPageData };
  readingLocator: { key: number; value: LocatorBucket };
  outboxBuckets: { key: number; value: OutboxBucket };
  settings: { key: string; value: KeyValue };
  syncMeta: { key: string; value: KeyValue };
  conflicts: { key: string; value: ConflictRecord; indexes: { byDocId: string } };
  /** Added in schema version 2. */
  layouts: { key: string; value: CsvLayout; indexes: { byHeader: string } };
  /** v1–v2 only (one record per reading / per pending doc); moved into pages and buckets by v3. */
  readings: {
    key: string;
    value: ReadingDoc;
    indexes: { bySiteTime: [string, string]; byUpdatedAt: string };
  };
  /** v1–v2 only; see `outboxBuckets`. */
  outbox: { key: string; value: OutboxEntry };
}

export type StoreName = keyof TufaDB & string;
