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
import { DB_NAME, type TufaDB } from './schema';

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
