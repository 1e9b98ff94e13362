/**
 * The few CouchDB HTTP API calls sync needs, over `fetch`: `_bulk_docs`, `_changes`, single
 * docs (with their conflicting revisions), `_local` checkpoint docs and `_session` login.
 * Every failure becomes a {@link SyncError} with a code and words, and says whether a retry can help.
 */

import { SyncError } from './sync-issues';

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

export interface ChangesPage {
  results: {
    id: string;
    seq: string | number;
    deleted?: boolean;
    doc?: CouchDoc;
    changes: { rev: string }[];
  }[];
  last_seq: string | number;
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
    } catch {
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
    const r = await this.request<BulkRow[]>('POST', '_bulk_docs', { docs });
    if (!Array.isArray(r.body))
      throw new SyncError(
        'sync-bad-response',
        'The server answered _bulk_docs without a list of rows.',
        true,
      );
    return r.body;
  }

  /**
   * One page of `_changes`. With a Mango `selector`: `filter=_selector`, the selector in the body
   * (CouchDB 2+) and also in the query (pouchdb-server reads it only there).
   */
  async changes(
    since: string | number,
    limit: number,
    selector?: Record<string, unknown>,
  ): Promise<ChangesPage> {
    const q = new URLSearchParams({
      since: String(since),
      limit: String(limit),
      include_docs: 'true',
      conflicts: 'true',
      style: 'all_docs',
    });
    if (selector) {
      q.set('filter', '_selector');
      q.set('selector', JSON.stringify(selector));
    }
    const r = selector
      ? await this.request<ChangesPage>('POST', `_changes?${q}`, { selector })
      : await this.request<ChangesPage>('GET', `_changes?${q}`);
    if (r.status === 404)
      throw new SyncError(
        'sync-db-missing',
        `The database "${this.config.db}" does not exist on the server.`,
        false,
        404,
      );
    if (!Array.isArray(r.body.results))
      throw new SyncError('sync-bad-response', 'The server answered _changes without results.', true);
    return r.body;
  }

  async getDoc(id: string, rev?: string): Promise<CouchDoc | undefined> {
    const q = rev ? `?rev=${encodeURIComponent(rev)}` : '?conflicts=true';
    const r = await this.request<CouchDoc>('GET', `${encodeURIComponent(id)}${q}`);
    return r.status === 404 ? undefined : r.body;
  }

  /** Every leaf revision of a doc, deleted ones included; empty when the server never had it. */
  async leafRevs(id: string): Promise<CouchDoc[]> {
    const r = await this.request<{ ok?: CouchDoc }[]>('GET', `${encodeURIComponent(id)}?open_revs=all`);
    if (r.status === 404 || !Array.isArray(r.body)) return [];
    return r.body.flatMap((x) => (x.ok ? [x.ok] : []));
  }

  /** Removes one losing revision of a doc (after the user has resolved its conflict). */
  async deleteRev(id: string, rev: string): Promise<void> {
    await this.request('DELETE', `${encodeURIComponent(id)}?rev=${encodeURIComponent(rev)}`);
  }

  async getLocal<T>(name: string): Promise<(T & { _rev?: string }) | undefined> {
    const r = await this.request<T & { _rev?: string }>('GET', `_local/${encodeURIComponent(name)}`);
    return r.status === 404 ? undefined : r.body;
  }

  async putLocal(name: string, body: Record<string, unknown>): Promise<void> {
    const cur = await this.getLocal<Record<string, unknown>>(name);
    const doc = cur?._rev ? { ...body, _rev: cur._rev } : body;
    await this.request('PUT', `_local/${encodeURIComponent(name)}`, doc);
  }
}
