/**
 * Two-way sync of the local database with one CouchDB database.
 *
 * One run: pull (`_changes` from the checkpoint, in pages), then push the outbox (`_bulk_docs` in
 * batches, every response row checked). The checkpoint is kept locally and as a `_local` doc on
 * the server; when the two disagree (server database recreated, device restored) the pull starts
 * from 0, which is safe because applying a change twice is a no-op.
 *
 * Idempotent retries: a push whose answer was lost is sent again with the old `_rev` and meets a
 * 409; the engine then reads the server's doc and, if it holds exactly our content, takes its
 * revision as ours. Ids are our uuids, so nothing is ever created twice.
 *
 * Conflicts: a doc changed here and on the server (409 with other content, or a pulled change to a
 * doc still in the outbox), or a doc the server holds with `_conflicts`, becomes a
 * {@link ConflictRecord} with both versions. Nothing is overwritten or deleted until the user
 * picks one side or a merge (`resolve`); meanwhile the doc is not pushed.
 */

import type { Issue } from '../chem/errors';
import type { TufaDoc } from '../io/docs';
import type { CouchClient, CouchDoc } from './couch-client';
import { fromCouch, sameContent, toCouch } from './doc-codec';
import { rejectedDocIssue, SyncError } from './sync-issues';
import type { OtherVersion, SyncStore } from './sync-store';

export type SyncState = 'idle' | 'syncing' | 'waiting-to-retry' | 'error';

export interface SyncStatus {
  state: SyncState;
  /** ISO time of the last run that finished without error. */
  lastSyncAt: string | undefined;
  pending: number;
  conflicts: number;
  /** What went wrong last, in words; cleared by a good run. */
  error: Issue | undefined;
  /** Docs the server refused for good (validation, permission), with its reason. */
  rejected: Issue[];
  /** When waiting to retry: ISO time of the next attempt. */
  retryAt: string | undefined;
}

export interface SyncOptions {
  deviceId: string;
  pushBatch?: number;
  pullLimit?: number;
  maxAttempts?: number;
  baseDelayMs?: number;
  maxDelayMs?: number;
  sleep?: (ms: number) => Promise<void>;
  now?: () => Date;
  random?: () => number;
  /** Team servers: the signed-in user, stamped as `changed_by` (and `created_by` on new docs). */
  author?: string;
  /**
   * Partial sync: pull only the docs this Mango selector matches (filtered `_changes`), e.g.
   * `pullSelector(siteIds)` from `./partial-sync.ts`. A new selector starts a new checkpoint.
   */
  pullSelector?: Record<string, unknown> | null;
}

export interface SyncRunResult {
  pushed: number;
  pulled: number;
  conflicts: number;
  attempts: number;
}

const CHECKPOINT = 'pull-checkpoint';
const LAST_SYNC = 'last-sync-at';

export class SyncEngine {
  private running: Promise<SyncRunResult> | undefined;
  private listeners = new Set<(s: SyncStatus) => void>();
  private status: SyncStatus = {
    state: 'idle',
    lastSyncAt: undefined,
    pending: 0,
    conflicts: 0,
    error: undefined,
    rejected: [],
    retryAt: undefined,
  };
  private readonly o: Required<SyncOptions>;

  constructor(
    private readonly store: SyncStore,
    private readonly client: CouchClient,
    options: SyncOptions,
  ) {
    this.o = {
      pushBatch: 200,
      pullLimit: 500,
      maxAttempts: 6,
      baseDelayMs: 1000,
      maxDelayMs: 60000,
      sleep: (ms) => new Promise((r) => setTimeout(r, ms)),
      now: () => new Date(),
      random: Math.random,
      author: '',
      pullSelector: null,
      ...options,
    };
  }

  subscribe(fn: (s: SyncStatus) => void): () => void {
    this.listeners.add(fn);
    fn(this.status);
    return () => this.listeners.delete(fn);
  }

  getStatus(): SyncStatus {
    return this.status;
  }

  private set(patch: Partial<SyncStatus>): void {
    this.status = { ...this.status, ...patch };
    for (const l of this.listeners) l(this.status);
  }

  /** Reads pending and conflict counts and the last sync time from the store. */
  async refreshStatus(): Promise<SyncStatus> {
    const [pending, conflicts, lastSyncAt] = await Promise.all([
      this.store.outboxCount(),
      this.store.conflicts(),
      this.store.getMeta<string>(LAST_SYNC),
    ]);
    this.set({ pending, conflicts: conflicts.length, lastSyncAt });
    return this.status;
  }

  /** Runs one sync with retries; calls while one runs share it (no double pushes). */
  sync(): Promise<SyncRunResult> {
    this.running ??= this.runWithRetry().finally(() => {
      this.running = undefined;
    });
    return this.running;
  }

  private delayFor(attempt: number): number {
    const exp = Math.min(this.o.maxDelayMs, this.o.baseDelayMs * 2 ** attempt);
    return Math.round(exp * (0.5 + this.o.random() / 2)); // jitter so devices do not retry in step
  }

  private async runWithRetry(): Promise<SyncRunResult> {
    const total: SyncRunResult = { pushed: 0, pulled: 0, conflicts: 0, attempts: 0 };
    this.set({ state: 'syncing', rejected: [], retryAt: undefined });
    for (let attempt = 0; ; attempt++) {
      total.attempts = attempt + 1;
      try {
        await this.pull(total);
        await this.push(total);
        const at = this.o.now().toISOString();
        await this.store.setMeta(LAST_SYNC, at);
        await this.refreshStatus();
        this.set({ state: 'idle', error: undefined, lastSyncAt: at, retryAt: undefined });
        return total;
      } catch (e) {
        const err =
          e instanceof SyncError
            ? e
            : new SyncError(
                'sync-bad-response',
                `Sync stopped: ${e instanceof Error ? e.message : String(e)}`,
                false,
              );
        await this.refreshStatus().catch(() => undefined);
        if (!err.retryable || attempt + 1 >= this.o.maxAttempts) {
          this.set({ state: 'error', error: err.toIssue(), retryAt: undefined });
          throw err;
        }
        const wait = this.delayFor(attempt);
        this.set({
          state: 'waiting-to-retry',
          error: err.toIssue(),
          retryAt: new Date(this.o.now().getTime() + wait).toISOString(),
        });
        await this.o.sleep(wait);
        this.set({ state: 'syncing' });
      }
    }
  }

  private checkpointName(): string {
    return `tufa-pull-${this.o.deviceId}`;
  }

  /**
   * Where to pull from. The local checkpoint counts only if the server's `_local` copy agrees.
   * If this device has synced before but the server has no checkpoint of it at all, the server
   * database was recreated or restored: everything local is queued again (pushes are idempotent).
   */
  private async startSeq(): Promise<string | number> {
    const local = await this.store.getMeta<string | number>(this.checkpointKey());
    if (local === undefined) return 0;
    const remote = await this.client.getLocal<{ last_seq?: string | number }>(this.checkpointName());
    if (!remote) {
      await this.store.queueAll();
      return 0;
    }
    return String(remote.last_seq) === String(local) ? local : 0;
  }

  private checkpointKey(): string {
    const sel = this.o.pullSelector;
    return sel ? `${CHECKPOINT}:${JSON.stringify(sel)}` : CHECKPOINT;
  }

  private async pull(total: SyncRunResult): Promise<void> {
    let since = await this.startSeq();
    for (;;) {
      const page = await this.client.changes(since, this.o.pullLimit, this.o.pullSelector ?? undefined);
      const docs = page.results.flatMap((r) => (r.doc && !r.id.startsWith('_design/') ? [r.doc] : []));
      if (docs.length > 0) await this.applyPulled(docs, total);
      since = page.last_seq;
      // Server copy first: a device checkpoint without one would look like a server reset.
      await this.client.putLocal(this.checkpointName(), { last_seq: since, device: this.o.deviceId });
      await this.store.setMeta(this.checkpointKey(), since);
      if (page.results.length < this.o.pullLimit) return;
    }
  }

  private async applyPulled(remoteDocs: CouchDoc[], total: SyncRunResult): Promise<void> {
    const ids = remoteDocs.map((d) => d._id);
    const [local, queue, open] = await Promise.all([
      this.store.getDocs(ids),
      this.store.outbox(),
      this.store.conflicts(),
    ]);
    const queued = new Set(queue.map((e) => e.docId));
    const conflicted = new Map(open.map((c) => [c.docId, c]));
    const now = this.o.now();
    const apply: TufaDoc[] = [];
    const seen = new Map<string, string | undefined>();
    const confirmed: { docId: string; rev: string; updatedAt: string }[] = [];
    const serverBranches: CouchDoc[] = [];
    const edits: { mine: TufaDoc; theirs: TufaDoc }[] = [];
    for (const rd of remoteDocs) {
      const mine = local.get(rd._id);
      const theirs = fromCouch(rd, mine, now);
      if (!theirs || !rd._rev) continue;
      if (rd._conflicts?.length) serverBranches.push(rd);
      if (mine?.rev === rd._rev) continue; // our own write coming back
      if ((queued.has(rd._id) || conflicted.has(rd._id)) && mine) {
        if (sameContent(mine, theirs))
          confirmed.push({ docId: rd._id, rev: rd._rev, updatedAt: mine.updatedAt });
        else edits.push({ mine, theirs });
        continue;
      }
      apply.push(theirs);
      seen.set(rd._id, mine?.updatedAt);
    }
    if (confirmed.length) await this.store.markPushed(confirmed);
    const changedMeanwhile = new Set(apply.length ? await this.store.applyRemote(apply, seen) : []);
    total.pulled += apply.length - changedMeanwhile.size;
    if (changedMeanwhile.size) {
      const now2 = await this.store.getDocs([...changedMeanwhile]);
      for (const d of apply) {
        const mine = now2.get(d.id);
        if (changedMeanwhile.has(d.id) && mine) edits.push({ mine, theirs: d });
      }
    }
    const editById = new Map(edits.map((e) => [e.mine.id, e]));
    for (const { mine, theirs } of edits) {
      if (serverBranches.some((b) => b._id === mine.id)) continue;
      await this.store.putConflict({
        docId: mine.id,
        kind: 'edit',
        local: mine,
        others: [{ rev: theirs.rev!, doc: theirs }],
        baseRev: theirs.rev,
        deleteRevs: [],
        detectedAt: now.toISOString(),
      });
      total.conflicts++;
    }
    for (const rd of serverBranches) {
      if (await this.recordServerConflict(rd, editById.get(rd._id)?.mine)) total.conflicts++;
    }
  }

  /**
   * Reads every losing branch from the server so the user sees exactly what each one holds. When
   * this device also changed the doc, its version is `local` and the server's winner is one more
   * "other" version.
   */
  private async recordServerConflict(winner: CouchDoc, pendingMine: TufaDoc | undefined): Promise<boolean> {
    const current = pendingMine ?? (await this.store.getDocs([winner._id])).get(winner._id);
    if (!current || !winner._rev) return false;
    const now = this.o.now();
    const others: OtherVersion[] = [];
    if (pendingMine) {
      const w = fromCouch(winner, current, now);
      if (w) others.push({ rev: winner._rev, doc: w });
    }
    for (const rev of winner._conflicts ?? []) {
      const loser = await this.client.getDoc(winner._id, rev);
      const doc = loser && fromCouch(loser, current, now);
      if (doc) others.push({ rev, doc });
    }
    if (others.length === 0) return false;
    await this.store.putConflict({
      docId: winner._id,
      kind: 'server',
      local: current,
      others,
      baseRev: winner._rev,
      deleteRevs: winner._conflicts ?? [],
      detectedAt: now.toISOString(),
    });
    return true;
  }

  private async push(total: SyncRunResult): Promise<void> {
    const open = new Set((await this.store.conflicts()).map((c) => c.docId));
    const entries = (await this.store.outbox()).filter((e) => !open.has(e.docId));
    const rejected: Issue[] = [];
    for (let i = 0; i < entries.length; i += this.o.pushBatch) {
      const batch = entries.slice(i, i + this.o.pushBatch);
      const docs = await this.store.getDocs(batch.map((e) => e.docId));
      const gone = batch.filter((e) => !docs.has(e.docId)).map((e) => e.docId);
      if (gone.length) await this.store.dropOutbox(gone);
      const sent = [...docs.values()];
      if (sent.length === 0) continue;
      const rows = await this.client.bulkDocs(sent.map((d) => toCouch(d, this.o.author)));
      const byId = new Map(rows.map((r) => [r.id, r]));
      const ok: { docId: string; rev: string; updatedAt: string }[] = [];
      const missing: string[] = [];
      const fresh: TufaDoc[] = [];
      for (const d of sent) {
        const row = byId.get(d.id);
        if (!row) {
          missing.push(d.id);
        } else if (row.error === undefined && row.rev) {
          ok.push({ docId: d.id, rev: row.rev, updatedAt: d.updatedAt });
        } else if (row.error === 'conflict') {
          const server = await this.client.getDoc(d.id);
          if (server && sameContent(server, toCouch(d, this.o.author))) {
            ok.push({ docId: d.id, rev: server._rev!, updatedAt: d.updatedAt }); // our earlier write, answer lost
          } else if (!server) {
            // Not readable: deleted on the server (a tombstone leaf) or never there (database recreated).
            const leaves = await this.client.leafRevs(d.id);
            const tomb = leaves.find((l) => l._deleted && l._rev);
            if (leaves.length === 0) fresh.push(d);
            else if (tomb?._rev) {
              await this.store.putConflict({
                docId: d.id,
                kind: 'edit',
                local: d,
                others: [{ rev: tomb._rev, doc: { ...d, deleted: true, rev: tomb._rev } }],
                baseRev: tomb._rev,
                deleteRevs: [],
                detectedAt: this.o.now().toISOString(),
              });
              total.conflicts++;
            }
          } else {
            const theirs = fromCouch(server, d, this.o.now());
            if (theirs && server._rev) {
              await this.store.putConflict({
                docId: d.id,
                kind: 'edit',
                local: d,
                others: [{ rev: server._rev, doc: theirs }],
                baseRev: server._rev,
                deleteRevs: [],
                detectedAt: this.o.now().toISOString(),
              });
              total.conflicts++;
            }
          }
        } else {
          rejected.push(rejectedDocIssue(d.type, d.id, row.error, row.reason));
        }
      }
      if (fresh.length) {
        // The server has no trace of these: send them as new documents.
        const again = await this.client.bulkDocs(
          fresh.map((d) => toCouch({ ...d, rev: undefined } as TufaDoc, this.o.author)),
        );
        for (const r of again) {
          const d = fresh.find((x) => x.id === r.id);
          if (d && r.rev && r.error === undefined)
            ok.push({ docId: d.id, rev: r.rev, updatedAt: d.updatedAt });
        }
      }
      if (ok.length) await this.store.markPushed(ok);
      total.pushed += ok.length;
      if (missing.length) {
        throw new SyncError(
          'sync-bad-response',
          `The server's answer left out ${missing.length} of the documents sent; Tufa will try again.`,
          true,
        );
      }
      this.set({ pending: await this.store.outboxCount() });
    }
    if (rejected.length) this.set({ rejected });
  }

  /**
   * Ends a conflict with the user's choice: the version this device shows (`local`), one of the
   * other versions (by its revision), or a merged doc. The choice is stored here first and queued,
   * as a new revision on top of the server's head, so nothing is lost if the device goes offline
   * now; then, for a `server` conflict, the losing branches are removed from the server.
   */
  async resolve(docId: string, choice: 'local' | { rev: string } | { merged: TufaDoc }): Promise<void> {
    const c = (await this.store.conflicts()).find((x) => x.docId === docId);
    if (!c) return;
    const now = this.o.now().toISOString();
    const picked =
      choice === 'local'
        ? c.local
        : 'rev' in choice
          ? c.others.find((o) => o.rev === choice.rev)?.doc
          : choice.merged;
    if (!picked) return;
    if (choice !== 'local' && 'rev' in choice && choice.rev === c.baseRev && c.deleteRevs.length === 0) {
      // The server's version as it is: nothing to push.
      await this.store.applyRemote([{ ...picked, rev: choice.rev }]);
      await this.store.dropOutbox([docId]);
    } else {
      const doc = { ...picked, id: docId, updatedAt: now } as TufaDoc;
      if (c.baseRev === undefined) delete doc.rev;
      else doc.rev = c.baseRev;
      await this.store.putLocal(doc);
    }
    for (const rev of c.deleteRevs) await this.client.deleteRev(docId, rev);
    await this.store.deleteConflict(docId);
    await this.refreshStatus();
  }
}
