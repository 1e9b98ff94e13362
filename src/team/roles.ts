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
