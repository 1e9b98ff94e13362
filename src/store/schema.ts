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
export const SITE_KINDS = ['stream', 'spring', 'well', 'lake', 'pond', 'tank', 'other'] as const;
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
  carbonic_constants?: 'lueker2000' | 'millero2010';
  boron_total?: 'lee2010' | 'uppstrom1974';
  ph_scale?: 'total' | 'free' | 'seawater' | 'nbs';
  /** Preferred unit per quantity id (see `src/ui/quantities.ts`), e.g. `{ alkalinity: 'dkh' }`. */
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

export interface TufaDB extends DBSchema {
  sites: { key: string; value: SiteDoc; indexes: { byUpdatedAt: string } };
  readings: {
    key: string;
    value: ReadingDoc;
    indexes: { bySiteTime: [string, string]; byUpdatedAt: string };
  };
  settings: { key: string; value: KeyValue };
  outbox: { key: string; value: OutboxEntry };
  syncMeta: { key: string; value: KeyValue };
  conflicts: { key: string; value: ConflictRecord; indexes: { byDocId: string } };
  /** Added in schema version 2. */
  layouts: { key: string; value: CsvLayout; indexes: { byHeader: string } };
}

export type StoreName = 'sites' | 'readings' | 'settings' | 'outbox' | 'syncMeta' | 'conflicts' | 'layouts';
