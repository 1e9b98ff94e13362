/**
 * Fuzz: a device syncs with a misbehaving CouchDB-API server (`fake-couch.ts` on 127.0.0.1).
 * fast-check draws the server's content (good docs, poison docs with one hostile field, arbitrary
 * JSON objects, docs reusing a local id with the other type, rewrites of local readings that are
 * older than the local copy) and a schedule of faults (bodies that are not JSON or `null`,
 * `results: null`, junk rows, full pages that never move on, hangs, 403/500, rows left out).
 * The local side has synced readings, local edits and new readings not yet sent.
 *
 * Invariants, for every case: each sync ends within a bound (never hangs), rejects only with a
 * coded SyncError in words (never raw JavaScript text, never an uncaught throw); after the server
 * behaves again one more sync succeeds; every local reading is still there exactly as last
 * written here (nothing lost or silently overwritten), every local change is on the server unless
 * it waits in a conflict, every good server doc arrived (sync goes on past bad ones) and every bad
 * one was set aside instead of stored. Bounded: a fixed number of cases, each with a time bound;
 * CI uses a fixed seed (tests/setup.ts).
 */

import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import type { ReadingDoc } from '../../src/store/schema';
import { listSetAside } from '../../src/sync/quarantine';
import { SyncError } from '../../src/sync/sync-issues';
import { device, readingInput, siteInput } from './devices';
import { type Endpoint, FakeCouch, type Fault, type FaultKind } from './fake-couch';

const CASES = Number(process.env.TUFA_FUZZ_CASES ?? 30);
const BOUND_MS = 8000;
const RAW_JS = /Cannot read|is not a function|undefined|null \(reading|TypeError|RangeError|SyntaxError/;
const counts = { cases: 0, faults: 0, hostile: 0, syncs: 0, rejected: 0, failures: 0 };

const FAULT_KINDS: FaultKind[] = [
  'status-403',
  'status-500',
  'not-json',
  'null-body',
  'hang',
  'null-results',
  'junk-rows',
  'same-seq',
  'cycle-seq',
  'missing-rows',
];
const ENDPOINTS: Endpoint[] = ['_changes', '_bulk_docs', '_all_docs', '_local', 'doc', 'any'];

const faultArb: fc.Arbitrary<Fault> = fc.record({
  on: fc.constantFrom(...ENDPOINTS),
  kind: fc.constantFrom(...FAULT_KINDS),
  times: fc.integer({ min: 1, max: 2 }),
});

function deep(n: number): unknown {
  let x: unknown = 'bottom';
  for (let i = 0; i < n; i++) x = [x];
  return x;
}

const READING_FIELDS = [
  'values',
  'takenAt',
  'updatedAt',
  'timeZone',
  'siteId',
  'deleted',
  'notes',
  'titration',
  'type',
];
const hostileValue = fc.oneof(
  fc.constantFrom<unknown>(
    null,
    'NaN',
    '',
    -1,
    1e308,
    [],
    {},
    [null],
    [{ quantity: 'ph', value: null, unit: 'nbs' }],
    deep(3000),
  ),
  fc.jsonValue({ maxDepth: 3 }),
);

type ServerItem =
  | { kind: 'good'; i: number }
  | { kind: 'poison'; i: number; field: string; value: unknown }
  | { kind: 'junk'; body: Record<string, unknown> }
  | { kind: 'swap'; which: number }
  | { kind: 'older-rewrite'; which: number };

const itemArb: fc.Arbitrary<ServerItem> = fc.oneof(
  fc.record({ kind: fc.constant('good' as const), i: fc.nat(500) }),
  fc.record({
    kind: fc.constant('poison' as const),
    i: fc.nat(500),
    field: fc.constantFrom(...READING_FIELDS),
    value: hostileValue,
  }),
  fc.record({
    kind: fc.constant('junk' as const),
    body: fc.dictionary(fc.string({ maxLength: 8 }), fc.jsonValue({ maxDepth: 2 }), { maxKeys: 5 }),
  }),
  fc.record({ kind: fc.constant('swap' as const), which: fc.nat(10) }),
  fc.record({ kind: fc.constant('older-rewrite' as const), which: fc.nat(10) }),
);

const scenarioArb = fc.record({
  local: fc.integer({ min: 1, max: 4 }),
  edits: fc.array(fc.nat(10), { maxLength: 3 }),
  fresh: fc.integer({ min: 0, max: 3 }),
  items: fc.array(itemArb, { maxLength: 10 }),
  faults: fc.array(faultArb, { maxLength: 4 }),
  pullLimit: fc.constantFrom(2, 3, 50),
});

function bounded<T>(p: Promise<T>, what: string): Promise<T> {
  let timer: ReturnType<typeof setTimeout> | undefined;
  const limit = new Promise<never>((_, reject) => {
    timer = setTimeout(() => reject(new Error(`${what} did not end within ${BOUND_MS} ms`)), BOUND_MS);
  });
  return Promise.race([p, limit]).finally(() => clearTimeout(timer));
}

/** One sync under faults: ends in time, and either succeeds or rejects with a coded error in words. */
async function syncChecked(engine: { sync(): Promise<unknown> }, what: string): Promise<boolean> {
  counts.syncs++;
  try {
    await bounded(engine.sync(), what);
    return true;
  } catch (e) {
    if (!(e instanceof SyncError)) throw e;
    expect(e.message).not.toMatch(RAW_JS);
    counts.rejected++;
    return false;
  }
}

let caseNo = 0;

type Scenario = typeof scenarioArb extends fc.Arbitrary<infer T> ? T : never;

async function runCase(s: Scenario): Promise<void> {
  counts.cases++;
  const server = new FakeCouch();
  await server.start();
  const a = await device(server.url, `fuzz-${caseNo++}`, {
    maxAttempts: 3,
    timeoutMs: 250,
    pullLimit: s.pullLimit,
    maxPullPages: 50,
  });
  try {
    const messages: string[] = [];
    a.engine.subscribe((st) => {
      if (st.error) messages.push(st.error.message);
      for (const i of [...(st.setAside ?? []), ...st.rejected]) messages.push(i.message);
    });
    // Local: a site with readings, synced cleanly once.
    const site = await a.repo.createSite(siteInput('Shingle lagoon'));
    const synced: ReadingDoc[] = [];
    for (let i = 0; i < s.local; i++) synced.push(await a.repo.createReading(readingInput(site.id, i)));
    await bounded(a.engine.sync(), 'first clean sync');
    // Local edits and new readings, not yet sent.
    const expected = new Map<string, ReadingDoc>(synced.map((r) => [r.id, r]));
    for (const w of s.edits) {
      const r = synced[w % synced.length]!;
      expected.set(r.id, await a.repo.updateReading(r.id, { notes: `edited here ${w}` }));
    }
    for (let i = 0; i < s.fresh; i++) {
      const r = await a.repo.createReading(readingInput(site.id, 100 + i));
      expected.set(r.id, r);
    }
    // The server: another site with good and bad docs.
    const good: string[] = [];
    const bad: string[] = [];
    server.inject({
      _id: 'far-site',
      type: 'site',
      ...siteInput('Far marsh'),
      updatedAt: '2026-05-01T00:00:00.000Z',
      deleted: false,
    });
    good.push('far-site');
    const localIds = [site.id, ...synced.map((r) => r.id)];
    const swapped = new Set<string>();
    s.items.forEach((it, n) => {
      const id = `srv-${n}`;
      const reading = {
        _id: id,
        type: 'reading',
        ...readingInput('far-site', 'i' in it ? it.i : n),
        updatedAt: '2026-05-04T00:00:00.000Z',
        deleted: false,
      };
      if (it.kind === 'good') {
        server.inject(reading);
        good.push(id);
      } else if (it.kind === 'poison') {
        server.inject({ ...reading, [it.field]: it.value });
        bad.push(id);
      } else if (it.kind === 'junk') {
        server.inject({ ...it.body, _id: id });
        bad.push(id);
      } else if (it.kind === 'swap') {
        const target = localIds[it.which % localIds.length]!;
        const other =
          target === site.id
            ? { ...reading, _id: target }
            : {
                _id: target,
                type: 'site',
                ...siteInput('Swapped'),
                updatedAt: '2030-01-01T00:00:00.000Z',
                deleted: false,
              };
        server.inject(other);
        swapped.add(target);
      } else {
        const target = synced[it.which % synced.length]!;
        const cur = server.docOf(target.id);
        if (cur)
          server.inject({ ...cur, notes: 'older rewrite elsewhere', updatedAt: '2001-01-01T00:00:00.000Z' });
      }
    });
    counts.hostile += s.items.filter((i) => i.kind !== 'good').length;
    counts.faults += s.faults.length;
    server.faults = s.faults.map((f) => ({ ...f }));

    await syncChecked(a.engine, 'sync under faults');
    // The server behaves again: the next sync must succeed.
    server.faults = [];
    server.releaseHung();
    const ok = await syncChecked(a.engine, 'clean sync after faults');
    expect(ok, `clean sync failed: ${a.engine.getStatus().error?.message}`).toBe(true);

    for (const m of messages) expect(m).not.toMatch(RAW_JS);
    // No local reading lost or silently overwritten.
    const conflicted = new Set((await a.store.conflicts()).map((c) => c.docId));
    for (const [id, want] of expected) {
      const got = await a.repo.getReading(id);
      expect(got?.notes, `reading ${id}`).toBe(want.notes);
      expect(got?.values).toEqual(want.values);
      expect(await a.repo.getSite(id)).toBeUndefined();
      // Every local change reached the server unless it waits in a conflict.
      if (!conflicted.has(id) && !swapped.has(id)) expect(server.docOf(id)?.notes).toBe(want.notes);
    }
    expect((await a.repo.getSite(site.id))?.name).toBe('Shingle lagoon');
    // Good docs arrived past the bad ones; bad ones were set aside, not stored.
    expect((await a.repo.getSite('far-site'))?.name).toBe('Far marsh');
    for (const id of good.slice(1)) expect((await a.repo.getReading(id))?.siteId, id).toBe('far-site');
    const aside = new Set((await listSetAside(a.store)).map((d) => d.docId));
    for (const id of bad) {
      const stored = (await a.repo.getReading(id)) ?? (await a.repo.getSite(id));
      if (!stored) expect(aside.has(id), `${id} neither stored nor set aside`).toBe(true);
    }
  } finally {
    a.repo.close();
    await server.stop();
  }
}

describe('sync against a misbehaving server (fuzz)', () => {
  afterAll(() => {
    console.log(
      `fuzz-server: ${counts.cases} cases, ${counts.syncs} syncs (${counts.rejected} ended with a coded error), ${counts.faults} faults, ${counts.hostile} hostile docs, failures ${counts.failures}`,
    );
  });

  it('never hangs, never throws raw, never loses or overwrites a local reading, goes on past bad docs', async () => {
    try {
      await fc.assert(fc.asyncProperty(scenarioArb, runCase), {
        numRuns: CASES,
        interruptAfterTimeLimit: 150_000,
      });
    } catch (e) {
      counts.failures++;
      throw e;
    }
  }, 180_000);
});
