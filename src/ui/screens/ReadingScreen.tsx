/** One reading in full: what was measured, every computed output, constants, formulations, speciation. */

import { useEffect, useRef, useState } from 'preact/hooks';
import type { SolveOutput, SolveResult } from '../../chem/api';
import { isSolveError } from '../../chem/api';
import { quantityById as quantity, siteProfile } from '../../quantities';
import type { ReadingRequest } from '../../reading/request';
import { storeIssue } from '../../store/errors';
import type { ReadingDoc, SiteDoc } from '../../store/schema';
import { teamRefusal } from '../../team/roles';
import { useApp } from '../app-context';
import { drawSpeciation, fractionsAt } from '../charts/speciation';
import { solveReadingInWorker } from '../engine-client';
import { dayPhSwing } from '../headline';
import { formatDateTime, formatNumber } from '../numbers';
import { constantName } from '../plain-words';
import { asSavedPlan } from '../plan/saved-plan';
import { go } from '../router';
import { useTeamIdentity } from '../sync/TeamRole';
import { METHOD_LABELS } from '../titration';
import { InputsUsed } from './InputsUsed';
import { ResultsPanel } from './ResultsPanel';
import { SavedPlanView } from './SavedPlanView';
import { TitrationSummary } from './TitrationSection';

function Speciation(props: { result: SolveOutput }) {
  const ref = useRef<HTMLCanvasElement>(null);
  const { locale } = useApp();
  const pk1 = props.result.constants.pk1;
  const pk2 = props.result.constants.pk2;
  // The constants are on the model's internal scale: total for saline water, activity for fresh.
  const fresh = props.result.model === 'fresh';
  const samplePh = (
    fresh
      ? (((props.result as unknown as Record<string, unknown>).ph as number | undefined) ??
        props.result.ph_nbs)
      : props.result.ph_total
  ) as number | undefined;
  const axis = fresh ? 'pH (activity)' : 'pH (total scale)';
  // On the total scale the sample sits below what the meter read (NBS): say both, so a reef
  // keeper who read 8.05 does not wonder where 7.91 came from.
  const meter = props.result.ph_nbs;
  const marker =
    !fresh && samplePh !== undefined && typeof meter === 'number'
      ? `meter ${formatNumber(meter, locale, { decimals: 2 })} = ${formatNumber(samplePh, locale, { decimals: 2 })} here`
      : undefined;
  useEffect(() => {
    const c = ref.current;
    if (!c || pk1 === undefined || pk2 === undefined) return;
    const draw = () => {
      const css = getComputedStyle(document.documentElement);
      const v = (n: string, d: string) => css.getPropertyValue(n).trim() || d;
      drawSpeciation(
        c,
        pk1,
        pk2,
        samplePh,
        axis,
        {
          text: v('--text', '#1b1f23'),
          grid: v('--grid', '#d5d9dc'),
          colours: [v('--s1', '#3d55b8'), v('--s2', '#0b6e69'), v('--s3', '#b4451f')],
          marker: v('--text', '#1b1f23'),
        },
        marker,
      );
    };
    draw();
    const ro = new ResizeObserver(draw);
    ro.observe(c);
    return () => ro.disconnect();
  }, [pk1, pk2, samplePh, marker]);
  if (pk1 === undefined || pk2 === undefined)
    return <p class="muted">The engine did not report pK1 and pK2; no diagram.</p>;
  const f = samplePh !== undefined ? fractionsAt(samplePh, pk1, pk2) : undefined;
  const pct = (x: number) => `${formatNumber(100 * x, locale, { decimals: 1 })} %`;
  const label = f
    ? `Speciation diagram. At the sample's pH ${samplePh!.toFixed(2)}: dissolved CO₂ ${pct(f.co2)}, bicarbonate ${pct(f.hco3)}, carbonate ${pct(f.co3)}.`
    : 'Speciation diagram.';
  return (
    <figure class="speciation">
      <canvas ref={ref} role="img" aria-label={label} data-testid="speciation" />
      <figcaption>
        Share of dissolved inorganic carbon against pH for this water (pK1{' '}
        {formatNumber(pk1, locale, { decimals: 3 })}, pK2 {formatNumber(pk2, locale, { decimals: 3 })}).
        {f &&
          ` At the sample: dissolved CO₂ ${pct(f.co2)}, bicarbonate ${pct(f.hco3)}, carbonate ${pct(f.co3)}.`}
        {marker && ' The line marks the sample on the total scale the sea-water constants use.'}
      </figcaption>
    </figure>
  );
}

type PlanPanelType = typeof import('../plan/PlanPanel').PlanPanel;

export function ReadingScreen(props: { readingId: string }) {
  const { repo, settings, locale, notify, dataChanged, reportError, sync } = useApp();
  const who = useTeamIdentity(sync);
  const [reading, setReading] = useState<ReadingDoc | null>();
  const [site, setSite] = useState<SiteDoc>();
  const [result, setResult] = useState<SolveResult>();
  const [request, setRequest] = useState<ReadingRequest>();
  // The planning panel carries the plan engine: loaded only when asked for.
  const [Planner, setPlanner] = useState<PlanPanelType>();
  const [swing, setSwing] = useState<{ lo: number; hi: number; n: number }>();

  // A pond manager's question: how far did pH swing today? (needs two readings of the day)
  useEffect(() => {
    if (!reading || siteProfile(site).trade !== 'aquaculture') return setSwing(undefined);
    const t = new Date(reading.takenAt).getTime();
    const iso = (ms: number) => new Date(ms).toISOString();
    repo
      .listReadings(reading.siteId, { from: iso(t - 86_400_000), to: iso(t + 86_400_000) })
      .then((list) => setSwing(dayPhSwing(reading, list)))
      .catch(() => setSwing(undefined));
  }, [reading, site]);

  useEffect(() => {
    (async () => {
      const r = await repo.getReading(props.readingId);
      if (!r || r.deleted) return setReading(null);
      setReading(r);
      const s = await repo.getSite(r.siteId);
      setSite(s);
      // The one request of this reading (src/reading/request.ts, made in the engine worker): a
      // stored titration is raw data, reduced again now; uncertainties of pH, titration and constants.
      const solved = await solveReadingInWorker(r, s, settings, true);
      setRequest(solved.request);
      setResult(solved.result);
    })().catch((e) => reportError(storeIssue(e)));
  }, [props.readingId, settings]);

  if (reading === null) return <p class="issue error">This reading does not exist (or was deleted).</p>;
  if (!reading) return <p class="muted">Loading…</p>;

  async function remove() {
    try {
      await repo.deleteReading(reading!.id);
      dataChanged();
      notify({
        kind: 'info',
        text: 'Reading deleted.',
        action: {
          label: 'Undo',
          run: () => {
            repo.restoreReading(reading!.id).then(dataChanged, (e) => reportError(storeIssue(e)));
          },
        },
      });
      go({ name: 'site', siteId: reading!.siteId });
    } catch (e) {
      reportError(storeIssue(e));
    }
  }

  const ok = result && !isSolveError(result) ? result : undefined;
  const savedPlan = asSavedPlan(reading.plan);
  const refusal = teamRefusal(who, reading);
  return (
    <article aria-labelledby="reading-h">
      <div class="titlebar">
        <div>
          <h1 id="reading-h">Reading</h1>
          <p class="muted">
            <a href={`#/site/${reading.siteId}`}>{site?.name ?? 'Site'}</a> ·{' '}
            {formatDateTime(reading.takenAt, reading.timeZone, locale)} ({reading.timeZone})
          </p>
          {reading.created_by && (
            <p class="muted small">
              Entered by {reading.created_by}
              {reading.changed_by && reading.changed_by !== reading.created_by
                ? ` · last changed by ${reading.changed_by}`
                : ''}
            </p>
          )}
        </div>
        {refusal ? (
          <p class="muted small team-refusal">{refusal}</p>
        ) : (
          <a class="button" href={`#/reading/${reading.id}/edit`}>
            Edit
          </a>
        )}
      </div>
      <section class="panel" aria-labelledby="measured-h">
        <h2 id="measured-h">Measured</h2>
        <dl class="outputs">
          {reading.values.map((v) => {
            const q = quantity(v.quantity);
            const u = q?.units.find((x) => x.id === v.unit);
            return (
              <div class="output" key={`${v.quantity}-${v.source ?? 'typed'}`}>
                <dt>
                  {q?.label ?? v.quantity}
                  {v.source === 'titration' && ' (from a titration)'}
                </dt>
                <dd>
                  <span class="value">{formatNumber(v.value, locale, { digits: 6 })}</span>
                  {u && u.label !== 'pH' && <span class="unit"> {u.label}</span>}
                </dd>
              </div>
            );
          })}
        </dl>
        {reading.notes && <p>{reading.notes}</p>}
      </section>
      {reading.titration && (
        <section class="panel" aria-labelledby="titration-h">
          <h2 id="titration-h">Titration</h2>
          <p class="muted">
            {reading.titration.points.length} points,{' '}
            {formatNumber(reading.titration.sampleVolumeMl, locale, { digits: 4 })} mL sample,{' '}
            {formatNumber(reading.titration.titrantNormality, locale, { digits: 4 })} eq/L acid ·{' '}
            {METHOD_LABELS[(reading.titration.method as keyof typeof METHOD_LABELS | undefined) ?? 'gran'] ??
              reading.titration.method}
          </p>
          <TitrationSummary outcome={request?.titration} />
        </section>
      )}
      <section class="panel" aria-labelledby="computed-h">
        <h2 id="computed-h">Computed</h2>
        <ResultsPanel
          result={result}
          full
          profile={siteProfile(site)}
          values={reading.values}
          daySwing={swing}
          request={request?.input}
        />
        {request && <InputsUsed request={request} />}
      </section>
      {ok && (
        <>
          <section class="panel" aria-labelledby="spec-h">
            <h2 id="spec-h">Speciation</h2>
            <Speciation result={ok} />
          </section>
          <details class="panel">
            <summary>
              <h2 class="inline-h">Constants and formulations</h2>
            </summary>
            <table class="kv">
              <caption class="sr-only">
                Constants used (−log10 unless named otherwise), totals and formulations
              </caption>
              <tbody>
                {Object.entries(ok.constants).map(([k, v]) => (
                  <tr key={k}>
                    <th scope="row">{constantName(k)}</th>
                    <td>{formatNumber(v, locale, { decimals: 4 })}</td>
                  </tr>
                ))}
                {Object.entries(ok.totals_umol_kg ?? {})
                  // Fresh water has no assumed boron, sulfate or fluoride: a row of zeros says nothing.
                  .filter(([, v]) => v !== 0)
                  .map(([k, v]) => (
                    <tr key={`t-${k}`}>
                      <th scope="row">total {k} (µmol/kg)</th>
                      <td>{formatNumber(v, locale, { digits: 5 })}</td>
                    </tr>
                  ))}
                {ok.conditions && (
                  <tr>
                    <th scope="row">results refer to</th>
                    <td>
                      {formatNumber(ok.conditions.temperature_c, locale, { digits: 4 })} °C, salinity{' '}
                      {formatNumber(ok.conditions.salinity, locale, { digits: 4 })},{' '}
                      {formatNumber(ok.conditions.pressure_dbar, locale, { digits: 4 })} dbar
                    </td>
                  </tr>
                )}
                {Object.entries(ok as unknown as Record<string, unknown>)
                  .filter(
                    ([k, v]) =>
                      typeof v === 'string' && !['model', 'model_reason', 'treatment_caution'].includes(k),
                  )
                  .map(([k, v]) => (
                    <tr key={`s-${k}`}>
                      <th scope="row">{k.replace(/_/g, ' ')}</th>
                      <td>{String(v)}</td>
                    </tr>
                  ))}
                {Object.entries(
                  ((ok as unknown as Record<string, unknown>).activity_coefficients ?? {}) as Record<
                    string,
                    unknown
                  >,
                )
                  .filter(([, v]) => typeof v === 'number')
                  .map(([k, v]) => (
                    <tr key={`g-${k}`}>
                      <th scope="row">activity coefficient γ {k}</th>
                      <td>{formatNumber(v as number, locale, { digits: 4 })}</td>
                    </tr>
                  ))}
                {Object.entries(ok.formulations).map(([k, v]) => (
                  <tr key={`f-${k}`}>
                    <th scope="row">{constantName(k)}</th>
                    <td>{v}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </details>
        </>
      )}
      <section class="panel" aria-label="Plan a change">
        {reading.plan !== undefined && <SavedPlanView plan={reading.plan} />}
        {Planner && request ? (
          <Planner
            reading={request.input}
            {...(savedPlan ? { saved: savedPlan } : {})}
            trade={siteProfile(site).trade}
            onSave={async (plan) => {
              try {
                setReading(await repo.updateReading(reading.id, { plan }));
                dataChanged();
                notify({ kind: 'info', text: 'Plan saved with the reading.' });
              } catch (e) {
                reportError(storeIssue(e));
              }
            }}
          />
        ) : (
          <button
            type="button"
            onClick={() =>
              import('../plan/PlanPanel').then(
                (m) => setPlanner(() => m.PlanPanel),
                (e) => reportError({ code: 'plan-unavailable', message: String(e) }),
              )
            }
          >
            {savedPlan ? 'Open the saved plan in the planner' : 'Plan a dose, aeration or mix for this water'}
          </button>
        )}
      </section>
      <div class="actions">
        {!teamRefusal(who) && (
          <a class="button primary" href={`#/site/${reading.siteId}/new-reading`}>
            Another reading here
          </a>
        )}
        {!refusal && (
          <button type="button" class="danger" onClick={remove}>
            Delete reading
          </button>
        )}
      </div>
    </article>
  );
}
