/**
 * An in-memory local database with the same contract as the IndexedDB repository: used by the
 * sync tests (two "devices" are two instances), the import tests and the Node benchmarks.
 */

import type { BackupStore, KeyValue } from '../io/backup';
import type { BaseDoc, SiteDoc } from '../io/docs';
import type { ImportTarget } from '../io/import-commit';
import type { ConflictRecord, OutboxEntry, SyncStore } from './sync-store';

const clone = <T>(x: T): T => structuredClone(x);

export class MemorySyncStore implements SyncStore, ImportTarget, BackupStore {
  readonly docs = new Map<string, BaseDoc>();
  private readonly queue = new Map<string, OutboxEntry>();
  private readonly meta = new Map<string, unknown>();
  private readonly conflictMap = new Map<string, ConflictRecord>();
  private readonly settings = new Map<string, unknown>();
  private readonly layouts = new Map<string, unknown>();
  /** When set, the next bulkPut throws (to test all-or-nothing writes). */
  failNextWrite: Error | undefined;

  /** A change made on this device: stored and queued, like the app's repository does. */
  async putLocal(doc: BaseDoc): Promise<void> {
    this.docs.set(doc.id, clone(doc));
    this.queue.delete(doc.id);
    this.queue.set(doc.id, { docId: doc.id, updatedAt: doc.updatedAt });
  }

  async bulkPut(docs: BaseDoc[]): Promise<void> {
    if (this.failNextWrite) {
      const e = this.failNextWrite;
      this.failNextWrite = undefined;
      throw e;
    }
    for (const d of docs) await this.putLocal(d);
  }

  async existingIds(ids: readonly string[]): Promise<Set<string>> {
    return new Set(ids.filter((id) => this.docs.has(id)));
  }

  async listSites(): Promise<SiteDoc[]> {
    return [...this.docs.values()].filter((d): d is SiteDoc => d.type === 'site').map(clone);
  }

  async outbox(): Promise<OutboxEntry[]> {
    return [...this.queue.values()].map(clone);
  }
  async outboxCount(): Promise<number> {
    return this.queue.size;
  }
  async getDocs(ids: readonly string[]): Promise<Map<string, BaseDoc>> {
    const out = new Map<string, BaseDoc>();
    for (const id of ids) {
      const d = this.docs.get(id);
      if (d) out.set(id, clone(d));
    }
    return out;
  }
  async markPushed(rows: { docId: string; rev: string; updatedAt: string }[]): Promise<void> {
    for (const r of rows) {
      const d = this.docs.get(r.docId);
      if (!d) continue;
      d.rev = r.rev;
      if (d.updatedAt === r.updatedAt) this.queue.delete(r.docId);
    }
  }
  async applyRemote(docs: BaseDoc[]): Promise<void> {
    for (const d of docs) this.docs.set(d.id, clone(d));
  }
  async dropOutbox(docIds: readonly string[]): Promise<void> {
    for (const id of docIds) this.queue.delete(id);
  }
  async getMeta<T>(key: string): Promise<T | undefined> {
    return clone(this.meta.get(key)) as T | undefined;
  }
  async setMeta(key: string, value: unknown): Promise<void> {
    this.meta.set(key, clone(value));
  }
  async conflicts(): Promise<ConflictRecord[]> {
    return [...this.conflictMap.values()].map(clone);
  }
  async putConflict(c: ConflictRecord): Promise<void> {
    this.conflictMap.set(c.docId, clone(c));
  }
  async deleteConflict(docId: string): Promise<void> {
    this.conflictMap.delete(docId);
  }

  async allDocs(): Promise<BaseDoc[]> {
    return [...this.docs.values()].map(clone);
  }
  async allSettings(): Promise<KeyValue[]> {
    return [...this.settings].map(([key, value]) => ({ key, value: clone(value) }));
  }
  async allLayouts(): Promise<KeyValue[]> {
    return [...this.layouts].map(([key, value]) => ({ key, value: clone(value) }));
  }
  async putSettings(entries: KeyValue[]): Promise<void> {
    for (const e of entries) this.settings.set(e.key, clone(e.value));
  }
  async putLayouts(entries: KeyValue[]): Promise<void> {
    for (const e of entries) this.layouts.set(e.key, clone(e.value));
  }
}
