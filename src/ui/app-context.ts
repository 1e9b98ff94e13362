/** What every screen needs: the repository, the user's settings, and a way to tell the user things. */

import { createContext } from 'preact';
import { useContext } from 'preact/hooks';
import type { Issue } from '../chem/errors';
import type { Repository } from '../store/repository';
import type { Settings } from '../store/settings';
import type { SyncService } from '../sync/sync-service';

export interface Notice {
  text: string;
  kind: 'info' | 'error';
  /** An action offered with the notice, e.g. Undo. */
  action?: { label: string; run: () => void };
}

export interface AppState {
  repo: Repository;
  settings: Settings;
  saveSettings: (patch: Partial<Settings>) => Promise<void>;
  locale: string | undefined;
  notify: (n: Notice) => void;
  reportError: (issue: Issue) => void;
  /** Sync with a server; absent when it could not start (the app works without it). */
  sync: SyncService | undefined;
  syncState: 'starting' | 'ready' | 'failed';
  /** Bumped after data changes (here or pulled by sync) so lists reload. */
  dataVersion: number;
  /** Call after a local change: lists reload and the change is sent (now, or when back online). */
  dataChanged: () => void;
}

export const AppContext = createContext<AppState | null>(null);

export function useApp(): AppState {
  const s = useContext(AppContext);
  if (!s) throw new Error('useApp outside AppContext');
  return s;
}
