/**
 * Checks a server address before any credentials are sent to it. Plain http is refused silently
 * by nobody, so we warn: a password sent over http can be read by anyone on the network. Loopback
 * addresses are exempt because the traffic never leaves the device.
 */

import type { Issue } from '../chem/errors';
import { syncIssue } from './sync-issues';

const LOOPBACK = /^(localhost|127(?:\.\d{1,3}){3}|\[::1\])$/i;

export function checkServerUrl(text: string): { url: URL; warnings: Issue[] } | { error: Issue } {
  let url: URL;
  try {
    url = new URL(text.trim());
  } catch {
    return {
      error: syncIssue(
        'sync-bad-url',
        `"${text}" is not a web address (it should start with https://).`,
        'url',
      ),
    };
  }
  if (url.protocol !== 'https:' && url.protocol !== 'http:') {
    return {
      error: syncIssue('sync-bad-url', 'The server address must start with https:// or http://.', 'url'),
    };
  }
  if (url.username || url.password) {
    return {
      error: syncIssue(
        'sync-bad-url',
        'Put the user name and password in their own fields, not in the address.',
        'url',
      ),
    };
  }
  const warnings: Issue[] = [];
  if (url.protocol === 'http:' && !LOOPBACK.test(url.hostname)) {
    warnings.push(
      syncIssue(
        'sync-insecure-http',
        'This address uses plain http: your password and readings travel unencrypted. Use https unless the server is on this device.',
        'url',
      ),
    );
  }
  if (!url.pathname.endsWith('/')) url.pathname += '/';
  return { url, warnings };
}

/** CouchDB database names: lower case letter first, then a–z, 0–9 and _$()+-/ (CouchDB API rule). */
export function checkDbName(name: string): Issue | undefined {
  return /^[a-z][a-z0-9_$()+/-]*$/.test(name)
    ? undefined
    : syncIssue(
        'sync-bad-url',
        'The database name must start with a lower-case letter and use only a–z, 0–9 and _$()+-/.',
        'db',
      );
}
