/**
 * What to do with each document of a pulled page, decided without touching the store or the
 * network (so every rule here is tested directly):
 *
 * - not a usable site or reading (fails the store's validation, or fields of the wrong kind):
 *   set aside with the reason, never stored, never stops the rest of the page;
 * - would change the type of a doc this device holds (site ↔ reading): refused, set aside;
 * - our own write coming back (same revision): nothing;
 * - the doc has a local change not yet on the server (queued or in an open conflict): the same
 *   content confirms the push, other content is an edit conflict;
 * - the doc was never confirmed by the server here (no revision), or the remote version is not
 *   newer than the local one: a rewrite that did not build on this device's copy (every Tufa
 *   edit moves `updatedAt` past the version it edits), so it is a conflict, never a silent
 *   overwrite;
 * - otherwise: applied.
 */

import type { TufaDoc } from '../io/docs';
import { validateDoc } from '../store/validate';
import type { CouchDoc } from './couch-client';
import { fromCouch, sameContent } from './doc-codec';
import { asJsonText, type SetAsideDoc } from './quarantine';

export interface PullPlan {
  apply: TufaDoc[];
  /** Local `updatedAt` each applied doc was decided on (undefined: no local doc). */
  seen: Map<string, string | undefined>;
  confirmed: { docId: string; rev: string; updatedAt: string }[];
  edits: { mine: TufaDoc; theirs: TufaDoc }[];
  /** Docs the server holds with `_conflicts`. */
  serverBranches: CouchDoc[];
  setAside: SetAsideDoc[];
}

const isObj = (x: unknown): x is Record<string, unknown> =>
  typeof x === 'object' && x !== null && !Array.isArray(x);

/** Field checks beyond the store's (which trusts our own code to pass the right kinds). */
function wrongField(d: Record<string, unknown>): string | undefined {
  if (d.notes !== undefined && typeof d.notes !== 'string') return 'notes must be text';
  if (d.type === 'site' && d.location !== undefined && d.location !== null && !isObj(d.location))
    return 'location must be an object';
  if (d.type === 'reading') {
    if (!Array.isArray(d.values) || !d.values.every(isObj)) return 'values must be a list of measured values';
    if (d.titration !== undefined && d.titration !== null) {
      if (!isObj(d.titration) || !Array.isArray(d.titration.points) || !d.titration.points.every(isObj))
        return 'titration must hold a list of points';
    }
  }
  return undefined;
}

/** Why a pulled doc cannot be stored, in words, or undefined when it can. */
export function whyUnusable(doc: TufaDoc): string | undefined {
  const d = doc as unknown as Record<string, unknown>;
  if (d.type !== 'site' && d.type !== 'reading') return "its type is neither 'site' nor 'reading'";
  const wrong = wrongField(d);
  if (wrong) return wrong;
  try {
    validateDoc(doc);
    return undefined;
  } catch (e) {
    const m = e instanceof Error ? e.message : '';
    const what = m.replace(/^Document .*?: /, '').replace(/\.$/, '');
    return what && e instanceof Error && e.name !== 'TypeError'
      ? what
      : 'its fields cannot be read as a site or reading';
  }
}

export function planPulled(
  remote: readonly CouchDoc[],
  local: ReadonlyMap<string, TufaDoc>,
  pending: (docId: string) => boolean,
  now: Date,
): PullPlan {
  const plan: PullPlan = {
    apply: [],
    seen: new Map(),
    confirmed: [],
    edits: [],
    serverBranches: [],
    setAside: [],
  };
  const at = now.toISOString();
  const aside = (rd: CouchDoc, code: SetAsideDoc['code'], reason: string) =>
    plan.setAside.push({ docId: rd._id, rev: rd._rev, code, reason, json: asJsonText(rd), at });
  for (const rd of remote) {
    if (rd._id.startsWith('_')) continue; // design and other system docs
    if (!rd._rev) {
      aside(rd, 'sync-doc-invalid', 'it has no revision');
      continue;
    }
    const mine = local.get(rd._id);
    const theirs = fromCouch(rd, mine, now);
    if (!theirs) continue; // a deletion of a doc this device never had
    const why = whyUnusable(theirs);
    if (why) {
      aside(rd, 'sync-doc-invalid', why);
      continue;
    }
    if (mine && mine.type !== theirs.type) {
      aside(rd, 'sync-type-change', `it would turn the ${mine.type} with this id into a ${theirs.type}`);
      continue;
    }
    if (rd._conflicts?.length) plan.serverBranches.push(rd);
    if (mine?.rev === rd._rev) continue; // our own write coming back
    if (mine && pending(rd._id)) {
      if (sameContent(mine, theirs))
        plan.confirmed.push({ docId: rd._id, rev: rd._rev, updatedAt: mine.updatedAt });
      else plan.edits.push({ mine, theirs });
      continue;
    }
    if (
      mine &&
      !sameContent(mine, theirs) &&
      (mine.rev === undefined || Date.parse(theirs.updatedAt) <= Date.parse(mine.updatedAt))
    ) {
      plan.edits.push({ mine, theirs });
      continue;
    }
    plan.apply.push(theirs);
    plan.seen.set(rd._id, mine?.updatedAt);
  }
  return plan;
}
