/**
 * The push half of a sync run: the outbox to the server in `_bulk_docs` batches, every answer row
 * checked, revisions recorded, 409s sorted into "already there", "send again as new" and
 * conflicts. The engine (`sync-engine.ts`) runs it after the pull.
 */

import type { Issue } from '../chem/errors';
import type { TufaDoc } from '../io/docs';
import type { CouchClient, CouchDoc } from './couch-client';
import { fromCouch, sameContent, toCouch } from './doc-codec';
import type { SetAsideDoc } from './quarantine';
import { keepRefused } from './refused';
import type { SyncRunResult, SyncStatus } from './sync-engine';
import { rejectedDocIssue, SyncError, syncIssue } from './sync-issues';
import type { SyncStore } from './sync-store';

export interface PushContext {
  store: SyncStore;
  client: CouchClient;
  pushBatch: number;
  now: () => Date;
  /** The signed-in user, stamped as `created_by` / `changed_by` (team servers check them). */
  author?: string | undefined;
  /** Revisions pushed in this session, so the next pull can skip them without a store read. */
  pushedRevs: Map<string, string>;
  putAside(docs: SetAsideDoc[]): Promise<void>;
  unusableOther(server: CouchDoc, mine: TufaDoc, theirs: TufaDoc): SetAsideDoc | undefined;
  set(patch: Partial<SyncStatus>): void;
}

type Pushed = { docId: string; rev: string; updatedAt: string; type: 'site' | 'reading' };

/** Sites first, then readings by site and time: the order the store keeps them in. */
function pageOrder(a: TufaDoc, b: TufaDoc): number {
  if (a.type !== b.type) return a.type === 'site' ? -1 : 1;
  if (a.type === 'reading' && b.type === 'reading') {
    if (a.siteId !== b.siteId) return a.siteId < b.siteId ? -1 : 1;
    if (a.takenAt !== b.takenAt) return a.takenAt < b.takenAt ? -1 : 1;
  }
  return a.id < b.id ? -1 : a.id > b.id ? 1 : 0;
}

/**
 * Pushes the outbox: docs read in chunks (one read per chunk), sent in page order (sites first,
 * then readings by site and time, so recording touches few reading pages), in `_bulk_docs`
 * batches; the revisions the server gave are recorded in the background while the next batch
 * is on the wire, a few batches at a time. A crash before recording only means those docs meet
 * a 409 next time and are recognised as already there (one `_all_docs` per batch).
 */
export async function pushOutbox(ctx: PushContext, total: SyncRunResult): Promise<void> {
  const open = new Set((await ctx.store.conflicts()).map((c) => c.docId));
  const entries = (await ctx.store.outbox()).filter((e) => !open.has(e.docId));
  const rejected: Issue[] = [];
  let pending = entries.length;
  let unrecorded: Pushed[] = [];
  let recording: Promise<void> = Promise.resolve();
  const flush = async () => {
    const rows = unrecorded;
    unrecorded = [];
    await recording;
    recording = rows.length ? ctx.store.markPushed(rows) : Promise.resolve();
  };
  const chunk = ctx.pushBatch * 40;
  try {
    for (let c = 0; c < entries.length; c += chunk) {
      const ids = entries.slice(c, c + chunk).map((e) => e.docId);
      const found = await ctx.store.getDocs(ids);
      const gone = ids.filter((id) => !found.has(id));
      if (gone.length) await ctx.store.dropOutbox(gone);
      const docs = [...found.values()].sort(pageOrder);
      for (let i = 0; i < docs.length; i += ctx.pushBatch) {
        const sent = docs.slice(i, i + ctx.pushBatch);
        const ok = await pushBatch(ctx, sent, total, rejected);
        unrecorded.push(...ok);
        for (const p of ok) ctx.pushedRevs.set(p.docId, p.rev);
        total.pushed += ok.length;
        pending -= ok.length;
        if (unrecorded.length >= ctx.pushBatch * 10) await flush();
        ctx.set({ pending: Math.max(0, pending) });
      }
    }
  } finally {
    await flush();
    await recording;
  }
  if (rejected.length) ctx.set({ rejected });
}

/** One `_bulk_docs` batch; returns what the server now holds as ours. */
async function pushBatch(
  ctx: PushContext,
  sent: TufaDoc[],
  total: SyncRunResult,
  rejected: Issue[],
): Promise<Pushed[]> {
  const rows = await ctx.client.bulkDocs(sent.map((d) => toCouch(d, ctx.author)));
  const byId = new Map(rows.map((r) => [r.id, r]));
  const ok: Pushed[] = [];
  const missing: string[] = [];
  const fresh: TufaDoc[] = [];
  const refused: { doc: TufaDoc; reason: string | undefined }[] = [];
  const clashing = sent.filter((d) => byId.get(d.id)?.error === 'conflict').map((d) => d.id);
  const onServer = clashing.length ? await ctx.client.getDocs(clashing) : new Map<string, CouchDoc>();
  for (const d of sent) {
    const row = byId.get(d.id);
    if (!row) {
      missing.push(d.id);
    } else if (row.error === undefined && row.rev) {
      ok.push({ docId: d.id, rev: row.rev, updatedAt: d.updatedAt, type: d.type });
    } else if (row.error === 'conflict') {
      const got = onServer.get(d.id);
      const server = got && !got._deleted ? got : undefined;
      if (server && sameContent(server, toCouch(d, ctx.author))) {
        ok.push({ docId: d.id, rev: server._rev!, updatedAt: d.updatedAt, type: d.type }); // our earlier write, answer lost
      } else if (!server) {
        // Not readable: deleted on the server (a tombstone leaf) or never there (database recreated).
        const leaves = got ? await ctx.client.leafRevs(d.id) : [];
        const tomb = leaves.find((l) => l._deleted && l._rev);
        if (leaves.length === 0) fresh.push(d);
        else if (tomb?._rev) {
          await ctx.store.putConflict({
            docId: d.id,
            kind: 'edit',
            local: d,
            others: [{ rev: tomb._rev, doc: { ...d, deleted: true, rev: tomb._rev } }],
            baseRev: tomb._rev,
            deleteRevs: [],
            detectedAt: ctx.now().toISOString(),
          });
          total.conflicts++;
        }
      } else {
        const theirs = fromCouch(server, d, ctx.now());
        const unusable = theirs && ctx.unusableOther(server, d, theirs);
        if (unusable) {
          await ctx.putAside([unusable]);
          rejected.push(
            syncIssue(
              unusable.code,
              `${d.type} ${d.id} cannot be sent: the server holds a document under its id that Tufa cannot use (${unusable.reason}). It stays on this device.`,
            ),
          );
        } else if (theirs && server._rev) {
          await ctx.store.putConflict({
            docId: d.id,
            kind: 'edit',
            local: d,
            others: [{ rev: server._rev, doc: theirs }],
            baseRev: server._rev,
            deleteRevs: [],
            detectedAt: ctx.now().toISOString(),
          });
          total.conflicts++;
        }
      }
    } else {
      if (row.error === 'forbidden' || row.error === 'unauthorized')
        refused.push({ doc: d, reason: row.reason });
      rejected.push(rejectedDocIssue(d.type, d.id, row.error, row.reason));
    }
  }
  // Refused by the server's rules: kept as conflicts beside the server's version, out of the outbox.
  await keepRefused(ctx, refused);
  total.conflicts += refused.length;
  if (fresh.length) {
    // The server has no trace of these: send them as new documents.
    const again = await ctx.client.bulkDocs(
      fresh.map((d) => toCouch({ ...d, rev: undefined } as TufaDoc, ctx.author)),
    );
    for (const r of again) {
      const d = fresh.find((x) => x.id === r.id);
      if (d && r.rev && r.error === undefined)
        ok.push({ docId: d.id, rev: r.rev, updatedAt: d.updatedAt, type: d.type });
    }
  }
  if (missing.length) {
    // Record what did arrive first: the retry then finds those as already there.
    await ctx.store.markPushed(ok);
    throw new SyncError(
      'sync-bad-response',
      `The server's answer left out ${missing.length} of the documents sent; Tufa will try again.`,
      true,
    );
  }
  return ok;
}
