/** The per-document rules of a pull (`src/sync/pull-plan.ts`) and the answer checks (`src/sync/wire.ts`), without a server. */

import { describe, expect, it } from 'vitest';
import type { ReadingDoc, SiteDoc, TufaDoc } from '../../src/store/schema';
import type { CouchDoc } from '../../src/sync/couch-client';
import { toCouch } from '../../src/sync/doc-codec';
import { planPulled } from '../../src/sync/pull-plan';
import { readAllDocs, readBulkRows, readChanges } from '../../src/sync/wire';

const now = new Date('2026-06-01T12:00:00.000Z');
const site: SiteDoc = {
  id: 's1',
  type: 'site',
  name: 'Gravel pit 3',
  kind: 'pond',
  defaults: {},
  notes: '',
  updatedAt: '2026-05-01T00:00:00.000Z',
  deleted: false,
  rev: '1-a',
};
const reading: ReadingDoc = {
  id: 'r1',
  type: 'reading',
  siteId: 's1',
  takenAt: '2026-05-02T08:00:00.000Z',
  timeZone: 'Europe/Oslo',
  values: [{ quantity: 'ph', value: 7.9, unit: 'nbs' }],
  notes: 'morning',
  updatedAt: '2026-05-02T09:00:00.000Z',
  deleted: false,
  rev: '1-b',
};
const local = new Map<string, TufaDoc>([
  [site.id, site],
  [reading.id, reading],
]);
const remote = (d: TufaDoc, patch: Record<string, unknown>): CouchDoc => ({ ...toCouch(d), ...patch });
const none = () => false;

describe('planPulled', () => {
  it('applies a newer remote edit, skips our own revision, and applies a new doc', () => {
    const p = planPulled(
      [
        remote(reading, { _rev: '2-c', notes: 'later', updatedAt: '2026-05-03T00:00:00.000Z' }),
        remote(site, {}),
        remote({ ...reading, id: 'r2' }, { _rev: '1-d' }),
      ],
      local,
      none,
      now,
    );
    expect(p.apply.map((d) => d.id)).toEqual(['r1', 'r2']);
    expect(p.edits).toEqual([]);
    expect(p.setAside).toEqual([]);
  });

  it('sets aside a doc that fails validation or changes type, with the reason', () => {
    const p = planPulled(
      [
        remote(reading, {
          _rev: '2-c',
          updatedAt: '2026-05-03T00:00:00.000Z',
          values: [{ quantity: 'ph', value: null, unit: 'nbs' }],
        }),
        remote(site, {
          _rev: '2-e',
          type: 'reading',
          siteId: 's1',
          takenAt: reading.takenAt,
          timeZone: 'UTC',
          values: [],
        }),
        { _id: 'x', _rev: '1-f', type: 'reading', values: 'many' },
        { _id: 'y', _rev: '1-g', notes: 42, type: 'site' },
      ],
      local,
      none,
      now,
    );
    expect(p.apply).toEqual([]);
    expect(p.setAside.map((d) => [d.docId, d.code, d.reason])).toEqual([
      ['r1', 'sync-doc-invalid', 'value of ph is not a finite number'],
      ['s1', 'sync-type-change', 'it would turn the site with this id into a reading'],
      ['x', 'sync-doc-invalid', 'values must be a list of measured values'],
      ['y', 'sync-doc-invalid', 'notes must be text'],
    ]);
  });

  it('a rewrite not newer than the local copy, or meeting a pending local change, is a conflict', () => {
    const older = remote(reading, { _rev: '2-c', notes: 'rewritten', updatedAt: '2026-05-02T09:00:00.000Z' });
    expect(planPulled([older], local, none, now).edits.map((e) => e.theirs.rev)).toEqual(['2-c']);
    const newer = remote(reading, { _rev: '2-c', notes: 'rewritten', updatedAt: '2026-05-09T00:00:00.000Z' });
    expect(planPulled([newer], local, () => true, now).edits).toHaveLength(1);
    // The same content as the pending change confirms the push instead.
    const same = remote(reading, { _rev: '2-c' });
    expect(planPulled([same], local, () => true, now).confirmed).toEqual([
      { docId: 'r1', rev: '2-c', updatedAt: reading.updatedAt },
    ]);
  });
});

describe('server answers', () => {
  it('_changes: the page must have results and last_seq; bad rows are described and dropped', () => {
    expect(() => readChanges(null)).toThrow(/not a JSON object/);
    expect(() => readChanges({ results: null, last_seq: 3 })).toThrow(/no list of results/);
    expect(() => readChanges({ results: [] })).toThrow(/last_seq/);
    const p = readChanges({
      results: [
        null,
        { id: 5, changes: [{ rev: '1-a' }] },
        { id: 'a', changes: [] },
        { id: 'b', seq: 2, changes: [{ rev: '1-b' }] },
      ],
      last_seq: 2,
    });
    expect(p.results.map((r) => r.id)).toEqual(['b']);
    expect(p.badRows).toHaveLength(3);
  });

  it('_bulk_docs: not a list is retryable; rows without a string id or any outcome are left out', () => {
    expect(() => readBulkRows({ rows: [] })).toThrow(
      expect.objectContaining({ code: 'sync-bad-response', retryable: true }),
    );
    expect(
      readBulkRows([
        null,
        { id: 1, rev: '1-a' },
        { id: 'a' },
        { id: 'b', rev: '1-b' },
        { id: 'c', error: 'forbidden' },
      ]),
    ).toEqual([
      { id: 'b', rev: '1-b', error: undefined, reason: undefined },
      { id: 'c', rev: undefined, error: 'forbidden', reason: undefined },
    ]);
  });

  it('_all_docs: every key must come back as a doc or not_found', () => {
    const ok = readAllDocs(
      {
        rows: [
          { id: 'a', key: 'a', value: { rev: '1-a' }, doc: { _id: 'a', _rev: '1-a' } },
          { id: 'b', key: 'b', value: { rev: '2-b', deleted: true }, doc: null },
          { key: 'c', error: 'not_found' },
        ],
      },
      ['a', 'b', 'c'],
    );
    expect([...ok.keys()]).toEqual(['a', 'b']);
    expect(ok.get('b')?._deleted).toBe(true);
    expect(() => readAllDocs({ rows: [null] }, ['a'])).toThrow(/left out 1 of the 1/);
  });
});
