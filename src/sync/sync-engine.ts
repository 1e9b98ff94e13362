/**
 * Two-way sync of the local database with one CouchDB database.
 *
 * One run: pull (`_changes` from the checkpoint in pages of ids and revisions, then `_all_docs`
 * for the docs this device does not hold at that revision), then push the outbox (`push.ts`).
 * Push runs even when the pull fails, so local changes always leave the device. A pulled doc that
 * cannot be stored (invalid, or a type change) is set aside (`quarantine.ts`) and the rest of the
 * page applied; the rules per doc are in `pull-plan.ts`. A feed that repeats its `last_seq` on
 * full pages stops with `sync-no-progress`. The checkpoint is kept locally and as a `_local` doc on
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
import { TufaError } from '../chem/errors';
import type { TufaDoc } from '../io/docs';
import type { ChangesRow, CouchClient, CouchDoc } from './couch-client';
import { fromCouch } from './doc-codec';
import { planPulled, whyUnusable } from './pull-plan';
import { pushOutbox } from './push';
import { asJsonText, keepSetAside, listSetAside, type SetAsideDoc, setAsideIssue } from './quarantine';
import { heldIds, type RefusedChoice, settleRefused } from './refused';
import { SyncError } from './sync-issues';
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
  /** Docs from the server set aside (invalid, type change), kept on this device for inspection. */
  setAside: Issue[];
  /** When waiting to retry: ISO time of the next attempt. */
  retryAt: string | undefined;
}

export interface SyncOptions {
  deviceId: string;
  pushBatch?: number;
  pullLimit?: number;
  maxAttempts?: number;
  /** Pages of changes one run reads at most (a bound against a server that never ends the feed). */
  maxPullPages?: number;
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

/** Anything caught during a run as a coded error in words; raw JavaScript text never reaches the screen. */
function asSyncError(e: unknown): SyncError {
  if (e instanceof SyncError) return e;
  if (e instanceof TufaError) return new SyncError('sync-internal', `Sync stopped: ${e.message}`, false);
  return new SyncError(
    'sync-internal',
    'Sync stopped on something Tufa did not expect; the data on this device is untouched. Try again later, and report it if it stays.',
    false,
  );
}
const LAST_SYNC = 'last-sync-at';

export class SyncEngine {
  private running: Promise<SyncRunResult> | undefined;
  /** Revisions this engine pushed and has not yet seen come back in a pull. */
  private readonly pushedRevs = new Map<string, string>();
  private listeners = new Set<(s: SyncStatus) => void>();
  private status: SyncStatus = {
    state: 'idle',
    lastSyncAt: undefined,
    pending: 0,
    conflicts: 0,
    error: undefined,
    rejected: [],
    setAside: [],
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
      pullLimit: 1000,
      maxAttempts: 6,
      maxPullPages: 2000,
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
    const [pending, conflicts, lastSyncAt, aside] = await Promise.all([
      this.store.outboxCount(),
      this.store.conflicts(),
      this.store.getMeta<string>(LAST_SYNC),
      listSetAside(this.store),
    ]);
    this.set({ pending, conflicts: conflicts.length, lastSyncAt, setAside: aside.map(setAsideIssue) });
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
        // Pull first (conflicts are seen before pushing), but a pull that fails must not keep
        // this device's changes from leaving it: push anyway, then report the pull's failure.
        let pullFailure: unknown;
        try {
          await this.pull(total);
        } catch (e) {
          pullFailure = e;
        }
        await pushOutbox(
          {
            store: this.store,
            client: this.client,
            pushBatch: this.o.pushBatch,
            now: this.o.now,
            author: this.o.author,
            pushedRevs: this.pushedRevs,
            putAside: (d) => this.putAside(d),
            unusableOther: (a, b, c) => this.unusableOther(a, b, c),
            set: (p) => this.set(p),
          },
          total,
        );
        if (pullFailure !== undefined) throw pullFailure;
        const at = this.o.now().toISOString();
        await this.store.setMeta(LAST_SYNC, at);
        await this.refreshStatus();
        this.set({ state: 'idle', error: undefined, lastSyncAt: at, retryAt: undefined });
        return total;
      } catch (e) {
        const err = asSyncError(e);
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
    const visited = new Set([String(since)]);
    for (let pages = 1; ; pages++) {
      const page = await this.client.changes(since, this.o.pullLimit, this.o.pullSelector ?? undefined);
      if (page.badRows.length) {
        await this.putAside(
          page.badRows.map((reason, i) => ({
            docId: `(row without id, page ${pages}, ${i + 1})`,
            rev: undefined,
            code: 'sync-doc-invalid' as const,
            reason,
            json: '',
            at: this.o.now().toISOString(),
          })),
        );
      }
      const fetched = await this.applyChanges(page.results, total);
      const full = page.results.length + page.badRows.length >= this.o.pullLimit;
      const next = page.last_seq;
      if (full && visited.has(String(next))) {
        throw new SyncError(
          'sync-no-progress',
          `The server keeps sending full pages of changes without moving on (still at "${String(next).slice(0, 40)}"); sync stopped to save battery and data. Sending your changes still works; check the server.`,
          false,
        );
      }
      visited.add(String(next));
      since = next;
      // Saved after every page that brought docs, every 10th page and at the end: pages of our
      // own pushes coming back cost a read here and are cheap to read again after a crash.
      if (fetched > 0 || !full || pages % 10 === 0) {
        // Server copy first: a device checkpoint without one would look like a server reset.
        await this.client.putLocal(this.checkpointName(), { last_seq: since, device: this.o.deviceId });
        await this.store.setMeta(this.checkpointKey(), since);
      }
      if (!full) return;
      if (pages >= this.o.maxPullPages) {
        throw new SyncError(
          'sync-no-progress',
          `Stopped after ${pages} pages of changes in one run; the next sync goes on from here.`,
          false,
        );
      }
    }
  }

  /**
   * One page of changes: ids and leaf revisions only. Docs this device already holds at that
   * revision (its own pushes above all) are not downloaded; the rest come in one `_all_docs`.
   */
  private async applyChanges(rows: ChangesRow[], total: SyncRunResult): Promise<number> {
    const ours = rows.filter((r) => {
      if (r.id.startsWith('_')) return false;
      // This device's own push coming back: known without reading the store.
      if (r.changes.length === 1 && this.pushedRevs.get(r.id) === r.changes[0]!.rev) {
        this.pushedRevs.delete(r.id);
        return false;
      }
      return true;
    });
    if (ours.length === 0) return 0;
    const local = await this.store.getDocs(ours.map((r) => r.id));
    const needed = ours.filter(
      (r) => !(r.changes.length === 1 && local.get(r.id)?.rev === r.changes[0]!.rev),
    );
    if (needed.length === 0) return 0;
    const fetched = await this.client.getDocs(needed.filter((r) => !r.doc).map((r) => r.id));
    const docs = needed.flatMap((r) => {
      const d = r.doc ?? fetched.get(r.id);
      return d ? [d] : [];
    });
    if (docs.length) await this.applyPulled(docs, local, total);
    return needed.length;
  }

  /** A server version that cannot stand beside `mine` in a conflict (invalid, or another type), as a set-aside record. */
  private unusableOther(server: CouchDoc, mine: TufaDoc, theirs: TufaDoc): SetAsideDoc | undefined {
    const why = whyUnusable(theirs);
    const typeChange = !why && theirs.type !== mine.type;
    if (!why && !typeChange) return undefined;
    return {
      docId: server._id,
      rev: server._rev,
      code: why ? 'sync-doc-invalid' : 'sync-type-change',
      reason: why ?? `it would turn the ${mine.type} with this id into a ${theirs.type}`,
      json: asJsonText(server),
      at: this.o.now().toISOString(),
    };
  }

  private async putAside(docs: SetAsideDoc[]): Promise<void> {
    const added = await keepSetAside(this.store, docs);
    if (added.length) this.set({ setAside: [...this.status.setAside, ...added.map(setAsideIssue)] });
  }

  private async applyPulled(
    remoteDocs: CouchDoc[],
    local: Map<string, TufaDoc>,
    total: SyncRunResult,
  ): Promise<void> {
    const [queue, open, held] = await Promise.all([
      this.store.outbox(),
      this.store.conflicts(),
      heldIds(this.store),
    ]);
    const pendingIds = new Set([...queue.map((e) => e.docId), ...open.map((c) => c.docId)]);
    const refusedWhy = new Map(open.filter((c) => c.kind === 'refused').map((c) => [c.docId, c.reason]));
    // A doc kept on this device only is as unsent as a queued one: a server change to it is a conflict.
    const isPending = (id: string) =>
      pendingIds.has(id) || (held.has(id) && held.get(id) === local.get(id)?.updatedAt);
    const now = this.o.now();
    const { apply, seen, confirmed, edits, serverBranches, setAside } = planPulled(
      remoteDocs,
      local,
      isPending,
      now,
    );
    await this.putAside(setAside);
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
    const branched = new Set(serverBranches.map((b) => b._id));
    for (const { mine, theirs } of edits) {
      if (branched.has(mine.id)) continue;
      const refused = refusedWhy.has(mine.id); // still refused; the server's newer version beside it
      const reason = refusedWhy.get(mine.id);
      await this.store.putConflict({
        docId: mine.id,
        kind: refused ? 'refused' : 'edit',
        ...(reason === undefined ? {} : { reason }),
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
      const unusable = w && this.unusableOther(winner, current, w);
      if (unusable) await this.putAside([unusable]);
      else if (w) others.push({ rev: winner._rev, doc: w });
    }
    for (const rev of winner._conflicts ?? []) {
      const loser = await this.client.getDoc(winner._id, rev);
      const doc = loser && fromCouch(loser, current, now);
      const unusable = doc && this.unusableOther(loser, current, doc);
      if (unusable) await this.putAside([unusable]);
      else if (doc) others.push({ rev, doc });
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

  /** Ends a `refused` conflict with the user's choice (`refused.ts`); false if that choice is not possible. */
  async settleRefused(docId: string, choice: RefusedChoice): Promise<boolean> {
    const c = (await this.store.conflicts()).find((x) => x.docId === docId && x.kind === 'refused');
    const done = c ? await settleRefused(this.store, c, choice) : false;
    await this.refreshStatus();
    return done;
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
      // Newer than every version in the conflict, whatever the clocks say: other devices then
      // take the resolution as an edit on top of what they hold, not as a conflicting rewrite.
      const after = [c.local, ...c.others.map((o) => o.doc)].map((d) => Date.parse(d.updatedAt) + 1);
      const at = new Date(Math.max(Date.parse(now), ...after.filter(Number.isFinite))).toISOString();
      const doc = { ...picked, id: docId, updatedAt: at } as TufaDoc;
      if (c.baseRev === undefined) delete doc.rev;
      else doc.rev = c.baseRev;
      await this.store.putLocal(doc);
    }
    for (const rev of c.deleteRevs) await this.client.deleteRev(docId, rev);
    await this.store.deleteConflict(docId);
    await this.refreshStatus();
  }
}
