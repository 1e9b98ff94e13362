/**
 * The sync state in a few words for the top bar (pending changes, conflicts, last sync, trouble),
 * linking to the full panel in Settings. Nothing is shown while no server is set up.
 */

import { useEffect, useState } from 'preact/hooks';
import type { SyncStatus } from '../../sync/sync-engine';
import type { SyncService } from '../../sync/sync-service';

/** The settings screen, opened at the sharing panel (SyncPanel scrolls itself into view). */
export const SYNC_PANEL_HASH = '#/settings/sync';

export function badgeWords(
  s: SyncStatus,
  locale?: string,
): { text: string; parts: string[]; when: boolean; tone: '' | 'attention' | 'error' } {
  const parts: string[] = [];
  if (s.state === 'syncing') parts.push('Syncing…');
  if (s.conflicts > 0) parts.push(`${s.conflicts} ${s.conflicts === 1 ? 'conflict' : 'conflicts'}`);
  if (s.pending > 0) parts.push(`${s.pending} to send`);
  if (s.state === 'error' || s.state === 'waiting-to-retry') parts.push('not synced');
  else if (s.state === 'idle' && s.lastSyncAt)
    parts.push(
      `synced ${new Date(s.lastSyncAt).toLocaleTimeString(locale, { hour: '2-digit', minute: '2-digit' })}`,
    );
  const tone =
    s.state === 'error' ? 'error' : s.conflicts > 0 || s.state === 'waiting-to-retry' ? 'attention' : '';
  const when = s.state === 'idle' && !!s.lastSyncAt;
  return { text: parts.join(' · ') || 'Sync set up', parts, when, tone };
}

export function SyncBadge({ service, locale }: { service: SyncService; locale?: string }) {
  const [status, setStatus] = useState<SyncStatus>();
  const [configured, setConfigured] = useState(false);
  useEffect(
    () =>
      service.subscribe((s) => {
        setStatus(s);
        service.configured().then(setConfigured);
      }),
    [service],
  );
  if (!status || !configured) return null;
  const { text, parts, when, tone } = badgeWords(status, locale);
  if (parts.length === 0) parts.push(text);
  // On a narrow phone the time of the last sync gives way when there is more to say, so the
  // badge and the menu share one row of the top bar (styles.css, .sync-badge .when).
  const last = parts.length - 1;
  return (
    <a
      class={`sync-badge ${tone}`}
      href={SYNC_PANEL_HASH}
      data-testid="sync-badge"
      aria-label={`Sync: ${text}`}
    >
      {parts.map((p, i) => (
        <span key={p} class={when && i === last && i > 0 ? 'when' : undefined}>
          {i > 0 ? ' · ' : ''}
          {p}
        </span>
      ))}
    </a>
  );
}
