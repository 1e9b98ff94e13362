import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CouchClient } from '../../src/sync/couch-client';
import { checkServerUrl } from '../../src/sync/server-url';
import { SyncService } from '../../src/sync/sync-service';
import { CouchServer } from './couch-server';
import { device, siteInput } from './devices';

const server = new CouchServer();
const DB = 'tufa-auth';

beforeAll(async () => {
  await server.start();
  await server.createDb(DB);
  // End the "admin party": one admin, and the database readable by members only (CouchDB API).
  const r = await fetch(`${server.url}_config/admins/ana`, {
    method: 'PUT',
    body: JSON.stringify('field-pass'),
  });
  expect(r.ok).toBe(true);
  const auth = `Basic ${btoa('ana:field-pass')}`;
  const sec = await fetch(`${server.url}${DB}/_security`, {
    method: 'PUT',
    headers: { authorization: auth, 'content-type': 'application/json' },
    body: JSON.stringify({ admins: { names: ['ana'] }, members: { names: ['ana'] } }),
  });
  expect(sec.ok).toBe(true);
}, 30000);
afterAll(() => server.stop());

describe('credentials', () => {
  it('basic auth and cookie session both work; a wrong password is an error in words', async () => {
    for (const kind of ['basic', 'session'] as const) {
      const ok = new CouchClient({
        url: server.url,
        db: DB,
        auth: { kind, user: 'ana', password: 'field-pass' },
      });
      expect((await ok.info()).db_name).toBe(DB);
      const bad = new CouchClient({
        url: server.url,
        db: DB,
        auth: { kind, user: 'ana', password: 'wrong' },
      });
      await expect(bad.info()).rejects.toMatchObject({ code: 'sync-auth-failed', retryable: false });
    }
    const anon = new CouchClient({ url: server.url, db: DB, auth: { kind: 'none' } });
    await expect(anon.info()).rejects.toMatchObject({ code: 'sync-auth-failed' });
  });

  it('the service tests a connection before storing it, and syncs with a session', async () => {
    const d = await device(server.url, DB);
    const service = new SyncService(d.store);
    const wrong = await service.configure({
      url: server.url,
      db: DB,
      auth: 'session',
      user: 'ana',
      password: 'nope',
    });
    expect(wrong).toMatchObject({ error: { code: 'sync-auth-failed' } });
    expect(await service.connection()).toBeUndefined();
    const good = await service.configure({
      url: server.url,
      db: DB,
      auth: 'session',
      user: 'ana',
      password: 'field-pass',
    });
    expect(good).toEqual({ warnings: [] }); // loopback http: no warning
    await d.repo.createSite(siteInput('Greenhouse tank 1'));
    const states: string[] = [];
    service.subscribe((s) => states.push(s.state));
    await service.syncNow();
    expect(states.at(-1)).toBe('idle');
    expect(await d.repo.outboxSize()).toBe(0);
  });

  it('keeps the password only in memory unless asked to remember it on the device', async () => {
    for (const auth of ['basic', 'session'] as const) {
      const d = await device(server.url, DB);
      const service = new SyncService(d.store);
      const c = { url: server.url, db: DB, auth, user: 'ana', password: 'field-pass' };
      expect(await service.configure(c)).toEqual({ warnings: [] });
      // Stored without the password; this session still has it.
      expect(await d.repo.getSyncMeta('connection')).toMatchObject({
        user: 'ana',
        password: '',
        remember: false,
      });
      expect((await service.connection())?.password).toBe('field-pass');
      await d.repo.createSite(siteInput(`Quarry pool ${auth}`));
      await service.syncNow();
      expect(await d.repo.outboxSize()).toBe(0);

      // The app reopened: a new service over the same database has no password and says so.
      const reopened = new SyncService(d.store);
      const states: { code: string | undefined }[] = [];
      reopened.subscribe((s) => states.push({ code: s.error?.code }));
      await reopened.start();
      await d.repo.createSite(siteInput(`Quarry pool ${auth} 2`));
      await reopened.syncNow();
      expect(states.at(-1)?.code).toBe('sync-password-needed');
      expect(await d.repo.outboxSize()).toBe(1); // nothing lost, still waiting

      // Remembered: stored, and a reopened service syncs by itself.
      expect(await reopened.configure({ ...c, remember: true })).toEqual({ warnings: [] });
      expect(await d.repo.getSyncMeta('connection')).toMatchObject({
        password: 'field-pass',
        remember: true,
      });
      const again = new SyncService(d.store);
      await again.syncNow();
      expect(await d.repo.outboxSize()).toBe(0);
    }
  });

  it('warns about plain http away from this device, refuses credentials in the address', () => {
    const r = checkServerUrl('http://couch.lab.example.org:5984');
    expect('warnings' in r && r.warnings.map((w) => w.code)).toEqual(['sync-insecure-http']);
    expect(checkServerUrl('https://couch.lab.example.org/')).toMatchObject({ warnings: [] });
    expect(checkServerUrl('http://localhost:5984')).toMatchObject({ warnings: [] });
    expect(checkServerUrl('https://ana:pw@couch.lab.example.org/')).toMatchObject({
      error: { code: 'sync-bad-url' },
    });
    expect(checkServerUrl('couch dot org')).toMatchObject({ error: { code: 'sync-bad-url' } });
  });
});
