import 'fake-indexeddb/auto';
import { describe, expect, it } from 'vitest';
import { solve } from '../../src/chem/solve';
import { defaultMapping, guessRoles, layoutKey } from '../../src/io/column-mapping';
import { parseCsv } from '../../src/io/csv-parse';
import { exportReadingsCsv } from '../../src/io/export-csv';
import { commitImport, previewImport, warningsFromResults } from '../../src/io/import-commit';
import { planImport } from '../../src/io/import-plan';
import { mappingFromRecord, mappingToRecord } from '../../src/io/layout-memory';
import { readingRequest, typedValues } from '../../src/reading/request';
import { openRepository } from '../../src/store/repository';
import type { ReadingDoc } from '../../src/store/schema';
import { RepositoryStore } from '../../src/sync/repository-store';

let n = 0;
async function fresh() {
  const repo = await openRepository({ name: `tufa-import-${process.pid}-${n++}` });
  return { repo, store: new RepositoryStore(repo) };
}

// Invented spreadsheet export from our own demo springs: BOM, `;`, decimal commas, local times.
const SPREADSHEET =
  '\uFEFFSite;Date/Time;Temp (°C);pH;Alkalinity (meq/L);Conductance (µS/cm);Notes\r\n' +
  'Quellhof spring;03.06.2026 09:15;9,4;7,21;5,12;612;"clear; slight odour"\r\n' +
  'Quellhof spring;03.06.2026 12:40;9,6;7,25;5,08;608;\r\n' +
  'Mill pond;03.06.2026 14:05;17,9;8,34;2,41;355;algae\r\n';

async function importText(store: RepositoryStore, text: string, tz = 'Europe/Vienna') {
  const csv = parseCsv(text);
  const mapping = defaultMapping(csv.table.header, tz);
  const plan = await planImport(csv, mapping, await store.repo.listSites());
  return { csv, mapping, plan, report: await commitImport(plan, store) };
}

describe('CSV import', () => {
  it('guesses the columns of a spreadsheet header', () => {
    const roles = guessRoles([
      'Site',
      'Date/Time',
      'Temp (°F)',
      'pH',
      'Alkalinity (meq/L)',
      'KH',
      'Cond. (mS/cm)',
      'x',
    ]);
    expect(roles).toEqual([
      { role: 'site' },
      { role: 'timestamp' },
      { role: 'value', quantity: 'temperature', unit: 'f' },
      { role: 'value', quantity: 'ph', unit: 'ph' },
      { role: 'value', quantity: 'alkalinity', unit: 'meq_l' },
      { role: 'ignore' }, // a second alkalinity column is left for the user to map
      { role: 'value', quantity: 'conductance', unit: 'ms_cm' },
      { role: 'ignore' },
    ]);
    expect(layoutKey(['Site', 'pH'])).toBe(layoutKey([' site ', 'PH']));
    expect(layoutKey(['Site', 'pH'])).not.toBe(layoutKey(['pH', 'Site']));
  });

  it('imports a file with a BOM, ; and decimal commas correctly', async () => {
    const { store, repo } = await fresh();
    const { csv, report } = await importText(store, SPREADSHEET);
    expect(csv.sniff).toEqual({ hadBom: true, delimiter: ';', decimalComma: true });
    expect(report).toMatchObject({ ok: true, rows: 3, written: 3, sitesCreated: 2, errors: [] });
    const sites = await repo.listSites();
    expect(sites.map((s) => s.name).sort()).toEqual(['Mill pond', 'Quellhof spring']);
    const spring = sites.find((s) => s.name === 'Quellhof spring')!;
    const rs = await repo.listReadings(spring.id);
    expect(rs.map((r) => r.takenAt)).toEqual(['2026-06-03T07:15:00.000Z', '2026-06-03T10:40:00.000Z']);
    expect(rs[0]!.values).toEqual([
      { quantity: 'temperature', value: 9.4, unit: 'c' },
      { quantity: 'ph', value: 7.21, unit: 'ph' },
      { quantity: 'alkalinity', value: 5.12, unit: 'meq_l' },
      { quantity: 'conductance', value: 612, unit: 'us_cm' },
    ]);
    expect(rs[0]!.notes).toBe('clear; slight odour');
    expect(typedValues(readingRequest(rs[0]!, undefined)).values).toEqual({
      temperature_c: 9.4,
      ph: 7.21,
      alkalinity_meq_l: 5.12,
      specific_conductance_us_cm: 612,
    });
    expect(await repo.outboxSize()).toBe(5); // two sites and three readings queued for sync
  });

  it('re-importing the same file creates no duplicates (content ids)', async () => {
    const { store, repo } = await fresh();
    await importText(store, SPREADSHEET);
    const again = await importText(store, SPREADSHEET);
    expect(again.report).toMatchObject({ ok: true, written: 0, alreadyPresent: 3, sitesCreated: 0 });
    // The same data with a decimal point and a comma delimiter is the same data.
    const pointed = SPREADSHEET.replace(/(\d),(\d)/g, '$1.$2')
      .replaceAll(';', ',')
      .replace('clear, slight', 'clear; slight');
    const third = await importText(store, pointed);
    expect(third.report.errors).toEqual([]);
    expect(third.report.alreadyPresent).toBe(3);
    expect((await repo.listAllReadings()).length).toBe(3);
    expect((await repo.listSites()).length).toBe(2);
  });

  it('re-importing a big file (the bulk existence check) creates no duplicates either', async () => {
    const { store, repo } = await fresh();
    const rows = Array.from(
      { length: 1200 },
      (_, i) => `Mill pond;${new Date(Date.UTC(2026, 5, 1) + i * 60000).toISOString()};8,${100 + (i % 50)}`,
    );
    const text = `site;taken_at;ph\n${rows.join('\n')}\n`;
    expect((await importText(store, text, 'UTC')).report).toMatchObject({ ok: true, written: 1200 });
    expect((await importText(store, text, 'UTC')).report).toMatchObject({
      ok: true,
      written: 0,
      alreadyPresent: 1200,
    });
    expect((await repo.listAllReadings()).length).toBe(1200);
  });

  it('a malformed file writes nothing and reports every bad row with its column', async () => {
    const { store, repo } = await fresh();
    const bad =
      'site,taken_at,temperature_c,ph,alkalinity_umol_kg\n' +
      'Pond A,2026-06-01T10:00:00Z,12.5,8.1,2100\n' +
      'Pond A,2026-06-01T11:00:00Z,abc,8.1,2100\n' + // line 3: temperature not a number
      'Pond A,2026-13-01T12:00:00Z,12.5,8.1,2100\n' + // line 4: month 13
      'Pond A,2026-06-01T13:00:00Z,12.5,19,-5\n' + // line 5: pH 19 and negative alkalinity
      ',2026-06-01T14:00:00Z,12.5,8.1,2100\n' + // line 6: no site
      'Pond A,2026-06-01T15:00:00Z,12.5\n' + // line 7: too few fields
      'Pond A,,12.5,8.1,2100\n'; // line 8: no time
    const { report } = await importText(store, bad, 'UTC');
    expect(report.ok).toBe(false);
    expect(report.written).toBe(0);
    expect(report.errors.map((e) => [e.row, e.code, e.column])).toEqual([
      [3, 'value-not-a-number', 'temperature_c'],
      [4, 'time-unreadable', 'taken_at'],
      [5, 'value-out-of-range', 'ph'],
      [5, 'value-out-of-range', 'alkalinity_umol_kg'],
      [6, 'site-missing', 'site'],
      [7, 'csv-ragged-row', undefined],
      [8, 'time-missing', 'taken_at'],
    ]);
    expect(report.errors.every((e) => e.message.length > 10)).toBe(true);
    expect(await repo.listSites({ includeDeleted: true })).toEqual([]);
    expect(await repo.listAllReadings({ includeDeleted: true })).toEqual([]);
    expect(await repo.outboxSize()).toBe(0);
  });

  it('a refused write leaves the database as it was (all or nothing)', async () => {
    const { store, repo } = await fresh();
    await importText(store, SPREADSHEET);
    const before = await repo.listAllReadings();
    const csv = parseCsv(
      'site,taken_at,ph\nMill pond,2026-07-01T10:00:00Z,8.2\nMill pond,2026-07-01T11:00:00Z,8.3\n',
    );
    const plan = await planImport(csv, defaultMapping(csv.table.header, 'UTC'), await repo.listSites());
    plan.readings[1]!.takenAt = 'not a time'; // a bug upstream: the store must refuse the whole batch
    const report = await commitImport(plan, store);
    expect(report.ok).toBe(false);
    expect(report.errors[0]?.code).toBe('store-write-failed');
    expect(await repo.listAllReadings()).toEqual(before);
  });

  it('stores converted values in the units the reading form knows, and keeps a named pH scale', async () => {
    const { store, repo } = await fresh();
    const { report } = await importText(
      store,
      'site,taken_at,Temp (°F),Cond (mS/cm),pH,ph_scale\nTank 3,2026-06-01T10:00Z,77,1.25,8.2,total\n',
      'UTC',
    );
    expect(report.ok).toBe(true);
    const [r] = await repo.listAllReadings();
    expect(r!.values).toEqual([
      { quantity: 'temperature', value: 25, unit: 'c' },
      { quantity: 'conductance', value: 1250, unit: 'us_cm' },
      { quantity: 'ph', value: 8.2, unit: 'total' },
    ]);
    expect(typedValues(readingRequest(r!, undefined)).options).toEqual({ ph_scale: 'total' });
  });

  it('asks for a site and a time column when the mapping has none', async () => {
    const { store, repo } = await fresh();
    const csv = parseCsv('ph;temp\n7,9;12\n');
    const plan = await planImport(csv, defaultMapping(csv.table.header, 'UTC'), await repo.listSites());
    expect(plan.errors.map((e) => e.code)).toEqual(['map-no-timestamp', 'map-no-site']);
    expect((await commitImport(plan, store)).written).toBe(0);
  });

  it('exports CSV that re-imports to the same readings', async () => {
    const { store, repo } = await fresh();
    await importText(store, SPREADSHEET);
    const sites = await repo.listSites();
    const text = exportReadingsCsv(await repo.listAllReadings(), sites);
    const lines = text.split('\r\n');
    expect(lines[0]).toBe(
      'reading_id,site,site_id,site_kind,site_defaults,taken_at,time_zone,updated_at,ph_scale,temperature_c,ph,alkalinity_meq_l,specific_conductance_us_cm,titration_alkalinity_meq_l,titration_dic_umol_kg,input_sources,notes',
    );
    const pond = sites.find((s) => s.name === 'Mill pond')!;
    const pondReading = (await repo.listReadings(pond.id))[0]!;
    // The pH scale column names only a scale the reading itself names (none here): a re-import
    // stores the very same values; the scale used is in input_sources.
    expect(lines).toContain(
      `${pondReading.id},Mill pond,${pond.id},other,,2026-06-03T14:05:00+02:00,Europe/Vienna,${pondReading.updatedAt},,17.9,8.34,2.41,355,,,temperature_c=typed;ph=typed;alkalinity_meq_l=typed;specific_conductance_us_cm=typed,algae`,
    );
    expect(text).toContain(',clear; slight odour\r\n'); // no quotes needed: no comma inside
    const back = await importText(store, text);
    expect(back.report).toMatchObject({ ok: true, written: 0, alreadyPresent: 3 });
    const { store: other, repo: otherRepo } = await fresh();
    const into = await importText(other, text);
    expect(into.report).toMatchObject({ ok: true, written: 3, sitesCreated: 2 });
    // The same readings: same ids, sites, times, values, notes and last change.
    const facts = (r: ReadingDoc) => [r.id, r.siteId, r.takenAt, r.values, r.notes, r.updatedAt];
    const a = (await repo.listAllReadings()).map(facts).sort();
    const b = (await otherRepo.listAllReadings()).map(facts).sort();
    expect(b).toEqual(a);
  });
});

describe('import preview', () => {
  it('shows the first rows with what the engine computes, and rows it cannot solve as warnings', async () => {
    const { store, repo } = await fresh();
    const csv = parseCsv(
      'site;taken_at;temperature_c;salinity;ph;alkalinity_umol_kg\n' +
        'Bay buoy;2026-06-03T09:15Z;25;35;8,05;2300\n' +
        'Bay buoy;2026-06-03T10:15Z;25;35;8,05;\n',
    );
    const mapping = defaultMapping(csv.table.header, 'UTC');
    mapping.columns[4] = { role: 'value', quantity: 'ph', unit: 'total' };
    const plan = await planImport(csv, mapping, []);
    const rows = previewImport(plan, [], solve, 5);
    expect(rows.map((r) => r.line)).toEqual([2, 3]);
    const first = rows[0]!.result;
    const direct = solve({
      temperature_c: 25,
      salinity: 35,
      ph: 8.05,
      ph_scale: 'total',
      alkalinity_umol_kg: 2300,
    });
    expect(first).toEqual(direct);
    expect('error' in rows[1]!.result).toBe(true);
    const report = await commitImport(plan, store, { solve });
    expect(report).toMatchObject({ ok: true, written: 2 });
    expect(report.warnings.map((w) => [w.row, w.code])).toEqual([[3, 'row-solve-failed']]);
    expect((await repo.listAllReadings()).length).toBe(2);
  });
});

describe('results computed elsewhere (the app solves in its engine worker)', () => {
  it('import warnings and export columns from given results match those from solve()', async () => {
    const { store, repo } = await fresh();
    const csv = parseCsv(
      'site;taken_at;temperature_c;salinity;ph;alkalinity_umol_kg\n' +
        'Bay buoy;2026-06-03T09:15Z;25;35;8,05;2300\n' +
        'Bay buoy;2026-06-03T10:15Z;25;35;8,05;\n',
    );
    const plan = await planImport(csv, defaultMapping(csv.table.header, 'UTC'), []);
    const bySite = new Map(plan.newSites.map((s) => [s.id, s]));
    const results = plan.readings.map((r) => solve(readingRequest(r, bySite.get(r.siteId)).input));
    expect(warningsFromResults(plan, results)).toEqual(
      (
        await commitImport(
          plan,
          { existingIds: async () => new Set(plan.readings.map((r) => r.id)), bulkPut: async () => {} },
          { solve },
        )
      ).warnings,
    );
    // A result missing for a row is reported, not passed.
    expect(warningsFromResults(plan, results.slice(0, 1)).map((w) => [w.row, w.message])).toEqual([
      [3, 'This row was not computed.'],
    ]);
    const report = await commitImport(plan, store, { results });
    expect(report.warnings.map((w) => [w.row, w.code])).toEqual([[3, 'row-solve-failed']]);

    const readings = await repo.listAllReadings();
    const sites = await repo.listSites();
    const byId = new Map(sites.map((s) => [s.id, s]));
    const given = new Map(readings.map((r) => [r.id, solve(readingRequest(r, byId.get(r.siteId)).input)]));
    const a = exportReadingsCsv(readings, sites, { solve });
    expect(exportReadingsCsv(readings, sites, { results: given })).toBe(a);
    expect(a).toContain('computed_dic_umol_kg');
    // A reading without a result gets its row, with the reason in the issues column.
    const partial = exportReadingsCsv(readings, sites, { results: new Map() });
    expect(
      partial.split('\r\n').filter((l) => l.includes('internal-error: This reading was not computed.')),
    ).toHaveLength(2);
  });
});

describe('remembered layouts', () => {
  it('a mapping survives the trip through the store, found again by the header key', async () => {
    const { repo } = await fresh();
    const header = ['Site', 'Date/Time', 'KH', 'Temp (°F)', 'x'];
    const m = defaultMapping(header, 'Europe/Vienna');
    m.columns[2] = { role: 'value', quantity: 'alkalinity', unit: 'dkh' };
    m.dateOrder = 'mdy';
    m.phScale = 'nbs';
    await repo.putLayout({
      name: 'tank logger',
      headerSignature: layoutKey(header),
      columns: mappingToRecord(header, m),
    });
    const [found] = await repo.findLayouts(layoutKey([' site', 'date/time', 'kh', 'temp (°f)', 'X']));
    expect(found).toBeDefined();
    expect(mappingFromRecord(header, found!.columns, 'UTC')).toEqual(m);
  });
});
