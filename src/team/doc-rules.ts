/**
 * What the team server accepts, generated from the app's own tables so the server and the app
 * cannot drift: quantities, units and physical limits from `src/quantities` (the limits a
 * CSV import already refuses), site kinds from the store schema, option names from the engine's
 * types. `designDoc()` turns them into the `_design/tufa-team` document `tufa team setup` writes.
 */

import { BORON_TOTAL_CHOICES, CARBONIC_CONSTANT_CHOICES, MODEL_CHOICES, PH_SCALE_CHOICES } from '../chem/api';
import { QUANTITIES } from '../quantities';
import { SITE_KINDS } from '../store/schema';
import { ROLES } from './roles';
import { validateSource } from './validate-source';

export const DESIGN_ID = '_design/tufa-team';

export { ROLE_NAMES, ROLES, type Role } from './roles';

/** ISO 8601 instant with a zone (`Z` or an offset), as `Date.prototype.toISOString` writes it. */
export const ISO_INSTANT = /^\d{4}-\d\d-\d\dT\d\d:\d\d(:\d\d(\.\d{1,9})?)?(Z|[+-]\d\d:\d\d)$/;

// The engine's own lists of choices (src/chem/api.ts): one home, so the server accepts what it does.
const MODELS = MODEL_CHOICES;
const CARBONIC = CARBONIC_CONSTANT_CHOICES;
const BORON = BORON_TOTAL_CHOICES;
const SCALES = PH_SCALE_CHOICES;

/**
 * Limits of each quantity in each of its units. The table gives them in the engine key's unit;
 * every unit conversion there is linear (°F, K, mmol/kg, mS/cm, bar), so the bounds map back
 * through two points of the conversion. Rounded to 12 digits; the check allows a relative 1e-9,
 * so a value at a limit written in another unit is not refused by a rounding error.
 */
export function quantityLimits(): Record<string, Record<string, [number, number]>> {
  const out: Record<string, Record<string, [number, number]>> = {};
  for (const q of QUANTITIES) {
    const units: Record<string, [number, number]> = {};
    for (const u of q.units) {
      const b = u.toKey(0);
      const a = u.toKey(1) - b;
      const x1 = (q.limits[0] - b) / a;
      const x2 = (q.limits[1] - b) / a;
      const r = (x: number) => Number(x.toPrecision(12));
      units[u.id] = [r(Math.min(x1, x2)), r(Math.max(x1, x2))];
    }
    out[q.id] = units;
  }
  return out;
}

function range(id: string, key: string): { range: [number, number] } {
  const q = QUANTITIES.find((x) => x.id === id);
  const u = q?.units.find((x) => x.key === key);
  if (!q || !u) throw new Error(`doc-rules: no quantity ${id} with key ${key}`);
  return { range: q.limits };
}

export function docRules(): Record<string, unknown> {
  return {
    roles: ROLES,
    isoInstant: '__ISO__',
    siteKinds: [...SITE_KINDS],
    quantities: quantityLimits(),
    defaults: {
      model: { oneOf: MODELS },
      salinity: range('salinity', 'salinity'),
      specific_conductance_us_cm: range('conductance', 'specific_conductance_us_cm'),
      carbonic_constants: { oneOf: CARBONIC },
      boron_total: { oneOf: BORON },
      ph_scale: { oneOf: SCALES },
    },
    // Common practice, not physics: generous caps so one document cannot fill the server.
    limits: { nameLength: 200, notesLength: 20000, values: 100, titrationPoints: 2000 },
  };
}

export interface DesignDoc {
  _id: string;
  _rev?: string;
  language: 'javascript';
  validate_doc_update: string;
  /** Which Tufa rules these are, so `team setup` knows when to rewrite them. */
  tufa_rules: string;
}

export function designDoc(): DesignDoc {
  const source = validateSource(docRules(), ISO_INSTANT);
  return {
    _id: DESIGN_ID,
    language: 'javascript',
    validate_doc_update: source,
    tufa_rules: hash(source),
  };
}

/** A short FNV-1a fingerprint of the rules (not for security: only "are these the same rules"). */
function hash(s: string): string {
  let h = 0x811c9dc5;
  for (let i = 0; i < s.length; i++) {
    h ^= s.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return (h >>> 0).toString(16).padStart(8, '0');
}

/** The `_security` object: members are the three roles; admins are server admins only. */
export function securityObject(): {
  admins: { names: string[]; roles: string[] };
  members: { names: string[]; roles: string[] };
} {
  return {
    admins: { names: [], roles: [] },
    members: { names: [], roles: [ROLES.viewer, ROLES.member, ROLES.lead] },
  };
}
