/**
 * The embedded team server: pouchdb-server (a CouchDB-API server on LevelDB files) run in this
 * process on a folder, with its config (admins, log file) kept in that folder, then set up for a
 * team exactly as `tufa team setup` sets up any CouchDB (`src/team/team-admin.ts`).
 *
 * pouchdb-server reads its options from the command line, so it is started by loading its entry
 * module with `process.argv` set to its own arguments; it then lives as long as this process.
 * The admin password is written in plain text into config.json only when the admin is new;
 * pouchdb-server hashes it (PBKDF2) when it starts, as CouchDB does with its ini files.
 */

import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { networkInterfaces } from 'node:os';
import { join, resolve } from 'node:path';
import { type AdminTarget, type SetupReport, setupTeam, TeamError } from '../team/team-admin';

export interface ServerOptions {
  dir: string;
  port: number;
  host: string;
  admin: { name: string; password: string };
  db: string;
}

export interface StartedServer {
  /** Address on this computer. */
  local: string;
  /** Addresses other devices can use (empty when bound to loopback). */
  network: string[];
  report: SetupReport;
}

export function isLoopback(host: string): boolean {
  return host === 'localhost' || host === '::1' || /^127\./.test(host);
}

/** Writes the server's config.json: log file in the folder, the admin added if not there yet. */
export function prepareDir(dir: string, admin: { name: string; password: string }): string {
  const root = resolve(dir);
  mkdirSync(join(root, 'data'), { recursive: true });
  const configPath = join(root, 'config.json');
  const config = existsSync(configPath)
    ? (JSON.parse(readFileSync(configPath, 'utf8')) as Record<string, Record<string, unknown>>)
    : {};
  config.log = { ...config.log, file: join(root, 'log.txt') };
  // Its request log goes to the file only (the command line flag for this is not read back).
  config.pouchdb_server = { ...config.pouchdb_server, 'no-stdout-logs': true };
  // A fixed cookie secret, so sign-in sessions survive a restart (the default is new every start).
  const auth = config.couch_httpd_auth ?? {};
  if (typeof auth.secret !== 'string') auth.secret = randomBytes(16).toString('hex');
  config.couch_httpd_auth = auth;
  config.admins = config.admins ?? {};
  if (!(admin.name in config.admins)) config.admins[admin.name] = admin.password;
  writeFileSync(configPath, `${JSON.stringify(config, null, 2)}\n`);
  return configPath;
}

export function networkAddresses(host: string, port: number): string[] {
  if (isLoopback(host)) return [];
  if (host !== '0.0.0.0' && host !== '::') return [`http://${host}:${port}/`];
  return Object.values(networkInterfaces())
    .flat()
    .filter((a) => a && a.family === 'IPv4' && !a.internal)
    .map((a) => `http://${a!.address}:${port}/`);
}

async function waitUp(url: string): Promise<void> {
  const deadline = Date.now() + 30000;
  for (;;) {
    try {
      if ((await fetch(url)).ok) return;
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline)
      throw new TeamError('team-unreachable', `The server did not start at ${url} within 30 s.`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

export async function startTeamServer(o: ServerOptions): Promise<StartedServer> {
  const root = resolve(o.dir);
  const configPath = prepareDir(root, o.admin);
  const local = `http://${o.host.includes(':') ? `[${o.host}]` : o.host}:${o.port}/`;
  const probe = isLoopback(o.host) || o.host === '0.0.0.0' ? `http://127.0.0.1:${o.port}/` : local;
  try {
    await fetch(probe, { signal: AbortSignal.timeout(1000) });
    throw new TeamError('team-server-error', `Port ${o.port} is already in use; choose another with --port.`);
  } catch (e) {
    if (e instanceof TeamError) throw e;
  }
  process.argv = [
    process.argv[0] ?? 'node',
    'pouchdb-server',
    '--dir',
    join(root, 'data'),
    '--config',
    configPath,
    '--port',
    String(o.port),
    '--host',
    o.host,
  ];
  createRequire(import.meta.url)('pouchdb-server/lib/index.js');
  await waitUp(probe);
  const target: AdminTarget = { url: probe, admin: o.admin };
  let report: SetupReport;
  try {
    report = await setupTeam(target, o.db);
  } catch (e) {
    if (e instanceof TeamError && e.code === 'team-auth-failed')
      throw new TeamError(
        e.code,
        `${e.message} This folder's server already has its admins (config.json): use the password it was first started with.`,
      );
    throw e;
  }
  return { local: o.host === '0.0.0.0' ? probe : local, network: networkAddresses(o.host, o.port), report };
}
