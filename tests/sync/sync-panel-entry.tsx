/** Page for the sync panel test: a device with one site, one reading in conflict, and a server that cannot be reached. */

import { render } from 'preact';
import { openRepository } from '../../src/store/repository';
import { keepSetAside } from '../../src/sync/quarantine';
import { RepositoryStore } from '../../src/sync/repository-store';
import { SyncService } from '../../src/sync/sync-service';
import { SyncPanel } from '../../src/ui/sync/SyncPanel';

declare global {
  interface Window {
    panelReady?: boolean;
  }
}

async function main() {
  const repo = await openRepository({ name: 'tufa-panel' });
  const store = new RepositoryStore(repo);
  const site = await repo.createSite({ name: 'Quellhof spring', kind: 'spring', defaults: {}, notes: '' });
  const mine = await repo.createReading({
    siteId: site.id,
    takenAt: '2026-06-03T07:15:00.000Z',
    timeZone: 'Europe/Vienna',
    values: [
      { quantity: 'temperature', value: 9.4, unit: 'c' },
      { quantity: 'ph', value: 7.21, unit: 'ph' },
    ],
    notes: 'meter recalibrated before this one',
  });
  const theirs = {
    ...mine,
    rev: '2-5b1c0de0',
    notes: 'bubbles in the flow cell',
    values: [
      { quantity: 'temperature', value: 9.4, unit: 'c' },
      { quantity: 'ph', value: 7.25, unit: 'ph' },
    ],
  };
  await store.putConflict({
    docId: mine.id,
    kind: 'edit',
    local: mine,
    others: [{ rev: theirs.rev, doc: theirs }],
    baseRev: theirs.rev,
    deleteRevs: [],
    detectedAt: new Date().toISOString(),
  });
  await store.setMeta('connection', {
    url: 'http://couch.lab.example.org/',
    db: 'springs',
    auth: 'basic',
    user: 'ana',
    password: 'x',
  });
  // A document another tool wrote to the server with a pH that is not a number: set aside.
  await keepSetAside(store, [
    {
      docId: '7c0e2a4e-0b7d-4c55-9d0e-3f1b2a9c8d11',
      rev: '3-a41f',
      code: 'sync-doc-invalid',
      reason: 'value of ph is not a finite number',
      json: '{"_id":"7c0e2a4e-0b7d-4c55-9d0e-3f1b2a9c8d11","type":"reading","values":[{"quantity":"ph","value":"seven","unit":"ph"}]}',
      at: new Date().toISOString(),
    },
  ]);
  // No network in this page: every request fails as it would with no signal at the spring.
  const offline = () => Promise.reject(new TypeError('Failed to fetch'));
  const service = new SyncService(store, offline);
  await service.start();
  render(<SyncPanel service={service} locale="en-GB" />, document.getElementById('app')!);
  window.panelReady = true;
}
void main();
