/** The app shell: top bar, the current screen, notices (undo, errors, update ready), offline state. */

import { useEffect, useRef, useState } from 'preact/hooks';
import type { Issue } from '../chem/errors';
import { storeIssue } from '../store/errors';
import type { Repository } from '../store/repository';
import type { Settings } from '../store/settings';
import type { SyncService } from '../sync/sync-service';
import { requestBackgroundSync } from '../sync/sync-triggers';
import { AppContext, type AppState, type Notice } from './app-context';
import { useRoute } from './router';
import { ReadingEntryScreen } from './screens/ReadingEntryScreen';
import { ReadingScreen } from './screens/ReadingScreen';
import { SettingsScreen } from './screens/SettingsScreen';
import { SiteFormScreen } from './screens/SiteFormScreen';
import { SiteScreen } from './screens/SiteScreen';
import { SitesScreen } from './screens/SitesScreen';
import { SyncBadge } from './sync/SyncBadge';

function applyTheme(theme: Settings['theme']) {
  const dark = theme === 'dark' || (theme === 'system' && matchMedia('(prefers-color-scheme: dark)').matches);
  document.documentElement.dataset.theme = theme === 'contrast' ? 'contrast' : dark ? 'dark' : 'light';
}

export function App(props: {
  repo: Repository;
  initialSettings: Settings;
  updateReady?: () => void;
  bootIssue?: Issue;
  sync?: SyncService;
  syncState?: AppState['syncState'];
}) {
  const route = useRoute();
  const [settings, setSettings] = useState(props.initialSettings);
  const [notice, setNotice] = useState<Notice>();
  const [dataVersion, setDataVersion] = useState(0);
  const [online, setOnline] = useState(navigator.onLine);
  const pushTimer = useRef<ReturnType<typeof setTimeout>>(undefined);
  const sync = props.sync;

  // A sync that finished may have brought changes from other devices: reload what is shown.
  useEffect(() => {
    if (!sync) return;
    let last: string | undefined;
    return sync.subscribe((s) => {
      if (s.state === 'idle' && s.lastSyncAt && s.lastSyncAt !== last) {
        if (last !== undefined) setDataVersion((v) => v + 1);
        last = s.lastSyncAt;
      }
    });
  }, [sync]);

  /** After a local change: the outbox already holds it; this only says when to send it. */
  const sendSoon = () => {
    if (!sync) return;
    void sync.refresh();
    if (!navigator.onLine) {
      // Chromium wakes the service worker when the network is back; elsewhere `online` does it.
      void requestBackgroundSync();
      return;
    }
    clearTimeout(pushTimer.current);
    pushTimer.current = setTimeout(() => void sync.syncNow(), 1500);
  };

  useEffect(() => applyTheme(settings.theme), [settings.theme]);
  useEffect(() => {
    const on = () => setOnline(navigator.onLine);
    addEventListener('online', on);
    addEventListener('offline', on);
    return () => {
      removeEventListener('online', on);
      removeEventListener('offline', on);
    };
  }, []);
  useEffect(() => {
    if (!notice || notice.kind === 'error') return;
    const t = setTimeout(() => setNotice(undefined), notice.action ? 8000 : 4000);
    return () => clearTimeout(t);
  }, [notice]);
  useEffect(() => {
    if (props.bootIssue)
      setNotice({ kind: 'error', text: `${props.bootIssue.code}: ${props.bootIssue.message}` });
  }, [props.bootIssue]);

  const state: AppState = {
    repo: props.repo,
    settings,
    locale: settings.locale || undefined,
    saveSettings: async (patch) => {
      try {
        setSettings(await props.repo.putSettings(patch));
      } catch (e) {
        const i = storeIssue(e);
        setNotice({ kind: 'error', text: `${i.code}: ${i.message}` });
      }
    },
    notify: setNotice,
    reportError: (i) => setNotice({ kind: 'error', text: `${i.code}: ${i.message}` }),
    sync,
    syncState: props.syncState ?? (sync ? 'ready' : 'failed'),
    dataVersion,
    dataChanged: () => {
      setDataVersion((v) => v + 1);
      sendSoon();
    },
  };

  let screen: preact.JSX.Element;
  switch (route.name) {
    case 'sites':
      screen = <SitesScreen />;
      break;
    case 'site-new':
      screen = <SiteFormScreen />;
      break;
    case 'site-edit':
      screen = <SiteFormScreen siteId={route.siteId} />;
      break;
    case 'site':
      screen = <SiteScreen siteId={route.siteId} />;
      break;
    case 'reading-new':
      screen = <ReadingEntryScreen siteId={route.siteId} />;
      break;
    case 'reading':
      screen = <ReadingScreen readingId={route.readingId} />;
      break;
    case 'reading-edit':
      screen = <ReadingEntryScreen readingId={route.readingId} />;
      break;
    case 'settings':
      screen = <SettingsScreen />;
      break;
  }

  return (
    <AppContext.Provider value={state}>
      <a class="skip" href="#main">
        Skip to content
      </a>
      <header class="topbar">
        <a class="brand" href="#/" aria-label="Tufa — sites">
          <img src="icons/icon-192.png" alt="" width="32" height="32" />
          <span>Tufa</span>
        </a>
        <span class={`net ${online ? 'on' : 'off'}`} role="status">
          {online ? 'Online' : 'Offline — saving on this device'}
        </span>
        {sync && <SyncBadge service={sync} locale={settings.locale || undefined} />}
        <nav aria-label="Main">
          <a href="#/" aria-current={route.name === 'sites' ? 'page' : undefined}>
            Sites
          </a>
          <a href="#/settings" aria-current={route.name === 'settings' ? 'page' : undefined}>
            Settings
          </a>
        </nav>
      </header>
      {props.updateReady && (
        <div class="banner" role="status">
          A new version of Tufa is ready.{' '}
          <button type="button" class="primary" onClick={props.updateReady}>
            Reload to update
          </button>
        </div>
      )}
      <main id="main" tabIndex={-1}>
        {screen}
      </main>
      {notice && (
        <div class={`toast ${notice.kind}`} role={notice.kind === 'error' ? 'alert' : 'status'}>
          <span>{notice.text}</span>
          {notice.action && (
            <button
              type="button"
              onClick={() => {
                notice.action!.run();
                setNotice(undefined);
              }}
            >
              {notice.action.label}
            </button>
          )}
          <button type="button" class="icon" aria-label="Dismiss" onClick={() => setNotice(undefined)}>
            ×
          </button>
        </div>
      )}
    </AppContext.Provider>
  );
}
