/**
 * Pure helpers of the paged layout: which page a reading belongs to, which bucket an id hashes to,
 * and merging documents into a page in order. No IndexedDB here, so they are easy to test.
 */

import type { ReadingDoc, ReadingPageMeta } from './schema';

export const BUCKETS = 256;

export function pageIdOf(siteId: string, takenAt: string): string {
  return `${siteId}|${takenAt.slice(0, 7)}`;
}

export function monthOf(takenAt: string): string {
  return takenAt.slice(0, 7);
}

/** FNV-1a 32-bit of the id, folded into 0..255: ids of any shape spread evenly. */
export function bucketOf(id: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < id.length; i++) {
    h ^= id.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return (h ^ (h >>> 8) ^ (h >>> 16) ^ (h >>> 24)) & (BUCKETS - 1);
}

export function compareReadings(a: ReadingDoc, b: ReadingDoc): number {
  return a.takenAt < b.takenAt ? -1 : a.takenAt > b.takenAt ? 1 : a.id < b.id ? -1 : a.id > b.id ? 1 : 0;
}

/** A page's documents after removing `remove` ids and upserting `upsert` docs, sorted. */
export function mergePage(current: ReadingDoc[], upsert: ReadingDoc[], remove: Set<string>): ReadingDoc[] {
  const byId = new Map<string, ReadingDoc>();
  for (const r of current) if (!remove.has(r.id)) byId.set(r.id, r);
  for (const r of upsert) byId.set(r.id, r);
  const out = [...byId.values()];
  // Bulk imports usually arrive in time order: skip the sort when already ordered.
  for (let i = 1; i < out.length; i++) {
    if (compareReadings(out[i - 1]!, out[i]!) > 0) return out.sort(compareReadings);
  }
  return out;
}

export function metaOf(id: string, readings: ReadingDoc[]): ReadingPageMeta {
  const first = readings[0]!;
  let live = 0;
  for (const r of readings) if (!r.deleted) live++;
  return { id, siteId: first.siteId, month: monthOf(first.takenAt), total: readings.length, live };
}
