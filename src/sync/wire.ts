/**
 * The shape of every server answer sync reads, checked before use. A server (or a proxy in front
 * of it) can send anything: `null` for a list, ids that are numbers, a page without `last_seq`.
 * Each check here either returns typed data or throws a {@link SyncError} that says in words what
 * was wrong; a whole answer that is unusable is retryable (the next answer may be fine), a single
 * bad row is dropped and reported by the caller, so good rows still count.
 */

import type { BulkRow, ChangesPage, ChangesRow, CouchDoc } from './couch-client';
import { SyncError } from './sync-issues';

const isObj = (x: unknown): x is Record<string, unknown> =>
  typeof x === 'object' && x !== null && !Array.isArray(x);
const isSeq = (x: unknown): x is string | number =>
  (typeof x === 'string' && x.length > 0 && x.length < 4096) || (typeof x === 'number' && Number.isFinite(x));

function malformed(what: string): SyncError {
  return new SyncError('sync-bad-response', `The server's answer to ${what}; Tufa will try again.`, true);
}

/** A CouchDB document as far as sync relies on it: a string `_id`, a string `_rev` if any. */
export function asCouchDoc(x: unknown): CouchDoc | undefined {
  if (!isObj(x) || typeof x._id !== 'string' || x._id === '') return undefined;
  if (x._rev !== undefined && typeof x._rev !== 'string') return undefined;
  if (
    x._conflicts !== undefined &&
    !(Array.isArray(x._conflicts) && x._conflicts.every((r) => typeof r === 'string'))
  )
    return undefined;
  return x as CouchDoc;
}

/** `_bulk_docs` rows: a list; rows that are not `{id: string, rev | error}` are left out (the caller retries them). */
export function readBulkRows(body: unknown): BulkRow[] {
  if (!Array.isArray(body)) throw malformed('_bulk_docs was not a list of rows');
  const rows: BulkRow[] = [];
  for (const r of body) {
    if (!isObj(r) || typeof r.id !== 'string') continue;
    const rev = typeof r.rev === 'string' && r.rev !== '' ? r.rev : undefined;
    const error = typeof r.error === 'string' ? r.error : r.error === undefined ? undefined : String(r.error);
    const reason = typeof r.reason === 'string' ? r.reason : undefined;
    if (rev === undefined && error === undefined) continue;
    rows.push({ id: r.id, rev, error, reason });
  }
  return rows;
}

/**
 * A `_changes` page. The page itself must have a `results` list and a `last_seq`; each row needs a
 * string `id`, and `changes` with string revisions. Rows that fail are counted in `badRows` (and
 * described) so the caller can report them and still apply the rest.
 */
export function readChanges(body: unknown): ChangesPage & { badRows: string[] } {
  if (!isObj(body)) throw malformed('_changes was not a JSON object');
  if (!Array.isArray(body.results)) throw malformed('_changes had no list of results');
  if (!isSeq(body.last_seq)) throw malformed('_changes had no usable last_seq');
  const results: ChangesRow[] = [];
  const badRows: string[] = [];
  body.results.forEach((r: unknown, i: number) => {
    if (!isObj(r) || typeof r.id !== 'string' || r.id === '') {
      badRows.push(`row ${i + 1} of a _changes page has no document id`);
      return;
    }
    const changes = Array.isArray(r.changes)
      ? r.changes.flatMap((c: unknown) => (isObj(c) && typeof c.rev === 'string' ? [{ rev: c.rev }] : []))
      : [];
    if (changes.length === 0) {
      badRows.push(`document ${r.id} in a _changes page has no revision`);
      return;
    }
    const row: ChangesRow = { id: r.id, seq: isSeq(r.seq) ? r.seq : '', changes };
    if (r.deleted === true) row.deleted = true;
    if (r.doc !== undefined && r.doc !== null) {
      const doc = asCouchDoc(r.doc);
      if (!doc || doc._id !== r.id) {
        badRows.push(`document ${r.id} in a _changes page is not a CouchDB document`);
        return;
      }
      row.doc = doc;
    }
    results.push(row);
  });
  return { results, last_seq: body.last_seq, badRows };
}

/**
 * `_all_docs` with `keys` and `include_docs`: docs by id (deleted ones as `_deleted` stubs). Every
 * key asked for must come back, as a doc or as `not_found`: a page is applied whole or retried, so
 * a doc the answer left out is never skipped past.
 */
export function readAllDocs(body: unknown, keys: readonly string[]): Map<string, CouchDoc> {
  if (!isObj(body) || !Array.isArray(body.rows)) throw malformed('_all_docs had no list of rows');
  const out = new Map<string, CouchDoc>();
  const answered = new Set<string>();
  for (const r of body.rows) {
    if (isObj(r) && typeof r.key === 'string' && r.error === 'not_found') answered.add(r.key);
    if (!isObj(r) || typeof r.id !== 'string' || !isObj(r.value) || typeof r.value.rev !== 'string') continue;
    if (r.value.deleted === true) {
      out.set(r.id, { _id: r.id, _rev: r.value.rev, _deleted: true });
      continue;
    }
    const doc = asCouchDoc(r.doc);
    if (doc && doc._id === r.id) out.set(r.id, doc);
  }
  const missing = keys.filter((k) => !out.has(k) && !answered.has(k));
  if (missing.length)
    throw malformed(`_all_docs left out ${missing.length} of the ${keys.length} documents asked for`);
  return out;
}

/** `?open_revs=all`: the leaf revisions that are documents. */
export function readLeaves(body: unknown): CouchDoc[] {
  if (!Array.isArray(body)) return [];
  return body.flatMap((x: unknown) => {
    const d = isObj(x) ? asCouchDoc(x.ok) : undefined;
    return d ? [d] : [];
  });
}

/** A `_local` checkpoint: its `last_seq` if it is usable. */
export function readCheckpoint(body: unknown): { last_seq?: string | number; _rev?: string } | undefined {
  if (!isObj(body)) return undefined;
  return {
    last_seq: isSeq(body.last_seq) ? body.last_seq : undefined,
    _rev: typeof body._rev === 'string' ? body._rev : undefined,
  };
}
