/**
 * Our docs on the wire: `id` travels as `_id` (our own uuid, so the same reading has the same id
 * on every device and a retried push cannot create a second copy), `rev` as `_rev`; every other
 * field as it is. Tombstones stay ordinary docs with `deleted: true` so their `updatedAt` survives.
 */

import type { TufaDoc } from '../io/docs';
import type { CouchDoc } from './couch-client';

export function toCouch(doc: TufaDoc, author?: string): CouchDoc {
  const { id, rev, ...rest } = doc;
  const c: CouchDoc =
    rev === undefined || rev === null ? { _id: id, ...rest } : { _id: id, _rev: rev, ...rest };
  return author ? stampAuthor(c, author) : c;
}

/**
 * Who made a doc and who changed it last, for a team server whose rules check both against the
 * signed-in user (`src/team/validate-source.ts`): `created_by` stays as the server first recorded
 * it (set to the author on a doc that has none), `changed_by` is the author of this push.
 */
export function stampAuthor(c: CouchDoc, author: string): CouchDoc {
  const created = typeof c.created_by === 'string' && c.created_by ? c.created_by : author;
  return { ...c, created_by: created, changed_by: author };
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
