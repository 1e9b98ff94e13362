/**
 * Team roles, as stored in `_users` docs and `_security` and as the CLI takes them, and what each
 * may do in words. Small and free of other imports so the app can show a role without loading
 * the server rules.
 */

export const ROLES = { viewer: 'viewer', member: 'member', lead: 'lead' } as const;
export type Role = keyof typeof ROLES;
export const ROLE_NAMES = Object.keys(ROLES) as Role[];

export const ROLE_WORDS: Record<Role | 'admin', string> = {
  viewer:
    'reads the team’s sites and readings; changes made on this device stay here, the server does not accept them',
  member: 'adds sites and readings; changes or deletes only what they entered',
  lead: 'adds, changes and deletes any site or reading',
  admin: 'server admin: everything, and manages people',
};

/** The strongest Tufa role among a user's CouchDB roles (`_admin` is a server admin). */
export function roleOf(roles: readonly string[]): Role | 'admin' | undefined {
  if (roles.includes('_admin')) return 'admin';
  return (['lead', 'member', 'viewer'] as const).find((r) => roles.includes(ROLES[r]));
}

export interface TeamIdentity {
  name: string;
  role: Role | 'admin' | undefined;
}

/**
 * Who the server says this device is signed in as (`GET /_session`, CouchDB API): with basic
 * auth the header is sent; with a cookie session the browser sends its cookie. `undefined` when
 * the server does not answer or nobody is signed in.
 */
export async function whoAmI(
  serverUrl: string,
  auth: { kind: 'none' | 'basic' | 'session'; user: string; password: string },
  fetchImpl: (u: string, i?: RequestInit) => Promise<Response> = (u, i) => fetch(u, i),
): Promise<TeamIdentity | undefined> {
  if (auth.kind === 'none') return undefined;
  const headers: Record<string, string> = { accept: 'application/json' };
  if (auth.kind === 'basic' && auth.password) {
    const bytes = new TextEncoder().encode(`${auth.user}:${auth.password}`);
    headers.authorization = `Basic ${btoa(String.fromCharCode(...bytes))}`;
  }
  try {
    const r = await fetchImpl(`${serverUrl}_session`, {
      headers,
      credentials: 'include',
      signal: AbortSignal.timeout(10000),
    });
    if (!r.ok) return undefined;
    const j = (await r.json()) as { userCtx?: { name?: string | null; roles?: string[] } };
    const name = j.userCtx?.name;
    return name ? { name, role: roleOf(j.userCtx?.roles ?? []) } : undefined;
  } catch {
    return undefined;
  }
}

/**
 * Why the team server would refuse this user's change, in words, or `undefined` when it would
 * accept it (the same rules as the server's `validate_doc_update`; the server still decides).
 * `doc` absent: creating a new site or reading. A doc with a server revision and no `created_by`
 * was stored before the team rules; only a lead changes it.
 */
export function teamRefusal(
  who: TeamIdentity | undefined,
  doc?: { type: 'site' | 'reading'; created_by?: string; rev?: string },
): string | undefined {
  if (!who || who.role === 'admin' || who.role === 'lead') return undefined;
  if (who.role === undefined)
    return `${who.name} has no role on this team server, so changes stay on this device.`;
  if (who.role === 'viewer')
    return 'You are a viewer on this team server: you can read, but changes you make would stay on this device.';
  if (!doc) return undefined;
  if (doc.created_by === undefined ? !doc.rev : doc.created_by === who.name) return undefined;
  return `Only ${doc.created_by ?? 'a lead'}${doc.created_by ? ' or a lead' : ''} can change or delete this ${doc.type}: as a member you change what you entered.`;
}
