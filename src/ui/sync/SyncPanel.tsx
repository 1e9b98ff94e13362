/**
 * Sync settings, status and conflicts, in one self-contained panel for the settings screen:
 * `<SyncPanel service={service} />` with the service from `bootSync(repo)` (`src/sync/boot-sync.ts`).
 */

import { useEffect, useRef, useState } from 'preact/hooks';
import type { Issue } from '../../chem/errors';
import type { TufaDoc } from '../../store/schema';
import type { SyncStatus } from '../../sync/sync-engine';
import { type ConnectionSettings, checkConnection, type SyncService } from '../../sync/sync-service';
import type { ConflictRecord } from '../../sync/sync-store';
import { differingFields, docTitle, fieldLabel, mergeVersions, showValue } from './conflict-fields';
import { KeepSites } from './KeepSites';
import { HeldHere, RefusedCard } from './RefusedCard';
import { SYNC_PANEL_HASH } from './SyncBadge';
import { TeamRole } from './TeamRole';

const EMPTY: ConnectionSettings = { url: '', db: 'tufa', auth: 'session', user: '', password: '' };

function when(iso: string | undefined, locale?: string): string {
  if (!iso) return 'never';
  return new Date(iso).toLocaleString(locale, { dateStyle: 'medium', timeStyle: 'medium' });
}

function stateWords(s: SyncStatus, locale?: string): string {
  if (s.error?.code === 'sync-not-configured') return 'Not shared with a server yet.';
  switch (s.state) {
    case 'idle':
      if (s.conflicts > 0)
        return s.conflicts === 1
          ? 'A conflict needs your choice (below); that record is not sent until then.'
          : `${s.conflicts} conflicts need your choice (below); those records are not sent until then.`;
      if (s.pending > 0) return 'Changes waiting to be sent.';
      return s.lastSyncAt ? 'Up to date.' : 'Not synced yet.';
    case 'syncing':
      return 'Syncing…';
    case 'waiting-to-retry':
      return `Trying again at ${new Date(s.retryAt ?? Date.now()).toLocaleTimeString(locale)}.`;
    case 'error':
      return 'Not syncing. Everything stays safe on this device; press Sync now, or Tufa tries again when the network returns.';
  }
}

function IssueLine({ issue, kind }: { issue: Issue; kind: 'warn' | 'error' }) {
  return (
    <p class={`issue ${kind}`} role={kind === 'error' ? 'alert' : 'status'}>
      {issue.message} <code>{issue.code}</code>
    </p>
  );
}

function ConflictCard({
  c,
  onResolve,
  locale,
}: {
  c: ConflictRecord;
  onResolve: (choice: Parameters<SyncService['resolve']>[1]) => void;
  locale?: string;
}) {
  const versions = [c.local, ...c.others.map((o) => o.doc)];
  const names = [
    'This device',
    ...c.others.map((_, i) => (c.kind === 'edit' ? 'Server' : `Server branch ${i + 1}`)),
  ];
  const fields = differingFields(versions);
  const [picks, setPicks] = useState<Record<string, number>>(() =>
    Object.fromEntries(fields.map((f) => [f, 0])),
  );
  return (
    <article class="panel" aria-label={`Conflict: ${docTitle(c.local, locale)}`}>
      <h3>{docTitle(c.local, locale)}</h3>
      <p class="muted small">
        {c.kind === 'edit'
          ? 'Changed on this device and on the server since the last sync. Both versions are kept until you choose.'
          : 'The server holds several versions of this record. All are kept until you choose.'}
      </p>
      <table class="kv conflict">
        <thead>
          <tr>
            <th scope="col">Field</th>
            {names.map((n) => (
              <th scope="col" key={n}>
                {n}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {fields.map((f) => (
            <tr key={f}>
              <th scope="row">{fieldLabel(f)}</th>
              {versions.map((v, i) => (
                <td key={names[i]}>
                  <label class="pick">
                    <input
                      type="radio"
                      name={`${c.docId}-${f}`}
                      checked={picks[f] === i}
                      onChange={() => setPicks({ ...picks, [f]: i })}
                    />
                    {showValue(f, (v as unknown as Record<string, unknown>)[f], locale)}
                  </label>
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
      <div class="actions">
        <button type="button" onClick={() => onResolve('local')}>
          Keep this device’s version
        </button>
        {c.others.map((o, i) => (
          <button type="button" key={o.rev} onClick={() => onResolve({ rev: o.rev })}>
            Keep {names[i + 1]?.toLowerCase()} version
          </button>
        ))}
        <button
          type="button"
          class="primary"
          onClick={() => onResolve({ merged: mergeVersions(versions, picks) })}
        >
          Save the fields picked above
        </button>
      </div>
    </article>
  );
}

export function SyncPanel({
  service,
  locale,
  onDataChanged,
}: {
  service: SyncService;
  locale?: string;
  onDataChanged?: () => void;
}) {
  const [form, setForm] = useState<ConnectionSettings>(EMPTY);
  const [formIssue, setFormIssue] = useState<Issue>();
  const [warnings, setWarnings] = useState<Issue[]>([]);
  const [status, setStatus] = useState<SyncStatus>();
  const [conflicts, setConflicts] = useState<ConflictRecord[]>([]);
  const [busy, setBusy] = useState(false);
  const [connected, setConnected] = useState<ConnectionSettings>();

  const [held, setHeld] = useState<TufaDoc[]>([]);
  const reloadConflicts = () =>
    Promise.all([service.conflicts().then(setConflicts), service.heldHere().then(setHeld)]);
  useEffect(() => {
    service.connection().then((c) => {
      if (c) setForm({ ...c, password: c.password });
      setConnected(c);
    });
    const stop = service.subscribe((s) => {
      setStatus(s);
      if (s.state === 'idle' || s.state === 'error') reloadConflicts();
    });
    reloadConflicts();
    return stop;
  }, [service]);

  useEffect(() => {
    const r = form.url ? checkConnection(form) : { warnings: [] };
    setWarnings('warnings' in r ? r.warnings : []);
  }, [form.url, form.db]);

  // The top-bar badge links here: bring the state and any conflicts into view, not the units.
  const section = useRef<HTMLElement>(null);
  useEffect(() => {
    const show = () => {
      if (location.hash === SYNC_PANEL_HASH) section.current?.scrollIntoView({ block: 'start' });
    };
    show();
    addEventListener('hashchange', show);
    return () => removeEventListener('hashchange', show);
  }, []);

  const set = (patch: Partial<ConnectionSettings>) => setForm({ ...form, ...patch });
  const save = async (e: Event) => {
    e.preventDefault();
    setBusy(true);
    const r = await service.configure(form);
    setBusy(false);
    setFormIssue('error' in r ? r.error : undefined);
    if (!('error' in r)) {
      setWarnings(r.warnings);
      setConnected(form);
      await service.syncNow();
      onDataChanged?.();
    }
  };
  const syncNow = async () => {
    setBusy(true);
    await service.syncNow();
    setBusy(false);
    onDataChanged?.();
  };
  const settle = async (act: () => Promise<void>) => {
    await act();
    await reloadConflicts();
    onDataChanged?.();
  };
  const resolve = (docId: string, choice: Parameters<SyncService['resolve']>[1]) =>
    settle(() => service.resolve(docId, choice));

  return (
    <section aria-labelledby="sync-h" class="stack" ref={section}>
      <h2 id="sync-h">Sharing with a server</h2>
      <div class="panel" aria-live="polite">
        <p>
          <strong>{status ? stateWords(status, locale) : '…'}</strong>
        </p>
        <table class="kv">
          <tbody>
            <tr>
              <th scope="row">Last synced</th>
              <td>{when(status?.lastSyncAt, locale)}</td>
            </tr>
            <tr>
              <th scope="row">Waiting to be sent</th>
              <td>
                {status?.pending ?? 0} {status?.pending === 1 ? 'change' : 'changes'}
              </td>
            </tr>
            <tr>
              <th scope="row">Conflicts to decide</th>
              <td>{status?.conflicts ?? conflicts.length}</td>
            </tr>
          </tbody>
        </table>
        {status?.error && (
          <IssueLine
            issue={status.error}
            kind={status.state === 'error' && status.error.code !== 'sync-not-configured' ? 'error' : 'warn'}
          />
        )}
        <TeamRole connection={connected} status={status} />
        {status?.rejected.map((r) => (
          <IssueLine key={r.message} issue={r} kind="error" />
        ))}
        {status?.setAside.slice(-5).map((r) => (
          <IssueLine key={r.message} issue={r} kind="warn" />
        ))}
        {(status?.setAside.length ?? 0) > 5 && (
          <p class="muted">
            …and {(status?.setAside.length ?? 0) - 5} more documents from the server set aside (kept on this
            device).
          </p>
        )}
        <div class="actions">
          <button
            type="button"
            class="primary"
            onClick={syncNow}
            disabled={busy || status?.state === 'syncing' || status?.error?.code === 'sync-not-configured'}
          >
            Sync now
          </button>
        </div>
      </div>

      {conflicts.length > 0 && (
        <section aria-labelledby="conflicts-h">
          <h3 id="conflicts-h">Conflicts to decide ({conflicts.length})</h3>
          {conflicts.map((c) =>
            c.kind === 'refused' ? (
              <RefusedCard
                key={c.docId}
                c={c}
                locale={locale}
                onSettle={(choice) => settle(() => service.settleRefused(c.docId, choice))}
              />
            ) : (
              <ConflictCard
                key={c.docId}
                c={c}
                locale={locale}
                onResolve={(choice) => resolve(c.docId, choice)}
              />
            ),
          )}
        </section>
      )}
      <HeldHere docs={held} locale={locale} onSend={(id) => settle(() => service.sendHeld(id))} />
      {connected && (
        <KeepSites
          key={`${connected.url}|${connected.db}`}
          service={service}
          connection={connected}
          onSaved={(keepSites) => setForm((f) => ({ ...f, keepSites }))}
        />
      )}
      <form class="panel" onSubmit={save} aria-labelledby="sync-server-h">
        <h3 id="sync-server-h">Server</h3>
        <label class="field">
          <span>Server address</span>
          <input
            type="url"
            inputMode="url"
            autoComplete="url"
            placeholder="https://couch.example.org/"
            value={form.url}
            onInput={(e) => set({ url: e.currentTarget.value })}
            required
          />
        </label>
        {warnings.map((w) => (
          <IssueLine key={w.code} issue={w} kind="warn" />
        ))}
        <label class="field">
          <span>Database name</span>
          <input value={form.db} onInput={(e) => set({ db: e.currentTarget.value })} required />
        </label>
        <label class="field">
          <span>Sign-in</span>
          <select
            value={form.auth}
            onChange={(e) => set({ auth: e.currentTarget.value as ConnectionSettings['auth'] })}
          >
            <option value="session">Password, signed in once (cookie)</option>
            <option value="basic">Password sent with each request</option>
            <option value="none">No sign-in (open server)</option>
          </select>
        </label>
        {form.auth !== 'none' && (
          <>
            <label class="field">
              <span>User name</span>
              <input
                autoComplete="username"
                value={form.user}
                onInput={(e) => set({ user: e.currentTarget.value })}
              />
            </label>
            <label class="field">
              <span>Password</span>
              <input
                type="password"
                autoComplete="current-password"
                value={form.password}
                onInput={(e) => set({ password: e.currentTarget.value })}
              />
            </label>
            <label class="check">
              <input
                type="checkbox"
                checked={form.remember === true}
                onChange={(e) => set({ remember: e.currentTarget.checked })}
              />
              <span>Remember the password on this device</span>
            </label>
            <p class="muted small" id="sync-stored">
              {form.remember
                ? 'The password is kept in this browser’s storage for Tufa, unencrypted: anyone who can use this device and browser profile can read it. Leave this off on a shared device.'
                : 'The password is kept only while Tufa is open. After it is closed, Tufa asks for it again (a cookie session may carry on until the server ends it).'}{' '}
              The server address and user name are kept on this device. None of them ever go into backups or
              exports.
            </p>
          </>
        )}
        <label class="check">
          <input
            type="checkbox"
            checked={form.keepSites !== undefined}
            onChange={(e) => set({ keepSites: e.currentTarget.checked ? (form.keepSites ?? []) : undefined })}
          />
          <span>Fetch only the sites I choose (a large team database: choose them below once connected)</span>
        </label>
        {formIssue && <IssueLine issue={formIssue} kind="error" />}
        <div class="actions">
          <button type="submit" class="primary" disabled={busy}>
            Check and save
          </button>
          {status?.error?.code !== 'sync-not-configured' && (
            <button
              type="button"
              onClick={async () => {
                await service.disconnect();
                setForm(EMPTY);
              }}
            >
              Stop sharing
            </button>
          )}
        </div>
      </form>
    </section>
  );
}
