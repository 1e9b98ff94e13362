/**
 * The server-side guard of a team database: the `validate_doc_update` function of the design doc
 * `_design/tufa-team`, as source text. CouchDB runs it in its own JavaScript engine (SpiderMonkey
 * 1.8.5 on CouchDB 2–3, QuickJS on 3.4+), so it is written in plain ES5 — `var`, no arrows, no
 * template strings — and is kept here as text, then filled with the rules of `./doc-rules.ts`
 * (generated from the engine's quantity table). Tests build the same text into a function with
 * `new Function` and call it as CouchDB does.
 *
 * Thrown `{ unauthorized }` becomes HTTP 401, `{ forbidden }` HTTP 403 with the message as reason.
 */

const TEMPLATE = `function (newDoc, oldDoc, userCtx, secObj) {
  var RULES = __RULES__;
  var roles = (userCtx && userCtx.roles) || [];
  var name = userCtx && userCtx.name;
  function has(role) { return roles.indexOf(role) !== -1; }
  function isDbAdmin() {
    if (has('_admin')) return true;
    var a = (secObj && secObj.admins) || {};
    var names = a.names || [], rs = a.roles || [];
    if (name && names.indexOf(name) !== -1) return true;
    for (var i = 0; i < rs.length; i++) if (has(rs[i])) return true;
    return false;
  }
  function refuse(msg) { throw { forbidden: msg }; }
  var what = (newDoc.type === 'site' || newDoc.type === 'reading') ? newDoc.type + ' ' + newDoc._id : 'document ' + newDoc._id;

  if (!name) throw { unauthorized: 'Sign in to change this database.' };
  var admin = isDbAdmin();
  if (newDoc._id.indexOf('_design/') === 0) {
    if (!admin) refuse('Only a server admin changes the rules of this database.');
    return;
  }
  var lead = admin || has(RULES.roles.lead);
  var member = lead || has(RULES.roles.member);
  if (!member) {
    refuse(has(RULES.roles.viewer)
      ? 'A viewer can read this database but not change it (' + what + ').'
      : 'User ' + name + ' has no Tufa role on this database; ask a server admin to add one.');
  }
  var existing = oldDoc && !oldDoc._deleted;
  var owner = existing ? oldDoc.created_by : undefined;
  if (existing && !lead && owner !== name) {
    refuse('A member changes or deletes only what they created; ' + what + ' was created by ' +
      (owner || 'someone before team roles were set up') + '. Ask a lead.');
  }
  if (newDoc._deleted) return;

  // Who made it and who changed it last, checked against the signed-in user.
  if (existing && owner !== undefined && newDoc.created_by !== owner)
    refuse(what + ': created_by cannot change (it is ' + owner + ').');
  if (!existing && !admin && newDoc.created_by !== name)
    refuse(what + ': created_by must be the signed-in user (' + name + ').');
  if (!admin && newDoc.changed_by !== name)
    refuse(what + ': changed_by must be the signed-in user (' + name + ').');

  // The shape of the document.
  function fail(field, msg) { refuse(what + ': ' + field + ' ' + msg + '.'); }
  function isNum(x) { return typeof x === 'number' && isFinite(x); }
  function str(field, x, max, required, emptyOk) {
    if (x === undefined && !required) return;
    if (typeof x !== 'string') fail(field, 'must be text');
    if (x.length === 0 && !emptyOk) fail(field, 'must not be empty');
    if (x.length > max) fail(field, 'is longer than ' + max + ' characters');
  }
  function num(field, x, lo, hi, required) {
    if (x === undefined && !required) return;
    if (!isNum(x)) fail(field, 'must be a number, not ' + JSON.stringify(x));
    var tol = (hi - lo) * 1e-9;
    if (x < lo - tol || x > hi + tol) fail(field, 'is ' + x + ', outside ' + lo + ' to ' + hi);
  }
  function oneOf(field, x, list, required) {
    if (x === undefined && !required) return;
    if (list.indexOf(x) === -1) fail(field, 'must be one of ' + list.join(', ') + ', not ' + JSON.stringify(x));
  }
  function obj(field, x, required) {
    if (x === undefined && !required) return false;
    if (!x || typeof x !== 'object' || Array.isArray(x)) fail(field, 'must be an object');
    return true;
  }
  function instant(field, x) {
    str(field, x, 40, true);
    if (!RULES.isoInstant.test(x) || isNaN(Date.parse(x))) fail(field, 'must be an ISO 8601 UTC instant like 2026-05-01T08:30:00Z, not ' + JSON.stringify(x));
  }
  oneOf('type', newDoc.type, ['site', 'reading'], true);
  instant('updatedAt', newDoc.updatedAt);
  if (typeof newDoc.deleted !== 'boolean') fail('deleted', 'must be true or false');
  str('created_by', newDoc.created_by, 200, false);
  str('changed_by', newDoc.changed_by, 200, false);
  var L = RULES.limits;
  if (newDoc.type === 'site') {
    str('name', newDoc.name, L.nameLength, true);
    oneOf('kind', newDoc.kind, RULES.siteKinds, true);
    str('notes', newDoc.notes, L.notesLength, true, true);
    if (obj('location', newDoc.location, false)) {
      num('location.latitude', newDoc.location.latitude, -90, 90, true);
      num('location.longitude', newDoc.location.longitude, -180, 180, true);
      num('location.accuracyM', newDoc.location.accuracyM, 0, 1e7, false);
      oneOf('location.source', newDoc.location.source, ['device', 'typed'], true);
    }
    obj('defaults', newDoc.defaults, true);
    var d = newDoc.defaults;
    for (var key in RULES.defaults) {
      var rule = RULES.defaults[key];
      if (rule.range) num('defaults.' + key, d[key], rule.range[0], rule.range[1], false);
      else oneOf('defaults.' + key, d[key], rule.oneOf, false);
    }
    if (obj('defaults.units', d.units, false))
      for (var q in d.units) {
        if (!RULES.quantities[q]) fail('defaults.units', 'names an unknown quantity ' + JSON.stringify(q));
        if (!RULES.quantities[q][d.units[q]]) fail('defaults.units.' + q, 'has an unknown unit ' + JSON.stringify(d.units[q]));
      }
  } else {
    str('siteId', newDoc.siteId, 200, true);
    instant('takenAt', newDoc.takenAt);
    str('timeZone', newDoc.timeZone, 64, true);
    str('notes', newDoc.notes, L.notesLength, true, true);
    if (!Array.isArray(newDoc.values)) fail('values', 'must be a list');
    if (newDoc.values.length > L.values) fail('values', 'has more than ' + L.values + ' entries');
    for (var i = 0; i < newDoc.values.length; i++) {
      var v = newDoc.values[i], f = 'values[' + i + ']';
      obj(f, v, true);
      var units = RULES.quantities[v.quantity];
      if (!units) fail(f + '.quantity', 'is ' + JSON.stringify(v.quantity) + ', not a quantity Tufa knows (update the server rules with tufa team setup if Tufa is newer)');
      var range = units[v.unit];
      if (!range) fail(f + '.unit', 'is ' + JSON.stringify(v.unit) + ', not a unit of ' + v.quantity);
      num(f + '.value (' + v.quantity + ' in ' + v.unit + ')', v.value, range[0], range[1], true);
    }
    if (obj('titration', newDoc.titration, false)) {
      var t = newDoc.titration;
      num('titration.sampleVolumeMl', t.sampleVolumeMl, 0, 1e5, true);
      num('titration.titrantNormality', t.titrantNormality, 0, 100, true);
      num('titration.correctionFactor', t.correctionFactor, 0, 100, false);
      num('titration.endpointPh', t.endpointPh, 0, 14, false);
      str('titration.method', t.method, 100, false);
      if (!Array.isArray(t.points)) fail('titration.points', 'must be a list');
      if (t.points.length > L.titrationPoints) fail('titration.points', 'has more than ' + L.titrationPoints + ' entries');
      for (var j = 0; j < t.points.length; j++) {
        obj('titration.points[' + j + ']', t.points[j], true);
        num('titration.points[' + j + '].volumeMl', t.points[j].volumeMl, 0, 1e5, true);
        num('titration.points[' + j + '].ph', t.points[j].ph, 0, 14, true);
      }
    }
  }
}`;

/** The validate function's source with its rules filled in (the rules are JSON plus one RegExp). */
export function validateSource(rules: Record<string, unknown>, isoInstant: RegExp): string {
  const json = JSON.stringify(rules).replace('"__ISO__"', isoInstant.toString());
  return TEMPLATE.replace('__RULES__', json);
}
