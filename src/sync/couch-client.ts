/**
 * The few CouchDB HTTP API calls sync needs, over `fetch`: `_bulk_docs`, `_changes`, single
 * docs (with their conflicting revisions), `_local` checkpoint docs and `_session` login.
 * Every failure becomes a {@link SyncError} with a code and words, and says whether a retry can help.
 */

import { changesRequest } from './pull-request';
import { SyncError } from './sync-issues';
import { asCouchDoc, readAllDocs, readBulkRows, readChanges, readCheckpoint, readLeaves } from './wire';

export type Auth =
  | { kind: 'none' }
  | { kind: 'basic'; user: string; password: string }
  /** Cookie session via `POST /_session`; the browser keeps the cookie, Node code keeps it here. */
  | { kind: 'session'; user: string; password: string };

export interface ServerConfig {
  /** Server root, ending in `/` (see `checkServerUrl`). */
  url: string;
  db: string;
  auth: Auth;
  timeoutMs?: number;
}

export type Fetch = (input: string, init?: RequestInit) => Promise<Response>;

export interface CouchDoc {
  _id: string;
  _rev?: string;
  _deleted?: boolean;
  _conflicts?: string[];
  [key: string]: unknown;
}

/** One row of a `_bulk_docs` answer: `rev` on success, `error` (and `reason`) on failure. */
export interface BulkRow {
  id: string;
  rev?: string;
  ok?: boolean;
  error?: string;
  reason?: string;
}

export interface ChangesRow {
  id: string;
  seq: string | number;
  deleted?: boolean;
  doc?: CouchDoc;
  /** Leaf revisions (`style=all_docs`): more than one means the server holds a conflict. */
  changes: { rev: string }[];
}

export interface ChangesPage {
  results: ChangesRow[];
  last_seq: string | number;
  /** Rows of the page that could not be read, in words (reported, the rest is applied). */
  badRows: string[];
}

function b64(s: string): string {
  const bytes = new TextEncoder().encode(s);
  let bin = '';
  for (const x of bytes) bin += String.fromCharCode(x);
  return btoa(bin);
}

export class CouchClient {
  private cookie: string | undefined;
  private loggedIn = false;
  /** Last known revision of each `_local` doc written by this client. */
  private readonly localRevs = new Map<string, string | undefined>();
  private readonly base: string;

  constructor(
    private readonly config: ServerConfig,
    private readonly fetchImpl: Fetch = (i, init) => fetch(i, init),
  ) {
    this.base = `${config.url}${encodeURIComponent(config.db)}/`;
  }

  private headers(): Record<string, string> {
    const h: Record<string, string> = { accept: 'application/json', 'content-type': 'application/json' };
    const a = this.config.auth;
    if (a.kind === 'basic') h.authorization = `Basic ${b64(`${a.user}:${a.password}`)}`;
    if (a.kind === 'session' && this.cookie) h.cookie = this.cookie;
    return h;
  }

  private async raw(
    method: string,
    url: string,
    body?: unknown,
    extra?: Record<string, string>,
  ): Promise<Response> {
    try {
      return await this.fetchImpl(url, {
        method,
        headers: { ...this.headers(), ...extra },
        body: body === undefined ? null : JSON.stringify(body),
        credentials: 'include',
        signal: AbortSignal.timeout(this.config.timeoutMs ?? 30000),
      });
    } catch (e) {
      if (e instanceof DOMException && (e.name === 'TimeoutError' || e.name === 'AbortError')) {
        throw new SyncError('sync-timeout', 'The server did not answer in time; Tufa will try again.', true);
      }
      throw new SyncError(
        'sync-offline',
        'The server cannot be reached (no network, or the server is down). Your data is safe on this device; Tufa will try again.',
        true,
      );
    }
  }

  async login(): Promise<void> {
    const a = this.config.auth;
    if (a.kind !== 'session') return;
    if (!a.password)
      throw new SyncError(
        'sync-password-needed',
        'The server session has ended: enter the password again (it is not stored on this device).',
        false,
        401,
      );
    const res = await this.raw('POST', `${this.config.url}_session`, { name: a.user, password: a.password });
    if (res.status === 401)
      throw new SyncError('sync-auth-failed', 'The server refused this user name and password.', false, 401);
    if (!res.ok) throw await this.failure(res, 'log in');
    const setCookie = res.headers.get('set-cookie');
    if (setCookie) this.cookie = setCookie.split(';')[0];
    this.loggedIn = true;
  }

  /** One JSON request to the database; logs in first for cookie sessions and once more on expiry. */
  async request<T>(method: string, path: string, body?: unknown): Promise<{ status: number; body: T }> {
    // Without a password in memory (not remembered, page reloaded) the browser's session cookie
    // from the last sign-in may still be valid: try it, and ask for the password only on a 401.
    const a = this.config.auth;
    if (a.kind === 'session' && !this.loggedIn && a.password) await this.login();
    let res = await this.raw(method, `${this.base}${path}`, body);
    if (res.status === 401 && this.config.auth.kind === 'session') {
      this.loggedIn = false;
      await this.login();
      res = await this.raw(method, `${this.base}${path}`, body);
    }
    if (res.status === 404 && method === 'GET') {
      return { status: 404, body: (await res.json().catch(() => ({}))) as T };
    }
    if (!res.ok && res.status !== 409)
      throw await this.failure(res, `${method} ${path.split('?')[0] || 'database'}`);
    try {
      return { status: res.status, body: (await res.json()) as T };
    } catch (e) {
      if (e instanceof DOMException && (e.name === 'TimeoutError' || e.name === 'AbortError'))
        throw new SyncError(
          'sync-timeout',
          'The server stopped answering midway; Tufa will try again.',
          true,
        );
      throw new SyncError(
        'sync-bad-response',
        'The server sent an answer that is not JSON; is this a CouchDB server?',
        true,
        res.status,
      );
    }
  }

  private async failure(res: Response, what: string): Promise<SyncError> {
    let reason = '';
    try {
      const j = (await res.json()) as { error?: string; reason?: string };
      reason = [j.error, j.reason].filter(Boolean).join(': ');
    } catch {
      // Body was not JSON; the status says enough.
    }
    const s = res.status;
    const detail = reason ? ` (${reason})` : '';
    if (s === 401)
      return new SyncError(
        'sync-auth-failed',
        `The server asks for a valid user name and password${detail}.`,
        false,
        s,
      );
    if (s === 403)
      return new SyncError(
        'sync-forbidden',
        `This user may not ${what} on this database${detail}.`,
        false,
        s,
      );
    if (s === 404)
      return new SyncError(
        'sync-db-missing',
        `The database "${this.config.db}" does not exist on the server${detail}.`,
        false,
        s,
      );
    if (s === 429 || s >= 500)
      return new SyncError(
        'sync-server-error',
        `The server had a problem (HTTP ${s})${detail}; Tufa will try again.`,
        true,
        s,
      );
    return new SyncError(
      'sync-bad-response',
      `The server refused to ${what} (HTTP ${s})${detail}.`,
      false,
      s,
    );
  }

  /** Checks that the database exists (and the credentials work). */
  async info(): Promise<{ db_name: string; update_seq: string | number }> {
    const r = await this.request<{ db_name: string; update_seq: string | number }>('GET', '');
    if (r.status === 404)
      throw new SyncError(
        'sync-db-missing',
        `The database "${this.config.db}" does not exist on the server.`,
        false,
        404,
      );
    return r.body;
  }

  async createDb(): Promise<void> {
    const res = await this.raw('PUT', this.base.slice(0, -1));
    if (!res.ok && res.status !== 412) throw await this.failure(res, 'create the database');
  }

  async bulkDocs(docs: CouchDoc[]): Promise<BulkRow[]> {
    const r = await this.request<unknown>('POST', '_bulk_docs', { docs });
    if (r.status === 409)
      throw new SyncError(
        'sync-bad-response',
        'The server refused the whole _bulk_docs batch (HTTP 409); Tufa will try again.',
        true,
        409,
      );
    return readBulkRows(r.body);
  }

  /** One page of changes (ids and leaf revisions), as built by {@link changesRequest}. */
  async changes(
    since: string | number,
    limit: number,
    selector?: Record<string, unknown>,
  ): Promise<ChangesPage> {
    const req = changesRequest(since, limit, selector);
    const r = await this.request<unknown>(req.method, req.path, req.body);
    if (r.status === 404)
      throw new SyncError(
        'sync-db-missing',
        `The database "${this.config.db}" does not exist on the server.`,
        false,
        404,
      );
    return readChanges(r.body);
  }

  /** The current (winning) revisions of many docs with their `_conflicts`, in one request. */
  async getDocs(ids: readonly string[]): Promise<Map<string, CouchDoc>> {
    if (ids.length === 0) return new Map();
    const r = await this.request<unknown>('POST', '_all_docs?include_docs=true&conflicts=true', {
      keys: ids,
    });
    return readAllDocs(r.body, ids);
  }

  async getDoc(id: string, rev?: string): Promise<CouchDoc | undefined> {
    const q = rev ? `?rev=${encodeURIComponent(rev)}` : '?conflicts=true';
    const r = await this.request<unknown>('GET', `${encodeURIComponent(id)}${q}`);
    if (r.status === 404) return undefined;
    const doc = asCouchDoc(r.body);
    if (!doc || doc._id !== id)
      throw new SyncError(
        'sync-bad-response',
        `The server sent something other than document ${id}; Tufa will try again.`,
        true,
      );
    return doc;
  }

  /** Every leaf revision of a doc, deleted ones included; empty when the server never had it. */
  async leafRevs(id: string): Promise<CouchDoc[]> {
    const r = await this.request<unknown>('GET', `${encodeURIComponent(id)}?open_revs=all`);
    return r.status === 404 ? [] : readLeaves(r.body);
  }

  /** Removes one losing revision of a doc (after the user has resolved its conflict). */
  async deleteRev(id: string, rev: string): Promise<void> {
    await this.request('DELETE', `${encodeURIComponent(id)}?rev=${encodeURIComponent(rev)}`);
  }

  async getLocal<T>(name: string): Promise<(T & { _rev?: string }) | undefined> {
    const r = await this.request<unknown>('GET', `_local/${encodeURIComponent(name)}`);
    if (r.status === 404) return undefined;
    const cp = readCheckpoint(r.body);
    // Not "no checkpoint" (that would queue everything again): an answer to retry.
    if (!cp)
      throw new SyncError(
        'sync-bad-response',
        'The server sent an unreadable sync checkpoint; Tufa will try again.',
        true,
      );
    return cp as T & { _rev?: string };
  }

  /** Writes a `_local` doc; its revision is remembered from the last write, read again only on a 409. */
  async putLocal(name: string, body: Record<string, unknown>): Promise<void> {
    const path = `_local/${encodeURIComponent(name)}`;
    for (let attempt = 0; attempt < 2; attempt++) {
      const rev =
        attempt === 0 && this.localRevs.has(name)
          ? this.localRevs.get(name)
          : (await this.getLocal<Record<string, unknown>>(name))?._rev;
      const r = await this.request<unknown>('PUT', path, rev ? { ...body, _rev: rev } : body);
      if (r.status !== 409) {
        const b = r.body as { rev?: unknown } | null;
        const next = b && typeof b === 'object' && typeof b.rev === 'string' ? b.rev : undefined;
        if (next) this.localRevs.set(name, next);
        else this.localRevs.delete(name);
        return;
      }
      this.localRevs.delete(name);
    }
    throw new SyncError(
      'sync-server-error',
      'The server kept refusing to save the sync checkpoint (HTTP 409); Tufa will try again.',
      true,
      409,
    );
  }
}
