/** Boot: open the on-device database, read settings, render, register the service worker. */

import { render } from 'preact';
import type { Issue } from '../chem/errors';
import { storeIssue } from '../store/errors';
import { openRepository } from '../store/repository';
import { DEFAULT_SETTINGS, rejectedSettingsMessage } from '../store/settings';
import type { SyncService } from '../sync/sync-service';
import { App } from './app';
import { registerServiceWorker } from './sw-register';
import './styles.css';

const root = document.getElementById('app')!;
let updateReady: (() => void) | undefined;
let rerender: (() => void) | undefined;

function fatal(issue: Issue) {
  root.innerHTML = '';
  const p = document.createElement('p');
  p.className = 'issue error';
  p.setAttribute('role', 'alert');
  p.textContent = `${issue.code}: ${issue.message}`;
  root.append(p);
}

async function boot() {
  let blocked: Issue | undefined;
  try {
    const repo = await openRepository({
      onBlocked: (i) => {
        blocked = i;
        fatal(i);
      },
      onVersionChange: () =>
        fatal({
          code: 'store-upgrade-blocked',
          message: 'A newer Tufa opened in another tab. Reload this page to continue.',
        }),
    });
    // The app always starts: a stored setting that cannot be used falls back to its default, and
    // the user is told which one (store-invalid-setting) so Settings can put it right.
    let settingsIssue: Issue | undefined;
    const { settings } = await repo.readSettings().then(
      ({ settings, rejected }) => {
        if (rejected.length > 0)
          settingsIssue = { code: 'store-invalid-setting', message: rejectedSettingsMessage(rejected) };
        return { settings };
      },
      (e: unknown) => {
        const i = storeIssue(e);
        settingsIssue = { code: i.code, message: `Settings could not be read; defaults apply. ${i.message}` };
        return { settings: DEFAULT_SETTINGS };
      },
    );
    // Sync is an extra, loaded after the first screen (it is not part of the shell's budget): if it
    // cannot start, the app still works and keeps everything on the device.
    let sync: SyncService | undefined;
    let syncState: 'starting' | 'ready' | 'failed' = 'starting';
    root.textContent = ''; // the static "Starting" placeholder; Preact 11 appends otherwise
    rerender = () =>
      render(
        <App
          repo={repo}
          initialSettings={settings}
          updateReady={updateReady}
          bootIssue={blocked ?? settingsIssue}
          sync={sync}
          syncState={syncState}
        />,
        root,
      );
    rerender();
    document.documentElement.dataset.ready = 'true';
    import('../sync/boot-sync')
      .then((m) => m.bootSync(repo))
      .then(
        (r) => {
          sync = r.service;
          syncState = 'ready';
        },
        (e) => {
          console.warn('sync did not start', e);
          syncState = 'failed';
        },
      )
      .then(() => rerender?.());
  } catch (e) {
    fatal(storeIssue(e));
  }
}

boot();
registerServiceWorker((apply) => {
  updateReady = apply;
  rerender?.();
});
