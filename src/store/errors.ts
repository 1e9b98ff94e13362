/**
 * Errors of the on-device store, as `{ code, message }` values the UI can show. The browser reports
 * IndexedDB failures as DOMExceptions with names; this turns the ones a user can act on into
 * stable codes with plain-language messages.
 */

import { type Issue, TufaError } from '../chem/errors';

export const STORE_ERROR_CODES = [
  'store-quota-exceeded',
  'store-upgrade-blocked',
  'store-version-newer',
  'store-unavailable',
  'store-not-found',
  'store-invalid-doc',
  'store-invalid-setting',
  'store-write-failed',
] as const;
export type StoreErrorCode = (typeof STORE_ERROR_CODES)[number];

export function storeError(code: StoreErrorCode, message: string, field?: string): TufaError {
  return new TufaError(code, message, field);
}

const MESSAGES: Record<string, [StoreErrorCode, string]> = {
  QuotaExceededError: [
    'store-quota-exceeded',
    'The device has no room left for Tufa’s data. Nothing was saved by this action; your earlier ' +
      'readings are safe. Free some space or sync/export and try again.',
  ],
  VersionError: [
    'store-version-newer',
    'This page is older than the data on this device (another tab runs a newer Tufa). Reload the page.',
  ],
  InvalidStateError: [
    'store-unavailable',
    'The on-device database is closed or unavailable (private browsing, or another tab is upgrading it). Reload the page.',
  ],
  UnknownError: [
    'store-unavailable',
    'The browser could not open its on-device database. Reload the page; if it persists, restart the browser.',
  ],
};

function nameOf(e: unknown): string {
  return typeof e === 'object' && e !== null && 'name' in e ? String((e as { name: unknown }).name) : '';
}

/**
 * The DOMException name that says what went wrong. A quota failure often reaches the caller as the
 * transaction's `AbortError` (idb rejects `tx.done` with it) while the cause sits in
 * `transaction.error` or `cause`; look there before calling it a plain write failure.
 */
function causeName(e: unknown): string {
  const name = nameOf(e);
  if (name !== 'AbortError' && name !== 'Error') return name;
  const o = e as { target?: { transaction?: { error?: unknown }; error?: unknown }; cause?: unknown };
  for (const inner of [o?.cause, o?.target?.transaction?.error, o?.target?.error]) {
    const n = nameOf(inner);
    if (n && n !== 'AbortError' && MESSAGES[n]) return n;
  }
  return name;
}

/** True for a QuotaExceededError, also when it arrives wrapped in a transaction's AbortError. */
export function isQuotaError(e: unknown): boolean {
  return (
    causeName(e) === 'QuotaExceededError' || (e instanceof TufaError && e.code === 'store-quota-exceeded')
  );
}

/** Any failure of a store call as an Issue; TufaErrors keep their code. */
export function storeIssue(e: unknown): Issue {
  if (e instanceof TufaError) return e.toIssue();
  const known = MESSAGES[causeName(e)];
  if (known) return { code: known[0], message: known[1] };
  const text = e instanceof Error ? e.message : String(e);
  return { code: 'store-write-failed', message: `The on-device database refused the change: ${text}` };
}

/** Rethrows anything as a TufaError with a store code, so callers only ever see `{code, message}`. */
export function asStoreError(e: unknown): TufaError {
  if (e instanceof TufaError) return e;
  const issue = storeIssue(e);
  return new TufaError(issue.code, issue.message);
}

export const UPGRADE_BLOCKED: Issue = {
  code: 'store-upgrade-blocked',
  message:
    'Tufa needs to update its on-device database, but another tab or window with Tufa is still open. ' +
    'Close the other Tufa tabs; this page continues by itself once they are closed.',
};
