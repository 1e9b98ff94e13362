/**
 * A change the team server refuses (403 from its rules) becomes a `refused` conflict on the
 * device: the local version beside the server's current one (or "not on the server"), the
 * server's reason, out of the outbox while open; each of the three choices does what it says
 * and nothing typed is lost. Against `tufa server`, started by the test.
 */

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main';
import type { ReadingDoc } from '../../src/store/schema';
import { heldHere } from '../../src/sync/refused';
import { readingInput, siteInput } from '../sync/devices';
import { teamDevice } from './team-devices';
import { TufaServer } from './tufa-server';

const ADMIN = 'root:field-admin-pass';
const server = new TufaServer(ADMIN, 'team');

async function addUser(name: string, role: string): Promise<void> {
  const sink = { write: () => {} };
  const code = await main(
    [
      'team',
      'add-user',
      '--url',
      server.url,
      '--admin',
      ADMIN,
      '--name',
      name,
      '--password',
      `${name}-pw`,
      '--role',
      role,
    ],
    { stdin: process.stdin, stdout: sink, stderr: sink },
  );
  expect(code).toBe(0);
}

beforeAll(async () => {
  await server.start();
  for (const [n, r] of [
    ['anna', 'member'],
    ['ben', 'member'],
    ['vera', 'viewer'],
  ] as const)
    await addUser(n, r);
}, 120000);
afterAll(() => server.stop());

/** Anna's reading on the server; Ben (a member) synced it and edited it: the server refuses. */
async function refusedEdit(tag: string) {
  const a = await teamDevice(server.url, 'team', 'anna', 'anna-pw');
  const site = await a.repo.createSite(siteInput(`Pond ${tag} by the weir`));
  const reading = await a.repo.createReading({ ...readingInput(site.id, 2), notes: 'anna, first visit' });
  expect((await a.engine.sync()).pushed).toBe(2);
  const b = await teamDevice(server.url, 'team', 'ben', 'ben-pw');
  await b.engine.sync();
  await b.repo.updateReading(reading.id, { notes: `ben typed this (${tag})` });
  const run = await b.engine.sync();
  expect(run.pushed).toBe(0);
  expect(run.conflicts).toBe(1);
  return { a, b, id: reading.id };
}

const notesOf = async (
  dev: { repo: { getReading(id: string): Promise<ReadingDoc | undefined> } },
  id: string,
) => (await dev.repo.getReading(id))?.notes;

describe('a refused change becomes a conflict the user resolves', () => {
  it('keeps both versions and the reason, leaves the outbox, and is not retried at each sync', async () => {
    const { b, id } = await refusedEdit('keep');
    expect(b.engine.getStatus().rejected.map((r) => r.code)).toEqual(['sync-doc-forbidden']);
    const [c] = await b.store.conflicts();
    expect(c).toMatchObject({ docId: id, kind: 'refused' });
    expect(c!.reason).toMatch(/created by anna/);
    expect((c!.local as ReadingDoc).notes).toBe('ben typed this (keep)');
    expect(c!.others).toHaveLength(1);
    expect((c!.others[0]!.doc as ReadingDoc).notes).toBe('anna, first visit');
    expect(await b.repo.outboxSize()).toBe(0);
    const again = await b.engine.sync();
    expect(again).toMatchObject({ pushed: 0, conflicts: 0 });
    expect(b.engine.getStatus().rejected).toEqual([]); // not sent again, so not refused again
    expect(await b.store.conflicts()).toHaveLength(1);
    expect(await notesOf(b, id)).toBe('ben typed this (keep)');
  });

  it("take the server's version: the edit is dropped, the reading is the server's copy", async () => {
    const { b, id } = await refusedEdit('take');
    expect(await b.engine.settleRefused(id, 'server')).toBe(true);
    expect(await b.store.conflicts()).toEqual([]);
    expect(await b.repo.outboxSize()).toBe(0);
    expect(await notesOf(b, id)).toBe('anna, first visit');
    expect(await b.engine.sync()).toMatchObject({ pushed: 0, conflicts: 0 });
    expect(await notesOf(b, id)).toBe('anna, first visit');
  });

  it('keep it on this device only: unsent, listed, and a later server change becomes a conflict, not an overwrite', async () => {
    const { a, b, id } = await refusedEdit('here');
    expect(await b.engine.settleRefused(id, 'here')).toBe(true);
    expect(await b.store.conflicts()).toEqual([]);
    expect((await heldHere(b.store)).map((d) => d.id)).toEqual([id]);
    expect(await b.engine.sync()).toMatchObject({ pushed: 0, conflicts: 0 });
    expect(await notesOf(b, id)).toBe('ben typed this (here)');

    await a.repo.updateReading(id, { notes: 'anna, second visit' });
    expect((await a.engine.sync()).pushed).toBe(1);
    expect((await b.engine.sync()).conflicts).toBe(1);
    expect(await notesOf(b, id)).toBe('ben typed this (here)');
    const [c] = await b.store.conflicts();
    expect((c!.others[0]!.doc as ReadingDoc).notes).toBe('anna, second visit');
  });

  it('try again later: back in the outbox, refused again while the role is the same, accepted once a lead', async () => {
    const { b, id } = await refusedEdit('retry');
    expect(await b.engine.settleRefused(id, 'retry')).toBe(true);
    expect(await b.store.conflicts()).toEqual([]);
    expect(await b.repo.outboxSize()).toBe(1);
    expect((await b.engine.sync()).conflicts).toBe(1); // still a member: refused again, still kept
    expect(await notesOf(b, id)).toBe('ben typed this (retry)');

    await addUser('ben', 'lead');
    try {
      expect(await b.engine.settleRefused(id, 'retry')).toBe(true);
      expect((await b.engine.sync()).pushed).toBe(1);
      expect(await b.store.conflicts()).toEqual([]);
      expect(await b.repo.outboxSize()).toBe(0);
      const c = await teamDevice(server.url, 'team', 'vera', 'vera-pw');
      await c.engine.sync();
      expect(await notesOf(c, id)).toBe('ben typed this (retry)');
    } finally {
      await addUser('ben', 'member');
    }
  });

  it("a refused delete: taking the server's version brings the reading back", async () => {
    const { b, id } = await refusedEdit('delete');
    await b.engine.settleRefused(id, 'retry');
    await b.repo.deleteReading(id);
    expect((await b.engine.sync()).conflicts).toBe(1);
    const [c] = await b.store.conflicts();
    expect(c).toMatchObject({ kind: 'refused', local: { deleted: true } });
    expect(await b.engine.settleRefused(id, 'server')).toBe(true);
    expect(await b.repo.getReading(id)).toMatchObject({ deleted: false, notes: 'anna, first visit' });
    expect(await b.repo.outboxSize()).toBe(0);
  });

  it('an edit made while the conflict is open is what "keep it here" keeps, unsent', async () => {
    const { b, id } = await refusedEdit('again');
    await b.repo.updateReading(id, { notes: 'ben typed more' });
    expect(await b.engine.sync()).toMatchObject({ pushed: 0, conflicts: 0 }); // open: not sent
    expect(await b.engine.settleRefused(id, 'here')).toBe(true);
    expect(await b.repo.outboxSize()).toBe(0);
    expect(await b.engine.sync()).toMatchObject({ pushed: 0, conflicts: 0 });
    expect(await notesOf(b, id)).toBe('ben typed more');
    expect((await heldHere(b.store)).map((d) => d.id)).toEqual([id]);
  });

  it('a refused create has "not on the server" on the other side; it cannot be swapped for nothing', async () => {
    const v = await teamDevice(server.url, 'team', 'vera', 'vera-pw');
    const site = await v.repo.createSite(siteInput('Tank row C (viewer tried)'));
    expect((await v.engine.sync()).conflicts).toBe(1);
    const [c] = await v.store.conflicts();
    expect(c).toMatchObject({ docId: site.id, kind: 'refused', others: [] });
    expect(c!.reason).toBeTruthy();
    expect(await v.engine.settleRefused(site.id, 'server')).toBe(false);
    expect(await v.store.conflicts()).toHaveLength(1);
    expect(await v.engine.settleRefused(site.id, 'here')).toBe(true);
    expect((await v.repo.getSite(site.id))?.name).toBe('Tank row C (viewer tried)');
    expect((await heldHere(v.store)).map((d) => d.id)).toEqual([site.id]);
  });
});
