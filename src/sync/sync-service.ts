/**
 * Sync as the app uses it: the connection settings (kept in `syncMeta` on this device only, never
 * in backups or exports), one engine built from them, status for the screen, and conflict
 * resolution.
 *
 * The password is stored with the settings only when the user asks to be remembered on this
 * device; otherwise it lives in this object's memory and is gone when the page closes (sync then
 * waits with `sync-password-needed` until it is typed again). With a cookie session the browser
 * also holds the server's session cookie, which lets sync go on after a reload until it expires. The settings screen mounts `SyncPanel` (`src/ui/sync/SyncPanel.tsx`) with one of these.
 */

import type { Issue } from '../chem/errors';
import type { TufaDoc } from '../io/docs';
import { type Auth, CouchClient, type Fetch } from './couch-client';
import { pullSelector } from './partial-sync';
import { heldHere, type RefusedChoice, sendHeld } from './refused';
import { checkDbName, checkServerUrl } from './server-url';
import { SyncEngine, type SyncStatus } from './sync-engine';
import { syncIssue } from './sync-issues';
import type { ConflictRecord, SyncStore } from './sync-store';

export interface ConnectionSettings {
  url: string;
  db: string;
  auth: Auth['kind'];
  user: string;
  password: string;
  /** Keep the password in this device's database (default: only in memory for this session). */
  remember?: boolean;
  /** Partial sync: the ids of the sites this device keeps (absent: every site). */
  keepSites?: string[];
}

const CONNECTION = 'connection';
const DEVICE = 'device-id';

const NOT_CONFIGURED: SyncStatus = {
  state: 'error',
  lastSyncAt: undefined,
  pending: 0,
  conflicts: 0,
  error: syncIssue('sync-not-configured', 'No sync server is set up yet: readings stay on this device.'),
  rejected: [],
  setAside: [],
  retryAt: undefined,
};

export function checkConnection(c: ConnectionSettings): { warnings: Issue[] } | { error: Issue } {
  const u = checkServerUrl(c.url);
  if ('error' in u) return u;
  const dbIssue = checkDbName(c.db);
  if (dbIssue) return { error: dbIssue };
  if (c.auth !== 'none' && c.user.trim() === '') {
    return { error: syncIssue('sync-auth-failed', 'Enter the user name for this server.', 'user') };
  }
  return { warnings: u.warnings };
}

function authOf(c: ConnectionSettings): Auth {
  return c.auth === 'none' ? { kind: 'none' } : { kind: c.auth, user: c.user, password: c.password };
}

export class SyncService {
  private engine: SyncEngine | undefined;
  private listeners = new Set<(s: SyncStatus) => void>();
  private unsubscribe: (() => void) | undefined;
  private status: SyncStatus = NOT_CONFIGURED;
  /** The password of this session when it is not remembered on the device. */
  private sessionPassword = '';

  constructor(
    readonly store: SyncStore,
    private readonly fetchImpl?: Fetch,
  ) {}

  /** The stored connection, with this session's password filled in when it is not stored. */
  async connection(): Promise<ConnectionSettings | undefined> {
    const c = await this.store.getMeta<ConnectionSettings>(CONNECTION);
    if (!c) return undefined;
    return c.password || !this.sessionPassword ? c : { ...c, password: this.sessionPassword };
  }

  private async deviceId(): Promise<string> {
    let id = await this.store.getMeta<string>(DEVICE);
    if (!id) {
      id = crypto.randomUUID();
      await this.store.setMeta(DEVICE, id);
    }
    return id;
  }

  /** Builds the engine from the stored connection; false when none is set up. */
  async start(): Promise<boolean> {
    const c = await this.connection();
    if (!c || 'error' in checkConnection(c)) {
      this.emit(NOT_CONFIGURED);
      return false;
    }
    const url = checkServerUrl(c.url);
    if ('error' in url) return false;
    if (c.auth === 'basic' && !c.password) {
      this.engine = undefined;
      this.emit({
        ...NOT_CONFIGURED,
        error: syncIssue(
          'sync-password-needed',
          'Enter the server password again: it is kept only while Tufa is open, not on this device.',
          'password',
        ),
      });
      return false;
    }
    const client = new CouchClient({ url: url.url.href, db: c.db, auth: authOf(c) }, this.fetchImpl);
    this.unsubscribe?.();
    this.engine = new SyncEngine(this.store, client, {
      deviceId: await this.deviceId(),
      author: c.auth === 'none' ? undefined : c.user,
      pullSelector: c.keepSites ? pullSelector(c.keepSites) : null,
    });
    // Counts first, then listen: the engine's initial status (nothing pending) is not the truth yet.
    await this.engine.refreshStatus();
    this.unsubscribe = this.engine.subscribe((s) => this.emit(s));
    return true;
  }

  /** Checks, tests against the server, and only then stores new connection settings. */
  async configure(c: ConnectionSettings): Promise<{ warnings: Issue[] } | { error: Issue }> {
    const checked = checkConnection(c);
    if ('error' in checked) return checked;
    const url = checkServerUrl(c.url);
    if ('error' in url) return url;
    const client = new CouchClient(
      { url: url.url.href, db: c.db, auth: authOf(c), timeoutMs: 15000 },
      this.fetchImpl,
    );
    try {
      await client.info();
    } catch (e) {
      const issue =
        e && typeof e === 'object' && 'toIssue' in e ? (e as { toIssue(): Issue }).toIssue() : undefined;
      return {
        error:
          issue ??
          syncIssue(
            'sync-bad-response',
            'The server answered in a way Tufa cannot read; is this a CouchDB server?',
          ),
      };
    }
    this.sessionPassword = c.remember ? '' : c.password;
    await this.store.setMeta(CONNECTION, {
      ...c,
      url: url.url.href,
      remember: c.remember === true,
      password: c.remember ? c.password : '',
    });
    await this.start();
    return checked;
  }

  /** Partial sync: the sites this device pulls (`undefined`: all). Applies from the next sync. */
  async setKeepSites(ids: string[] | undefined): Promise<void> {
    const c = await this.store.getMeta<ConnectionSettings>(CONNECTION);
    if (!c) return;
    const { keepSites: _, ...rest } = c;
    await this.store.setMeta(CONNECTION, ids ? { ...rest, keepSites: ids } : rest);
    await this.start();
  }

  async disconnect(): Promise<void> {
    this.sessionPassword = '';
    await this.store.setMeta(CONNECTION, undefined);
    this.unsubscribe?.();
    this.engine = undefined;
    this.emit(NOT_CONFIGURED);
  }

  /** Runs a sync now; errors end up in the status (in words), never as an exception. */
  async syncNow(): Promise<void> {
    if (!this.engine && !(await this.start())) return;
    await this.engine?.sync().catch(() => undefined);
  }

  /** Re-reads pending and conflict counts (after a local change) without syncing. */
  async refresh(): Promise<void> {
    await this.engine?.refreshStatus();
  }

  /** Whether a server is set up (sync may still wait for a password or the network). */
  async configured(): Promise<boolean> {
    return (await this.store.getMeta<ConnectionSettings>(CONNECTION)) !== undefined;
  }

  subscribe(fn: (s: SyncStatus) => void): () => void {
    this.listeners.add(fn);
    fn(this.status);
    return () => this.listeners.delete(fn);
  }

  private emit(s: SyncStatus): void {
    this.status = s;
    for (const l of this.listeners) l(s);
  }

  conflicts(): Promise<ConflictRecord[]> {
    return this.store.conflicts();
  }

  /** A refused change settled by the user (`refused.ts`), then a sync so the result shows. */
  async settleRefused(docId: string, choice: RefusedChoice): Promise<void> {
    if (!this.engine && !(await this.start())) return;
    await this.engine!.settleRefused(docId, choice);
    await this.syncNow();
  }

  /** Docs the user chose to keep on this device only (not sent), as they are now. */
  heldHere(): Promise<TufaDoc[]> {
    return heldHere(this.store);
  }

  /** Sends a doc kept on this device only again. */
  async sendHeld(docId: string): Promise<void> {
    await sendHeld(this.store, docId);
    await this.syncNow();
  }

  async resolve(docId: string, choice: 'local' | { rev: string } | { merged: TufaDoc }): Promise<void> {
    if (!this.engine && !(await this.start())) return;
    await this.engine!.resolve(docId, choice);
    await this.syncNow();
  }
}
