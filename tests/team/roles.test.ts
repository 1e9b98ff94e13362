/**
 * Roles and document rules enforced by the server, not the app: the same checks against
 * `tufa server` (started by the test) and against a plain pouchdb-server that only had
 * `tufa team setup` applied over the CouchDB HTTP API.
 */

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main';
import { whoAmI } from '../../src/team/roles';
import { CouchServer } from '../sync/couch-server';
import { readingInput, siteInput } from '../sync/devices';
import { basic, teamDevice } from './team-devices';
import { TufaServer } from './tufa-server';

const ADMIN = 'root:field-admin-pass';

async function tufa(...args: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await main(args, {
    stdin: process.stdin,
    stdout: { write: (s: string) => (out += s) },
    stderr: { write: (s: string) => (err += s) },
  });
  return { code, out, err };
}

async function addPeople(url: string) {
  for (const [name, role] of [
    ['anna', 'member'],
    ['ben', 'member'],
    ['vera', 'viewer'],
    ['lea', 'lead'],
  ] as const) {
    const r = await tufa(
      'team',
      'add-user',
      '--url',
      url,
      '--admin',
      ADMIN,
      '--name',
      name,
      '--password',
      `${name}-pw`,
      '--role',
      role,
    );
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
  }
}

function roleChecks(label: string, target: () => { url: string; db: string }) {
  describe(label, () => {
    const doc = (id: string, by: string, extra: Record<string, unknown> = {}) => ({
      _id: id,
      type: 'reading',
      ...readingInput('site-1', 1),
      updatedAt: '2026-05-02T10:00:00.000Z',
      deleted: false,
      created_by: by,
      changed_by: by,
      ...extra,
    });
    const put = async (who: string | null, body: Record<string, unknown>) => {
      const { url, db } = target();
      const r = await fetch(`${url}${db}/${body._id}`, {
        method: 'PUT',
        headers: who ? basic(who, `${who}-pw`) : { 'content-type': 'application/json' },
        body: JSON.stringify(body),
      });
      return { status: r.status, body: (await r.json()) as { rev?: string; reason?: string } };
    };

    it('anonymous reads and writes nothing (401); a viewer reads but cannot write (403)', async () => {
      const { url, db } = target();
      expect((await fetch(`${url}${db}/_all_docs`)).status).toBe(401);
      expect((await fetch(`${url}${db}/_changes`)).status).toBe(401);
      expect((await put(null, doc('anon-1', 'anna'))).status).toBe(401);
      expect((await fetch(`${url}${db}/_all_docs`, { headers: basic('vera', 'vera-pw') })).status).toBe(200);
      const w = await put('vera', doc('viewer-1', 'vera'));
      expect(w.status).toBe(403);
      expect(w.body.reason).toMatch(/A viewer can read this database but not change it/);
    });

    it("member B cannot change or delete member A's reading (403); a lead can", async () => {
      const { url, db } = target();
      const a = await put('anna', doc('a-1', 'anna'));
      expect(a.status).toBe(201);
      const changed = await put(
        'ben',
        doc('a-1', 'ben', { _rev: a.body.rev, created_by: 'anna', notes: 'mine' }),
      );
      expect(changed.status).toBe(403);
      expect(changed.body.reason).toMatch(/created by anna/);
      const del = await fetch(`${url}${db}/a-1?rev=${a.body.rev}`, {
        method: 'DELETE',
        headers: basic('ben', 'ben-pw'),
      });
      expect(del.status).toBe(403);
      const byLead = await put(
        'lea',
        doc('a-1', 'lea', { _rev: a.body.rev, created_by: 'anna', notes: 'checked' }),
      );
      expect(byLead.status).toBe(201);
      const gone = await fetch(`${url}${db}/a-1?rev=${byLead.body.rev}`, {
        method: 'DELETE',
        headers: basic('lea', 'lea-pw'),
      });
      expect(gone.status).toBe(200);
    });

    it('the app learns the signed-in role from _session', async () => {
      const { url } = target();
      expect(await whoAmI(url, { kind: 'basic', user: 'vera', password: 'vera-pw' })).toEqual({
        name: 'vera',
        role: 'viewer',
      });
      expect(await whoAmI(url, { kind: 'basic', user: 'lea', password: 'lea-pw' })).toEqual({
        name: 'lea',
        role: 'lead',
      });
      expect(await whoAmI(url, { kind: 'basic', user: 'lea', password: 'wrong' })).toBeUndefined();
    });

    it('a string where a number belongs is refused with a message naming the field', async () => {
      const bad = doc('bad-1', 'anna', { values: [{ quantity: 'ph', value: '7.9', unit: 'nbs' }] });
      const r = await put('anna', bad);
      expect(r.status).toBe(403);
      expect(r.body.reason).toBe('reading bad-1: values[0].value (ph in nbs) must be a number, not "7.9".');
    });

    it('through the app: A syncs a reading, B edits it offline, the server refuses it and B keeps the edit as a conflict', async () => {
      const { url, db } = target();
      const a = await teamDevice(url, db, 'anna', 'anna-pw');
      const site = await a.repo.createSite(siteInput('Spring below the quarry'));
      const reading = await a.repo.createReading(readingInput(site.id, 3));
      expect((await a.engine.sync()).pushed).toBe(2);
      const onServer = (await (
        await fetch(`${url}${db}/${reading.id}`, { headers: basic('lea', 'lea-pw') })
      ).json()) as Record<string, unknown>;
      expect(onServer).toMatchObject({ created_by: 'anna', changed_by: 'anna' });

      const b = await teamDevice(url, db, 'ben', 'ben-pw');
      await b.engine.sync();
      await b.repo.updateReading(reading.id, { notes: 'ben was here' });
      await b.engine.sync();
      const rejected: string[] = [];
      b.engine.subscribe((s) => rejected.push(...s.rejected.map((x) => `${x.code} ${x.message}`)));
      expect(rejected.join('\n')).toMatch(
        /^sync-doc-forbidden The server did not accept your change to this reading: .*created by anna/m,
      );
      // Kept, not lost: a conflict beside the server's version, out of the outbox until B chooses.
      expect(await b.repo.outboxSize()).toBe(0);
      expect(await b.store.conflicts()).toMatchObject([{ docId: reading.id, kind: 'refused' }]);
      expect((await b.repo.getReading(reading.id))?.notes).toBe('ben was here');

      const lead = await teamDevice(url, db, 'lea', 'lea-pw');
      await lead.engine.sync();
      await lead.repo.updateReading(reading.id, { notes: 'lead checked' });
      expect((await lead.engine.sync()).pushed).toBe(1);
      const after = (await (
        await fetch(`${url}${db}/${reading.id}`, { headers: basic('vera', 'vera-pw') })
      ).json()) as Record<string, unknown>;
      expect(after).toMatchObject({ notes: 'lead checked', created_by: 'anna', changed_by: 'lea' });
    });
  });
}

const embedded = new TufaServer(ADMIN, 'team');
const plain = new CouchServer();
const PLAIN_DB = 'field-team';

beforeAll(async () => {
  await Promise.all([embedded.start(), plain.start()]);
  await addPeople(embedded.url);
  // A plain pouchdb-server in admin party: make the admin, then only the CouchDB API.
  const [name, pw] = ADMIN.split(':') as [string, string];
  const r = await fetch(`${plain.url}_config/admins/${name}`, { method: 'PUT', body: JSON.stringify(pw) });
  expect(r.ok).toBe(true);
  const s = await tufa('team', 'setup', '--url', plain.url, '--admin', ADMIN, '--db', PLAIN_DB);
  expect(s.code).toBe(0);
  expect(s.out).toMatch(/set up: _design\/tufa-team/);
  const again = await tufa('team', 'setup', '--url', plain.url, '--admin', ADMIN, '--db', PLAIN_DB);
  expect(again.out).not.toMatch(/set up:/); // idempotent
  await addPeople(plain.url);
}, 120000);
afterAll(() => Promise.all([embedded.stop(), plain.stop()]));

roleChecks('tufa server', () => ({ url: embedded.url, db: 'team' }));
roleChecks('plain pouchdb-server after tufa team setup', () => ({ url: plain.url, db: PLAIN_DB }));

describe('tufa team', () => {
  it('lists and removes people; a removed person is refused', async () => {
    const list = await tufa('team', 'list-users', '--url', plain.url, '--admin', ADMIN);
    expect(list.out.split('\n').filter(Boolean).sort()).toEqual([
      'anna\tmember',
      'ben\tmember',
      'lea\tlead',
      'vera\tviewer',
    ]);
    await tufa(
      'team',
      'add-user',
      '--url',
      plain.url,
      '--admin',
      ADMIN,
      '--name',
      'tmp',
      '--password',
      'tmp-pw',
      '--role',
      'member',
    );
    expect((await fetch(`${plain.url}${PLAIN_DB}`, { headers: basic('tmp', 'tmp-pw') })).status).toBe(200);
    const rm = await tufa('team', 'remove-user', '--url', plain.url, '--admin', ADMIN, '--name', 'tmp');
    expect(rm.code).toBe(0);
    expect((await fetch(`${plain.url}${PLAIN_DB}`, { headers: basic('tmp', 'tmp-pw') })).status).toBe(401);
  });

  it('refuses a wrong admin password and a made-up role with codes', async () => {
    const wrong = await tufa('team', 'list-users', '--url', plain.url, '--admin', 'root:nope');
    expect(wrong.err).toMatch(/^error \[team-auth-failed\]/);
    const role = await tufa(
      'team',
      'add-user',
      '--url',
      plain.url,
      '--admin',
      ADMIN,
      '--name',
      'x',
      '--password',
      'y',
      '--role',
      'boss',
    );
    expect(role.err).toMatch(/^error \[team-bad-role\]: --role must be one of viewer, member, lead/);
  });
});
