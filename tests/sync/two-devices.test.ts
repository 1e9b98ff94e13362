import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CouchServer } from './couch-server';
import { device, readingInput, siteInput } from './devices';

const server = new CouchServer({ shared: true });
const DB = `tufa-two-devices-${Date.now()}`;

beforeAll(async () => {
  await server.start();
  await server.createDb(DB);
}, 30000);
afterAll(() => server.stop());

describe('two devices against a real CouchDB API', () => {
  it('edit, sync and converge; a conflict keeps both versions until the user picks', async () => {
    const a = await device(server.url, DB);
    const b = await device(server.url, DB);

    const site = await a.repo.createSite(siteInput('Limestone spring K3'));
    const r1 = await a.repo.createReading(readingInput(site.id, 1));
    await a.repo.createReading(readingInput(site.id, 2));
    await a.engine.sync();
    await b.engine.sync();
    await b.repo.createReading(readingInput(site.id, 3));
    await b.engine.sync();
    await a.engine.sync();

    expect((await a.repo.listReadings(site.id)).length).toBe(3);
    expect((await b.repo.listReadings(site.id)).length).toBe(3);
    expect((await server.allDocs(DB)).length).toBe(4);
    expect(await a.repo.outboxSize()).toBe(0);
    expect(await b.repo.outboxSize()).toBe(0);

    // Both devices change the same reading while apart.
    await a.repo.updateReading(r1.id, { notes: 'A: bubbles in the cell' });
    await b.repo.updateReading(r1.id, { notes: 'B: meter recalibrated' });
    await a.engine.sync();
    const run = await b.engine.sync();
    expect(run.conflicts).toBe(1);

    const status = await b.engine.refreshStatus();
    expect(status.conflicts).toBe(1);
    const [conflict] = await b.store.conflicts();
    expect(conflict?.kind).toBe('edit');
    expect(conflict?.local.type === 'reading' && conflict.local.notes).toBe('B: meter recalibrated');
    expect(conflict?.others[0]?.doc.type === 'reading' && conflict.others[0].doc.notes).toBe(
      'A: bubbles in the cell',
    );
    // B still shows its own version, and it is not pushed while the conflict is open.
    expect((await b.repo.getReading(r1.id))?.notes).toBe('B: meter recalibrated');
    await b.engine.sync();
    const onServer = (await (await fetch(`${server.url}${DB}/${r1.id}`)).json()) as { notes: string };
    expect(onServer.notes).toBe('A: bubbles in the cell');

    // The user merges both notes.
    const merged = { ...conflict!.local, notes: 'A: bubbles in the cell / B: meter recalibrated' };
    await b.engine.resolve(r1.id, { merged });
    expect(await b.store.conflicts()).toEqual([]);
    await b.engine.sync();
    await a.engine.sync();

    for (const d of [a, b]) {
      expect((await d.repo.getReading(r1.id))?.notes).toBe('A: bubbles in the cell / B: meter recalibrated');
      expect(await d.repo.outboxSize()).toBe(0);
    }
    const after = (await (await fetch(`${server.url}${DB}/${r1.id}?conflicts=true`)).json()) as {
      notes: string;
      _conflicts?: string[];
    };
    expect(after.notes).toBe('A: bubbles in the cell / B: meter recalibrated');
    expect(after._conflicts).toBeUndefined();
    expect(a.engine.getStatus().state).toBe('idle');
  }, 60000);

  it('a deletion travels as a tombstone', async () => {
    const a = await device(server.url, DB);
    const b = await device(server.url, DB);
    const site = await a.repo.createSite(siteInput('Carp pond 2'));
    const r = await a.repo.createReading(readingInput(site.id, 9));
    await a.engine.sync();
    await b.engine.sync();
    expect((await b.repo.getReading(r.id))?.deleted).toBe(false);
    await a.repo.deleteReading(r.id);
    await a.engine.sync();
    await b.engine.sync();
    expect((await b.repo.getReading(r.id))?.deleted).toBe(true);
  }, 60000);

  it('a server-side conflict (two branches) is surfaced and resolved with the losing branch removed', async () => {
    const a = await device(server.url, DB);
    const site = await a.repo.createSite(siteInput('Well W7'));
    await a.engine.sync();
    // Another replica wrote a second branch straight into the server (new_edits: false).
    const cur = (await (await fetch(`${server.url}${DB}/${site.id}`)).json()) as Record<string, unknown>;
    const branch = { ...cur, name: 'Well W7 (north)', _rev: '2-0123456789abcdef0123456789abcdef' };
    const w = await fetch(`${server.url}${DB}/_bulk_docs`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ docs: [branch], new_edits: false }),
    });
    expect(w.status).toBe(201);
    await a.repo.updateSite(site.id, { notes: 'pump replaced' });
    await a.engine.sync();
    const open = await a.store.conflicts();
    expect(open.length).toBe(1);
    expect(open[0]?.kind).toBe('server');
    // This device's edit, the server's winning branch and its losing branch are all visible.
    const versions = [open[0]!.local, ...open[0]!.others.map((o) => o.doc)];
    const labels = versions.map((d) => (d.type === 'site' ? `${d.name}|${d.notes}` : ''));
    expect(labels.sort()).toEqual(['Well W7 (north)|', 'Well W7|', 'Well W7|pump replaced']);

    const north = open[0]!.others.find((o) => o.doc.type === 'site' && o.doc.name === 'Well W7 (north)')!;
    await a.engine.resolve(site.id, { rev: north.rev });
    await a.engine.sync();
    const after = (await (await fetch(`${server.url}${DB}/${site.id}?conflicts=true`)).json()) as {
      name: string;
      _conflicts?: string[];
    };
    expect(after.name).toBe('Well W7 (north)');
    expect(after._conflicts).toBeUndefined();
  }, 60000);

  it('the server database is recreated empty: the device sends everything again', async () => {
    const db = `${DB}-reset`;
    await server.createDb(db);
    const a = await device(server.url, db);
    const site = await a.repo.createSite(siteInput('Spring S4'));
    for (let i = 0; i < 3; i++) await a.repo.createReading(readingInput(site.id, i));
    await a.engine.sync();
    expect((await server.allDocs(db)).length).toBe(4);
    expect(await fetch(`${server.url}${db}`, { method: 'DELETE' }).then((r) => r.ok)).toBe(true);
    await server.createDb(db);
    const run = await a.engine.sync();
    expect(run.pushed).toBe(4);
    expect((await server.allDocs(db)).length).toBe(4);
    expect(await a.repo.outboxSize()).toBe(0);
  }, 60000);

  it('an edit meets a deletion made on the server: both kept, the user decides', async () => {
    const db = `${DB}-deleted`;
    await server.createDb(db);
    const a = await device(server.url, db);
    const site = await a.repo.createSite(siteInput('Tank 9'));
    const r = await a.repo.createReading(readingInput(site.id, 1));
    await a.engine.sync();
    const cur = (await (await fetch(`${server.url}${db}/${r.id}`)).json()) as { _rev: string };
    expect((await fetch(`${server.url}${db}/${r.id}?rev=${cur._rev}`, { method: 'DELETE' })).ok).toBe(true);
    await a.repo.updateReading(r.id, { notes: 'pH probe replaced' });
    const run = await a.engine.sync();
    expect(run.conflicts).toBe(1);
    const [c] = await a.store.conflicts();
    expect(c?.others[0]?.doc.deleted).toBe(true);
    expect(c?.local.type === 'reading' && c.local.notes).toBe('pH probe replaced');
    await a.engine.resolve(r.id, 'local');
    await a.engine.sync();
    const back = (await (await fetch(`${server.url}${db}/${r.id}`)).json()) as {
      notes: string;
      deleted: boolean;
    };
    expect(back).toMatchObject({ notes: 'pH probe replaced', deleted: false });
  }, 60000);
});
