/**
 * The one place the `_changes` request of a pull is built. The pull asks for ids and leaf
 * revisions only (no `include_docs`): the engine then fetches, with `_all_docs`, just the docs
 * this device does not already hold at that revision, so what it pushed is never downloaded again.
 *
 * Partial sync adds its filter here and nowhere else: e.g. `filter=_selector` in the query with
 * `method: 'POST'` and `body: { selector: { siteId: { $in: [...] } } }`. Everything downstream
 * (paging, checkpoints, no-progress detection) works unchanged on a filtered feed.
 */

export interface PullRequest {
  method: 'GET' | 'POST';
  /** Path under the database, with the query string. */
  path: string;
  body?: unknown;
}

/**
 * With a Mango `selector` (partial sync: only the sites this device keeps): `filter=_selector`,
 * the selector in the body (CouchDB 2+) and also in the query (pouchdb-server reads it only there).
 */
export function changesRequest(
  since: string | number,
  limit: number,
  selector?: Record<string, unknown>,
): PullRequest {
  const q = new URLSearchParams({ since: String(since), limit: String(limit), style: 'all_docs' });
  if (!selector) return { method: 'GET', path: `_changes?${q}` };
  q.set('filter', '_selector');
  q.set('selector', JSON.stringify(selector));
  return { method: 'POST', path: `_changes?${q}`, body: { selector } };
}
