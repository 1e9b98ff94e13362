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
 * - Readings live in pages per site and month, outbox entries in hashed buckets (`pages.ts`);
 *   that layout is internal: every call here takes and returns plain documents and entries.
 * Failures reach callers as TufaError with a store code (`storeIssue()` turns them into Issues).
 */

import type { IDBPDatabase, IDBPTransaction } from 'idb';
import { type OpenOptions, openTufaDb } from './database';
import { asStoreError, storeError } from './errors';
import { bucketOf, mergePage, metaOf, pageIdOf } from './pages';
import type {
  ConflictRecord,
  CsvLayout,
  LocatorBucket,
  OutboxBucket,
  OutboxEntry,
  ReadingDoc,
  ReadingPageData,
  SiteDoc,
  TufaDB,
  TufaDoc,
} from './schema';
import { checkSetting, isSettingKey, type RejectedSetting, readSettings, type Settings } from './settings';
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

/** The stores every document write touches, locked together so a change and its queue entry commit as one. */
const DOC_STORES = [
  'sites',
  'readingPages',
  'readingPageData',
  'readingLocator',
  'outboxBuckets',
  'conflicts',
] as const;
type DocTx = IDBPTransaction<TufaDB, (typeof DOC_STORES)[number][], 'readwrite'>;
/** The two lookups finding a reading needs, from whatever transaction the caller holds. */
interface ReadingLookup {
  locator(bucket: number): Promise<LocatorBucket | undefined>;
  page(id: string): Promise<ReadingPageData | undefined>;
}
function lookupIn(tx: {
  objectStore(name: 'readingLocator'): { get(k: number): Promise<LocatorBucket | undefined> };
  objectStore(name: 'readingPageData'): { get(k: string): Promise<ReadingPageData | undefined> };
}): ReadingLookup {
  return {
    locator: (b) => tx.objectStore('readingLocator').get(b),
    page: (id) => tx.objectStore('readingPageData').get(id),
  };
}

function unique<T>(xs: Iterable<T>): T[] {
  return [...new Set(xs)];
}

/** Current versions of readings by id, located through the locator buckets. */
async function findReadings(tx: ReadingLookup, ids: string[]): Promise<Map<string, ReadingDoc>> {
  const buckets = unique(ids.map(bucketOf));
  const locs = await Promise.all(buckets.map((b) => tx.locator(b)));
  const pageOf = new Map<string, string>();
  for (const id of ids) {
    const loc = locs[buckets.indexOf(bucketOf(id))];
    const p = loc?.pages[id];
    if (p) pageOf.set(id, p);
  }
  const pageIds = unique(pageOf.values());
  const datas = await Promise.all(pageIds.map((p) => tx.page(p)));
  const out = new Map<string, ReadingDoc>();
  const wanted = new Set(ids);
  for (const d of datas) for (const r of d?.readings ?? []) if (wanted.has(r.id)) out.set(r.id, r);
  return out;
}

/** Writes readings into their pages (moving any whose site or month changed) and the locator. */
async function putReadings(tx: DocTx, docs: ReadingDoc[]): Promise<void> {
  if (docs.length === 0) return;
  const buckets = unique(docs.map((d) => bucketOf(d.id)));
  const got = await Promise.all(buckets.map((b) => tx.objectStore('readingLocator').get(b)));
  const locator = new Map<number, LocatorBucket>();
  buckets.forEach((b, i) => {
    locator.set(b, got[i] ?? { bucket: b, pages: {} });
  });
  const upserts = new Map<string, ReadingDoc[]>();
  const removes = new Map<string, Set<string>>();
  const moved = new Set<number>();
  for (const d of docs) {
    const target = pageIdOf(d.siteId, d.takenAt);
    const loc = locator.get(bucketOf(d.id))!;
    const old = loc.pages[d.id];
    if (old !== target) moved.add(loc.bucket);
    if (old !== undefined && old !== target) {
      const set = removes.get(old) ?? new Set<string>();
      set.add(d.id);
      removes.set(old, set);
    }
    const list = upserts.get(target);
    if (list) list.push(d);
    else upserts.set(target, [d]);
    loc.pages[d.id] = target;
  }
  const pageIds = unique([...upserts.keys(), ...removes.keys()]);
  const datas = await Promise.all(pageIds.map((p) => tx.objectStore('readingPageData').get(p)));
  const writes: Promise<unknown>[] = [];
  pageIds.forEach((id, i) => {
    const merged = mergePage(datas[i]?.readings ?? [], upserts.get(id) ?? [], removes.get(id) ?? new Set());
    if (merged.length === 0) {
      writes.push(tx.objectStore('readingPageData').delete(id), tx.objectStore('readingPages').delete(id));
    } else {
      writes.push(tx.objectStore('readingPageData').put({ id, readings: merged }));
      writes.push(tx.objectStore('readingPages').put(metaOf(id, merged)));
    }
  });
  // Only buckets whose entries changed (a rev update keeps every reading where it is).
  for (const b of locator.values())
    if (moved.has(b.bucket)) writes.push(tx.objectStore('readingLocator').put(b));
  await Promise.all(writes);
}

/** Queues one outbox entry per document (replacing an older entry of the same document). */
async function queue(tx: DocTx, entries: OutboxEntry[]): Promise<void> {
  if (entries.length === 0) return;
  const buckets = unique(entries.map((e) => bucketOf(e.docId)));
  const got = await Promise.all(buckets.map((b) => tx.objectStore('outboxBuckets').get(b)));
  const byBucket = new Map<number, OutboxBucket>();
  buckets.forEach((b, i) => {
    byBucket.set(b, got[i] ?? { bucket: b, entries: {} });
  });
  for (const e of entries) byBucket.get(bucketOf(e.docId))!.entries[e.docId] = e;
  await Promise.all([...byBucket.values()].map((b) => tx.objectStore('outboxBuckets').put(b)));
}

interface OutboxAccess {
  get(bucket: number): Promise<OutboxBucket | undefined>;
  put(b: OutboxBucket): Promise<unknown>;
}

/** Drops outbox entries that still have the pushed `updatedAt` (a newer change stays queued). */
async function ackIn(store: OutboxAccess, pushed: OutboxEntry[]): Promise<number> {
  const buckets = unique(pushed.map((e) => bucketOf(e.docId)));
  const got = await Promise.all(buckets.map((b) => store.get(b)));
  let removed = 0;
  for (const e of pushed) {
    const bucket = got[buckets.indexOf(bucketOf(e.docId))];
    const cur = bucket?.entries[e.docId];
    if (bucket && cur && cur.updatedAt === e.updatedAt) {
      delete bucket.entries[e.docId];
      removed++;
    }
  }
  await Promise.all(got.filter((b): b is OutboxBucket => b !== undefined).map((b) => store.put(b)));
  return removed;
}

function outboxIn(tx: DocTx): OutboxAccess {
  const store = tx.objectStore('outboxBuckets');
  return { get: (b) => store.get(b), put: (b) => store.put(b) };
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
    await this.writeLocal([doc]);
    return doc;
  }

  async updateSite(id: string, patch: SitePatch): Promise<SiteDoc> {
    return this.change<SiteDoc>('site', id, (cur) => ({ ...cur, ...patch }));
  }

  /** Tombstones the site and every live reading of it, in one transaction. */
  async deleteSite(id: string): Promise<void> {
    const now = this.now();
    await this.inDocTx(async (tx) => {
      const site = await tx.objectStore('sites').get(id);
      if (!site) throw storeError('store-not-found', `No site with id ${id}.`);
      const range = IDBKeyRange.bound([id, ''], [id, '\uffff']);
      const metas = await tx.objectStore('readingPages').index('bySiteMonth').getAll(range);
      const datas = await Promise.all(metas.map((m) => tx.objectStore('readingPageData').get(m.id)));
      const dead: ReadingDoc[] = [];
      for (const d of datas)
        for (const r of d?.readings ?? [])
          if (!r.deleted) dead.push({ ...r, deleted: true, updatedAt: laterThan(r.updatedAt, now) });
      const tomb: SiteDoc = { ...site, deleted: true, updatedAt: laterThan(site.updatedAt, now) };
      await tx.objectStore('sites').put(tomb);
      await putReadings(tx, dead);
      await queue(tx, [tomb, ...dead].map(outboxOf));
    });
  }

  async restoreSite(id: string): Promise<SiteDoc> {
    return this.change<SiteDoc>('site', id, (cur) => ({ ...cur, deleted: false }), true);
  }

  // ---- readings -------------------------------------------------------------------------------

  async listReadings(siteId: string, opts: ListReadingsOptions = {}): Promise<ReadingDoc[]> {
    const all = await this.run(async () => {
      const tx = this.db.transaction(['readingPages', 'readingPageData'], 'readonly');
      const range = IDBKeyRange.bound(
        [siteId, opts.from?.slice(0, 7) ?? ''],
        [siteId, opts.to?.slice(0, 7) ?? '\uffff'],
      );
      const metas = await tx.objectStore('readingPages').index('bySiteMonth').getAll(range);
      const datas = await Promise.all(metas.map((m) => tx.objectStore('readingPageData').get(m.id)));
      await tx.done;
      return datas.flatMap((d) => d?.readings ?? []);
    });
    const from = opts.from ?? '';
    const to = opts.to ?? '\uffff';
    let kept = all.filter((r) => (opts.includeDeleted || !r.deleted) && r.takenAt >= from && r.takenAt <= to);
    if (opts.newestFirst) kept.reverse();
    if (opts.limit !== undefined) kept = kept.slice(0, opts.limit);
    return kept;
  }

  /** Readings of a site that are not deleted (cheap: page summaries only). */
  async countReadings(siteId: string): Promise<number> {
    const range = IDBKeyRange.bound([siteId, ''], [siteId, '\uffff']);
    const metas = await this.run(() => this.db.getAllFromIndex('readingPages', 'bySiteMonth', range));
    return metas.reduce((n, m) => n + m.live, 0);
  }

  async getReading(id: string): Promise<ReadingDoc | undefined> {
    return this.run(async () => {
      const tx = this.db.transaction(['readingPages', 'readingPageData', 'readingLocator'], 'readonly');
      const found = await findReadings(lookupIn(tx), [id]);
      await tx.done;
      return found.get(id);
    });
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
    await this.inDocTx(async (tx) => {
      const site = await tx.objectStore('sites').get(doc.siteId);
      if (!site || site.deleted)
        throw storeError('store-not-found', `No site with id ${doc.siteId}.`, 'siteId');
      await putReadings(tx, [doc]);
      await queue(tx, [outboxOf(doc)]);
    });
    return doc;
  }

  async updateReading(id: string, patch: ReadingPatch): Promise<ReadingDoc> {
    return this.change<ReadingDoc>('reading', id, (cur) => ({ ...cur, ...patch }));
  }

  async deleteReading(id: string): Promise<ReadingDoc> {
    return this.change<ReadingDoc>('reading', id, (cur) => ({ ...cur, deleted: true }), true);
  }

  async restoreReading(id: string): Promise<ReadingDoc> {
    return this.change<ReadingDoc>('reading', id, (cur) => ({ ...cur, deleted: false }), true);
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

  /**
   * After the server accepted a push, in ONE transaction: set the server revision on each doc as it
   * is now (a local edit made during the push keeps its content and gets the new base revision),
   * and drop its outbox entry only where the entry still has the pushed `updatedAt` (that later
   * edit stays queued). Doing read and write in one transaction is what keeps an edit that lands
   * mid-push from being overwritten by the copy read before it.
   */
  async recordPushed(
    rows: { docId: string; rev: string; updatedAt: string; type?: 'site' | 'reading' }[],
  ): Promise<number> {
    if (rows.length === 0) return 0;
    let acked = 0;
    await this.inDocTx(async (tx) => {
      // A row that names its type is looked up in that store only (one request per site is slow).
      const [sites, readings] = await Promise.all([
        Promise.all(
          rows.map((r) => (r.type === 'reading' ? undefined : tx.objectStore('sites').get(r.docId))),
        ),
        findReadings(
          lookupIn(tx),
          rows.filter((r) => r.type !== 'site').map((r) => r.docId),
        ),
      ]);
      const siteWrites: SiteDoc[] = [];
      const readingWrites: ReadingDoc[] = [];
      const acks: OutboxEntry[] = [];
      rows.forEach((r, i) => {
        const cur: TufaDoc | undefined = sites[i] ?? readings.get(r.docId);
        if (!cur) return;
        if (cur.rev !== r.rev) {
          if (cur.type === 'site') siteWrites.push({ ...cur, rev: r.rev });
          else readingWrites.push({ ...cur, rev: r.rev });
        }
        acks.push({ docId: r.docId, type: cur.type, updatedAt: r.updatedAt });
      });
      await Promise.all(siteWrites.map((d) => tx.objectStore('sites').put(d)));
      await putReadings(tx, readingWrites);
      acked = await ackIn(outboxIn(tx), acks);
    });
    return acked;
  }

  /**
   * Writes docs that came from the server (not queued), in ONE transaction, except those changed
   * locally since sync looked at them: `seen` gives the local `updatedAt` sync decided on
   * (undefined: there was no local doc). Docs not in `seen` are written as they are. Returns the
   * ids left alone, so sync can keep both versions.
   */
  async applyRemoteIfUnchanged(
    docs: TufaDoc[],
    seen: ReadonlyMap<string, string | undefined>,
  ): Promise<string[]> {
    for (const d of docs) validateDoc(d);
    const skipped: string[] = [];
    await this.inDocTx(async (tx) => {
      const ids = docs.filter((d) => seen.has(d.id)).map((d) => d.id);
      const [sites, readings] = await Promise.all([
        Promise.all(ids.map((i) => tx.objectStore('sites').get(i))),
        findReadings(lookupIn(tx), ids),
      ]);
      const now = new Map<string, string>();
      ids.forEach((id, i) => {
        const cur = sites[i] ?? readings.get(id);
        if (cur) now.set(id, cur.updatedAt);
      });
      const write = docs.filter((d) => {
        if (!seen.has(d.id) || now.get(d.id) === seen.get(d.id)) return true;
        skipped.push(d.id);
        return false;
      });
      await Promise.all(
        write.filter((d): d is SiteDoc => d.type === 'site').map((d) => tx.objectStore('sites').put(d)),
      );
      await putReadings(
        tx,
        write.filter((d): d is ReadingDoc => d.type === 'reading'),
      );
    });
    return skipped;
  }

  /** Current versions of the given documents (tombstones included), e.g. to push an outbox. */
  async getDocs(ids: { docId: string; type: 'site' | 'reading' }[]): Promise<TufaDoc[]> {
    return this.run(async () => {
      const tx = this.db.transaction(
        ['sites', 'readingPages', 'readingPageData', 'readingLocator'],
        'readonly',
      );
      const siteIds = ids.filter((e) => e.type === 'site').map((e) => e.docId);
      const readingIds = ids.filter((e) => e.type === 'reading').map((e) => e.docId);
      const [sites, readings] = await Promise.all([
        Promise.all(siteIds.map((i) => tx.objectStore('sites').get(i))),
        findReadings(lookupIn(tx), readingIds),
      ]);
      await tx.done;
      const siteMap = new Map(sites.filter((d): d is SiteDoc => d !== undefined).map((d) => [d.id, d]));
      return ids
        .map((e) => (e.type === 'site' ? siteMap.get(e.docId) : readings.get(e.docId)))
        .filter((d): d is TufaDoc => d !== undefined);
    });
  }

  /** Every reading of every site (tombstones on request), e.g. for export. */
  async listAllReadings(opts: { includeDeleted?: boolean } = {}): Promise<ReadingDoc[]> {
    const pages = await this.run(() => this.db.getAll('readingPageData'));
    const all = pages.flatMap((p) => p.readings);
    return opts.includeDeleted ? all : all.filter((r) => !r.deleted);
  }

  // ---- outbox ---------------------------------------------------------------------------------

  /** Pending pushes, oldest change first. */
  async listOutbox(limit?: number): Promise<OutboxEntry[]> {
    const buckets = await this.run(() => this.db.getAll('outboxBuckets'));
    const all = buckets.flatMap((b) => Object.values(b.entries));
    all.sort((a, b) =>
      a.updatedAt < b.updatedAt ? -1 : a.updatedAt > b.updatedAt ? 1 : a.docId < b.docId ? -1 : 1,
    );
    return limit === undefined ? all : all.slice(0, limit);
  }

  async outboxSize(): Promise<number> {
    const buckets = await this.run(() => this.db.getAll('outboxBuckets'));
    return buckets.reduce((n, b) => n + Object.keys(b.entries).length, 0);
  }

  /** Removes pushed entries, except those whose document changed again since (still pending). */
  async ackOutbox(pushed: OutboxEntry[]): Promise<number> {
    return this.run(async () => {
      const tx = this.db.transaction('outboxBuckets', 'readwrite', STRICT);
      const [removed] = await Promise.all([
        ackIn({ get: (b) => tx.store.get(b), put: (b) => tx.store.put(b) }, pushed),
        tx.done,
      ]);
      return removed;
    });
  }

  // ---- sync bookkeeping -----------------------------------------------------------------------

  async getSyncMeta<T = unknown>(key: string): Promise<T | undefined> {
    const kv = await this.run(() => this.db.get('syncMeta', key));
    return kv?.value as T | undefined;
  }

  async setSyncMeta(key: string, value: unknown): Promise<void> {
    await this.strictWrite('syncMeta', (store) => store.put({ key, value }));
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
    await this.strictWrite('conflicts', (store) => store.delete(id));
  }

  // ---- settings -------------------------------------------------------------------------------

  /** Settings over their defaults; a stored value that fails its check is not used. */
  async getSettings(): Promise<Settings> {
    return (await this.readSettings()).settings;
  }

  /** Settings, and the stored values that failed their check (defaults apply to those). */
  async readSettings(): Promise<{ settings: Settings; rejected: RejectedSetting[] }> {
    return readSettings(await this.run(() => this.db.getAll('settings')));
  }

  /** Checks every value first (store-invalid-setting: nothing is written), then writes all. */
  async putSettings(patch: Partial<Settings>): Promise<Settings> {
    // Keys that are not settings (an older Tufa's, say) are ignored as before.
    const entries = Object.entries(patch).filter(([k, v]) => v !== undefined && isSettingKey(k));
    for (const [k, v] of entries) {
      const why = checkSetting(k, v);
      if (why) throw storeError('store-invalid-setting', `Setting ${k} ${why}; nothing was changed.`, k);
    }
    await this.run(async () => {
      const tx = this.db.transaction('settings', 'readwrite', STRICT);
      await this.settle(tx, Promise.all(entries.map(([key, value]) => tx.store.put({ key, value }))));
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
    await this.strictWrite('layouts', (store) => store.put(doc));
    return doc;
  }

  async deleteLayout(id: string): Promise<void> {
    await this.strictWrite('layouts', (store) => store.delete(id));
  }

  // ---- internals ------------------------------------------------------------------------------

  private async run<T>(f: () => Promise<T>): Promise<T> {
    try {
      return await f();
    } catch (e) {
      throw asStoreError(e);
    }
  }

  /**
   * Waits for `work` and the commit of `tx`. An aborted transaction rejects with a bare AbortError
   * whose cause (a QuotaExceededError, say) is only in `tx.error`; that cause is what is thrown.
   */
  private async settle(
    tx: { error: DOMException | null; done: Promise<void> },
    work: Promise<unknown>,
  ): Promise<void> {
    try {
      await Promise.all([work, tx.done]);
    } catch (e) {
      tx.done.catch(() => undefined);
      const cause = tx.error;
      throw cause && (e as { name?: string })?.name === 'AbortError' ? cause : e;
    }
  }

  /** One strict read-write transaction on one store (every write is durable, see the class comment). */
  private async strictWrite<S extends 'syncMeta' | 'conflicts' | 'layouts'>(
    name: S,
    write: (store: IDBPTransaction<TufaDB, [S], 'readwrite'>['store']) => Promise<unknown>,
  ): Promise<void> {
    await this.run(async () => {
      const tx = this.db.transaction(name, 'readwrite', STRICT);
      await this.settle(tx, write(tx.store));
    });
  }

  /** Runs `work` in one strict read-write transaction over the document stores; any throw aborts it all. */
  private async inDocTx(work: (tx: DocTx) => Promise<void>): Promise<void> {
    await this.run(async () => {
      const tx = this.db.transaction([...DOC_STORES], 'readwrite', STRICT);
      try {
        await work(tx);
      } catch (e) {
        // Swallow the abort's own rejection of tx.done; the caller gets the first error.
        tx.done.catch(() => undefined);
        try {
          tx.abort();
        } catch {
          // already aborted by the failed request
        }
        throw e;
      }
      await this.settle(tx, Promise.resolve());
    });
  }

  private async writeLocal(docs: TufaDoc[]): Promise<void> {
    await this.writeDocs(docs, true, []);
  }

  private async writeDocs(docs: TufaDoc[], queued: boolean, conflicts: ConflictRecord[]): Promise<void> {
    await this.inDocTx(async (tx) => {
      const sites = docs.filter((d): d is SiteDoc => d.type === 'site');
      const readings = docs.filter((d): d is ReadingDoc => d.type === 'reading');
      await Promise.all(sites.map((d) => tx.objectStore('sites').put(d)));
      await putReadings(tx, readings);
      if (queued) await queue(tx, docs.map(outboxOf));
      if (conflicts.length) await Promise.all(conflicts.map((c) => tx.objectStore('conflicts').put(c)));
    });
  }

  /** Read-modify-write of one document with its outbox entry, in one transaction. */
  private async change<D extends TufaDoc>(
    type: D['type'],
    id: string,
    edit: (cur: D) => D,
    allowDeleted = false,
  ): Promise<D> {
    const now = this.now();
    let next: D | undefined;
    await this.inDocTx(async (tx) => {
      const cur = (
        type === 'site'
          ? await tx.objectStore('sites').get(id)
          : (await findReadings(lookupIn(tx), [id])).get(id)
      ) as D | undefined;
      if (!cur || (cur.deleted && !allowDeleted)) {
        throw storeError('store-not-found', `No ${type} with id ${id}.`);
      }
      const n = { ...edit(cur), id: cur.id, type: cur.type, updatedAt: laterThan(cur.updatedAt, now) } as D;
      if (cur.rev !== undefined) n.rev = cur.rev;
      if (n.type === 'reading') validateReading(n, (cur as ReadingDoc).timeZone);
      else validateDoc(n);
      if (n.type === 'site') await tx.objectStore('sites').put(n);
      else await putReadings(tx, [n]);
      await queue(tx, [outboxOf(n)]);
      next = n;
    });
    return next!;
  }
}
