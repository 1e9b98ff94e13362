/**
 * Deterministic ids for imported documents, so importing the same file twice creates nothing new.
 * The id is a UUID (RFC 9562 version 8, "custom") whose 122 free bits are the first bits of the
 * SHA-256 of a canonical text of what makes the document itself: for a reading the site id, the
 * UTC instant and the measured values after unit conversion (sorted by key, shortest number form);
 * for a site created by import, its normalized name. The same row written with a decimal comma or
 * in another unit gives the same id; a row with one value changed gives a new one.
 */

import { sha256 } from './sha256';

const HEX = Array.from({ length: 256 }, (_, i) => i.toString(16).padStart(2, '0'));

export function uuidFromDigest(digest: Uint8Array): string {
  const b = digest.slice(0, 16);
  b[6] = (b[6]! & 0x0f) | 0x80; // version 8
  b[8] = (b[8]! & 0x3f) | 0x80; // RFC 9562 variant
  let hex = '';
  for (const x of b) hex += HEX[x];
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20)}`;
}

export function contentId(canonical: string): string {
  return uuidFromDigest(sha256(canonical));
}

export function readingCanonical(siteId: string, takenAt: string, values: Record<string, number>): string {
  const keys = Object.keys(values).sort();
  return ['tufa-reading', siteId, takenAt, ...keys.map((k) => `${k}=${String(values[k])}`)].join('\u001f');
}

export function siteCanonical(name: string): string {
  return `tufa-site\u001f${normalizeName(name)}`;
}

export function normalizeName(name: string): string {
  return name.normalize('NFC').trim().replace(/\s+/g, ' ').toLowerCase();
}
