/**
 * Partial sync: a device that keeps only some sites pulls every site doc (small: so it can offer
 * the others to choose from), the readings of its sites, and deletions made through the CouchDB
 * API (those leave a stub without `siteId`; a stub of a doc the device never had is dropped by
 * `fromCouch`). It pushes only its own outbox, as every device does.
 */

export function pullSelector(siteIds: readonly string[]): Record<string, unknown> {
  return {
    $or: [{ type: 'site' }, { type: 'reading', siteId: { $in: [...siteIds] } }, { _deleted: true }],
  };
}
