/**
 * The repository the app and sync use: typed operations over the Tufa database, never raw stores.
 *
 * Invariants it keeps:
 * - Every local change of a site or reading writes the document AND its outbox entry in the same
 *   transaction, so a change can never be saved without being queued for sync (or the reverse).
 * - Deletions are tombstones (`deleted: true`); `restore*` undoes them.
 * - `updatedAt` of a document only moves forward, even for two changes in the same millisecond, so
 *   `ackOutbox` can tell a pushed change from a newer one made during the push.
 * - Writes use `{ durability: 'strict' }`: a saved field reading survives a power cut.
 * - Bulk writes are all-or-nothing: every document is validated first, then written in one
 *   transaction that aborts on the first failure.
 * - Only IndexedDB calls are awaited inside a transaction (it auto-commits otherwise).
 * Failures reach callers as TufaError with a store code (`storeIssue()` turns them into Issues).
 */

import type { IDBPDatabase } from 'idb';
import { type OpenOptions, openTufaDb } from './database';
import { asStoreError, storeError } from './errors';
import type {
  ConflictRecord,
  CsvLayout,
  OutboxEntry,
  ReadingDoc,
  SiteDoc,
  StoreName,
  TufaDB,
  TufaDoc,
} from './schema';
import { DEFAULT_SETTINGS, SETTING_KEYS, type Settings } from './settings';
import { validateDoc, validateReading, validateSite } from './validate';

const STRICT = { durability: 'strict' } as const;

export type NewSite = Omit<SiteDoc, 'id' | 'type' | 'updatedAt' | 'deleted' | 'rev'> & { id?: string };
export type NewReading = Omit<ReadingDoc, 'id' | 'type' | 'updatedAt' | 'deleted' | 'rev'> & { id?: string };
export type SitePatch = Partial<Omit<SiteDoc, 'id' | 'type' | 'updatedAt' | 'deleted' | 'rev'>>;
export type ReadingPatch = Partial<
  Omit<ReadingDoc, 'id' | 'type' | 'updatedAt' | 'deleted' | 'rev' | 'siteId'>
>;

export interface ListReadingsOptions {
  /** Inclusive ISO UTC bounds on takenAt. */
  from?: string;
  to?: string;
  includeDeleted?: boolean;
  /** Newest first (default oldest first, the order charts want). */
  newestFirst?: boolean;
  limit?: number;
}

export interface RepositoryOptions extends OpenOptions {
  /** Clock, injectable for tests. */
  now?: () => Date;
  newId?: () => string;
}

export interface BulkOptions {
  /** Queue every document for push (import: yes, the default). */
  queue?: boolean;
}

export async function openRepository(options: RepositoryOptions = {}): Promise<Repository> {
  const db = await openTufaDb(options);
  return new Repository(db, options.now ?? (() => new Date()), options.newId ?? (() => crypto.randomUUID()));
}

function laterThan(prev: string | undefined, now: Date): string {
  const t = now.getTime();
  const p = prev ? Date.parse(prev) : Number.NEGATIVE_INFINITY;
  return new Date(t > p ? t : p + 1).toISOString();
}

function outboxOf(doc: TufaDoc): OutboxEntry {
  return { docId: doc.id, type: doc.type, updatedAt: doc.updatedAt };
}

export class Repository {
  constructor(
    readonly db: IDBPDatabase<TufaDB>,
    private readonly now: () => Date,
    private readonly newId: () => string,
  ) {}

  close(): void {
    this.db.close();
  }

  // ---- sites ----------------------------------------------------------------------------------

  async listSites(opts: { includeDeleted?: boolean } = {}): Promise<SiteDoc[]> {
    const all = await this.run(() => this.db.getAll('sites'));
    const kept = opts.includeDeleted ? all : all.filter((s) => !s.deleted);
    return kept.sort((a, b) => a.name.localeCompare(b.name));
  }

  async getSite(id: string): Promise<SiteDoc | undefined> {
    return this.run(() => this.db.get('sites', id));
  }

  async createSite(input: NewSite): Promise<SiteDoc> {
    const { id, ...rest } = input;
    const doc: SiteDoc = {
      ...rest,
      id: id ?? this.newId(),
      type: 'site',
      updatedAt: laterThan(undefined, this.now()),
      deleted: false,
    };
    validateSite(doc);
    await this.writeLocal('sites', [doc]);
    return doc;
  }

  async updateSite(id: string, patch: SitePatch): Promise<SiteDoc> {
    return this.change('sites', id, (cur) => ({ ...cur, ...patch }));
  }

  /** Tombstones the site and every live reading of it, in one transaction. */
  async deleteSite(id: string): Promise<void> {
    const now = this.now();
    await this.run(async () => {
      const tx = this.db.transaction(['sites', 'readings', 'outbox'], 'readwrite', STRICT);
      const site = await tx.objectStore('sites').get(id);
      if (!site) {
        tx.abort();
        await tx.done.catch(() => undefined);
        throw storeError('store-not-found', `No site with id ${id}.`);
      }
      const range = IDBKeyRange.bound([id, ''], [id, '\uffff']);
      const readings = await tx.objectStore('readings').index('bySiteTime').getAll(range);
      const changed: TufaDoc[] = [{ ...site, deleted: true, updatedAt: laterThan(site.updatedAt, now) }];
      for (const r of readings)
        if (!r.deleted) changed.push({ ...r, deleted: true, updatedAt: laterThan(r.updatedAt, now) });
      const writes: Promise<unknown>[] = [];
      for (const d of changed) {
        writes.push(d.type === 'site' ? tx.objectStore('sites').put(d) : tx.objectStore('readings').put(d));
        writes.push(tx.objectStore('outbox').put(outboxOf(d)));
      }
      await Promise.all([...writes, tx.done]);
    });
  }

  async restoreSite(id: string): Promise<SiteDoc> {
    return this.change('sites', id, (cur) => ({ ...cur, deleted: false }), true);
  }

  // ---- readings -------------------------------------------------------------------------------

  async listReadings(siteId: string, opts: ListReadingsOptions = {}): Promise<ReadingDoc[]> {
    const range = IDBKeyRange.bound([siteId, opts.from ?? ''], [siteId, opts.to ?? '\uffff']);
    const all = await this.run(() => this.db.getAllFromIndex('readings', 'bySiteTime', range));
    let kept = opts.includeDeleted ? all : all.filter((r) => !r.deleted);
    if (opts.newestFirst) kept.reverse();
    if (opts.limit !== undefined) kept = kept.slice(0, opts.limit);
    return kept;
  }

  async countReadings(siteId: string): Promise<number> {
    const range = IDBKeyRange.bound([siteId, ''], [siteId, '\uffff']);
    return this.run(() => this.db.countFromIndex('readings', 'bySiteTime', range));
  }

  async getReading(id: string): Promise<ReadingDoc | undefined> {
    return this.run(() => this.db.get('readings', id));
  }

  async createReading(input: NewReading): Promise<ReadingDoc> {
    const { id, ...rest } = input;
    const doc: ReadingDoc = {
      ...rest,
      id: id ?? this.newId(),
      type: 'reading',
      updatedAt: laterThan(undefined, this.now()),
      deleted: false,
    };
    validateReading(doc);
    const site = await this.getSite(doc.siteId);
    if (!site || site.deleted)
      throw storeError('store-not-found', `No site with id ${doc.siteId}.`, 'siteId');
    await this.writeLocal('readings', [doc]);
    return doc;
  }

  async updateReading(id: string, patch: ReadingPatch): Promise<ReadingDoc> {
    return this.change('readings', id, (cur) => ({ ...cur, ...patch }));
  }

  async deleteReading(id: string): Promise<ReadingDoc> {
    return this.change('readings', id, (cur) => ({ ...cur, deleted: true }), true);
  }

  async restoreReading(id: string): Promise<ReadingDoc> {
    return this.change('readings', id, (cur) => ({ ...cur, deleted: false }), true);
  }

  // ---- bulk and sync --------------------------------------------------------------------------

  /**
   * Writes many documents as given (their own `updatedAt`), all or nothing. Import uses it with
   * `queue: true` (the default) so the documents are pushed later.
   */
  async bulkPut(docs: TufaDoc[], opts: BulkOptions = {}): Promise<number> {
    for (const d of docs) validateDoc(d);
    await this.writeDocs(docs, opts.queue ?? true, []);
    return docs.length;
  }

  /**
   * Applies documents that came from the server: written as they are, never queued for push, in one
   * transaction together with any losing revisions to keep. Outbox entries of these documents are
   * left alone: sync decides whether a local change still has to go out.
   */
  async applyRemote(docs: TufaDoc[], conflicts: ConflictRecord[] = []): Promise<number> {
    for (const d of docs) validateDoc(d);
    for (const c of conflicts) validateDoc(c.doc);
    await this.writeDocs(docs, false, conflicts);
    return docs.length;
  }

  /** Current versions of the given documents (tombstones included), e.g. to push an outbox. */
  async getDocs(ids: { docId: string; type: 'site' | 'reading' }[]): Promise<TufaDoc[]> {
    return this.run(async () => {
      const tx = this.db.transaction(['sites', 'readings'], 'readonly');
      const got = await Promise.all(
        ids.map((e) =>
          e.type === 'site' ? tx.objectStore('sites').get(e.docId) : tx.objectStore('readings').get(e.docId),
        ),
      );
      await tx.done;
      return got.filter((d): d is TufaDoc => d !== undefined);
    });
  }

  /** Every reading of every site (tombstones on request), e.g. for export. */
  async listAllReadings(opts: { includeDeleted?: boolean } = {}): Promise<ReadingDoc[]> {
    const all = await this.run(() => this.db.getAll('readings'));
    return opts.includeDeleted ? all : all.filter((r) => !r.deleted);
  }

  // ---- outbox ---------------------------------------------------------------------------------

  async listOutbox(limit?: number): Promise<OutboxEntry[]> {
    return this.run(() => this.db.getAll('outbox', null, limit));
  }

  async outboxSize(): Promise<number> {
    return this.run(() => this.db.count('outbox'));
  }

  /** Removes pushed entries, except those whose document changed again since (still pending). */
  async ackOutbox(pushed: OutboxEntry[]): Promise<number> {
    return this.run(async () => {
      const tx = this.db.transaction('outbox', 'readwrite', STRICT);
      const current = await Promise.all(pushed.map((e) => tx.store.get(e.docId)));
      let removed = 0;
      const dels: Promise<unknown>[] = [];
      current.forEach((cur, i) => {
        if (cur && cur.updatedAt === pushed[i]?.updatedAt) {
          dels.push(tx.store.delete(cur.docId));
          removed++;
        }
      });
      await Promise.all([...dels, tx.done]);
      return removed;
    });
  }

  // ---- sync bookkeeping -----------------------------------------------------------------------

  async getSyncMeta<T = unknown>(key: string): Promise<T | undefined> {
    const kv = await this.run(() => this.db.get('syncMeta', key));
    return kv?.value as T | undefined;
  }

  async setSyncMeta(key: string, value: unknown): Promise<void> {
    await this.run(() => this.db.put('syncMeta', { key, value }));
  }

  async keepConflicts(records: ConflictRecord[]): Promise<void> {
    for (const c of records) validateDoc(c.doc);
    await this.run(async () => {
      const tx = this.db.transaction('conflicts', 'readwrite', STRICT);
      await Promise.all([...records.map((c) => tx.store.put(c)), tx.done]);
    });
  }

  async listConflicts(docId?: string): Promise<ConflictRecord[]> {
    return this.run(() =>
      docId === undefined
        ? this.db.getAll('conflicts')
        : this.db.getAllFromIndex('conflicts', 'byDocId', docId),
    );
  }

  async dropConflict(id: string): Promise<void> {
    await this.run(() => this.db.delete('conflicts', id));
  }

  // ---- settings -------------------------------------------------------------------------------

  async getSettings(): Promise<Settings> {
    const rows = await this.run(() => this.db.getAll('settings'));
    const out: Settings = structuredClone(DEFAULT_SETTINGS);
    const target = out as unknown as Record<string, unknown>;
    for (const row of rows) if ((SETTING_KEYS as string[]).includes(row.key)) target[row.key] = row.value;
    return out;
  }

  async putSettings(patch: Partial<Settings>): Promise<Settings> {
    await this.run(async () => {
      const tx = this.db.transaction('settings', 'readwrite', STRICT);
      const puts = Object.entries(patch)
        .filter(([k, v]) => (SETTING_KEYS as string[]).includes(k) && v !== undefined)
        .map(([key, value]) => tx.store.put({ key, value }));
      await Promise.all([...puts, tx.done]);
    });
    return this.getSettings();
  }

  // ---- CSV layouts ----------------------------------------------------------------------------

  async listLayouts(): Promise<CsvLayout[]> {
    return this.run(() => this.db.getAll('layouts'));
  }

  async findLayouts(headerSignature: string): Promise<CsvLayout[]> {
    return this.run(() => this.db.getAllFromIndex('layouts', 'byHeader', headerSignature));
  }

  async putLayout(layout: Omit<CsvLayout, 'id' | 'updatedAt'> & { id?: string }): Promise<CsvLayout> {
    const doc: CsvLayout = { ...layout, id: layout.id ?? this.newId(), updatedAt: this.now().toISOString() };
    await this.run(() => this.db.put('layouts', doc));
    return doc;
  }

  async deleteLayout(id: string): Promise<void> {
    await this.run(() => this.db.delete('layouts', id));
  }

  // ---- internals ------------------------------------------------------------------------------

  private async run<T>(f: () => Promise<T>): Promise<T> {
    try {
      return await f();
    } catch (e) {
      throw asStoreError(e);
    }
  }

  private async writeLocal(store: 'sites' | 'readings', docs: TufaDoc[]): Promise<void> {
    await this.writeDocs(docs, true, [], store);
  }

  private async writeDocs(
    docs: TufaDoc[],
    queue: boolean,
    conflicts: ConflictRecord[],
    only?: 'sites' | 'readings',
  ): Promise<void> {
    const names: StoreName[] = only ? [only] : ['sites', 'readings'];
    if (queue) names.push('outbox');
    if (conflicts.length) names.push('conflicts');
    await this.run(async () => {
      const tx = this.db.transaction(
        names as ('sites' | 'readings' | 'outbox' | 'conflicts')[],
        'readwrite',
        STRICT,
      );
      const writes: Promise<unknown>[] = [];
      try {
        const sites = names.includes('sites') ? tx.objectStore('sites') : undefined;
        const readings = names.includes('readings') ? tx.objectStore('readings') : undefined;
        const outbox = queue ? tx.objectStore('outbox') : undefined;
        for (const d of docs) {
          if (d.type === 'site') writes.push(sites!.put(d));
          else writes.push(readings!.put(d));
          if (outbox) writes.push(outbox.put(outboxOf(d)));
        }
        if (conflicts.length) {
          const cs = tx.objectStore('conflicts');
          for (const c of conflicts) writes.push(cs.put(c));
        }
      } catch (e) {
        // A put threw synchronously (e.g. a value that cannot be cloned): abort the whole batch and
        // swallow the rejections of the requests already issued, which the abort causes.
        for (const w of writes) w.catch(() => undefined);
        tx.done.catch(() => undefined);
        tx.abort();
        throw e;
      }
      await Promise.all([...writes, tx.done]);
    });
  }

  /** Read-modify-write of one document with its outbox entry, in one transaction. */
  private async change<S extends 'sites' | 'readings'>(
    store: S,
    id: string,
    edit: (cur: TufaDB[S]['value']) => TufaDB[S]['value'],
    allowDeleted = false,
  ): Promise<TufaDB[S]['value']> {
    const now = this.now();
    return this.run(async () => {
      const tx = this.db.transaction([store, 'outbox'], 'readwrite', STRICT);
      const os = tx.objectStore(store);
      const cur = (await os.get(id)) as TufaDB[S]['value'] | undefined;
      if (!cur || (cur.deleted && !allowDeleted)) {
        tx.abort();
        await tx.done.catch(() => undefined);
        throw storeError('store-not-found', `No ${store === 'sites' ? 'site' : 'reading'} with id ${id}.`);
      }
      const next = {
        ...edit(cur),
        id: cur.id,
        type: cur.type,
        updatedAt: laterThan(cur.updatedAt, now),
      } as TufaDB[S]['value'];
      if (cur.rev !== undefined) next.rev = cur.rev;
      try {
        validateDoc(next);
      } catch (e) {
        tx.abort();
        await tx.done.catch(() => undefined);
        throw e;
      }
      await Promise.all([os.put(next as never), tx.objectStore('outbox').put(outboxOf(next)), tx.done]);
      return next;
    });
  }
}
