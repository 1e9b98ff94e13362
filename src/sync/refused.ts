/**
 * Changes the server refused (its rules: role, authorship, document shape; HTTP 403 rows in
 * `_bulk_docs`). A refused change becomes a `refused` conflict beside the server's current
 * version, and leaves the outbox while the conflict is open, so it is not sent again at every
 * sync. The user then takes the server's version, keeps theirs on this device only (unsent,
 * listed as such), or sends it again later. The local version is never overwritten by anything
 * but the user's own choice.
 */

import type { TufaDoc } from '../io/docs';
import type { CouchClient, CouchDoc } from './couch-client';
import { fromCouch } from './doc-codec';
import type { SetAsideDoc } from './quarantine';
import type { ConflictRecord, SyncStore } from './sync-store';

/** Docs kept on this device only, by id, with the `updatedAt` of the version kept. */
const HELD = 'held-here';

export type RefusedChoice = 'server' | 'here' | 'retry';

export interface RefusedContext {
  store: SyncStore;
  client: CouchClient;
  now: () => Date;
  putAside(docs: SetAsideDoc[]): Promise<void>;
  unusableOther(server: CouchDoc, mine: TufaDoc, theirs: TufaDoc): SetAsideDoc | undefined;
}

/** Records each refused change as a `refused` conflict with the server's current version, if any. */
export async function keepRefused(
  ctx: RefusedContext,
  refused: { doc: TufaDoc; reason: string | undefined }[],
): Promise<void> {
  if (refused.length === 0) return;
  const onServer = await ctx.client.getDocs(refused.map((r) => r.doc.id));
  const at = ctx.now();
  for (const { doc, reason } of refused) {
    const got = onServer.get(doc.id);
    const server = got && !got._deleted && got._rev ? got : undefined;
    const theirs = server && fromCouch(server, doc, at);
    const unusable = server && theirs && ctx.unusableOther(server, doc, theirs);
    if (unusable) await ctx.putAside([unusable]);
    await ctx.store.putConflict({
      docId: doc.id,
      kind: 'refused',
      ...(reason === undefined ? {} : { reason }),
      local: doc,
      others: server && theirs && !unusable ? [{ rev: server._rev!, doc: theirs }] : [],
      baseRev: server?._rev ?? doc.rev,
      deleteRevs: [],
      detectedAt: at.toISOString(),
    });
  }
  await ctx.store.dropOutbox(refused.map((r) => r.doc.id));
  await unhold(
    ctx.store,
    refused.map((r) => r.doc.id),
  );
}

/**
 * Ends a `refused` conflict with the user's choice. `server`: the server's version replaces the
 * local one (not possible when the server has none; returns false). `here`: the local version
 * stays, unsent, listed by {@link heldHere}. `retry`: back into the outbox, sent at the next sync.
 */
export async function settleRefused(
  store: SyncStore,
  c: ConflictRecord,
  choice: RefusedChoice,
): Promise<boolean> {
  if (choice === 'server') {
    const theirs = c.others[0];
    if (!theirs) return false;
    await store.applyRemote([{ ...theirs.doc, rev: theirs.rev } as TufaDoc]);
    await store.dropOutbox([c.docId]);
    await unhold(store, [c.docId]);
  } else if (choice === 'here') {
    await store.dropOutbox([c.docId]); // an edit made while the conflict was open stays here too
    const held = (await store.getMeta<Record<string, string>>(HELD)) ?? {};
    await store.setMeta(HELD, { ...held, [c.docId]: c.local.updatedAt });
  } else {
    await store.putLocal(c.local);
    await unhold(store, [c.docId]);
  }
  await store.deleteConflict(c.docId);
  return true;
}

/** Sends a doc kept on this device only again (queued for the next sync). */
export async function sendHeld(store: SyncStore, docId: string): Promise<void> {
  const doc = (await store.getDocs([docId])).get(docId);
  if (doc) await store.putLocal(doc);
  await unhold(store, [docId]);
}

/** Ids of docs kept on this device only, with the `updatedAt` of the version kept. */
export async function heldIds(store: SyncStore): Promise<Map<string, string>> {
  return new Map(Object.entries((await store.getMeta<Record<string, string>>(HELD)) ?? {}));
}

/**
 * Docs kept on this device only, as they are now. A doc edited since (a new change, queued
 * again) is no longer held and leaves the list.
 */
export async function heldHere(store: SyncStore): Promise<TufaDoc[]> {
  const held = await heldIds(store);
  if (held.size === 0) return [];
  const docs = await store.getDocs([...held.keys()]);
  const still = [...docs.values()].filter((d) => held.get(d.id) === d.updatedAt);
  if (still.length < held.size)
    await store.setMeta(HELD, Object.fromEntries(still.map((d) => [d.id, d.updatedAt])));
  return still;
}

async function unhold(store: SyncStore, ids: readonly string[]): Promise<void> {
  const held = await heldIds(store);
  if (!ids.some((id) => held.has(id))) return;
  for (const id of ids) held.delete(id);
  await store.setMeta(HELD, Object.fromEntries(held));
}
