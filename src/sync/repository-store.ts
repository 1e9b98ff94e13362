/**
 * The sync engine's, the importer's and the backup's view of the IndexedDB repository
 * (`src/store/repository.ts`).
 *
 * Two operations need one transaction over docs and outbox that the repository has no call for:
 * recording a push (set `rev`, drop the outbox entry only if the doc was not edited meanwhile) and
 * applying pulled docs only where the local doc is unchanged since the engine looked. Done as two
 * separate calls, a field edit made between them would be overwritten and lost, so they use the
 * repository's database handle directly, in one strict transaction each.
 *
 * Conflicts are kept in the repository's `conflicts` store (one record per other version,
 * id `${docId}@${rev}`); kind, base revision and branches to delete go to `syncMeta` under
 * `conflict:${docId}`.
 */

import type { BackupStore, KeyValue } from '../io/backup';
import type { ImportTarget } from '../io/import-commit';
import type { Repository } from '../store/repository';
import type { ConflictRecord as StoredConflict, TufaDoc } from '../store/schema';
import { validateDoc } from '../store/validate';
import type { ConflictRecord, OutboxEntry, SyncStore } from './sync-store';

const STRICT = { durability: 'strict' } as const;
const KIND_KEY = (docId: string) => `conflict:${docId}`;

export class RepositoryStore implements SyncStore, ImportTarget, BackupStore {
  constructor(readonly repo: Repository) {}

  async outbox(): Promise<OutboxEntry[]> {
    return (await this.repo.listOutbox()).map((e) => ({ docId: e.docId, updatedAt: e.updatedAt }));
  }

  outboxCount(): Promise<number> {
    return this.repo.outboxSize();
  }

  async getDocs(ids: readonly string[]): Promise<Map<string, TufaDoc>> {
    const tx = this.repo.db.transaction(['sites', 'readings'], 'readonly');
    const sites = tx.objectStore('sites');
    const readings = tx.objectStore('readings');
    const got = await Promise.all(ids.map(async (id) => (await readings.get(id)) ?? (await sites.get(id))));
    await tx.done;
    const out = new Map<string, TufaDoc>();
    for (const d of got) if (d) out.set(d.id, d);
    return out;
  }

  async existingIds(ids: readonly string[]): Promise<Set<string>> {
    if (ids.length < 2000) return new Set((await this.getDocs(ids)).keys());
    // For a big import one key scan beats 100 000 single lookups by far.
    const tx = this.repo.db.transaction(['sites', 'readings'], 'readonly');
    const [siteKeys, readingKeys] = await Promise.all([
      tx.objectStore('sites').getAllKeys(),
      tx.objectStore('readings').getAllKeys(),
      tx.done,
    ]);
    const have = new Set<string>([...siteKeys, ...readingKeys]);
    return new Set(ids.filter((id) => have.has(id)));
  }

  async markPushed(rows: { docId: string; rev: string; updatedAt: string }[]): Promise<void> {
    if (rows.length === 0) return;
    const tx = this.repo.db.transaction(['sites', 'readings', 'outbox'], 'readwrite', STRICT);
    const sites = tx.objectStore('sites');
    const readings = tx.objectStore('readings');
    const outbox = tx.objectStore('outbox');
    await Promise.all(
      rows.map(async (r) => {
        const reading = await readings.get(r.docId);
        const doc = reading ?? (await sites.get(r.docId));
        if (!doc) return;
        doc.rev = r.rev;
        if (doc.type === 'reading') await readings.put(doc);
        else await sites.put(doc);
        const entry = await outbox.get(r.docId);
        if (entry && entry.updatedAt === r.updatedAt && doc.updatedAt === r.updatedAt)
          await outbox.delete(r.docId);
      }),
    );
    await tx.done;
  }

  async applyRemote(docs: TufaDoc[], seen?: Map<string, string | undefined>): Promise<string[]> {
    for (const d of docs) validateDoc(d);
    const skipped: string[] = [];
    const tx = this.repo.db.transaction(['sites', 'readings'], 'readwrite', STRICT);
    const sites = tx.objectStore('sites');
    const readings = tx.objectStore('readings');
    await Promise.all(
      docs.map(async (d) => {
        const os = d.type === 'reading' ? readings : sites;
        if (seen?.has(d.id)) {
          const cur = await os.get(d.id);
          if (cur?.updatedAt !== seen.get(d.id)) {
            skipped.push(d.id);
            return;
          }
        }
        if (d.type === 'reading') await readings.put(d);
        else await sites.put(d);
      }),
    );
    await tx.done;
    return skipped;
  }

  async putLocal(doc: TufaDoc): Promise<void> {
    await this.repo.bulkPut([doc], { queue: true });
  }

  async bulkPut(docs: TufaDoc[]): Promise<void> {
    await this.repo.bulkPut(docs, { queue: true });
  }

  async dropOutbox(docIds: readonly string[]): Promise<void> {
    const entries = (await this.repo.listOutbox()).filter((e) => docIds.includes(e.docId));
    await this.repo.ackOutbox(entries);
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
    const docs = await this.getDocs([...byDoc.keys()]);
    const out: ConflictRecord[] = [];
    for (const [docId, records] of byDoc) {
      const local = docs.get(docId);
      if (!local) continue;
      const meta = await this.repo.getSyncMeta<Pick<ConflictRecord, 'kind' | 'baseRev' | 'deleteRevs'>>(
        KIND_KEY(docId),
      );
      out.push({
        docId,
        kind: meta?.kind ?? 'edit',
        baseRev: meta?.baseRev ?? records[0]!.rev,
        deleteRevs: meta?.deleteRevs ?? [],
        local,
        others: records.map((r) => ({ rev: r.rev, doc: r.doc })),
        detectedAt: records[0]!.keptAt,
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
    });
  }

  async deleteConflict(docId: string): Promise<void> {
    for (const r of await this.repo.listConflicts(docId)) await this.repo.dropConflict(r.id);
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
