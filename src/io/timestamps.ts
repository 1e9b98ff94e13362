/**
 * Sampling times in and out. Inside Tufa a reading's time is a UTC instant (`takenAt`, ISO 8601
 * with `Z`) plus the IANA time zone of the site, so exports can show local time with its offset.
 * Files give times with an offset, in UTC, or as local wall-clock time of a zone the user names.
 */

export type DateOrder = 'ymd' | 'dmy' | 'mdy';

const ISO =
  /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{1,2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?)?\s*(Z|[+-]\d{2}(?::?\d{2})?)?$/i;
const NUMERIC_DATE = /^(\d{1,4})[./-](\d{1,2})[./-](\d{1,4})$/;
const TIME = /^(\d{1,2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,9}))?)?$/;

export interface WallClock {
  year: number;
  month: number;
  day: number;
  hour: number;
  minute: number;
  second: number;
  ms: number;
}

const QUARTER_HOUR_MS = 900000;
const DAY_MS = 86400000;
type OffsetCache = Map<string, Map<number, number>>;
const dayEnds: OffsetCache = new Map();
const quarters: OffsetCache = new Map();

function intlOffset(timeZone: string, at: number): number {
  const parts = formatterFor(timeZone).formatToParts(new Date(at));
  const get = (t: string) => Number(parts.find((p) => p.type === t)?.value ?? '0');
  const asUtc = Date.UTC(
    get('year'),
    get('month') - 1,
    get('day'),
    get('hour') % 24,
    get('minute'),
    get('second'),
  );
  return Math.round((asUtc - at) / 60000);
}

function cached(cache: OffsetCache, timeZone: string, key: number, f: () => number): number {
  let zone = cache.get(timeZone);
  if (!zone) {
    zone = new Map();
    cache.set(timeZone, zone);
  }
  const hit = zone.get(key);
  if (hit !== undefined) return hit;
  const v = f();
  if (zone.size > 100000) zone.clear();
  zone.set(key, v);
  return v;
}

/** Per zone, the last span of instants [lo, hi) known to share one offset: most lookups end here. */
interface Span {
  lo: number;
  hi: number;
  offset: number;
}
const spans = new Map<string, Span>();
let lastZone = '';
let lastSpan: Span = { lo: 0, hi: 0, offset: 0 };

/**
 * Offset of a zone from UTC at an instant, in minutes (east positive). Throws on unknown zones.
 * Intl is slow enough to matter for 100 000 rows, so offsets are cached: per UTC day when the
 * offset is the same at both ends of the day (no change that day), else per quarter hour, since
 * offsets are whole quarter hours and change on quarter-hour instants (true of the time zone
 * database since the 1970s). Per zone, the run of neighbouring days (or quarter hours) last found
 * to share one offset is remembered as a span, so rows in time order cost two comparisons and no
 * Map lookup; its answers are those of the caches it was made from.
 */
export function zoneOffsetMinutes(timeZone: string, epochMs: number): number {
  let span = timeZone === lastZone ? lastSpan : spans.get(timeZone);
  if (span !== undefined && epochMs >= span.lo && epochMs < span.hi) {
    lastZone = timeZone;
    lastSpan = span;
    return span.offset;
  }
  const day = Math.floor(epochMs / DAY_MS);
  // Keys 2·day and 2·day + 1: the offsets at the start and at the end of a UTC day.
  const start = cached(dayEnds, timeZone, 2 * day, () => intlOffset(timeZone, day * DAY_MS));
  const end = cached(dayEnds, timeZone, 2 * day + 1, () => intlOffset(timeZone, (day + 1) * DAY_MS - 1000));
  let lo: number;
  let hi: number;
  let offset: number;
  if (start === end) {
    lo = day * DAY_MS;
    hi = lo + DAY_MS;
    offset = start;
  } else {
    const q = Math.floor(epochMs / QUARTER_HOUR_MS);
    lo = q * QUARTER_HOUR_MS;
    hi = lo + QUARTER_HOUR_MS;
    offset = cached(quarters, timeZone, q, () => intlOffset(timeZone, q * QUARTER_HOUR_MS));
  }
  if (span === undefined) {
    span = { lo, hi, offset };
    spans.set(timeZone, span);
  } else if (offset === span.offset && (hi === span.lo || lo === span.hi)) {
    // A neighbour with the same offset: the span grows (to a whole season as rows go by), so a
    // look-up a day either side of the last one, as wallClockToEpoch makes, hits it too.
    span.lo = Math.min(lo, span.lo);
    span.hi = Math.max(hi, span.hi);
  } else {
    span.lo = lo;
    span.hi = hi;
    span.offset = offset;
  }
  lastZone = timeZone;
  lastSpan = span;
  return offset;
}

const formatters = new Map<string, Intl.DateTimeFormat>();
function formatterFor(timeZone: string): Intl.DateTimeFormat {
  let f = formatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', {
      timeZone,
      hourCycle: 'h23',
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      second: '2-digit',
    });
    formatters.set(timeZone, f);
  }
  return f;
}

export function isKnownTimeZone(timeZone: string): boolean {
  try {
    formatterFor(timeZone);
    return true;
  } catch {
    return false;
  }
}

/**
 * Wall-clock time in a zone to a UTC instant. Candidate offsets from a day before, at and a day
 * after the naive instant cover a DST change; a candidate is kept when it maps back to the same
 * wall clock. A time that does not exist (spring gap) is read with the offset before the change (02:30
 * becomes 03:30 summer time); a repeated hour (autumn) takes its first occurrence.
 */
export function wallClockToEpoch(w: WallClock, timeZone: string): number {
  const naive = Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second, w.ms);
  // Offsets a day before and after bracket any change near this time (changes are rarer than daily).
  const before = naive - zoneOffsetMinutes(timeZone, naive - DAY_MS) * 60000;
  const at = naive - zoneOffsetMinutes(timeZone, naive) * 60000;
  const after = naive - zoneOffsetMinutes(timeZone, naive + DAY_MS) * 60000;
  const valid = (e: number) => naive - zoneOffsetMinutes(timeZone, e) * 60000 === e;
  // The usual case: one offset all round, and the wall clock exists.
  if (before === at && at === after && valid(at)) return at;
  // Several valid: the repeated autumn hour, take the first occurrence. None: the spring gap.
  let first = Number.POSITIVE_INFINITY;
  for (const e of [before, at, after]) if (e < first && valid(e)) first = e;
  return first !== Number.POSITIVE_INFINITY ? first : Math.max(before, at, after);
}

function validWallClock(w: WallClock): boolean {
  if (w.month < 1 || w.month > 12 || w.day < 1 || w.hour > 23 || w.minute > 59 || w.second > 60) return false;
  const dim = new Date(Date.UTC(w.year, w.month, 0)).getUTCDate();
  return w.day <= dim;
}

function fraction(s: string | undefined): number {
  return s ? Math.round(Number(`0.${s}`) * 1000) : 0;
}

/**
 * Parses one time field (or a date field plus a time field). Returns epoch milliseconds, or a
 * reason in words. `timeZone` applies to times written without an offset.
 */
export function parseTimestamp(
  dateText: string,
  timeText: string | undefined,
  timeZone: string,
  order: DateOrder,
): { epochMs: number } | { reason: string } {
  const d = dateText.trim();
  const t = timeText?.trim() ?? '';
  const joined = t === '' ? d : `${d}T${t}`;
  const iso = ISO.exec(joined);
  if (iso) {
    const w: WallClock = {
      year: Number(iso[1]),
      month: Number(iso[2]),
      day: Number(iso[3]),
      hour: Number(iso[4] ?? '0'),
      minute: Number(iso[5] ?? '0'),
      second: Number(iso[6] ?? '0'),
      ms: fraction(iso[7]),
    };
    if (!validWallClock(w)) return { reason: `"${joined}" is not a calendar date and time.` };
    const zone = iso[8];
    if (zone === undefined) return { epochMs: wallClockToEpoch(w, timeZone) };
    const naive = Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second, w.ms);
    if (zone.toUpperCase() === 'Z') return { epochMs: naive };
    const sign = zone.startsWith('-') ? -1 : 1;
    const digits = zone.slice(1).replace(':', '');
    const off = Number(digits.slice(0, 2)) * 60 + Number(digits.slice(2, 4) || '0');
    return { epochMs: naive - sign * off * 60000 };
  }
  // Dates such as 03.06.2026 or 06/03/2026, with the time in the same field or a separate one.
  const [datePart, ...rest] = d.split(/[ T]+/);
  const timePart = t !== '' ? t : rest.join(' ');
  const m = NUMERIC_DATE.exec(datePart ?? '');
  if (!m)
    return { reason: `"${joined}" is not a date Tufa can read (use ISO 8601, e.g. 2026-06-03T14:05+02:00).` };
  const a = Number(m[1]);
  const b = Number(m[2]);
  const c = Number(m[3]);
  let year: number;
  let month: number;
  let day: number;
  if (m[1]!.length === 4) [year, month, day] = [a, b, c];
  else if (order === 'mdy') [year, month, day] = [c, a, b];
  else [year, month, day] = [c, b, a];
  if (year < 100) year += 2000;
  let hour = 0;
  let minute = 0;
  let second = 0;
  let ms = 0;
  if (timePart !== '') {
    const tm = TIME.exec(timePart);
    if (!tm) return { reason: `"${timePart}" is not a time of day (use HH:MM or HH:MM:SS).` };
    hour = Number(tm[1]);
    minute = Number(tm[2]);
    second = Number(tm[3] ?? '0');
    ms = fraction(tm[4]);
  }
  const w: WallClock = { year, month, day, hour, minute, second, ms };
  if (!validWallClock(w)) return { reason: `"${joined}" is not a calendar date and time.` };
  return { epochMs: wallClockToEpoch(w, timeZone) };
}

const pad = (n: number, w = 2) => String(Math.abs(n)).padStart(w, '0');

/** ISO 8601 local time with its UTC offset in a zone, e.g. `2026-06-03T14:05:00+02:00`. */
export function formatWithOffset(epochMs: number, timeZone: string): string {
  const off = zoneOffsetMinutes(timeZone, epochMs);
  const local = new Date(epochMs + off * 60000);
  const ms = local.getUTCMilliseconds();
  const sign = off < 0 ? '-' : '+';
  return (
    `${local.getUTCFullYear()}-${pad(local.getUTCMonth() + 1)}-${pad(local.getUTCDate())}` +
    `T${pad(local.getUTCHours())}:${pad(local.getUTCMinutes())}:${pad(local.getUTCSeconds())}` +
    (ms ? `.${pad(ms, 3)}` : '') +
    `${sign}${pad(Math.trunc(Math.abs(off) / 60))}:${pad(Math.abs(off) % 60)}`
  );
}
