/**
 * Our docs on the wire: `id` travels as `_id` (our own uuid, so the same reading has the same id
 * on every device and a retried push cannot create a second copy), `rev` as `_rev`; every other
 * field as it is. Tombstones stay ordinary docs with `deleted: true` so their `updatedAt` survives.
 */

import type { TufaDoc } from '../io/docs';
import type { CouchDoc } from './couch-client';

export function toCouch(doc: TufaDoc): CouchDoc {
  const { id, rev, ...rest } = doc;
  return rev === undefined || rev === null ? { _id: id, ...rest } : { _id: id, _rev: rev, ...rest };
}

/** Our doc from a server doc, or `undefined` for a CouchDB deletion of a doc we never had. */
export function fromCouch(c: CouchDoc, local: TufaDoc | undefined, now: Date): TufaDoc | undefined {
  const { _id, _rev, _deleted, _conflicts, _revisions, _attachments, ...rest } = c;
  if (_deleted) {
    // Deleted through the CouchDB API by another tool: keep a tombstone of what we had.
    if (!local) return undefined;
    return { ...local, deleted: true, updatedAt: now.toISOString(), rev: _rev };
  }
  return { ...(rest as Omit<TufaDoc, 'id'>), id: _id, rev: _rev } as TufaDoc;
}

function stable(x: unknown): string {
  if (Array.isArray(x)) return `[${x.map(stable).join(',')}]`;
  if (x && typeof x === 'object') {
    const entries = Object.entries(x as Record<string, unknown>)
      .filter(([k, v]) => v !== undefined && k !== 'id' && k !== 'rev' && !k.startsWith('_'))
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${stable(v)}`).join(',')}}`;
  }
  return JSON.stringify(x);
}

/** Same data, ignoring ids and revisions: how a retried push recognizes its own earlier write. */
export function sameContent(a: TufaDoc | CouchDoc, b: TufaDoc | CouchDoc): boolean {
  return stable(a) === stable(b);
}
