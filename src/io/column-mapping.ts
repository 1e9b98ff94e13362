/**
 * How the columns of a file map to Tufa's fields, how a mapping is guessed from the header, and
 * the key under which a mapping is remembered: a hash of the normalized header, so the next file
 * from the same logger or spreadsheet opens with the user's choices already made.
 */

import type { PhScaleName } from '../chem/api';
import { QUANTITIES, quantityById } from '../quantities';
import { type RowIssue, rowIssue } from './io-issues';
import type { DateOrder } from './timestamps';

export type ColumnRole =
  | { role: 'ignore' }
  /** Date and time in one field (ISO 8601 or a numeric date with time). */
  | { role: 'timestamp' }
  | { role: 'date' }
  | { role: 'time' }
  /** IANA zone per row, e.g. `Europe/Vienna`. */
  | { role: 'time-zone' }
  /** Site name or site id. */
  | { role: 'site' }
  | { role: 'notes' }
  /** `total`, `free`, `seawater` or `nbs` per row. */
  | { role: 'ph-scale' }
  | { role: 'value'; quantity: string; unit: string }
  /** The site's own id (our export's `site_id`): rows go to that site, or one created with that id. */
  | { role: 'site-id' }
  /** The reading's own id (our export's `reading_id`): the same reading, never a copy. */
  | { role: 'reading-id' }
  /** When the reading last changed (ISO 8601): an import replaces only an older copy. */
  | { role: 'updated-at' }
  /** Kind of water of a site the import creates (stream, spring, ...). */
  | { role: 'site-kind' }
  /** Defaults of a site the import creates (`model=fresh;salinity=0.3`, see `site-defaults-text.ts`). */
  | { role: 'site-defaults' }
  /** A titration's result (no raw points), used where nothing was typed, as on the reading page. */
  | { role: 'titration-value'; quantity: string; unit: string };

export interface ColumnMapping {
  /** One role per header column, by position. */
  columns: ColumnRole[];
  /** Zone for times written without an offset. */
  timeZone: string;
  /** Order of day, month and year in numeric dates such as 03/06/2026. */
  dateOrder: DateOrder;
  /** Site for every row when the file has no site column. */
  siteId?: string;
  /** Scale of pH values when the file has no scale column. */
  phScale?: PhScaleName;
}

/** FNV-1a over the normalized header, twice with different offsets: 64 bits as 16 hex digits. */
export function layoutKey(header: readonly string[]): string {
  const text = header.map((h) => h.trim().toLowerCase()).join('\u001f');
  let a = 0x811c9dc5;
  let b = 0x9dc5811c;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    a = Math.imul(a ^ c, 0x01000193) >>> 0;
    b = Math.imul(b ^ c, 0x01000193) >>> 0;
  }
  return `layout-${a.toString(16).padStart(8, '0')}${b.toString(16).padStart(8, '0')}`;
}

function norm(h: string): string {
  return h
    .toLowerCase()
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/µ|μ/g, 'u')
    .replace(/[^a-z0-9%/]+/g, ' ')
    .trim();
}

interface Guess {
  test: RegExp;
  role: ColumnRole;
}

const v = (quantity: string, unit: string): ColumnRole => ({ role: 'value', quantity, unit });

// Header words people and loggers commonly use (common practice, collected by us), most specific first.
const GUESSES: Guess[] = [
  {
    test: /^(date ?\/? ?time|date and time|timestamp|taken at|sampled at|sample time|datetime utc)$/,
    role: { role: 'timestamp' },
  },
  { test: /^(date|day|sample date|sampling date)$/, role: { role: 'date' } },
  { test: /^(time|clock|sample time of day)$/, role: { role: 'time' } },
  { test: /^(time ?zone|tz|zone)$/, role: { role: 'time-zone' } },
  { test: /^(site|site name|station|location|tank|pond|well|spring|site id)$/, role: { role: 'site' } },
  { test: /^(notes?|comments?|remarks?)$/, role: { role: 'notes' } },
  { test: /^ph scale$/, role: { role: 'ph-scale' } },
  { test: /(temp|temperature|water temp|wtemp)\b.*\b(f|degf|fahrenheit)$/, role: v('temperature', 'f') },
  { test: /(temp|temperature)\b.*\b(k|kelvin)$/, role: v('temperature', 'k') },
  { test: /^(t|temp|temperature|water temp|wtemp|temperature c)\b/, role: v('temperature', 'c') },
  { test: /^(sal|salinity|psu)\b/, role: v('salinity', 'pss') },
  { test: /^(pressure|press)\b.*\bbar$/, role: v('pressure', 'bar') },
  { test: /^(pressure|press)\b/, role: v('pressure', 'dbar') },
  { test: /^ph\b/, role: v('ph', 'ph') },
  { test: /^(alk|alkalinity|ta)\b.*\b(dkh|kh)$/, role: v('alkalinity', 'dkh') },
  { test: /^(kh|dkh)\b/, role: v('alkalinity', 'dkh') },
  { test: /^(alk|alkalinity|ta)\b.*\bmeq/, role: v('alkalinity', 'meq_l') },
  { test: /^(alk|alkalinity|ta)\b.*\bcaco3/, role: v('alkalinity', 'mg_l_caco3') },
  { test: /^(alk|alkalinity|ta)\b.*\bmmol/, role: v('alkalinity', 'mmol_kg') },
  { test: /^(alk|alkalinity|ta)\b/, role: v('alkalinity', 'umol_kg') },
  { test: /^(dic|tco2|ct)\b.*\bmmol/, role: v('dic', 'mmol_kg') },
  { test: /^(dic|tco2|ct)\b/, role: v('dic', 'umol_kg') },
  { test: /^pco2\b/, role: v('pco2', 'uatm') },
  { test: /^fco2\b/, role: v('fco2', 'uatm') },
  { test: /^(cond|conductance|conductivity|spc|sc|ec)\b.*\bms/, role: v('conductance', 'ms_cm') },
  { test: /^(cond|conductance|conductivity|spc|sc|ec)\b/, role: v('conductance', 'us_cm') },
  { test: /^(ca|calcium)\b.*\bumol/, role: v('calcium', 'umol_kg') },
  { test: /^(ca|calcium)\b/, role: v('calcium', 'mg_l') },
  { test: /^(mg|magnesium)\b/, role: v('magnesium', 'mg_l') },
  { test: /^(tds|dissolved solids)\b/, role: v('tds', 'mg_l') },
];

const EXACT = new Map<string, ColumnRole>([
  ['taken_at', { role: 'timestamp' }],
  ['time_zone', { role: 'time-zone' }],
  ['site', { role: 'site' }],
  ['notes', { role: 'notes' }],
  ['ph_scale', { role: 'ph-scale' }],
  ['reading_id', { role: 'reading-id' }],
  ['site_id', { role: 'site-id' }],
  ['updated_at', { role: 'updated-at' }],
  ['site_kind', { role: 'site-kind' }],
  ['site_defaults', { role: 'site-defaults' }],
  ['titration_alkalinity_meq_l', { role: 'titration-value', quantity: 'alkalinity', unit: 'meq_l' }],
  ['titration_dic_umol_kg', { role: 'titration-value', quantity: 'dic', unit: 'umol_kg' }],
  ...QUANTITIES.flatMap((q) =>
    q.units
      .filter((u) => u.id === q.units.find((x) => x.key === u.key)?.id)
      .map((u): [string, ColumnRole] => [u.key, v(q.id, u.id)]),
  ),
]);

/** A first mapping from the header alone; columns nobody recognizes are ignored until mapped. */
export function guessRoles(header: readonly string[]): ColumnRole[] {
  const used = new Set<string>();
  return header.map((h) => {
    // Our own export names (engine keys) map exactly, so an exported file re-imports as it was.
    const exact = EXACT.get(h.trim().toLowerCase());
    if (exact) {
      // One column per quantity and role: a titration's alkalinity and its DIC are two columns.
      const id =
        exact.role === 'value' || exact.role === 'titration-value'
          ? `${exact.role}:${exact.quantity}`
          : exact.role;
      if (!used.has(id)) {
        used.add(id);
        return exact;
      }
    }
    const n = norm(h);
    for (const g of GUESSES) {
      if (!g.test.test(n)) continue;
      const id = g.role.role === 'value' ? `value:${g.role.quantity}` : g.role.role;
      if (used.has(id)) return { role: 'ignore' };
      used.add(id);
      return g.role;
    }
    return { role: 'ignore' };
  });
}

/** Problems that make a mapping unusable as a whole (reported against the header row). */
export function checkMapping(header: readonly string[], m: ColumnMapping): RowIssue[] {
  const issues: RowIssue[] = [];
  if (m.columns.length !== header.length) {
    issues.push(rowIssue(1, 'map-unknown-column', 'The mapping was made for a file with other columns.'));
    return issues;
  }
  const roles = m.columns.map((c) => c.role);
  if (!roles.includes('timestamp') && !roles.includes('date')) {
    issues.push(
      rowIssue(1, 'map-no-timestamp', 'Choose the column that holds the date and time of sampling.'),
    );
  }
  if (!roles.includes('site') && !m.siteId) {
    issues.push(rowIssue(1, 'map-no-site', 'Choose a site for these readings, or the column that names it.'));
  }
  const seen = new Map<string, number>();
  m.columns.forEach((c, i) => {
    let id: string | undefined;
    if (c.role === 'value' || c.role === 'titration-value') {
      const q = quantityById(c.quantity);
      const unit = q?.units.find((x) => x.id === c.unit);
      if (!q || !unit) {
        issues.push(
          rowIssue(
            1,
            'map-unknown-quantity',
            `Column "${header[i]}" is mapped to an unknown quantity or unit.`,
            header[i],
          ),
        );
        return;
      }
      id = `${c.role}:${c.quantity}`;
    } else if (c.role !== 'ignore' && c.role !== 'notes') id = c.role;
    if (id === undefined) return;
    const prev = seen.get(id);
    if (prev !== undefined) {
      issues.push(
        rowIssue(
          1,
          'map-column-twice',
          `Columns "${header[prev]}" and "${header[i]}" are mapped to the same field.`,
          header[i],
        ),
      );
    }
    seen.set(id, i);
  });
  return issues;
}

export function defaultMapping(header: readonly string[], timeZone: string): ColumnMapping {
  return { columns: guessRoles(header), timeZone, dateOrder: 'dmy' };
}

export const QUANTITY_CHOICES = QUANTITIES;
