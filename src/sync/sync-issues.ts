/**
 * Sync errors and warnings in words, with stable codes. `retryable` says whether waiting and
 * trying again can help (network down, server busy) or the user must act (wrong password).
 */

import type { Issue } from '../chem/errors';

export type SyncCode =
  | 'sync-bad-url'
  | 'sync-insecure-http'
  | 'sync-not-configured'
  | 'sync-offline'
  | 'sync-timeout'
  | 'sync-auth-failed'
  | 'sync-password-needed'
  | 'sync-forbidden'
  | 'sync-db-missing'
  | 'sync-server-error'
  | 'sync-bad-response'
  | 'sync-doc-rejected'
  /** A pulled doc that fails validation: set aside, the rest of the page applied. */
  | 'sync-doc-invalid'
  /** A pulled doc that would turn a site into a reading or back: refused, set aside. */
  | 'sync-type-change'
  /** The server keeps answering without moving on (same or earlier `last_seq` on full pages). */
  | 'sync-no-progress'
  /** Something failed inside Tufa itself during sync; the data on this device is untouched. */
  | 'sync-internal'
  /** The server refused a change for this user's role (HTTP 403); it stays on the device as a conflict. */
  | 'sync-doc-forbidden';

export class SyncError extends Error {
  readonly code: SyncCode;
  readonly retryable: boolean;
  readonly status: number | undefined;
  constructor(code: SyncCode, message: string, retryable: boolean, status?: number) {
    super(message);
    this.name = 'SyncError';
    this.code = code;
    this.retryable = retryable;
    this.status = status;
  }
  toIssue(): Issue {
    return { code: this.code, message: this.message };
  }
}

export function syncIssue(code: SyncCode, message: string, field?: string): Issue {
  return field === undefined ? { code, message } : { code, message, field };
}

/**
 * A document the server refused in a `_bulk_docs` row. `forbidden` is a team server's rule (role,
 * authorship or document shape: `src/team/validate-source.ts`), said plainly with the server's
 * reason; the change stays on this device as a `refused` conflict (`refused.ts`), out of the
 * outbox until the user decides, so nothing typed is lost.
 */
export function rejectedDocIssue(
  type: string,
  id: string,
  error: string | undefined,
  reason?: string,
): Issue {
  if (error === 'forbidden' || error === 'unauthorized')
    return syncIssue(
      'sync-doc-forbidden',
      `The server did not accept your change to this ${type}: ${(reason ?? 'your role does not allow it').replace(/\.$/, '')}. Your change is kept on this device and not sent again until you choose, under Conflicts to decide.`,
    );
  return syncIssue(
    'sync-doc-rejected',
    `The server refused ${type} ${id}: ${error ?? 'no revision in the answer'}${reason ? ` (${reason})` : ''}.`,
  );
}
