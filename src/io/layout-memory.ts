/**
 * Remembered column mappings, stored with the repository's `putLayout` and found again by the
 * header's `layoutKey`. `columns` maps each header name to a role string (`site`, `timestamp`,
 * `value:alkalinity:meq_l`, ...); the mapping's other choices ride along under keys that start
 * with `@` (`@timeZone`, `@dateOrder`, `@siteId`, `@phScale`), which no header of ours uses.
 */

import type { PhScaleName } from '../chem/api';
import { quantityById } from '../quantities';
import type { ColumnMapping, ColumnRole } from './column-mapping';
import type { DateOrder } from './timestamps';

export function roleToString(r: ColumnRole): string {
  return r.role === 'value' || r.role === 'titration-value' ? `${r.role}:${r.quantity}:${r.unit}` : r.role;
}

export function roleFromString(s: string | undefined): ColumnRole {
  if (!s) return { role: 'ignore' };
  if (s.startsWith('value:') || s.startsWith('titration-value:')) {
    const [role, quantity = '', unit = ''] = s.split(':');
    const q = quantityById(quantity);
    if (!q?.units.some((u) => u.id === unit)) return { role: 'ignore' };
    return role === 'value' ? { role: 'value', quantity, unit } : { role: 'titration-value', quantity, unit };
  }
  const simple = [
    'ignore',
    'timestamp',
    'date',
    'time',
    'time-zone',
    'site',
    'notes',
    'ph-scale',
    'reading-id',
    'site-id',
    'updated-at',
    'site-kind',
    'site-defaults',
  ] as const;
  const hit = simple.find((x) => x === s);
  return hit ? ({ role: hit } as ColumnRole) : { role: 'ignore' };
}

export function mappingToRecord(header: readonly string[], m: ColumnMapping): Record<string, string> {
  const rec: Record<string, string> = {};
  header.forEach((h, i) => {
    rec[h] = roleToString(m.columns[i] ?? { role: 'ignore' });
  });
  rec['@timeZone'] = m.timeZone;
  rec['@dateOrder'] = m.dateOrder;
  if (m.siteId) rec['@siteId'] = m.siteId;
  if (m.phScale) rec['@phScale'] = m.phScale;
  return rec;
}

export function mappingFromRecord(
  header: readonly string[],
  rec: Record<string, string>,
  fallbackZone: string,
): ColumnMapping {
  const order = rec['@dateOrder'];
  const m: ColumnMapping = {
    columns: header.map((h) => roleFromString(rec[h])),
    timeZone: rec['@timeZone'] ?? fallbackZone,
    dateOrder: order === 'mdy' || order === 'ymd' ? (order as DateOrder) : 'dmy',
  };
  if (rec['@siteId']) m.siteId = rec['@siteId'];
  const scale = rec['@phScale'];
  if (scale === 'total' || scale === 'free' || scale === 'seawater' || scale === 'nbs')
    m.phScale = scale as PhScaleName;
  return m;
}
