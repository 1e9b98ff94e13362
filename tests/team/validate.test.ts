/**
 * The design doc's `validate_doc_update`, run as a pure function: the exact source text the server
 * stores, built with `new Function` and called as CouchDB calls it (newDoc, oldDoc, userCtx, secObj).
 */

import { describe, expect, it } from 'vitest';
import { QUANTITIES as FORM_QUANTITIES } from '../../src/quantities';
import { toCouch } from '../../src/sync/doc-codec';
import { designDoc, quantityLimits, securityObject } from '../../src/team/doc-rules';
import { roleOf, teamRefusal } from '../../src/team/roles';

type Validate = (n: unknown, o: unknown, u: unknown, s: unknown) => void;
const validate = new Function(`return (${designDoc().validate_doc_update})`)() as Validate;
const sec = securityObject();
const user = (name: string | null, ...roles: string[]) => ({ name, roles, db: 'team' });

function outcome(n: unknown, o: unknown, u: unknown): string {
  try {
    validate(n, o, u, sec);
    return 'ok';
  } catch (e) {
    const x = e as { forbidden?: string; unauthorized?: string };
    if (x.forbidden) return `403 ${x.forbidden}`;
    if (x.unauthorized) return `401 ${x.unauthorized}`;
    throw e;
  }
}

const T = '2026-05-01T08:30:00.000Z';
function reading(by: string, extra: Record<string, unknown> = {}) {
  return {
    _id: 'r1',
    type: 'reading',
    siteId: 's1',
    takenAt: T,
    timeZone: 'Europe/Vienna',
    values: [
      { quantity: 'temperature', value: 12.5, unit: 'c' },
      { quantity: 'ph', value: 7.9, unit: 'ph' },
      { quantity: 'alkalinity', value: 2.1, unit: 'meq_l' },
    ],
    notes: '',
    updatedAt: T,
    deleted: false,
    created_by: by,
    changed_by: by,
    ...extra,
  };
}
const site = (by: string) => ({
  _id: 's1',
  type: 'site',
  name: 'Spring below the quarry',
  kind: 'spring',
  defaults: { model: 'fresh', units: { alkalinity: 'meq_l' } },
  notes: '',
  location: { latitude: 47.1, longitude: 15.4, source: 'typed' },
  updatedAt: T,
  deleted: false,
  created_by: by,
  changed_by: by,
});

describe('roles', () => {
  it('anonymous is asked to sign in; a viewer and a user without a role are refused', () => {
    expect(outcome(reading('x'), null, user(null))).toMatch(/^401 Sign in/);
    expect(outcome(reading('vera'), null, user('vera', 'viewer'))).toMatch(/^403 A viewer can read/);
    expect(outcome(reading('olga'), null, user('olga'))).toMatch(/^403 .*no Tufa role/);
  });

  it('a member creates as themself, changes and deletes only their own documents', () => {
    const a = user('anna', 'member');
    const b = user('ben', 'member');
    expect(outcome(reading('anna'), null, a)).toBe('ok');
    expect(outcome(site('anna'), null, a)).toBe('ok');
    expect(outcome(reading('ben'), null, a)).toMatch(/created_by must be the signed-in user \(anna\)/);
    const old = { ...reading('anna'), _rev: '1-a' };
    expect(outcome({ ...old, notes: 'rinsed', changed_by: 'anna' }, old, a)).toBe('ok');
    expect(outcome({ ...old, notes: 'mine now', changed_by: 'ben' }, old, b)).toMatch(
      /^403 A member changes or deletes only what they created; reading r1 was created by anna/,
    );
    expect(outcome({ _id: 'r1', _rev: '1-a', _deleted: true }, old, b)).toMatch(/^403 A member changes/);
    expect(outcome({ ...old, deleted: true, changed_by: 'ben' }, old, b)).toMatch(/^403 A member/);
    expect(outcome({ _id: 'r1', _rev: '1-a', _deleted: true }, old, a)).toBe('ok');
    expect(outcome({ ...old, created_by: 'ben', changed_by: 'anna' }, old, a)).toMatch(
      /created_by cannot change/,
    );
    expect(outcome({ ...old, changed_by: 'zoe' }, old, a)).toMatch(/changed_by must be the signed-in user/);
  });

  it('a lead changes and deletes anything, keeping created_by; server admins may do anything', () => {
    const old = { ...reading('anna'), _rev: '1-a' };
    const lea = user('lea', 'lead');
    expect(outcome({ ...old, notes: 'checked', changed_by: 'lea' }, old, lea)).toBe('ok');
    expect(outcome({ _id: 'r1', _deleted: true }, old, lea)).toBe('ok');
    expect(outcome({ ...old, created_by: 'lea', changed_by: 'lea' }, old, lea)).toMatch(/created_by cannot/);
    expect(outcome({ _id: '_design/x' }, null, lea)).toMatch(/Only a server admin/);
    expect(outcome({ ...old, changed_by: 'import' }, old, user('root', '_admin'))).toBe('ok');
    expect(outcome({ _id: '_design/x' }, null, user('root', '_admin'))).toBe('ok');
  });
});

describe('shape', () => {
  const a = user('anna', 'member');
  it('refuses a string where a number belongs, with the field named', () => {
    const bad = reading('anna', { values: [{ quantity: 'ph', value: '7.9', unit: 'ph' }] });
    expect(outcome(bad, null, a)).toBe(
      '403 reading r1: values[0].value (ph in ph) must be a number, not "7.9".',
    );
  });
  it('refuses values outside the limits the import refuses, in the unit they are written in', () => {
    const hot = (value: number, unit: string) =>
      outcome(reading('anna', { values: [{ quantity: 'temperature', value, unit }] }), null, a);
    // src/quantities: temperature limits −10 to 150 °C, i.e. 14 to 302 °F.
    expect(hot(150, 'c')).toBe('ok');
    expect(hot(302, 'f')).toBe('ok');
    expect(hot(303, 'f')).toMatch(/is 303, outside 14 to 302\./);
    expect(hot(-11, 'c')).toMatch(/outside -10/);
    expect(
      outcome(reading('anna', { values: [{ quantity: 'ph', value: 15, unit: 'ph' }] }), null, a),
    ).toMatch(/ph in ph\) is 15, outside/);
    expect(
      outcome(reading('anna', { values: [{ quantity: 'sparkle', value: 1, unit: 'x' }] }), null, a),
    ).toMatch(/not a quantity Tufa knows/);
    expect(
      outcome(reading('anna', { values: [{ quantity: 'ph', value: 7, unit: 'dkh' }] }), null, a),
    ).toMatch(/not a unit of ph/);
  });
  it('refuses missing or mistyped fields', () => {
    expect(outcome({ ...reading('anna'), takenAt: 'yesterday' }, null, a)).toMatch(
      /takenAt must be an ISO 8601/,
    );
    expect(outcome({ ...reading('anna'), type: 'note' }, null, a)).toMatch(
      /type must be one of site, reading/,
    );
    expect(outcome({ ...site('anna'), kind: 'ocean' }, null, a)).toMatch(/kind must be one of/);
    expect(outcome({ ...site('anna'), name: '' }, null, a)).toMatch(/name must not be empty/);
    expect(
      outcome({ ...site('anna'), location: { latitude: 91, longitude: 0, source: 'typed' } }, null, a),
    ).toMatch(/location.latitude is 91/);
    expect(outcome({ ...site('anna'), defaults: { salinity: 'sea' } }, null, a)).toMatch(
      /defaults.salinity must be a number/,
    );
    expect(outcome({ ...reading('anna'), deleted: 'no' }, null, a)).toMatch(/deleted must be true or false/);
  });
  it('accepts every quantity and unit the reading form offers, at both ends of its plausible range', () => {
    const limits = quantityLimits();
    for (const q of FORM_QUANTITIES) {
      for (const u of q.units) {
        expect(limits[q.id]?.[u.id], `${q.id} ${u.id}`).toBeDefined();
      }
      const [lo, hi] = q.plausible ?? [0, 1];
      for (const value of [lo, hi]) {
        const r = reading('anna', { values: [{ quantity: q.id, value, unit: q.units[0]!.id }] });
        expect(outcome(r, null, a), q.id).toBe('ok');
      }
    }
  });
  it('accepts what the app sends: a stored doc through the sync codec, stamped with the user', () => {
    const doc = toCouch(
      {
        id: 'r9',
        type: 'reading',
        siteId: 's1',
        takenAt: T,
        timeZone: 'UTC',
        values: [{ quantity: 'dic', value: 2100, unit: 'umol_kg' }],
        notes: 'after rain',
        updatedAt: T,
        deleted: false,
      },
      'anna',
    );
    expect(doc).toMatchObject({ created_by: 'anna', changed_by: 'anna' });
    expect(outcome(doc, null, a)).toBe('ok');
  });
});

describe('what the app says before trying agrees with the server', () => {
  it('teamRefusal is undefined exactly when validate_doc_update accepts the change', () => {
    const people: [string, string][] = [
      ['anna', 'member'],
      ['ben', 'member'],
      ['vera', 'viewer'],
      ['lea', 'lead'],
      ['olga', ''],
    ];
    for (const [name, role] of people) {
      const who = { name, role: roleOf(role ? [role] : []) };
      // Creating: a new reading by this user.
      const created = outcome(reading(name), null, user(name, ...(role ? [role] : [])));
      expect(teamRefusal(who) === undefined, `${name} creates`).toBe(created === 'ok');
      // Changing anna's stored reading.
      const old = { ...reading('anna'), _rev: '1-a' };
      const changed = outcome(
        { ...old, notes: 'x', changed_by: name },
        old,
        user(name, ...(role ? [role] : [])),
      );
      const local = { type: 'reading' as const, created_by: 'anna', rev: '1-a' };
      expect(teamRefusal(who, local) === undefined, `${name} changes anna's`).toBe(changed === 'ok');
    }
  });
});
