/**
 * What the sync engine needs from the local database. The IndexedDB repository (`src/store`)
 * implements it through an adapter; `MemorySyncStore` implements it for tests and benchmarks.
 * The outbox (one entry per changed doc, written with the change) is the source of truth for
 * what still has to reach the server.
 */

import type { TufaDoc } from '../io/docs';

/** A doc waiting to be pushed, as it was when queued. */
export interface OutboxEntry {
  docId: string;
  /** `updatedAt` of the doc version that was queued. */
  updatedAt: string;
}

/** A version of a doc other than the one this device shows, with its server revision. */
export interface OtherVersion {
  rev: string;
  doc: TufaDoc;
}

/**
 * Every version of a doc in disagreement, kept until the user picks or merges.
 * `edit`: this device changed a doc the server also changed; `local` is this device's version
 * (still queued, not pushed), `others[0]` the server's. `server`: the server holds several
 * branches; `local` is the winning one (what this device shows), `others` the losing branches.
 * `refused`: the server refused this device's change (its rules: role, authorship, shape);
 * `local` is the refused version (out of the outbox while the conflict is open), `others[0]` the
 * server's current version, or none when the server has no copy (a refused create); `reason` is
 * the server's reason.
 */
export interface ConflictRecord {
  docId: string;
  kind: 'edit' | 'server' | 'refused';
  /** For `refused`: the server's reason, in its words. */
  reason?: string;
  local: TufaDoc;
  others: OtherVersion[];
  /** The server's winning revision: the resolution is written on top of it. */
  baseRev: string | undefined;
  /** Losing server branches (leaf revisions) to remove once resolved. */
  deleteRevs: string[];
  detectedAt: string;
}

export interface SyncStore {
  /** Every queued entry, oldest first. */
  outbox(): Promise<OutboxEntry[]>;
  outboxCount(): Promise<number>;
  getDocs(ids: readonly string[]): Promise<Map<string, TufaDoc>>;
  /**
   * After the server accepted a push: set `rev` on the doc and drop its outbox entry, but only
   * where the doc still has the pushed `updatedAt` (a later local edit stays queued, with the new rev).
   */
  markPushed(
    rows: { docId: string; rev: string; updatedAt: string; type?: 'site' | 'reading' }[],
  ): Promise<void>;
  /**
   * Writes docs that came from the server; they are not queued again. `seen` gives the local
   * `updatedAt` the engine decided on (undefined: no local doc); a doc changed locally since is not
   * overwritten and its id is returned, so the engine can keep both versions.
   */
  applyRemote(docs: TufaDoc[], seen?: Map<string, string | undefined>): Promise<string[]>;
  /** A local change (e.g. a conflict resolved by the user): stored and queued. */
  putLocal(doc: TufaDoc): Promise<void>;
  dropOutbox(docIds: readonly string[]): Promise<void>;
  /** Queues every local doc again (the server lost its data); returns how many. */
  queueAll(): Promise<number>;
  getMeta<T>(key: string): Promise<T | undefined>;
  setMeta(key: string, value: unknown): Promise<void>;
  conflicts(): Promise<ConflictRecord[]>;
  putConflict(c: ConflictRecord): Promise<void>;
  deleteConflict(docId: string): Promise<void>;
}
