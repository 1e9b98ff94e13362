/**
 * Checks documents before they are written, so a bad import or a bug never stores something the
 * app cannot show later (a NaN value, a reading without a site, a time that is not ISO UTC).
 */

import { TufaError } from '../chem/errors';
import { storeError } from './errors';
import { type ReadingDoc, SITE_KINDS, type SiteDoc, type TufaDoc } from './schema';

const ISO_UTC = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d{1,3})?)?Z$/;

function bad(doc: { id?: unknown }, what: string, field: string): never {
  throw storeError('store-invalid-doc', `Document ${String(doc.id ?? '(no id)')}: ${what}.`, field);
}

const zones = new Map<string, boolean>();
/**
 * An IANA time zone name (or UTC offset) this device's Intl knows; checked once per name. A reading
 * with any other zone could not be shown in its local time or exported (issue 15 §4).
 */
export function isTimeZone(s: unknown): boolean {
  if (typeof s !== 'string' || s === '' || s.length > 64) return false;
  let ok = zones.get(s);
  if (ok === undefined) {
    try {
      new Intl.DateTimeFormat('en-US', { timeZone: s });
      ok = true;
    } catch {
      ok = false;
    }
    zones.set(s, ok);
  }
  return ok;
}

export function isIsoUtc(s: unknown): s is string {
  return typeof s === 'string' && ISO_UTC.test(s) && !Number.isNaN(Date.parse(s));
}

function checkBase(doc: TufaDoc): void {
  if (typeof doc.id !== 'string' || doc.id.length === 0) bad(doc, 'missing id', 'id');
  if (!isIsoUtc(doc.updatedAt)) bad(doc, 'updatedAt must be an ISO 8601 UTC time', 'updatedAt');
  if (typeof doc.deleted !== 'boolean') bad(doc, 'deleted must be true or false', 'deleted');
  if (doc.rev !== undefined && typeof doc.rev !== 'string') bad(doc, 'rev must be a string', 'rev');
}

export function validateSite(doc: SiteDoc): void {
  checkBase(doc);
  if (typeof doc.name !== 'string' || doc.name.trim() === '') bad(doc, 'a site needs a name', 'name');
  if (!SITE_KINDS.includes(doc.kind)) bad(doc, `kind must be one of ${SITE_KINDS.join(', ')}`, 'kind');
  if (typeof doc.defaults !== 'object' || doc.defaults === null)
    bad(doc, 'defaults must be an object', 'defaults');
  if (doc.location) {
    if (typeof doc.location !== 'object') bad(doc, 'location must be an object', 'location');
    const { latitude, longitude } = doc.location;
    if (!Number.isFinite(latitude) || latitude < -90 || latitude > 90)
      bad(doc, 'latitude out of range', 'location');
    if (!Number.isFinite(longitude) || longitude < -180 || longitude > 180)
      bad(doc, 'longitude out of range', 'location');
  }
}

/**
 * `storedZone`: the zone the reading already has in the store. An edit that keeps it is allowed
 * even if this device does not know it, so such a reading can still be corrected or deleted.
 */
export function validateReading(doc: ReadingDoc, storedZone?: string): void {
  checkBase(doc);
  if (typeof doc.siteId !== 'string' || doc.siteId === '') bad(doc, 'a reading needs a site', 'siteId');
  if (!isIsoUtc(doc.takenAt)) bad(doc, 'takenAt must be an ISO 8601 UTC time', 'takenAt');
  if (typeof doc.timeZone !== 'string' || doc.timeZone === '') bad(doc, 'timeZone missing', 'timeZone');
  if (doc.timeZone !== storedZone && !isTimeZone(doc.timeZone))
    bad(
      doc,
      `timeZone "${doc.timeZone.slice(0, 40)}" is not a time zone name such as Europe/Berlin`,
      'timeZone',
    );
  if (!Array.isArray(doc.values)) bad(doc, 'values must be a list', 'values');
  for (const v of doc.values) {
    if (typeof v !== 'object' || v === null) bad(doc, 'each value must be an object', 'values');
    if (typeof v.quantity !== 'string' || typeof v.unit !== 'string')
      bad(doc, 'each value needs quantity and unit', 'values');
    if (typeof v.value !== 'number' || !Number.isFinite(v.value))
      bad(doc, `value of ${v.quantity} is not a finite number`, v.quantity);
  }
  if (doc.titration !== undefined && doc.titration !== null) {
    const t = doc.titration as unknown;
    if (typeof t !== 'object' || !Array.isArray((t as { points?: unknown }).points))
      bad(doc, 'titration must hold a list of points', 'titration');
    for (const p of doc.titration.points) {
      if (typeof p !== 'object' || p === null) bad(doc, 'titration point is not an object', 'titration');
      if (!Number.isFinite(p.volumeMl) || !Number.isFinite(p.ph))
        bad(doc, 'titration point is not a number', 'titration');
    }
  }
}

export function validateDoc(doc: TufaDoc): void {
  if (doc === null || typeof doc !== 'object') throw new TufaError('store-invalid-doc', 'Not a document.');
  if (doc.type === 'site') validateSite(doc);
  else if (doc.type === 'reading') validateReading(doc);
  else bad(doc, "type must be 'site' or 'reading'", 'type');
}
