/**
 * Issue 10: one function turns a stored reading into the engine's request, and every consumer —
 * the engine worker (reading page, reading form, planner "before", site chart, CSV download),
 * CSV export, import preview and checks — solves exactly that request.
 */
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SolveInput, SolveResult } from '../../src/chem/api';
import { solve } from '../../src/chem/solve';
import type { TitrationMethod } from '../../src/chem/titration/types';
import { exportReadingsCsv } from '../../src/io/export-csv';
import { computeWarnings, previewImport } from '../../src/io/import-commit';
import type { ImportPlan } from '../../src/io/import-plan';
import {
  type ReadingRequest,
  type RequestSettings,
  readingRequest,
  sourcesText,
} from '../../src/reading/request';
import type {
  MeasuredValue,
  ReadingDoc,
  SiteDefaults,
  SiteDoc,
  TitrationRecord,
} from '../../src/store/schema';
import { DEFAULT_SETTINGS } from '../../src/store/settings';
import type { EngineRequest, EngineResponse } from '../../src/ui/engine.worker';
import { DEFAULT_FORM, planRequest } from '../../src/ui/plan/plan-model';
import { KESTREL } from './fixtures';

/** The engine worker, run in Node: `self` is a stub whose postMessage hands the answer back. */
let answer: EngineResponse | undefined;
let onmessage: (ev: { data: EngineRequest }) => void;
beforeAll(async () => {
  const stub = { postMessage: (m: EngineResponse) => (answer = m), onmessage: undefined as unknown };
  (globalThis as unknown as { self: unknown }).self = stub;
  await import('../../src/ui/engine.worker');
  onmessage = stub.onmessage as typeof onmessage;
});
afterAll(() => {
  delete (globalThis as unknown as { self?: unknown }).self;
});
function worker(req: EngineRequest): EngineResponse {
  answer = undefined;
  onmessage({ data: structuredClone(req) });
  if (!answer) throw new Error('the worker did not answer');
  return structuredClone(answer);
}

function site(defaults: SiteDefaults): SiteDoc {
  return {
    id: 'site-1',
    type: 'site',
    name: 'Kestrel Hollow spring',
    kind: 'spring',
    defaults,
    notes: '',
    updatedAt: '2026-11-14T10:00:00.000Z',
    deleted: false,
  };
}
function reading(values: MeasuredValue[], titration?: TitrationRecord): ReadingDoc {
  return {
    id: 'reading-1',
    type: 'reading',
    siteId: 'site-1',
    takenAt: '2026-11-14T10:42:00.000Z',
    timeZone: 'Europe/Vienna',
    values,
    notes: '',
    updatedAt: '2026-11-14T10:50:00.000Z',
    deleted: false,
    ...(titration ? { titration } : {}),
  };
}

describe('the request of a reading', () => {
  it('converts typed values exactly, reports unknown units, and says where every input came from', () => {
    const req = readingRequest(
      reading([
        { quantity: 'temperature', value: 77, unit: 'f' },
        { quantity: 'alkalinity', value: 8.4, unit: 'dkh' },
        { quantity: 'ph', value: 8.1, unit: 'ph' },
        { quantity: 'turbidity', value: 3, unit: 'ntu' },
      ]),
      site({ model: 'saline', salinity: 35, units: { alkalinity: 'dkh' } }),
      DEFAULT_SETTINGS,
    );
    expect(req.input.temperature_c).toBeCloseTo(25, 12); // (77 − 32) × 5/9, exact by definition of °F
    expect(req.input).toMatchObject({ alkalinity_dkh: 8.4, ph: 8.1, salinity: 35, model: 'saline' });
    expect(req.input.ph_scale).toBe('nbs'); // plain `ph`: the scale of the site, else Settings
    expect(req.input).not.toHaveProperty('units');
    expect(req.unknown).toEqual(['turbidity (ntu)']);
    expect(req.sources).toMatchObject({
      temperature_c: 'typed',
      alkalinity_dkh: 'typed',
      salinity: 'site default',
      model: 'site default',
      ph_scale: 'settings',
      air_pco2_uatm: 'settings',
    });
    expect(req.uncertainty).toEqual({ constants: true, ph: DEFAULT_SETTINGS.ph_uncertainty });
    expect(sourcesText(req)).toBe(
      'model=site default;salinity=site default;temperature_c=typed;alkalinity_dkh=typed;ph=typed',
    );
  });

  it('a pH unit that names its scale wins over the site and Settings', () => {
    for (const scale of ['total', 'free', 'seawater', 'nbs'] as const) {
      const req = readingRequest(
        reading([{ quantity: 'ph', value: 7.95, unit: scale }]),
        site({ ph_scale: 'free' }),
        {
          ...DEFAULT_SETTINGS,
          ph_scale: 'total',
        },
      );
      expect(req.input.ph_scale).toBe(scale);
      expect(req.sources.ph_scale).toBe('typed');
    }
  });

  it('a titration gives the alkalinity (with its uncertainty) when none is typed; a typed one wins', () => {
    const values: MeasuredValue[] = [
      { quantity: 'temperature', value: 11.2, unit: 'c' },
      { quantity: 'ph', value: 7.16, unit: 'ph' },
    ];
    const t = readingRequest(reading(values, { ...KESTREL, method: 'curve_fit' }), site({ model: 'fresh' }));
    if (!t.titration || 'error' in t.titration) throw new Error('titration did not reduce');
    expect(t.input.alkalinity_meq_l).toBe(t.titration.alkalinity_meq_l);
    expect(t.sources.alkalinity_meq_l).toBe('titration');
    // The whole-curve fit gives DIC too, and its standard errors reach the outputs' uncertainty.
    expect(t.titration.dic_umol_kg).toBeGreaterThan(0);
    expect(t.input.dic_umol_kg).toBe(t.titration.dic_umol_kg);
    expect(t.sources.dic_umol_kg).toBe('titration');
    expect(t.uncertainty.alkalinity_meq_l).toBe(t.titration.fit.details.alkalinity_se_meq_l);
    expect(t.uncertainty.dic_umol_kg).toBeCloseTo(t.titration.fit.details.dic_se_mmol_l! * 1000, 9);
    const u = solve({ ...t.input, uncertainty: t.uncertainty });
    if ('error' in u) throw new Error(u.error.message);
    expect(Object.keys(u.uncertainty?.pco2_uatm?.contributions ?? {})).toEqual(
      expect.arrayContaining(['ph', 'alkalinity_meq_l', 'dic_umol_kg']),
    );

    const typed = readingRequest(
      reading([...values, { quantity: 'alkalinity', value: 4.2, unit: 'meq_l' }], KESTREL),
      site({}),
    );
    expect(typed.input.alkalinity_meq_l).toBe(4.2);
    expect(typed.sources.alkalinity_meq_l).toBe('typed');
  });

  it('a titration result carried by a file counts as from the titration, after typed values', () => {
    const carried: MeasuredValue = { quantity: 'alkalinity', value: 3.9, unit: 'meq_l', source: 'titration' };
    const t = { quantity: 'temperature', value: 11.2, unit: 'c' };
    const only = readingRequest(reading([t, carried]), site({}));
    expect(only.input.alkalinity_meq_l).toBe(3.9);
    expect(only.sources.alkalinity_meq_l).toBe('titration');
    const typed = readingRequest(
      reading([t, carried, { quantity: 'alkalinity', value: 8, unit: 'dkh' }]),
      site({}),
    );
    expect(typed.input).not.toHaveProperty('alkalinity_meq_l');
    expect(typed.sources.alkalinity_dkh).toBe('typed');
  });

  it('a failed reduction is reported with its code, and nothing is invented in its place', () => {
    const req = readingRequest(reading([{ quantity: 'ph', value: 7.1, unit: 'ph' }], KESTREL), site({}));
    expect(req.titration).toEqual({
      error: expect.objectContaining({ code: 'titration-needs-temperature' }),
    });
    expect(req.input).not.toHaveProperty('alkalinity_meq_l');
  });
});

/** Random readings: typed rows in any unit, with or without a titration, with site defaults and settings. */
const valueArb: fc.Arbitrary<MeasuredValue[]> = fc
  .record(
    {
      temperature: fc.oneof(
        fc.record({
          quantity: fc.constant('temperature'),
          value: fc.double({ min: 2, max: 30, noNaN: true }),
          unit: fc.constant('c'),
        }),
        fc.record({
          quantity: fc.constant('temperature'),
          value: fc.double({ min: 36, max: 86, noNaN: true }),
          unit: fc.constant('f'),
        }),
      ),
      ph: fc.record({
        quantity: fc.constant('ph'),
        value: fc.double({ min: 6.5, max: 8.6, noNaN: true }),
        unit: fc.constantFrom('ph', 'nbs', 'total'),
      }),
      alkalinity: fc.oneof(
        fc.record({
          quantity: fc.constant('alkalinity'),
          value: fc.double({ min: 500, max: 4000, noNaN: true }),
          unit: fc.constant('umol_kg'),
        }),
        fc.record({
          quantity: fc.constant('alkalinity'),
          value: fc.double({ min: 1, max: 12, noNaN: true }),
          unit: fc.constant('dkh'),
        }),
        fc.record({
          quantity: fc.constant('alkalinity'),
          value: fc.double({ min: 0.5, max: 5, noNaN: true }),
          unit: fc.constant('meq_l'),
        }),
      ),
      salinity: fc.record({
        quantity: fc.constant('salinity'),
        value: fc.double({ min: 0, max: 38, noNaN: true }),
        unit: fc.constant('pss'),
      }),
      conductance: fc.record({
        quantity: fc.constant('conductance'),
        value: fc.double({ min: 50, max: 2000, noNaN: true }),
        unit: fc.constant('us_cm'),
      }),
    },
    { requiredKeys: ['temperature'] },
  )
  .chain((r) =>
    // Sometimes a titration's result carried by an imported file (used only where nothing was typed).
    fc
      .option(fc.double({ min: 0.5, max: 6, noNaN: true }), { nil: undefined })
      .map((carried) => [
        ...(Object.values(r) as MeasuredValue[]),
        ...(carried === undefined
          ? []
          : [{ quantity: 'alkalinity', value: carried, unit: 'meq_l', source: 'titration' as const }]),
      ]),
  );

const defaultsArb: fc.Arbitrary<SiteDefaults> = fc.record(
  {
    model: fc.constantFrom('saline', 'fresh', 'auto'),
    salinity: fc.double({ min: 0, max: 36, noNaN: true }),
    specific_conductance_us_cm: fc.double({ min: 50, max: 3000, noNaN: true }),
    ph_scale: fc.constantFrom('total', 'nbs'),
    carbonic_constants: fc.constantFrom('auto', 'lueker2000', 'millero2010'),
  },
  { requiredKeys: [] },
) as fc.Arbitrary<SiteDefaults>;

const settingsArb: fc.Arbitrary<RequestSettings> = fc.record({
  model: fc.constantFrom('auto', 'saline', 'fresh'),
  ph_scale: fc.constantFrom('total', 'free', 'seawater', 'nbs'),
  carbonic_constants: fc.constantFrom('auto', 'lueker2000', 'millero2010'),
  boron_total: fc.constantFrom('lee2010', 'uppstrom1974'),
  atmospheric_pco2_uatm: fc.double({ min: 300, max: 600, noNaN: true }),
  ph_uncertainty: fc.double({ min: 0.001, max: 0.05, noNaN: true }),
}) as fc.Arbitrary<RequestSettings>;

const titrationArb: fc.Arbitrary<TitrationRecord | undefined> = fc.option(
  fc
    .constantFrom<TitrationMethod>('gran', 'endpoint', 'inflection', 'curve_fit')
    .map((method) => ({ ...KESTREL, method })),
  { nil: undefined },
);

describe('every consumer solves the same request for a reading (property)', () => {
  it('worker (page, form, planner, chart, download), export, import preview and checks agree', () => {
    fc.assert(
      fc.property(
        valueArb,
        titrationArb,
        defaultsArb,
        settingsArb,
        (values, titration, defaults, settings) => {
          const r = reading(values, titration);
          const s = site(defaults);
          const truth = readingRequest(r, s, settings);
          const seen: { who: string; input: SolveInput }[] = [];
          const spy =
            (who: string) =>
            (input: SolveInput): SolveResult => {
              seen.push({ who, input: structuredClone(input) });
              return solve(input);
            };

          // The engine worker: one reading (reading page with ±, reading form, planner's "before").
          const one = worker({
            id: 1,
            kind: 'reading',
            job: { reading: r, defaults },
            settings,
            uncertainty: true,
          });
          if (one.kind !== 'reading') throw new Error('wrong answer');
          seen.push({ who: 'worker reading', input: one.request.input });
          seen.push({
            who: 'planner before',
            input: planRequest(one.request.input, DEFAULT_FORM).water as SolveInput,
          });
          // Many readings (site chart, CSV download).
          const many = worker({
            id: 2,
            kind: 'readings',
            jobs: [{ reading: r, defaults }],
            settings,
            keys: ['dic_umol_kg'],
          });
          if (many.kind !== 'readings') throw new Error('wrong answer');
          seen.push({ who: 'worker readings', input: many.requests[0]!.input });
          // CSV export in Node, import preview and the import's check of every row.
          exportReadingsCsv([r], [s], { solve: spy('export'), settings });
          const plan: ImportPlan = {
            readings: [r],
            readingLines: [2],
            updatedAtGiven: [false],
            newSites: [],
            errors: [],
            duplicateRows: [],
            rowCount: 1,
          };
          previewImport(plan, [s], spy('preview'), 1, settings);
          computeWarnings(plan, [s], spy('import check'), settings);

          expect(seen.map((x) => x.who)).toHaveLength(6);
          for (const x of seen) expect(x.input, x.who).toEqual(truth.input);
          expect(one.request.sources).toEqual(truth.sources);
          expect(many.requests[0]!.sources).toEqual(truth.sources);
          expect(one.request.uncertainty).toEqual(truth.uncertainty);
        },
      ),
      { numRuns: 40 },
    );
  });

  it('the reading page shows the same numbers as the chart and the export (titration only)', () => {
    const r = reading(
      [
        { quantity: 'temperature', value: 11.2, unit: 'c' },
        { quantity: 'ph', value: 7.16, unit: 'ph' },
        { quantity: 'conductance', value: 480, unit: 'us_cm' },
      ],
      KESTREL,
    );
    const defaults: SiteDefaults = { model: 'fresh' };
    const page = worker({
      id: 3,
      kind: 'reading',
      job: { reading: r, defaults },
      settings: DEFAULT_SETTINGS,
      uncertainty: true,
    });
    const chart = worker({
      id: 4,
      kind: 'readings',
      jobs: [{ reading: r, defaults }],
      settings: DEFAULT_SETTINGS,
      keys: ['pco2_uatm', 'dic_umol_kg'],
    });
    if (page.kind !== 'reading' || chart.kind !== 'readings') throw new Error('wrong answer');
    const a = page.result as unknown as Record<string, number>;
    const b = chart.results[0] as unknown as Record<string, number>;
    expect('error' in page.result).toBe(false);
    expect(b.pco2_uatm).toBe(a.pco2_uatm);
    expect(b.dic_umol_kg).toBe(a.dic_umol_kg);
    const csv = exportReadingsCsv([r], [site(defaults)], { solve }).split('\r\n');
    const header = csv[0]!.split(',');
    const row = csv[1]!.split(',');
    const cell = (k: string) => row[header.indexOf(k)]!;
    expect(Number(cell('computed_dic_umol_kg'))).toBeCloseTo(a.dic_umol_kg!, 6);
    expect(Number(cell('titration_alkalinity_meq_l'))).toBeCloseTo(
      (page.request as ReadingRequest).input.alkalinity_meq_l as number,
      12,
    );
    expect(cell('input_sources')).toContain('alkalinity_meq_l=titration');
    expect(cell('computed_issues')).not.toMatch(/too-few/);
  });
});
