/**
 * `tufa server` keeps its data: killed (SIGKILL) in the middle of a signed-in push and started
 * again on the same folder, nothing is lost or stored twice. And partial sync: a device that keeps
 * some sites pulls exactly those sites' readings (filtered `_changes` with a selector).
 */

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main';
import type { ReadingDoc } from '../../src/store/schema';
import type { Fetch } from '../../src/sync/couch-client';
import { readingInput, siteInput } from '../sync/devices';
import { basic, teamDevice } from './team-devices';
import { TufaServer } from './tufa-server';

const ADMIN = 'root:field-admin-pass';
const server = new TufaServer(ADMIN, 'team');
const quiet = { stdin: process.stdin, stdout: { write: () => true }, stderr: { write: () => true } };

beforeAll(async () => {
  await server.start();
  for (const [name, role] of [
    ['anna', 'member'],
    ['lea', 'lead'],
    ['vera', 'viewer'],
  ])
    await main(
      [
        'team',
        'add-user',
        '--url',
        server.url,
        '--admin',
        ADMIN,
        '--name',
        name!,
        '--password',
        `${name}-pw`,
        '--role',
        role!,
      ],
      quiet,
    );
}, 90000);
afterAll(() => server.stop());

async function serverRows(): Promise<{ id: string; value: { rev: string } }[]> {
  const r = await fetch(`${server.url}team/_all_docs`, { headers: basic('lea', 'lea-pw') });
  return ((await r.json()) as { rows: { id: string; value: { rev: string } }[] }).rows.filter(
    (x) => !x.id.startsWith('_design/'),
  );
}

function readings(siteId: string, n: number, from = 0): ReadingDoc[] {
  return Array.from({ length: n }, (_, i) => ({
    ...readingInput(siteId, from + i),
    id: crypto.randomUUID(),
    type: 'reading' as const,
    updatedAt: '2026-05-02T10:00:00.000Z',
    deleted: false,
  }));
}

describe('tufa server on disk', () => {
  it('killed in the middle of a push and restarted: every reading there exactly once, users kept', async () => {
    let bulkCalls = 0;
    let restarted: Promise<void> | undefined;
    const crashing: Fetch = (url, init) => {
      const p = fetch(url, init);
      if (url.endsWith('/_bulk_docs') && ++bulkCalls === 3) {
        restarted = (async () => {
          await new Promise((r) => setTimeout(r, 5));
          await server.kill();
          await server.start();
        })();
      }
      return p;
    };
    const a = await teamDevice(server.url, 'team', 'anna', 'anna-pw', { fetch: crashing });
    const site = await a.repo.createSite(siteInput('Trout raceway 4'));
    const docs = readings(site.id, 1000);
    await a.repo.bulkPut(docs);
    const run = await a.engine.sync();
    await restarted;
    expect(bulkCalls).toBeGreaterThan(3);
    expect(run.attempts).toBeGreaterThan(1);
    expect(await a.repo.outboxSize()).toBe(0);
    const rows = await serverRows(); // lea's password still works: _users survived
    expect(rows.map((r) => r.id).sort()).toEqual([site.id, ...docs.map((d) => d.id)].sort());
    expect(rows.filter((r) => !r.value.rev.startsWith('1-'))).toEqual([]);
    // The rules survived too: a viewer still cannot write.
    const w = await fetch(`${server.url}team/x`, {
      method: 'PUT',
      headers: basic('vera', 'vera-pw'),
      body: '{}',
    });
    expect(w.status).toBe(403);
  }, 120000);

  it('a device keeping 2 of 5 sites pulls every site but only those sites’ readings', async () => {
    const lead = await teamDevice(server.url, 'team', 'lea', 'lea-pw');
    const sites = [];
    for (let i = 0; i < 5; i++) {
      const s = await lead.repo.createSite(siteInput(`Pond ${i + 1}`));
      sites.push(s);
      await lead.repo.bulkPut(readings(s.id, 30, i * 100));
    }
    await lead.engine.sync();
    const keep = [sites[1]!.id, sites[3]!.id];
    const phone = await teamDevice(server.url, 'team', 'vera', 'vera-pw', { keepSites: keep });
    const run = await phone.engine.sync();
    const local = await phone.repo.listAllReadings();
    expect(local.length).toBe(60);
    expect(new Set(local.map((r) => r.siteId))).toEqual(new Set(keep));
    expect(run.pulled).toBe(60 + (await phone.repo.listSites()).length);
    // Every site is known (to choose from): the 5 ponds and the raceway of the test above.
    expect((await phone.repo.listSites()).map((s) => s.name)).toEqual(
      expect.arrayContaining(['Pond 1', 'Pond 2', 'Pond 3', 'Pond 4', 'Pond 5']),
    );
    // A reading added later to a kept site arrives; one at another site does not.
    await lead.repo.bulkPut([...readings(keep[0]!, 1, 900), ...readings(sites[0]!.id, 1, 901)]);
    await lead.engine.sync();
    await phone.engine.sync();
    expect((await phone.repo.listAllReadings()).length).toBe(61);
    // A reading deleted through the CouchDB API leaves a stub without siteId: it still arrives.
    const gone = local[0]!;
    const head = (await (
      await fetch(`${server.url}team/${gone.id}`, { headers: basic('lea', 'lea-pw') })
    ).json()) as {
      _rev: string;
    };
    const del = await fetch(`${server.url}team/${gone.id}?rev=${head._rev}`, {
      method: 'DELETE',
      headers: basic('lea', 'lea-pw'),
    });
    expect(del.status).toBe(200);
    await phone.engine.sync();
    expect((await phone.repo.getReading(gone.id))?.deleted).toBe(true);
  }, 120000);
});
