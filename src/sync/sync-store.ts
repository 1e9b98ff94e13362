/**
 * What the sync engine needs from the local database. The IndexedDB repository (`src/store`)
 * implements it through an adapter; `MemorySyncStore` implements it for tests and benchmarks.
 * The outbox (one entry per changed doc, written with the change) is the source of truth for
 * what still has to reach the server.
 */

import type { BaseDoc } from '../io/docs';

/** A doc waiting to be pushed, as it was when queued. */
export interface OutboxEntry {
  docId: string;
  /** `updatedAt` of the doc version that was queued. */
  updatedAt: string;
}

/** Both sides of a disagreement, kept until the user picks or merges. */
export interface ConflictRecord {
  docId: string;
  /** `edit`: this device changed a doc the server also changed. `server`: the server holds two branches. */
  kind: 'edit' | 'server';
  local: BaseDoc;
  /** The server's current winning version, `rev` set. */
  remote: BaseDoc;
  /** Losing server revisions to remove once resolved (`server` kind). */
  losingRevs: string[];
  detectedAt: string;
}

export interface SyncStore {
  /** Every queued entry, oldest first. */
  outbox(): Promise<OutboxEntry[]>;
  outboxCount(): Promise<number>;
  getDocs(ids: readonly string[]): Promise<Map<string, BaseDoc>>;
  /**
   * After the server accepted a push: set `rev` on the doc and drop its outbox entry, but only
   * where the doc still has the pushed `updatedAt` (a later local edit stays queued, with the new rev).
   */
  markPushed(rows: { docId: string; rev: string; updatedAt: string }[]): Promise<void>;
  /** Writes docs that came from the server; they are not queued again. */
  applyRemote(docs: BaseDoc[]): Promise<void>;
  /** A local change (e.g. a conflict resolved by the user): stored and queued. */
  putLocal(doc: BaseDoc): Promise<void>;
  dropOutbox(docIds: readonly string[]): Promise<void>;
  getMeta<T>(key: string): Promise<T | undefined>;
  setMeta(key: string, value: unknown): Promise<void>;
  conflicts(): Promise<ConflictRecord[]>;
  putConflict(c: ConflictRecord): Promise<void>;
  deleteConflict(docId: string): Promise<void>;
}
