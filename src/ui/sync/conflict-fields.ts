/** Which fields of the versions of a doc in conflict differ, and how each reads to a person. */

import { quantityById, unitOf } from '../../quantities';
import type { MeasuredValue, TufaDoc } from '../../store/schema';
import { formatNumber } from '../numbers';

const HIDDEN = new Set(['id', 'rev', 'type', 'updatedAt']);

const LABELS: Record<string, string> = {
  name: 'Name',
  kind: 'Kind',
  notes: 'Notes',
  takenAt: 'Sampled at (UTC)',
  timeZone: 'Time zone',
  values: 'Measured values',
  defaults: 'Site defaults',
  location: 'Location',
  titration: 'Titration',
  siteId: 'Site',
  deleted: 'Deleted',
  plan: 'Plan',
};

/** A record as a person names it: the site's name, or the reading's local time and zone. */
export function docTitle(d: TufaDoc, locale?: string): string {
  if (d.type === 'site') return `Site “${d.name}”`;
  const local = new Date(d.takenAt).toLocaleString(locale, {
    dateStyle: 'medium',
    timeStyle: 'short',
    timeZone: d.timeZone,
  });
  return `Reading of ${local} (${d.timeZone})`;
}

export function fieldLabel(key: string): string {
  return LABELS[key] ?? key;
}

export function showValue(key: string, v: unknown, locale?: string): string {
  if (v === undefined || v === '') return '(none)';
  if (key === 'deleted') return v ? 'yes (deleted)' : 'no';
  if (key === 'values' && Array.isArray(v))
    return (v as MeasuredValue[]).map((m) => showMeasured(m, locale)).join('; ');
  return typeof v === 'object' ? JSON.stringify(v) : String(v);
}

/** Every digit stored, in the user's decimal style: two versions may differ in the last one. */
function showMeasured(m: MeasuredValue, locale?: string): string {
  const q = quantityById(m.quantity);
  const unit = unitOf(m.quantity, m.unit);
  const x = formatNumber(m.value, locale, { digits: 15 });
  if (!q || !unit) return `${m.quantity} ${x} ${m.unit}`;
  if (q.id === 'ph') return m.unit === 'ph' ? `pH ${x}` : `pH ${x} (${m.unit} scale)`;
  return `${q.label} ${x} ${unit.label}`;
}

/** Keys whose values are not the same in every version, in a stable order. */
export function differingFields(versions: readonly TufaDoc[]): string[] {
  const keys = new Set<string>();
  for (const d of versions) for (const k of Object.keys(d)) if (!HIDDEN.has(k)) keys.add(k);
  const rec = (d: TufaDoc) => d as unknown as Record<string, unknown>;
  return [...keys]
    .filter((k) => new Set(versions.map((d) => JSON.stringify(rec(d)[k] ?? null))).size > 1)
    .sort((a, b) => (LABELS[a] ? 0 : 1) - (LABELS[b] ? 0 : 1) || a.localeCompare(b));
}

/** A merged doc: each differing field taken from the version the user picked (index into versions). */
export function mergeVersions(versions: readonly TufaDoc[], picks: Record<string, number>): TufaDoc {
  const base = { ...(versions[0] as unknown as Record<string, unknown>) };
  for (const [k, i] of Object.entries(picks)) {
    const from = versions[i] as unknown as Record<string, unknown> | undefined;
    if (!from) continue;
    if (from[k] === undefined) delete base[k];
    else base[k] = from[k];
  }
  return base as unknown as TufaDoc;
}
