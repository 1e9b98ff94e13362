/**
 * The sync state in a few words for the top bar (pending changes, conflicts, last sync, trouble),
 * linking to the full panel in Settings. Nothing is shown while no server is set up.
 */

import { useEffect, useState } from 'preact/hooks';
import type { SyncStatus } from '../../sync/sync-engine';
import type { SyncService } from '../../sync/sync-service';

export function badgeWords(
  s: SyncStatus,
  locale?: string,
): { text: string; tone: '' | 'attention' | 'error' } {
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
  return { text: parts.join(' · ') || 'Sync set up', tone };
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
  const { text, tone } = badgeWords(status, locale);
  return (
    <a class={`sync-badge ${tone}`} href="#/settings" data-testid="sync-badge" aria-label={`Sync: ${text}`}>
      {text}
    </a>
  );
}
