/**
 * Issue 10: a reading is one fact across files and devices.
 * - Defect 1: a reading whose alkalinity comes only from its titration is computed in the export,
 *   and after re-import on another device gives the same outputs (to 1e-9 relative).
 * - Defect 2: export → import → export → import → restore a backup → sync, on two devices, leaves
 *   exactly one copy of every reading, with its id; a newer copy replaces an older one.
 * - Defect 6: a site created by a CSV import keeps its kind.
 */
import 'fake-indexeddb/auto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SolveOutput } from '../../src/chem/api';
import { solve } from '../../src/chem/solve';
import { createBackup, restoreBackup } from '../../src/io/backup';
import { defaultMapping } from '../../src/io/column-mapping';
import { parseCsv } from '../../src/io/csv-parse';
import { COMPUTED_COLUMNS, exportReadingsCsv } from '../../src/io/export-csv';
import { commitImport } from '../../src/io/import-commit';
import { planImport } from '../../src/io/import-plan';
import { readingRequest } from '../../src/reading/request';
import type { ReadingDoc } from '../../src/store/schema';
import { KESTREL } from '../reading/fixtures';
import { CouchServer } from '../sync/couch-server';
import { device } from '../sync/devices';

const server = new CouchServer({ shared: true });
const DB = `tufa-round-trip-${process.pid}-${Date.now()}`;
beforeAll(async () => {
  await server.start();
  await server.createDb(DB);
}, 30000);
afterAll(() => server.stop());

type Device = Awaited<ReturnType<typeof device>>;

async function exportCsv(d: Device): Promise<string> {
  return exportReadingsCsv(await d.repo.listAllReadings(), await d.repo.listSites({ includeDeleted: true }), {
    solve,
  });
}
async function importCsv(d: Device, text: string) {
  const csv = parseCsv(text);
  const plan = await planImport(csv, defaultMapping(csv.table.header, 'UTC'), await d.repo.listSites());
  return commitImport(plan, d.store, { solve, sites: await d.repo.listSites() });
}
async function computed(d: Device, id: string): Promise<SolveOutput> {
  const r = (await d.repo.getReading(id))!;
  const s = await d.repo.getSite(r.siteId);
  const out = solve(readingRequest(r, s).input);
  if ('error' in out) throw new Error(`${out.error.code}: ${out.error.message}`);
  return out;
}
const ids = async (d: Device) => (await d.repo.listAllReadings()).map((r) => r.id).sort();
function expectSame(a: SolveOutput, b: SolveOutput) {
  for (const k of COMPUTED_COLUMNS) {
    const x = a[k] as number;
    const y = b[k] as number;
    expect(Math.abs(y - x) / Math.max(Math.abs(x), 1e-300), k).toBeLessThan(1e-9);
  }
}

async function seeded(): Promise<{ a: Device; titrationOnly: ReadingDoc }> {
  const a = await device(server.url, DB);
  const site = await a.repo.createSite({
    name: 'Kestrel Hollow spring',
    kind: 'spring',
    defaults: { model: 'fresh' },
    notes: '',
  });
  const titrationOnly = await a.repo.createReading({
    siteId: site.id,
    takenAt: '2026-11-14T10:42:00.000Z',
    timeZone: 'Europe/Vienna',
    values: [
      { quantity: 'temperature', value: 11.2, unit: 'c' },
      { quantity: 'ph', value: 7.16, unit: 'ph' },
      { quantity: 'conductance', value: 480, unit: 'us_cm' },
    ],
    titration: KESTREL,
    notes: 'alkalinity by field titration only',
  });
  for (const [i, alk] of [4.9, 5.05].entries()) {
    await a.repo.createReading({
      siteId: site.id,
      takenAt: `2026-11-1${5 + i}T10:00:00.000Z`,
      timeZone: 'Europe/Vienna',
      values: [
        { quantity: 'temperature', value: 11 + i, unit: 'c' },
        { quantity: 'ph', value: 7.2, unit: 'ph' },
        { quantity: 'alkalinity', value: alk, unit: 'meq_l' },
      ],
      notes: '',
    });
  }
  return { a, titrationOnly };
}

describe('a titration-only reading in files (defect 1)', () => {
  it('is computed in the export and gives the same outputs after re-import elsewhere', async () => {
    const { a, titrationOnly } = await seeded();
    const page = await computed(a, titrationOnly.id);
    const text = await exportCsv(a);
    const [head, ...rows] = text.split('\r\n');
    const header = head!.split(',');
    const row = rows.find((l) => l.startsWith(titrationOnly.id))!.split(',');
    const cell = (k: string) => row[header.indexOf(k)]!;
    expect(cell('computed_issues')).not.toMatch(/too-few-parameters/);
    expect(Number(cell('computed_dic_umol_kg'))).toBeGreaterThan(0);
    expect(cell('input_sources')).toContain('alkalinity_meq_l=titration');

    const b = await device(server.url, `${DB}-unused`);
    const report = await importCsv(b, text);
    expect(report).toMatchObject({ ok: true, written: 3, warnings: [] });
    const again = await computed(b, titrationOnly.id);
    expectSame(page, again);
    // The re-imported reading says its alkalinity came from a titration, not that it was typed.
    const r = (await b.repo.getReading(titrationOnly.id))!;
    expect(readingRequest(r, await b.repo.getSite(r.siteId)).sources.alkalinity_meq_l).toBe('titration');
    // Defect 6: the spring is still a spring.
    expect((await b.repo.listSites()).map((s) => [s.name, s.kind])).toEqual([
      ['Kestrel Hollow spring', 'spring'],
    ]);
  });
});

describe('site defaults travel with the file', () => {
  it('a reading computed with its site salinity and pH scale computes the same elsewhere', async () => {
    const a = await device(server.url, `${DB}-unused`);
    const tank = await a.repo.createSite({
      name: 'Saltmarsh holding tank',
      kind: 'tank',
      defaults: { model: 'saline', salinity: 31.5, ph_scale: 'total', units: { alkalinity: 'dkh' } },
      notes: '',
    });
    const r = await a.repo.createReading({
      siteId: tank.id,
      takenAt: '2026-06-03T09:00:00.000Z',
      timeZone: 'Europe/Vienna',
      values: [
        { quantity: 'temperature', value: 24, unit: 'c' },
        { quantity: 'ph', value: 8.02, unit: 'ph' },
        { quantity: 'alkalinity', value: 8.1, unit: 'dkh' },
      ],
      notes: '',
    });
    const text = await exportCsv(a);
    expect(text).toContain(',tank,model=saline;salinity=31.5;ph_scale=total,');
    const b = await device(server.url, `${DB}-unused`);
    expect(await importCsv(b, text)).toMatchObject({ ok: true, written: 1, sitesCreated: 1 });
    const [site] = await b.repo.listSites();
    expect(site).toMatchObject({
      id: tank.id,
      kind: 'tank',
      defaults: { model: 'saline', salinity: 31.5, ph_scale: 'total' },
    });
    expectSame(await computed(a, r.id), await computed(b, r.id));
    // A cell that is not a site default is a row error, not a guess.
    const bad = text.replace('salinity=31.5', 'salinity=lots');
    const c = await device(server.url, `${DB}-unused`);
    expect((await importCsv(c, bad)).errors.map((e) => e.code)).toEqual(['value-out-of-range']);
  });
});

describe('identity across export, import, backup, restore and sync (defect 2)', () => {
  it('leaves exactly one copy of every reading, with its id, on two devices', async () => {
    const { a, titrationOnly } = await seeded();
    const before = await ids(a);
    expect(before).toHaveLength(3);

    const first = await exportCsv(a);
    expect(await importCsv(a, first)).toMatchObject({ ok: true, written: 0, replaced: 0, alreadyPresent: 3 });
    const second = await exportCsv(a);
    expect(second).toBe(first);
    expect(await importCsv(a, second)).toMatchObject({ ok: true, written: 0, alreadyPresent: 3 });
    const backup = await createBackup(a.store);
    expect(await restoreBackup(a.store, backup)).toMatchObject({ added: 0, replaced: 0 });
    expect(await ids(a)).toEqual(before);

    // Device B starts from the CSV, then restores A's backup, then both sync.
    const b = await device(server.url, DB);
    expect(await importCsv(b, second)).toMatchObject({ ok: true, written: 3, sitesCreated: 1 });
    await restoreBackup(b.store, backup);
    await a.engine.sync();
    await b.engine.sync();
    await a.engine.sync();
    expect(await ids(a)).toEqual(before);
    expect(await ids(b)).toEqual(before);
    // CSV cannot carry a titration's raw points or a site's defaults: where B's CSV copy meets
    // the full document, sync keeps both versions for the user to choose, never a second copy.
    const conflicts = (await b.store.conflicts()).map((c) => c.local.id).sort();
    const site = (await a.repo.listSites())[0]!;
    expect(conflicts).toEqual([site.id, titrationOnly.id].sort());
    expect((await a.repo.listSites()).length).toBe(1);
    expect((await b.repo.listSites()).length).toBe(1);
    const onServer = (await server.allDocs(DB)) as { id: string }[];
    for (const id of before) expect(onServer.filter((d) => d.id === id)).toHaveLength(1);

    // A newer copy (same id, later updated_at) replaces the older one; an older one does not.
    const r = (await a.repo.getReading(before[0]!))!;
    const edited = await a.repo.updateReading(r.id, { notes: 'recalibrated the meter' });
    const newer = await exportCsv(a);
    expect(await importCsv(b, newer)).toMatchObject({ ok: true, written: 0, replaced: 1 });
    expect((await b.repo.getReading(r.id))?.notes).toBe('recalibrated the meter');
    expect(await importCsv(b, second)).toMatchObject({
      ok: true,
      written: 0,
      replaced: 0,
      alreadyPresent: 3,
    });
    expect((await b.repo.getReading(r.id))?.updatedAt).toBe(edited.updatedAt);
    expect(await ids(b)).toEqual(before);
  }, 60000);
});
