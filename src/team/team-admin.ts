/**
 * Sets up a team database and its people on any CouchDB-API server, through the plain CouchDB
 * HTTP API only (`PUT /db`, `/db/_security`, design docs, `/_users`): the same calls work on
 * Apache CouchDB (single node or cluster) and on the embedded `tufa server`.
 */

import { DESIGN_ID, designDoc, ROLE_NAMES, ROLES, type Role, securityObject } from './doc-rules';

export type TeamCode =
  | 'team-bad-url'
  | 'team-bad-admin'
  | 'team-bad-name'
  | 'team-bad-role'
  | 'team-unreachable'
  | 'team-auth-failed'
  | 'team-server-error'
  | 'team-no-user';

export class TeamError extends Error {
  constructor(
    readonly code: TeamCode,
    message: string,
  ) {
    super(message);
    this.name = 'TeamError';
  }
}

export interface AdminTarget {
  /** Server root, ending in `/`. */
  url: string;
  admin: { name: string; password: string };
}

export function parseAdmin(s: string | undefined): { name: string; password: string } {
  const i = s?.indexOf(':') ?? -1;
  if (!s || i <= 0 || i === s.length - 1)
    throw new TeamError('team-bad-admin', '--admin must be NAME:PASSWORD (the server admin).');
  return { name: s.slice(0, i), password: s.slice(i + 1) };
}

export function parseUrl(s: string | undefined): string {
  let u: URL;
  try {
    u = new URL(s ?? '');
  } catch {
    throw new TeamError(
      'team-bad-url',
      `--url must be a server address like http://127.0.0.1:5984/, not "${s ?? ''}".`,
    );
  }
  if (u.protocol !== 'http:' && u.protocol !== 'https:')
    throw new TeamError('team-bad-url', `--url must start with http:// or https://, not ${u.protocol}`);
  return u.href.endsWith('/') ? u.href : `${u.href}/`;
}

/** CouchDB's rule for database names (lower case, starts with a letter). */
export function checkDbName(db: string | undefined): string {
  if (!db || !/^[a-z][a-z0-9_$()+/-]*$/.test(db))
    throw new TeamError(
      'team-bad-name',
      `--db must be a database name in lower case starting with a letter (a-z, 0-9, _$()+-/), not "${db ?? ''}".`,
    );
  return db;
}

export function checkRole(role: string | undefined): Role {
  if (!role || !(ROLE_NAMES as string[]).includes(role))
    throw new TeamError(
      'team-bad-role',
      `--role must be one of ${ROLE_NAMES.join(', ')}, not "${role ?? ''}".`,
    );
  return role as Role;
}

function b64(s: string): string {
  return Buffer.from(s, 'utf8').toString('base64');
}

async function call<T>(
  t: AdminTarget,
  method: string,
  path: string,
  body?: unknown,
  okStatuses: number[] = [],
): Promise<{ status: number; body: T }> {
  let res: Response;
  try {
    res = await fetch(`${t.url}${path}`, {
      method,
      headers: {
        accept: 'application/json',
        'content-type': 'application/json',
        authorization: `Basic ${b64(`${t.admin.name}:${t.admin.password}`)}`,
      },
      body: body === undefined ? null : JSON.stringify(body),
      signal: AbortSignal.timeout(30000),
    });
  } catch {
    throw new TeamError('team-unreachable', `No CouchDB server answers at ${t.url}; is it running?`);
  }
  const json = (await res.json().catch(() => ({}))) as T & { error?: string; reason?: string };
  if (res.ok || okStatuses.includes(res.status)) return { status: res.status, body: json };
  if (res.status === 401 || res.status === 403)
    throw new TeamError(
      'team-auth-failed',
      `The server refused the admin ${t.admin.name} (HTTP ${res.status}${json.reason ? `: ${json.reason}` : ''}); --admin must be a server admin.`,
    );
  throw new TeamError(
    'team-server-error',
    `${method} /${path.split('?')[0]} failed with HTTP ${res.status}${json.error ? ` (${json.error}: ${json.reason ?? ''})` : ''}.`,
  );
}

export interface SetupReport {
  created: string[];
  unchanged: string[];
  hints: string[];
}

/** Creates or brings up to date the team database, its `_security`, rules and `_users`. Idempotent. */
export async function setupTeam(t: AdminTarget, db: string): Promise<SetupReport> {
  const report: SetupReport = { created: [], unchanged: [], hints: [] };
  const who = await call<{ userCtx?: { roles?: string[] } }>(t, 'GET', '_session');
  if (!who.body.userCtx?.roles?.includes('_admin'))
    throw new TeamError(
      'team-auth-failed',
      `${t.admin.name} is not a server admin here (wrong password, or not an admin).`,
    );
  // CouchDB 3 does not create the system databases on a fresh single node; clusters have them.
  for (const name of ['_users', db]) {
    const r = await call(t, 'PUT', encodeURIComponent(name), undefined, [412]);
    (r.status === 412 ? report.unchanged : report.created).push(`database ${name}`);
  }
  const base = `${encodeURIComponent(db)}/`;
  const want = securityObject();
  const sec = await call<Record<string, unknown>>(t, 'GET', `${base}_security`);
  if (JSON.stringify(sec.body) === JSON.stringify(want)) report.unchanged.push('_security');
  else {
    await call(t, 'PUT', `${base}_security`, want);
    report.created.push(`_security (members: roles ${want.members.roles.join(', ')})`);
  }
  const doc = designDoc();
  const cur = await call<{ _rev?: string; tufa_rules?: string }>(
    t,
    'GET',
    `${base}${DESIGN_ID}`,
    undefined,
    [404],
  );
  if (cur.status === 200 && cur.body.tufa_rules === doc.tufa_rules) report.unchanged.push(DESIGN_ID);
  else {
    await call(t, 'PUT', `${base}${DESIGN_ID}`, cur.status === 200 ? { ...doc, _rev: cur.body._rev } : doc);
    report.created.push(`${DESIGN_ID} (rules ${doc.tufa_rules})`);
  }
  report.hints.push(...(await corsHints(t)));
  return report;
}

/**
 * What the browser app needs from the server's CORS settings, read through the config API where
 * the server has one (`/_node/_local/_config` on CouchDB 2+, `/_config` on older APIs).
 */
async function corsHints(t: AdminTarget): Promise<string[]> {
  const need =
    'The app calls the server from its own origin: enable CORS with credentials for that origin ' +
    '(CouchDB: [chttpd] enable_cors = true; [cors] origins = https://your-app-origin, credentials = true, ' +
    'methods = GET, PUT, POST, HEAD, DELETE, headers = accept, authorization, content-type, origin, referer).';
  for (const path of ['_node/_local/_config/cors', '_config/cors']) {
    const r = await call<Record<string, string>>(t, 'GET', path, undefined, [400, 404, 405]).catch(
      () => undefined,
    );
    if (r?.status !== 200) continue;
    const origins = r.body.origins;
    if (!origins) return [`CORS: no origins set. ${need}`];
    if (origins === '*')
      return ['CORS: origins = * (any web page may ask; the database still needs a signed-in team member).'];
    return [`CORS: origins = ${origins}; add the app's origin there if the phones use another one.`];
  }
  return [`CORS: could not read the settings. ${need}`];
}

export interface TeamUser {
  name: string;
  roles: string[];
}

const userId = (name: string) => `org.couchdb.user:${name}`;

export function checkUserName(name: string | undefined): string {
  if (!name || name.startsWith('_') || name.includes(':') || name.length > 100)
    throw new TeamError(
      'team-bad-name',
      `--name must be a user name without ':' that does not start with '_', not "${name ?? ''}".`,
    );
  return name;
}

/** Adds a person, or changes their password and role if they exist (idempotent). */
export async function addUser(
  t: AdminTarget,
  name: string,
  password: string,
  role: Role,
): Promise<'created' | 'updated'> {
  const path = `_users/${encodeURIComponent(userId(name))}`;
  const cur = await call<{ _rev?: string; roles?: string[] }>(t, 'GET', path, undefined, [404]);
  const others = (cur.body.roles ?? []).filter((r) => !(ROLE_NAMES as string[]).includes(r));
  const doc = { _id: userId(name), name, type: 'user', password, roles: [...others, ROLES[role]] };
  await call(t, 'PUT', path, cur.status === 200 ? { ...doc, _rev: cur.body._rev } : doc);
  return cur.status === 200 ? 'updated' : 'created';
}

export async function listUsers(t: AdminTarget): Promise<TeamUser[]> {
  const r = await call<{ rows: { id: string; doc?: { name?: string; roles?: string[] } }[] }>(
    t,
    'GET',
    '_users/_all_docs?include_docs=true',
  );
  return r.body.rows
    .filter((x) => x.id.startsWith('org.couchdb.user:') && x.doc)
    .map((x) => ({ name: x.doc?.name ?? x.id.slice(17), roles: x.doc?.roles ?? [] }));
}

export async function removeUser(t: AdminTarget, name: string): Promise<void> {
  const path = `_users/${encodeURIComponent(userId(name))}`;
  const cur = await call<{ _rev?: string }>(t, 'GET', path, undefined, [404]);
  if (cur.status === 404) throw new TeamError('team-no-user', `There is no user "${name}" on this server.`);
  await call(t, 'DELETE', `${path}?rev=${encodeURIComponent(cur.body._rev ?? '')}`);
}
