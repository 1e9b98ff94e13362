/**
 * Documents from the server that this device will not store (invalid fields, a type change, an
 * unreadable row) are set aside here instead of stopping sync: kept on this device for
 * inspection, with the reason in words, under one `syncMeta` key (the store's key-value
 * bookkeeping, so no schema change). The same doc at the same revision is kept once; the list is
 * capped so a server full of junk cannot fill the device.
 */

import type { Issue } from '../chem/errors';
import { type SyncCode, syncIssue } from './sync-issues';
import type { SyncStore } from './sync-store';

export interface SetAsideDoc {
  /** The document id, or a description of the row when it had none. */
  docId: string;
  rev: string | undefined;
  code: SyncCode;
  /** Why, in words. */
  reason: string;
  /** The document as the server sent it, as JSON text (cut at {@link MAX_TEXT} characters). */
  json: string;
  at: string;
}

const KEY = 'set-aside';
export const MAX_KEPT = 500;
const MAX_TEXT = 100_000;

export function asJsonText(x: unknown): string {
  try {
    const s = JSON.stringify(x) ?? 'undefined';
    return s.length > MAX_TEXT ? `${s.slice(0, MAX_TEXT)}…` : s;
  } catch {
    return '(not representable as JSON)';
  }
}

export async function listSetAside(store: SyncStore): Promise<SetAsideDoc[]> {
  const v = await store.getMeta<SetAsideDoc[]>(KEY);
  return Array.isArray(v) ? v : [];
}

/** Adds docs to the kept list (newest last); returns those not already kept. */
export async function keepSetAside(store: SyncStore, docs: SetAsideDoc[]): Promise<SetAsideDoc[]> {
  if (docs.length === 0) return [];
  const kept = await listSetAside(store);
  const have = new Set(kept.map((d) => `${d.docId}@${d.rev}`));
  const added = docs.filter((d) => {
    const k = `${d.docId}@${d.rev}`;
    if (have.has(k)) return false;
    have.add(k);
    return true;
  });
  if (added.length) await store.setMeta(KEY, [...kept, ...added].slice(-MAX_KEPT));
  return added;
}

export function setAsideIssue(d: SetAsideDoc): Issue {
  return syncIssue(
    d.code,
    `Document ${d.docId}${d.rev ? ` (revision ${d.rev})` : ''} from the server was set aside: ${d.reason}. It is kept on this device for inspection; the rest syncs as usual.`,
  );
}
