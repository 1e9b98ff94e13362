import { describe, expect, it } from 'vitest';
import { parseTimestamp, wallClockToEpoch, zoneOffsetMinutes } from '../../src/io/timestamps';

/**
 * The cached offsets (per day, per quarter hour, and the last span per zone) against Intl asked
 * afresh for every instant, around DST changes in both hemispheres and in zones whose offset or
 * whose change is not a whole hour. Change instants are from memory of the IANA rules (EU: last
 * Sunday of March and October at 01:00 UTC; South Australia and New Zealand: first Sunday of April
 * and first Sunday of October / last Sunday of September; Lord Howe shifts by 30 minutes);
 * the brute-force comparison does not depend on them.
 */
const formats = new Map<string, Intl.DateTimeFormat>();
function referenceOffset(timeZone: string, at: number): number {
  const f =
    formats.get(timeZone) ??
    new Intl.DateTimeFormat('en-US', {
      timeZone,
      hourCycle: 'h23',
      year: 'numeric',
      month: 'numeric',
      day: 'numeric',
      hour: 'numeric',
      minute: 'numeric',
      second: 'numeric',
    });
  formats.set(timeZone, f);
  const parts = f.formatToParts(new Date(at));
  const get = (t: string) => Number(parts.find((p) => p.type === t)?.value);
  const asUtc = Date.UTC(
    get('year'),
    get('month') - 1,
    get('day'),
    get('hour') % 24,
    get('minute'),
    get('second'),
  );
  return Math.round((asUtc - Math.floor(at / 1000) * 1000) / 60000);
}

const CHANGES: [string, string, number, number][] = [
  ['Europe/Vienna', '2026-03-29T01:00:00Z', 60, 120],
  ['Europe/Vienna', '2026-10-25T01:00:00Z', 120, 60],
  ['Australia/Adelaide', '2026-04-04T16:30:00Z', 630, 570],
  ['Australia/Adelaide', '2026-10-03T16:30:00Z', 570, 630],
  ['Pacific/Auckland', '2026-04-04T14:00:00Z', 780, 720],
  ['Pacific/Auckland', '2026-09-26T14:00:00Z', 720, 780],
  ['Australia/Lord_Howe', '2026-04-04T15:00:00Z', 660, 630],
  ['Australia/Lord_Howe', '2026-10-03T15:30:00Z', 630, 660],
];

describe('zone offsets (cached) equal Intl asked afresh', () => {
  it('changes at the expected instants, in both hemispheres and by half hours', () => {
    for (const [zone, at, before, after] of CHANGES) {
      const t = Date.parse(at);
      expect(zoneOffsetMinutes(zone, t - 1000), `${zone} before ${at}`).toBe(before);
      expect(zoneOffsetMinutes(zone, t), `${zone} at ${at}`).toBe(after);
    }
    expect(zoneOffsetMinutes('Asia/Kolkata', Date.parse('2026-06-01T00:00:00Z'))).toBe(330);
  });

  it('every 5 minutes (and odd seconds) over two days around each change, zones interleaved', () => {
    const zones = [...new Set(CHANGES.map(([z]) => z)), 'Asia/Kolkata', 'UTC'];
    let checked = 0;
    for (const [, at] of CHANGES) {
      const t0 = Date.parse(at) - 86400000;
      for (let t = t0; t < t0 + 2 * 86400000; t += 300000) {
        for (const zone of zones) {
          for (const dt of [0, 59000, 299000]) {
            expect(zoneOffsetMinutes(zone, t + dt), `${zone} ${new Date(t + dt).toISOString()}`).toBe(
              referenceOffset(zone, t + dt),
            );
            checked++;
          }
        }
      }
    }
    expect(checked).toBeGreaterThan(40000);
  });

  it('in time order and backwards give the same answers (the remembered span is only a shortcut)', () => {
    const zone = 'Australia/Adelaide';
    const t0 = Date.parse('2026-10-03T00:00:00Z');
    const forward: number[] = [];
    for (let i = 0; i < 288; i++) forward.push(zoneOffsetMinutes(zone, t0 + i * 300000));
    const backward: number[] = [];
    for (let i = 287; i >= 0; i--) backward.push(zoneOffsetMinutes(zone, t0 + i * 300000));
    expect(backward.reverse()).toEqual(forward);
  });
});

describe('wall clock to UTC across changes', () => {
  const iso = (text: string, zone: string) => {
    const r = parseTimestamp(text, undefined, zone, 'ymd');
    return 'epochMs' in r ? new Date(r.epochMs).toISOString() : r.reason;
  };
  it('southern hemisphere, 30-minute offset: gap read with the offset before, repeated hour first', () => {
    // Adelaide: 2026-10-04 02:00 +09:30 jumps to 03:00 +10:30; 2026-04-05 03:00 +10:30 back to 02:00 +09:30.
    expect(iso('2026-10-04 01:59', 'Australia/Adelaide')).toBe('2026-10-03T16:29:00.000Z');
    expect(iso('2026-10-04 02:30', 'Australia/Adelaide')).toBe('2026-10-03T17:00:00.000Z');
    expect(iso('2026-10-04 03:00', 'Australia/Adelaide')).toBe('2026-10-03T16:30:00.000Z');
    expect(iso('2026-04-05 02:30', 'Australia/Adelaide')).toBe('2026-04-04T16:00:00.000Z');
    expect(iso('2026-04-05 03:00', 'Australia/Adelaide')).toBe('2026-04-04T17:30:00.000Z');
    // Lord Howe moves by 30 minutes: 02:00 +10:30 → 02:30 +11.
    expect(iso('2026-10-04 02:15', 'Australia/Lord_Howe')).toBe('2026-10-03T15:45:00.000Z');
    expect(iso('2026-04-05 01:45', 'Australia/Lord_Howe')).toBe('2026-04-04T14:45:00.000Z');
    expect(iso('2026-06-01 12:00', 'Asia/Kolkata')).toBe('2026-06-01T06:30:00.000Z');
  });

  it('every wall-clock minute in steps of 5 around each change maps like a brute-force search', () => {
    for (const [zone, at, before, after] of CHANGES) {
      const mid = Date.parse(at);
      for (let naive = mid - 86400000; naive < mid + 86400000; naive += 300000) {
        const d = new Date(naive);
        const w = {
          year: d.getUTCFullYear(),
          month: d.getUTCMonth() + 1,
          day: d.getUTCDate(),
          hour: d.getUTCHours(),
          minute: d.getUTCMinutes(),
          second: 0,
          ms: 0,
        };
        // Instants whose local time is this wall clock, under either offset of the change.
        const hits = [before, after]
          .map((o) => naive - o * 60000)
          .filter((e) => e + referenceOffset(zone, e) * 60000 === naive);
        const expected = hits.length > 0 ? Math.min(...hits) : naive - Math.min(before, after) * 60000;
        expect(wallClockToEpoch(w, zone), `${zone} ${d.toISOString()} local`).toBe(expected);
      }
    }
  });
});
