/**
 * Opens, upgrades and migrates the Tufa database. The only module that calls `openDB`.
 *
 * Migrations are a list indexed by target version; opening at version N runs every step from the
 * stored version up to N inside the one upgrade transaction, so a database left at any older
 * version reaches the latest shape with its data. Never change a shipped step: add a new one.
 */

import { type IDBPDatabase, type IDBPTransaction, openDB, type StoreNames } from 'idb';
import type { Issue } from '../chem/errors';
import { asStoreError, UPGRADE_BLOCKED } from './errors';
import { bucketOf, mergePage, metaOf, pageIdOf } from './pages';
import { DB_NAME, type LocatorBucket, type OutboxBucket, type ReadingDoc, type TufaDB } from './schema';

type UpgradeTx = IDBPTransaction<TufaDB, StoreNames<TufaDB>[], 'versionchange'>;
type Migration = (db: IDBPDatabase<TufaDB>, tx: UpgradeTx) => void;

/** MIGRATIONS[v - 1] takes a database from version v - 1 to version v. */
const MIGRATIONS: readonly Migration[] = [
  // v1: documents, settings and the sync bookkeeping.
  (db) => {
    const sites = db.createObjectStore('sites', { keyPath: 'id' });
    sites.createIndex('byUpdatedAt', 'updatedAt');
    const readings = db.createObjectStore('readings', { keyPath: 'id' });
    readings.createIndex('bySiteTime', ['siteId', 'takenAt']);
    db.createObjectStore('settings', { keyPath: 'key' });
    db.createObjectStore('outbox', { keyPath: 'docId' });
    db.createObjectStore('syncMeta', { keyPath: 'key' });
    const conflicts = db.createObjectStore('conflicts', { keyPath: 'id' });
    conflicts.createIndex('byDocId', 'docId');
  },
  // v2: remembered CSV column layouts, and readings by change time (sync and export "since").
  (db, tx) => {
    const layouts = db.createObjectStore('layouts', { keyPath: 'id' });
    layouts.createIndex('byHeader', 'headerSignature');
    tx.objectStore('readings').createIndex('byUpdatedAt', 'updatedAt');
  },
  // v3: readings in pages per site and month, reading locator and outbox in hashed buckets, so
  // that 100 000 readings are a few hundred records (see pages.ts). Moves the v1–v2 data over.
  (db, tx) => {
    const metas = db.createObjectStore('readingPages', { keyPath: 'id' });
    metas.createIndex('bySiteMonth', ['siteId', 'month']);
    db.createObjectStore('readingPageData', { keyPath: 'id' });
    db.createObjectStore('readingLocator', { keyPath: 'bucket' });
    db.createObjectStore('outboxBuckets', { keyPath: 'bucket' });
    // The upgrade transaction stays alive while its own requests run: only IndexedDB is awaited.
    void Promise.all([tx.objectStore('readings').getAll(), tx.objectStore('outbox').getAll()]).then(
      ([readings, outbox]) => {
        const pages = new Map<string, ReadingDoc[]>();
        const locator = new Map<number, LocatorBucket>();
        for (const r of readings) {
          const id = pageIdOf(r.siteId, r.takenAt);
          pages.set(id, [...(pages.get(id) ?? []), r]);
          const b = bucketOf(r.id);
          const bucket = locator.get(b) ?? { bucket: b, pages: {} };
          bucket.pages[r.id] = id;
          locator.set(b, bucket);
        }
        for (const [id, docs] of pages) {
          const sorted = mergePage([], docs, new Set());
          tx.objectStore('readingPageData').put({ id, readings: sorted });
          tx.objectStore('readingPages').put(metaOf(id, sorted));
        }
        for (const bucket of locator.values()) tx.objectStore('readingLocator').put(bucket);
        const ob = new Map<number, OutboxBucket>();
        for (const e of outbox) {
          const b = bucketOf(e.docId);
          const bucket = ob.get(b) ?? { bucket: b, entries: {} };
          bucket.entries[e.docId] = e;
          ob.set(b, bucket);
        }
        for (const bucket of ob.values()) tx.objectStore('outboxBuckets').put(bucket);
        db.deleteObjectStore('readings');
        db.deleteObjectStore('outbox');
      },
    );
  },
];

export const LATEST_VERSION = MIGRATIONS.length;

export interface OpenOptions {
  name?: string;
  /** Stop at this version (tests of migrations); defaults to the latest. */
  version?: number;
  /** Another tab holds an older version open: tell the user to close it (the open waits). */
  onBlocked?: (issue: Issue) => void;
  /** A newer tab wants to upgrade: we close our connection so it can; the page should reload. */
  onVersionChange?: () => void;
}

export async function openTufaDb(options: OpenOptions = {}): Promise<IDBPDatabase<TufaDB>> {
  const version = options.version ?? LATEST_VERSION;
  if (!Number.isInteger(version) || version < 1 || version > LATEST_VERSION) {
    throw new RangeError(`Schema version ${version} does not exist (1..${LATEST_VERSION}).`);
  }
  try {
    const db = await openDB<TufaDB>(options.name ?? DB_NAME, version, {
      upgrade(database, oldVersion, newVersion, tx) {
        const target = newVersion ?? version;
        for (let v = oldVersion + 1; v <= target; v++) MIGRATIONS[v - 1]?.(database, tx);
      },
      blocked() {
        options.onBlocked?.(UPGRADE_BLOCKED);
      },
      blocking() {
        db.close();
        options.onVersionChange?.();
      },
    });
    return db;
  } catch (e) {
    throw asStoreError(e);
  }
}
