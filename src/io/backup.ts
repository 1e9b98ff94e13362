/**
 * JSON backup of the whole local database and its restore.
 *
 * Format (our own, `format: "tufa-backup"`, `version: 1`): one JSON object with `created_at`
 * (ISO 8601), `counts`, and the arrays `sites`, `readings` (titrations travel inside their
 * readings), `settings` (`{key, value}`), `layouts` (remembered CSV mappings). Credentials are
 * never written: any settings entry or field whose name says password, secret, token, cookie or
 * credential is dropped, and so is the whole sync connection's auth block.
 *
 * Restore merges by id: a doc not present is added; a present one is replaced only when the
 * backup's copy is newer (`updatedAt`), so restoring twice, or an old backup over newer work,
 * changes nothing and creates no duplicates.
 */

import type { Issue } from '../chem/errors';
import { checkSetting, isSettingKey, type RejectedSetting } from '../store/settings';
import { isTimeZone } from '../store/validate';
import type { ReadingDoc, SiteDoc, TufaDoc } from './docs';
import { type IoCode, ioIssue } from './io-issues';

export const BACKUP_FORMAT = 'tufa-backup';
export const BACKUP_VERSION = 1;

export interface KeyValue {
  key: string;
  value: unknown;
}

export interface Backup {
  format: typeof BACKUP_FORMAT;
  version: number;
  created_at: string;
  counts: { sites: number; readings: number; settings: number; layouts: number };
  sites: SiteDoc[];
  readings: ReadingDoc[];
  settings: KeyValue[];
  layouts: KeyValue[];
}

export interface BackupStore {
  allDocs(): Promise<TufaDoc[]>;
  allSettings(): Promise<KeyValue[]>;
  allLayouts(): Promise<KeyValue[]>;
  getDocs(ids: readonly string[]): Promise<Map<string, TufaDoc>>;
  /** One transaction, queued for sync; all or nothing. */
  bulkPut(docs: TufaDoc[]): Promise<void>;
  putSettings(entries: KeyValue[]): Promise<void>;
  putLayouts(entries: KeyValue[]): Promise<void>;
}

const SECRET = /pass(word)?|secret|token|cookie|credential|auth/i;

/** Deep copy without any field whose name marks a secret. */
export function withoutSecrets(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(withoutSecrets);
  if (value && typeof value === 'object') {
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(value)) if (!SECRET.test(k)) out[k] = withoutSecrets(v);
    return out;
  }
  return value;
}

function stripRev<T extends TufaDoc>(d: T): T {
  // The server revision belongs to this device's sync state, not to the data.
  const { rev: _rev, ...rest } = d;
  return rest as T;
}

export async function createBackup(store: BackupStore, now: Date = new Date()): Promise<Backup> {
  const docs = await store.allDocs();
  const sites = docs.filter((d): d is SiteDoc => d.type === 'site').map((d) => stripRev(d) as SiteDoc);
  const readings = docs
    .filter((d): d is ReadingDoc => d.type === 'reading')
    .map((d) => stripRev(d) as ReadingDoc);
  const settings = (await store.allSettings())
    .filter((s) => !SECRET.test(s.key))
    .map((s) => ({ key: s.key, value: withoutSecrets(s.value) }));
  const layouts = await store.allLayouts();
  return {
    format: BACKUP_FORMAT,
    version: BACKUP_VERSION,
    created_at: now.toISOString(),
    counts: {
      sites: sites.length,
      readings: readings.length,
      settings: settings.length,
      layouts: layouts.length,
    },
    sites,
    readings,
    settings,
    layouts,
  };
}

export function backupToJson(b: Backup): string {
  return `${JSON.stringify(b, null, 1)}\n`;
}

function bad(code: IoCode, message: string): { error: Issue } {
  return { error: ioIssue(code, message) };
}

const isObj = (x: unknown): x is Record<string, unknown> =>
  typeof x === 'object' && x !== null && !Array.isArray(x);

function checkDoc(d: unknown, type: 'site' | 'reading', i: number): string | undefined {
  if (!isObj(d)) return `${type} #${i + 1} is not an object`;
  if (typeof d.id !== 'string' || d.id === '') return `${type} #${i + 1} has no id`;
  if (d.type !== type) return `${type} ${d.id} has type ${String(d.type)}`;
  if (typeof d.updatedAt !== 'string' || Number.isNaN(Date.parse(d.updatedAt)))
    return `${type} ${d.id} has no valid updatedAt`;
  if (typeof d.deleted !== 'boolean') return `${type} ${d.id} has no deleted flag`;
  if (type === 'reading') {
    if (typeof d.siteId !== 'string') return `reading ${d.id} has no siteId`;
    if (typeof d.takenAt !== 'string' || Number.isNaN(Date.parse(d.takenAt)))
      return `reading ${d.id} has no valid takenAt`;
    if (!isTimeZone(d.timeZone))
      return `reading ${d.id} has an unknown time zone (${String(d.timeZone).slice(0, 40)})`;
    if (
      !Array.isArray(d.values) ||
      d.values.some(
        (v) =>
          !isObj(v) ||
          typeof v.quantity !== 'string' ||
          typeof v.value !== 'number' ||
          !Number.isFinite(v.value),
      )
    )
      return `reading ${d.id} has values that are not finite numbers`;
  } else if (typeof d.name !== 'string') return `site ${d.id} has no name`;
  return undefined;
}

/** Reads and checks a backup file completely before anything is written. */
export function parseBackup(text: string): Backup | { error: Issue } {
  let raw: unknown;
  try {
    raw = JSON.parse(text.replace(/^\uFEFF/, ''));
  } catch (e) {
    return bad(
      'backup-not-json',
      `The file is not valid JSON (${e instanceof Error ? e.message : String(e)}).`,
    );
  }
  if (!isObj(raw) || raw.format !== BACKUP_FORMAT)
    return bad('backup-wrong-format', 'This file is not a Tufa backup.');
  if (typeof raw.version !== 'number' || raw.version > BACKUP_VERSION) {
    return bad(
      'backup-newer-version',
      `This backup has format version ${String(raw.version)}; update Tufa to read it.`,
    );
  }
  for (const k of ['sites', 'readings', 'settings', 'layouts']) {
    if (!Array.isArray(raw[k])) return bad('backup-wrong-format', `The backup has no "${k}" list.`);
  }
  const problems: string[] = [];
  (raw.sites as unknown[]).forEach((d, i) => {
    const p = checkDoc(d, 'site', i);
    if (p) problems.push(p);
  });
  (raw.readings as unknown[]).forEach((d, i) => {
    const p = checkDoc(d, 'reading', i);
    if (p) problems.push(p);
  });
  for (const k of ['settings', 'layouts']) {
    (raw[k] as unknown[]).forEach((e, i) => {
      if (!isObj(e) || typeof e.key !== 'string') problems.push(`${k} entry #${i + 1} has no key`);
    });
  }
  if (problems.length > 0) {
    const more = problems.length > 5 ? ` and ${problems.length - 5} more` : '';
    return bad('backup-bad-doc', `Nothing was restored: ${problems.slice(0, 5).join('; ')}${more}.`);
  }
  return raw as unknown as Backup;
}

export interface RestoreReport {
  added: number;
  replaced: number;
  unchanged: number;
  settings: number;
  /** Settings in the backup that failed their check (the current value or default is kept). */
  settingsRejected: RejectedSetting[];
  layouts: number;
}

export async function restoreBackup(store: BackupStore, backup: Backup): Promise<RestoreReport> {
  const incoming: TufaDoc[] = [...backup.sites, ...backup.readings].map((d) => stripRev<TufaDoc>(d));
  const existing = await store.getDocs(incoming.map((d) => d.id));
  const toWrite: TufaDoc[] = [];
  let added = 0;
  let replaced = 0;
  for (const d of incoming) {
    const cur = existing.get(d.id);
    if (!cur) {
      added++;
      toWrite.push(d);
    } else if (Date.parse(d.updatedAt) > Date.parse(cur.updatedAt)) {
      replaced++;
      // Keep this device's server revision so the next push updates instead of conflicting.
      toWrite.push(cur.rev === undefined ? d : { ...d, rev: cur.rev });
    }
  }
  if (toWrite.length > 0) await store.bulkPut(toWrite);
  // Every setting is checked before it is stored: an unusable value (a locale of "en_US", say)
  // would otherwise reach Intl on every screen after the next start.
  const settingsRejected: RejectedSetting[] = [];
  const settings = backup.settings.filter((s) => {
    if (SECRET.test(s.key) || !isSettingKey(s.key)) return false;
    const why = checkSetting(s.key, s.value);
    if (why) settingsRejected.push({ key: s.key, reason: why });
    return !why;
  });
  await store.putSettings(settings);
  await store.putLayouts(backup.layouts);
  return {
    added,
    replaced,
    unchanged: incoming.length - added - replaced,
    settings: settings.length,
    settingsRejected,
    layouts: backup.layouts.length,
  };
}
