/**
 * The sync engine's, the importer's and the backup's view of the IndexedDB repository
 * (`src/store/repository.ts`), through its public API only (the store lays readings out in pages).
 *
 * Recording a push and applying pulled docs each read the local doc and write it back; both run
 * in one repository transaction (`recordPushed`, `applyRemoteIfUnchanged`), so a local edit
 * cannot slip in between and be overwritten.
 *
 * Conflicts are kept in the repository's `conflicts` store (one record per other version,
 * id `${docId}@${rev}`); kind, base revision and branches to delete go to `syncMeta` under
 * `conflict:${docId}`. A refused change with no server copy has no other version to store: its
 * id is listed under `conflicts:bare` so it is still found.
 */

import type { BackupStore, KeyValue } from '../io/backup';
import type { ImportTarget } from '../io/import-commit';
import type { Repository } from '../store/repository';
import type { ConflictRecord as StoredConflict, TufaDoc } from '../store/schema';
import type { ConflictRecord, OutboxEntry, SyncStore } from './sync-store';

const KIND_KEY = (docId: string) => `conflict:${docId}`;
const BARE_KEY = 'conflicts:bare';
type ConflictMeta = Pick<ConflictRecord, 'kind' | 'baseRev' | 'deleteRevs' | 'reason'>;

export class RepositoryStore implements SyncStore, ImportTarget, BackupStore {
  constructor(readonly repo: Repository) {}

  async outbox(): Promise<OutboxEntry[]> {
    return (await this.repo.listOutbox()).map((e) => ({ docId: e.docId, updatedAt: e.updatedAt }));
  }

  outboxCount(): Promise<number> {
    return this.repo.outboxSize();
  }

  /**
   * Sites are few: for many ids, reading them all at once beats one request per id (which costs
   * seconds for thousands of ids in Chromium); readings are found through the locator.
   */
  async getDocs(ids: readonly string[]): Promise<Map<string, TufaDoc>> {
    if (ids.length === 0) return new Map();
    if (ids.length < 50) {
      const docs = await this.repo.getDocs(
        ids.flatMap((docId) => [
          { docId, type: 'reading' as const },
          { docId, type: 'site' as const },
        ]),
      );
      return new Map(docs.map((d) => [d.id, d]));
    }
    const want = new Set(ids);
    const [sites, readings] = await Promise.all([
      this.repo.listSites({ includeDeleted: true }),
      this.repo.getDocs(ids.map((docId) => ({ docId, type: 'reading' as const }))),
    ]);
    const out = new Map<string, TufaDoc>();
    for (const r of readings) out.set(r.id, r);
    for (const s of sites) if (want.has(s.id)) out.set(s.id, s);
    return out;
  }

  async existingIds(ids: readonly string[]): Promise<Set<string>> {
    if (ids.length < 1000) return new Set((await this.getDocs(ids)).keys());
    // A big import: reading every doc once (pages) beats 100 000 lookups through the locator.
    const [sites, readings] = await Promise.all([
      this.repo.listSites({ includeDeleted: true }),
      this.repo.listAllReadings({ includeDeleted: true }),
    ]);
    const have = new Set<string>();
    for (const d of sites) have.add(d.id);
    for (const d of readings) have.add(d.id);
    return new Set(ids.filter((id) => have.has(id)));
  }

  async markPushed(
    rows: { docId: string; rev: string; updatedAt: string; type?: 'site' | 'reading' }[],
  ): Promise<void> {
    await this.repo.recordPushed(rows);
  }

  async applyRemote(docs: TufaDoc[], seen?: Map<string, string | undefined>): Promise<string[]> {
    if (docs.length === 0) return [];
    return this.repo.applyRemoteIfUnchanged(docs, seen ?? new Map());
  }

  async putLocal(doc: TufaDoc): Promise<void> {
    await this.repo.bulkPut([doc], { queue: true });
  }

  async bulkPut(docs: TufaDoc[]): Promise<void> {
    await this.repo.bulkPut(docs, { queue: true });
  }

  async queueAll(): Promise<number> {
    const docs = await this.allDocs();
    if (docs.length) await this.repo.bulkPut(docs, { queue: true });
    return docs.length;
  }

  async dropOutbox(docIds: readonly string[]): Promise<void> {
    const ids = new Set(docIds);
    await this.repo.ackOutbox((await this.repo.listOutbox()).filter((e) => ids.has(e.docId)));
  }

  getMeta<T>(key: string): Promise<T | undefined> {
    return this.repo.getSyncMeta<T>(key);
  }

  setMeta(key: string, value: unknown): Promise<void> {
    return this.repo.setSyncMeta(key, value);
  }

  async conflicts(): Promise<ConflictRecord[]> {
    const stored = await this.repo.listConflicts();
    const byDoc = new Map<string, StoredConflict[]>();
    for (const c of stored) byDoc.set(c.docId, [...(byDoc.get(c.docId) ?? []), c]);
    for (const id of (await this.repo.getSyncMeta<string[]>(BARE_KEY)) ?? [])
      byDoc.set(id, byDoc.get(id) ?? []);
    const docs = await this.getDocs([...byDoc.keys()]);
    const out: ConflictRecord[] = [];
    for (const [docId, records] of byDoc) {
      const local = docs.get(docId);
      if (!local) continue;
      const meta = await this.repo.getSyncMeta<ConflictMeta & { detectedAt?: string }>(KIND_KEY(docId));
      out.push({
        docId,
        kind: meta?.kind ?? 'edit',
        ...(meta?.reason === undefined ? {} : { reason: meta.reason }),
        baseRev: meta?.baseRev ?? records[0]?.rev,
        deleteRevs: meta?.deleteRevs ?? [],
        local,
        others: records.map((r) => ({ rev: r.rev, doc: r.doc })),
        detectedAt: records[0]?.keptAt ?? meta?.detectedAt ?? local.updatedAt,
      });
    }
    return out;
  }

  async putConflict(c: ConflictRecord): Promise<void> {
    await this.deleteConflict(c.docId);
    await this.repo.keepConflicts(
      c.others.map((o) => ({
        id: `${c.docId}@${o.rev}`,
        docId: c.docId,
        rev: o.rev,
        doc: o.doc,
        keptAt: c.detectedAt,
      })),
    );
    await this.repo.setSyncMeta(KIND_KEY(c.docId), {
      kind: c.kind,
      baseRev: c.baseRev,
      deleteRevs: c.deleteRevs,
      ...(c.reason === undefined ? {} : { reason: c.reason }),
      detectedAt: c.detectedAt,
    });
    if (c.others.length === 0) {
      const bare = (await this.repo.getSyncMeta<string[]>(BARE_KEY)) ?? [];
      if (!bare.includes(c.docId)) await this.repo.setSyncMeta(BARE_KEY, [...bare, c.docId]);
    }
  }

  async deleteConflict(docId: string): Promise<void> {
    for (const r of await this.repo.listConflicts(docId)) await this.repo.dropConflict(r.id);
    const bare = (await this.repo.getSyncMeta<string[]>(BARE_KEY)) ?? [];
    if (bare.includes(docId))
      await this.repo.setSyncMeta(
        BARE_KEY,
        bare.filter((id) => id !== docId),
      );
  }

  // ---- backup ----

  async allDocs(): Promise<TufaDoc[]> {
    const [sites, readings] = await Promise.all([
      this.repo.listSites({ includeDeleted: true }),
      this.repo.listAllReadings({ includeDeleted: true }),
    ]);
    return [...sites, ...readings];
  }

  async allSettings(): Promise<KeyValue[]> {
    return Object.entries(await this.repo.getSettings()).map(([key, value]) => ({ key, value }));
  }

  async allLayouts(): Promise<KeyValue[]> {
    return (await this.repo.listLayouts()).map((l) => ({ key: l.id, value: l }));
  }

  async putSettings(entries: KeyValue[]): Promise<void> {
    await this.repo.putSettings(Object.fromEntries(entries.map((e) => [e.key, e.value])));
  }

  async putLayouts(entries: KeyValue[]): Promise<void> {
    for (const e of entries) {
      const v = e.value as { name?: unknown; headerSignature?: unknown; columns?: unknown };
      if (typeof v?.headerSignature !== 'string' || typeof v.columns !== 'object' || v.columns === null)
        continue;
      await this.repo.putLayout({
        ...(e.value as object),
        id: e.key,
        name: typeof v.name === 'string' ? v.name : e.key,
        headerSignature: v.headerSignature,
        columns: v.columns as Record<string, string>,
      });
    }
  }
}
