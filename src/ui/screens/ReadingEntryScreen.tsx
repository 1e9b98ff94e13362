/**
 * Entering (or editing) a reading: one row per measured quantity, each with its own unit; results
 * recomputed in the worker as the user types; engine warnings shown under the row they concern.
 */

import { useEffect, useMemo, useRef, useState } from 'preact/hooks';
import type { SolveInput, SolveResult } from '../../chem/api';
import { isSolveError } from '../../chem/api';
import type { Issue } from '../../chem/errors';
import type { TitrateOutcome } from '../../chem/titration/titrate';
import {
  checkHistory,
  checkPlausible,
  type Profile,
  QUANTITIES,
  quantityById as quantity,
  quantityForKey,
  siteProfile,
  tradeQuantities,
  tradeUnits,
} from '../../quantities';
import { storeIssue } from '../../store/errors';
import type { MeasuredValue, ReadingDoc, SiteDoc } from '../../store/schema';
import { useApp } from '../app-context';
import { solveReadingInWorker } from '../engine-client';
import { formatNumber, parseDecimal } from '../numbers';
import { plainWords } from '../plain-words';
import { go } from '../router';
import { askPersistenceAfterSave } from '../storage-state';
import { ResultsPanel } from './ResultsPanel';
import {
  EMPTY_TITRATION,
  formFromRecord,
  recordFromForm,
  TitrationFields,
  type TitrationForm,
} from './TitrationSection';

interface Row {
  quantity: string;
  unit: string;
  text: string;
}

/** A new reading of this site: the trade's usual quantities, each in the trade's unit unless the
 * site (or, for quantities the trade has no unit for, the user's Settings) chose another. */
function defaultRows(site: SiteDoc | undefined, preferred: Record<string, string>): Row[] {
  const profile = siteProfile(site);
  const units = { ...preferred, ...tradeUnits(profile), ...(site?.defaults.units ?? {}) };
  return tradeQuantities(profile).map((id) => {
    const q = quantity(id)!;
    // A site with a usual salinity starts the row with it, in PSS-78 as the site states it.
    const usual =
      id === 'salinity' && site?.defaults.salinity !== undefined && !site.defaults.units?.salinity;
    const unit = usual
      ? 'pss'
      : units[id] && q.units.some((u) => u.id === units[id])
        ? units[id]!
        : q.units[0]!.id;
    return {
      quantity: id,
      unit,
      text:
        id === 'salinity' && site?.defaults.salinity !== undefined && unit === 'pss'
          ? String(site.defaults.salinity)
          : '',
    };
  });
}

function rowsFrom(values: MeasuredValue[], locale: string | undefined): Row[] {
  return values.map((v) => ({
    quantity: v.quantity,
    unit: v.unit,
    text: formatNumber(v.value, locale, { digits: 15 }).replace(/\u202f|\u00a0/g, ''),
  }));
}

/** `datetime-local` wants local wall time without zone. */
function toLocalInput(d: Date): string {
  const p = (n: number) => String(n).padStart(2, '0');
  return `${d.getFullYear()}-${p(d.getMonth() + 1)}-${p(d.getDate())}T${p(d.getHours())}:${p(d.getMinutes())}`;
}

export function ReadingEntryScreen(props: { siteId?: string; readingId?: string }) {
  const { repo, settings, locale, notify, dataChanged } = useApp();
  const [site, setSite] = useState<SiteDoc>();
  const [existing, setExisting] = useState<ReadingDoc>();
  const [carried, setCarried] = useState<MeasuredValue[]>([]);
  const [rows, setRows] = useState<Row[]>([]);
  const [when, setWhen] = useState(() => toLocalInput(new Date()));
  const [notes, setNotes] = useState('');
  const [result, setResult] = useState<SolveResult>();
  const [request, setRequest] = useState<SolveInput>();
  const [busy, setBusy] = useState(false);
  const [saveIssue, setSaveIssue] = useState<Issue>();
  const [loaded, setLoaded] = useState(false);
  const [tform, setTform] = useState<TitrationForm>(EMPTY_TITRATION);
  const [toutcome, setToutcome] = useState<TitrateOutcome>();
  const [history, setHistory] = useState<MeasuredValue[]>([]);
  const seq = useRef(0);

  useEffect(() => {
    (async () => {
      let s: SiteDoc | undefined;
      if (props.readingId) {
        const r = await repo.getReading(props.readingId);
        if (r) {
          setExisting(r);
          s = await repo.getSite(r.siteId);
          // A titration's result carried by an imported file is not typed: it stays as it is.
          setRows(
            rowsFrom(
              r.values.filter((v) => v.source === undefined),
              locale,
            ),
          );
          setCarried(r.values.filter((v) => v.source !== undefined));
          setWhen(toLocalInput(new Date(r.takenAt)));
          setNotes(r.notes);
          setTform(formFromRecord(r.titration));
        }
      } else if (props.siteId) {
        s = await repo.getSite(props.siteId);
        setRows(defaultRows(s, settings.units));
      }
      setSite(s);
      setLoaded(true);
      if (s) {
        // The site's own readings, for "this spring has read 7.1–7.3" beside an unusual value.
        const past = await repo.listReadings(s.id, { newestFirst: true, limit: 200 });
        setHistory(past.filter((r) => r.id !== props.readingId).flatMap((r) => r.values));
      }
    })().catch((e) => setSaveIssue(storeIssue(e)));
  }, [props.siteId, props.readingId]);

  useEffect(() => {
    // Marks when a person can start typing; the cold-start benchmark reads it.
    if (loaded) performance.mark('tufa-entry-ready');
  }, [loaded]);

  const parsed = useMemo(
    () =>
      rows.map((r) => {
        if (r.text.trim() === '') return { row: r, value: undefined, issue: undefined };
        const p = parseDecimal(r.text, locale);
        return p.ok
          ? { row: r, value: p.value, issue: undefined }
          : { row: r, value: undefined, issue: p.issue };
      }),
    [rows, locale],
  );
  const values: MeasuredValue[] = [
    ...parsed
      .filter((p) => p.value !== undefined)
      .map((p) => ({ quantity: p.row.quantity, unit: p.row.unit, value: p.value as number })),
    ...carried,
  ];
  const valuesKey = JSON.stringify(values);

  const titration = useMemo(() => recordFromForm(tform, locale), [tform, locale]);
  const titrationKey = JSON.stringify(titration.record ?? null);

  useEffect(() => {
    if (!loaded) return;
    if (values.length < (titration.record ? 1 : 2)) {
      setResult(undefined);
      setToutcome(undefined);
      return;
    }
    const mine = ++seq.current;
    setBusy(true);
    const t = setTimeout(async () => {
      // The draft goes through the same request function as a stored reading (in the worker).
      const draft = titration.record ? { values, titration: titration.record } : { values };
      const { request, result: r } = await solveReadingInWorker(draft, site, settings);
      const reduced = request.titration;
      if (mine !== seq.current) return; // a newer keystroke won
      setToutcome(reduced);
      setRequest(request.input);
      setResult(r);
      setBusy(false);
    }, 120);
    return () => clearTimeout(t);
  }, [valuesKey, titrationKey, site, settings, loaded]);

  // Issues about an input (engine warnings or the error) go beside that input's row.
  const byQuantity = new Map<string, Issue[]>();
  if (result) {
    const issues = isSolveError(result) ? [result.error] : result.warnings;
    for (const w of issues) {
      const q = w.field ? quantityForKey(w.field) : undefined;
      if (q) byQuantity.set(q, [...(byQuantity.get(q) ?? []), w]);
    }
  }

  const setRow = (i: number, patch: Partial<Row>) =>
    setRows(rows.map((r, j) => (j === i ? { ...r, ...patch } : r)));
  const unused = QUANTITIES.filter((q) => q.form && !rows.some((r) => r.quantity === q.id));
  const profile: Profile = siteProfile(site);
  const fmt = (x: number) => formatNumber(x, locale, { digits: 4 });

  async function save(ev: Event) {
    ev.preventDefault();
    setSaveIssue(undefined);
    const bad = parsed.find((p) => p.issue);
    if (bad) {
      setSaveIssue({
        code: 'input-not-a-number',
        message: `${quantity(bad.row.quantity)?.label}: ${bad.issue!.message}`,
      });
      return;
    }
    if (titration.issues.length) {
      setSaveIssue({
        code: titration.issues[0]!.code,
        message: `Titration: ${titration.issues[0]!.message}`,
      });
      return;
    }
    if (values.length === 0) {
      setSaveIssue({ code: 'reading-empty', message: 'Enter at least one measured value.' });
      return;
    }
    const taken = new Date(when);
    if (Number.isNaN(taken.getTime())) {
      setSaveIssue({ code: 'input-bad-time', message: 'The sampling time is not a valid date and time.' });
      return;
    }
    try {
      const timeZone = Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC';
      const doc = existing
        ? await repo.updateReading(existing.id, {
            values,
            notes,
            takenAt: taken.toISOString(),
            titration: titration.record,
          })
        : await repo.createReading({
            siteId: site!.id,
            takenAt: taken.toISOString(),
            timeZone,
            values,
            notes,
            ...(titration.record ? { titration: titration.record } : {}),
          });
      dataChanged();
      void askPersistenceAfterSave();
      notify({ kind: 'info', text: existing ? 'Reading updated.' : 'Reading saved on this device.' });
      go({ name: 'reading', readingId: doc.id });
    } catch (e) {
      setSaveIssue(storeIssue(e));
    }
  }

  if (loaded && !site) return <p class="issue error">This site does not exist (or was deleted).</p>;

  return (
    <form class="entry" onSubmit={save} aria-label="Reading">
      <h1>{existing ? 'Edit reading' : 'New reading'}</h1>
      <p class="muted">{site?.name}</p>
      <div class="entry-grid">
        <fieldset class="measured">
          <legend>Measured</legend>
          <label class="field">
            <span>Sampled at (local time)</span>
            <input
              type="datetime-local"
              value={when}
              onInput={(e) => setWhen(e.currentTarget.value)}
              required
            />
          </label>
          {parsed.map(({ row, issue, value }, i) => {
            const q = quantity(row.quantity);
            if (!q) return null;
            const id = `q-${row.quantity}`;
            const plausibleNote =
              value !== undefined &&
              q.plausible &&
              row.unit === q.units[0]!.id &&
              (value < q.plausible[0] || value > q.plausible[1]);
            // The trade's everyday range (with a one-tap unit fix), then the site's own history.
            const tradeNote =
              value !== undefined && !plausibleNote
                ? checkPlausible(profile, row.quantity, row.unit, value, fmt)
                : undefined;
            const historyNote =
              value !== undefined && !plausibleNote && !tradeNote
                ? checkHistory(
                    profile,
                    row.quantity,
                    row.unit,
                    value,
                    history.filter((h) => h.quantity === row.quantity),
                    fmt,
                  )
                : undefined;
            return (
              <div class="qrow" key={row.quantity}>
                <label for={id}>{q.label}</label>
                <div class="qinputs">
                  <input
                    id={id}
                    name={row.quantity}
                    type="text"
                    inputMode="decimal"
                    autoComplete="off"
                    value={row.text}
                    aria-invalid={issue ? 'true' : undefined}
                    aria-describedby={`${id}-msg`}
                    onInput={(e) => setRow(i, { text: e.currentTarget.value })}
                  />
                  {q.units.length > 1 ? (
                    <select
                      aria-label={`${q.label} unit`}
                      value={row.unit}
                      onChange={(e) => setRow(i, { unit: e.currentTarget.value })}
                    >
                      {q.units.map((u) => (
                        <option key={u.id} value={u.id}>
                          {u.label}
                        </option>
                      ))}
                    </select>
                  ) : (
                    <span class="unit-fixed">{q.units[0]!.label}</span>
                  )}
                  <button
                    type="button"
                    class="icon"
                    aria-label={`Remove ${q.label}`}
                    onClick={() => setRows(rows.filter((_, j) => j !== i))}
                  >
                    ×
                  </button>
                </div>
                <div id={`${id}-msg`} class="qmsg">
                  {issue && (
                    <span class="issue error">
                      <code>{issue.code}</code> {issue.message}
                    </span>
                  )}
                  {plausibleNote && (
                    <span class="issue warn">
                      <code>input-unusual-value</code> {q.label} is usually between{' '}
                      {formatNumber(q.plausible![0], locale)} and {formatNumber(q.plausible![1], locale)}
                      {q.id === 'ph' ? '' : ` ${q.units[0]!.label}`}: please check the value (it is kept as
                      typed).
                    </span>
                  )}
                  {tradeNote && (
                    <span class="issue warn" data-code={tradeNote.code}>
                      <code>{tradeNote.code}</code> {tradeNote.message}
                      {tradeNote.fixUnit && (
                        <button
                          type="button"
                          class="fix"
                          onClick={() => setRow(i, { unit: tradeNote.fixUnit! })}
                        >
                          Use {q.units.find((u) => u.id === tradeNote.fixUnit)?.label}
                        </button>
                      )}
                    </span>
                  )}
                  {historyNote && (
                    <span class="issue warn" data-code={historyNote.code}>
                      <code>{historyNote.code}</code> {historyNote.message}
                    </span>
                  )}
                  {(byQuantity.get(row.quantity) ?? []).map((w, k) => (
                    <span key={`${w.code}-${k}`} class="issue warn">
                      <code>{w.code}</code> {plainWords(w.message)}
                    </span>
                  ))}
                </div>
              </div>
            );
          })}
          {unused.length > 0 && (
            <label class="field">
              <span>Add a measured quantity</span>
              <select
                value=""
                onChange={(e) => {
                  const q = quantity(e.currentTarget.value);
                  if (q)
                    setRows([
                      ...rows,
                      {
                        quantity: q.id,
                        unit:
                          site?.defaults.units?.[q.id] ??
                          tradeUnits(profile)[q.id] ??
                          settings.units[q.id] ??
                          q.units[0]!.id,
                        text: '',
                      },
                    ]);
                }}
              >
                <option value="">Choose…</option>
                {unused.map((q) => (
                  <option key={q.id} value={q.id}>
                    {q.label}
                  </option>
                ))}
              </select>
            </label>
          )}
          <TitrationFields
            form={tform}
            onChange={setTform}
            outcome={toutcome}
            issues={titration.record || tform.pointsText.trim() === '' ? [] : titration.issues}
          />
          <label class="field">
            <span>Notes</span>
            <textarea rows={2} value={notes} onInput={(e) => setNotes(e.currentTarget.value)} />
          </label>
        </fieldset>
        <ResultsPanel result={result} busy={busy} profile={profile} values={values} request={request} />
      </div>
      {saveIssue && (
        <p class="issue error" role="alert">
          <code>{saveIssue.code}</code> {saveIssue.message}
        </p>
      )}
      <div class="actions">
        <button type="submit" class="primary">
          Save reading
        </button>
        <a class="button" href={existing ? `#/reading/${existing.id}` : `#/site/${site?.id ?? ''}`}>
          Cancel
        </a>
      </div>
    </form>
  );
}
