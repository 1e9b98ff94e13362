/**
 * One site: its log of readings and a time-series chart of any measured or computed quantity,
 * for this site and, optionally, other sites on the same axes.
 */

import { useEffect, useRef, useState } from 'preact/hooks';
import { quantityById as quantity } from '../../quantities';
import { storeIssue } from '../../store/errors';
import type { ReadingDoc, SiteDoc } from '../../store/schema';
import { teamRefusal } from '../../team/roles';
import { useApp } from '../app-context';
import type { Columnar, PointSeries } from '../charts/chart-data';
import { mergeSeries } from '../charts/chart-data';
import type { TimeChart } from '../charts/time-chart';
import { resultColumns, solveReadingsInWorker } from '../engine-client';
import { formatDateTime, formatNumber } from '../numbers';
import { OUTPUTS } from '../outputs';
import { go } from '../router';
import { useTeamIdentity } from '../sync/TeamRole';
import { kindLabel } from './SitesScreen';

const PAGE = 50;

/** A plottable thing: a measured quantity in one unit (`m:ph:ph`) or a computed output (`c:pco2_uatm`). */
function seriesOptions(readings: ReadingDoc[]): { id: string; label: string; unit: string }[] {
  const seen = new Map<string, { id: string; label: string; unit: string }>();
  for (const r of readings.slice(-500)) {
    for (const v of r.values) {
      const id = `m:${v.quantity}:${v.unit}`;
      if (seen.has(id)) continue;
      const q = quantity(v.quantity);
      const u = q?.units.find((x) => x.id === v.unit);
      seen.set(id, {
        id,
        label: q?.label ?? v.quantity,
        unit: u?.label === 'pH' ? '' : (u?.label ?? v.unit),
      });
    }
  }
  const computed = OUTPUTS.filter((o) => o.headline || o.key.startsWith('ph_')).map((o) => ({
    id: `c:${o.key}`,
    label: `${o.label} (computed)`,
    unit: o.unit,
  }));
  return [...seen.values(), ...computed];
}

export function SiteScreen(props: { siteId: string }) {
  const { repo, settings, locale, dataVersion, reportError, dataChanged, sync } = useApp();
  const who = useTeamIdentity(sync);
  const [exporting, setExporting] = useState(false);
  const [site, setSite] = useState<SiteDoc | null>();
  const [readings, setReadings] = useState<ReadingDoc[]>([]);
  const [allSites, setAllSites] = useState<SiteDoc[]>([]);
  const [shown, setShown] = useState(PAGE);
  const [selected, setSelected] = useState<string[]>([]);
  const [compare, setCompare] = useState<string[]>([]);
  const [chartNote, setChartNote] = useState('');
  const chartEl = useRef<HTMLDivElement>(null);
  const chart = useRef<TimeChart | undefined>(undefined);

  useEffect(() => {
    (async () => {
      const s = await repo.getSite(props.siteId);
      setSite(s && !s.deleted ? s : null);
      setReadings(await repo.listReadings(props.siteId));
      setAllSites(await repo.listSites());
    })().catch((e) => reportError(storeIssue(e)));
  }, [props.siteId, dataVersion]);

  useEffect(() => {
    setSelected([]);
    setCompare([]);
    setShown(PAGE);
  }, [props.siteId]);

  const options = seriesOptions(readings);
  useEffect(() => {
    // Default to a measured quantity (pH if there is one) once the readings are in.
    if (selected.length > 0 || readings.length === 0) return;
    const measured = options.filter((o) => o.id.startsWith('m:'));
    const first = measured.find((o) => o.id.startsWith('m:ph:')) ?? measured[0] ?? options[0];
    if (first) setSelected([first.id]);
  }, [readings]);

  useEffect(() => {
    const el = chartEl.current;
    if (!el || selected.length === 0) return;
    let cancelled = false;
    (async () => {
      const siteIds = [props.siteId, ...compare];
      const series: PointSeries[] = [];
      const specs: { label: string; unit: string }[] = [];
      for (const sid of siteIds) {
        const rs = sid === props.siteId ? readings : await repo.listReadings(sid);
        const s = sid === props.siteId ? site : allSites.find((x) => x.id === sid);
        const t = Float64Array.from(rs, (r) => Date.parse(r.takenAt) / 1000);
        const computedKeys = selected.filter((id) => id.startsWith('c:')).map((id) => id.slice(2));
        const computed = computedKeys.length
          ? resultColumns(
              (await solveReadingsInWorker(rs, new Map(s ? [[s.id, s]] : []), settings, computedKeys))
                .results,
              computedKeys,
            )
          : [];
        for (const id of selected) {
          const opt = options.find((o) => o.id === id);
          if (!opt) continue;
          let v: (number | null)[];
          if (id.startsWith('m:')) {
            const [, qid, uid] = id.split(':');
            v = rs.map((r) => r.values.find((x) => x.quantity === qid && x.unit === uid)?.value ?? null);
          } else {
            v = computed[computedKeys.indexOf(id.slice(2))] ?? [];
          }
          series.push({ t, v });
          specs.push({
            label: siteIds.length > 1 ? `${s?.name ?? '?'}: ${opt.label}` : opt.label,
            unit: opt.unit,
          });
        }
      }
      if (cancelled) return;
      const data: Columnar = mergeSeries(series);
      const nonNull = data.ys.reduce((n, y) => n + y.filter((x) => x !== null).length, 0);
      setChartNote(
        nonNull === 0
          ? 'Nothing to plot: no values for this choice (or the engine could not compute them).'
          : '',
      );
      const { createTimeChart } = await import('../charts/time-chart');
      if (cancelled) return;
      chart.current?.destroy();
      const css = getComputedStyle(document.documentElement);
      chart.current = createTimeChart(el, data, specs, {
        textColour: css.getPropertyValue('--text').trim() || undefined,
        gridColour: css.getPropertyValue('--grid').trim() || undefined,
        locale,
      });
    })().catch((e) => setChartNote(`Chart failed: ${e instanceof Error ? e.message : String(e)}`));
    return () => {
      cancelled = true;
    };
  }, [readings, selected.join(), compare.join(), settings]);

  useEffect(() => () => chart.current?.destroy(), []);

  if (site === null) return <p class="issue error">This site does not exist (or was deleted).</p>;
  const newestFirst = readings.slice().reverse();

  return (
    <section aria-labelledby="site-h">
      <div class="titlebar">
        <div>
          <h1 id="site-h">{site?.name ?? '…'}</h1>
          <p class="muted">
            {site ? kindLabel(site.kind) : ''} · {readings.length}{' '}
            {readings.length === 1 ? 'reading' : 'readings'}
          </p>
        </div>
        {teamRefusal(who) ? (
          <p class="muted small team-refusal">{teamRefusal(who)}</p>
        ) : (
          <a class="button primary" href={`#/site/${props.siteId}/new-reading`}>
            New reading
          </a>
        )}
      </div>

      <section class="panel" aria-labelledby="chart-h">
        <h2 id="chart-h">Time series</h2>
        <div ref={chartEl} class="chart" data-testid="time-chart" />
        <p class="muted small">
          <span class="hint-mouse">Drag across the chart to zoom; double-click to zoom out.</span>
          <span class="hint-touch">
            Tap the chart to read the values at that time; pinch with two fingers to zoom in or out.
          </span>
        </p>
        {chartNote && <p class="issue warn">{chartNote}</p>}
        <details class="chart-controls">
          <summary>Choose what to plot ({selected.length + compare.length} chosen)</summary>
          <fieldset>
            <legend>Plot</legend>
            <div class="chips">
              {options.map((o) => (
                <label key={o.id} class="chip">
                  <input
                    type="checkbox"
                    checked={selected.includes(o.id)}
                    onChange={(e) =>
                      setSelected(
                        e.currentTarget.checked ? [...selected, o.id] : selected.filter((x) => x !== o.id),
                      )
                    }
                  />
                  <span>
                    {o.label}
                    {o.unit ? ` (${o.unit})` : ''}
                  </span>
                </label>
              ))}
            </div>
          </fieldset>
          {allSites.length > 1 && (
            <fieldset>
              <legend>Compare with</legend>
              <div class="chips">
                {allSites
                  .filter((s) => s.id !== props.siteId)
                  .map((s) => (
                    <label key={s.id} class="chip">
                      <input
                        type="checkbox"
                        checked={compare.includes(s.id)}
                        onChange={(e) =>
                          setCompare(
                            e.currentTarget.checked ? [...compare, s.id] : compare.filter((x) => x !== s.id),
                          )
                        }
                      />
                      <span>{s.name}</span>
                    </label>
                  ))}
              </div>
            </fieldset>
          )}
        </details>
      </section>

      <section class="panel" aria-labelledby="log-h">
        <h2 id="log-h">Log</h2>
        {readings.length === 0 && <p class="muted">No readings yet.</p>}
        <ul class="log">
          {newestFirst.slice(0, shown).map((r) => (
            <li key={r.id}>
              <a href={`#/reading/${r.id}`} class="log-row">
                <span class="log-time">{formatDateTime(r.takenAt, r.timeZone, locale)}</span>
                <span class="log-values">
                  {r.values
                    .slice(0, 4)
                    .map((v) => {
                      const q = quantity(v.quantity);
                      const u = q?.units.find((x) => x.id === v.unit);
                      return `${q?.label ?? v.quantity} ${formatNumber(v.value, locale, { digits: 4 })}${u && u.label !== 'pH' ? ` ${u.label}` : ''}`;
                    })
                    .join(' · ')}
                </span>
              </a>
            </li>
          ))}
        </ul>
        {shown < readings.length && (
          <button type="button" onClick={() => setShown(shown + PAGE * 4)}>
            Show more ({readings.length - shown} older)
          </button>
        )}
      </section>
      <div class="actions">
        {site && teamRefusal(who, site) ? (
          <p class="muted small team-refusal">{teamRefusal(who, site)}</p>
        ) : (
          <a class="button" href={`#/site/${props.siteId}/edit`}>
            Edit site
          </a>
        )}
        <button
          type="button"
          disabled={exporting || readings.length === 0}
          onClick={async () => {
            setExporting(true);
            try {
              const { downloadText, fileStem, readingsCsv } = await import('../data/csv-download');
              const text = await readingsCsv(repo, settings, props.siteId);
              const day = new Date().toISOString().slice(0, 10);
              downloadText(`${fileStem(site?.name ?? '')}-${day}.csv`, text, 'text/csv');
            } catch (e) {
              reportError(storeIssue(e));
            } finally {
              setExporting(false);
            }
          }}
        >
          {exporting ? 'Preparing CSV…' : 'Download CSV of this site'}
        </button>
        {!(site && teamRefusal(who, site)) && (
          <button
            type="button"
            class="danger"
            onClick={async () => {
              if (
                !confirm(
                  `Delete “${site?.name}” and its readings from this device? They are kept as deleted entries for sync.`,
                )
              )
                return;
              try {
                await repo.deleteSite(props.siteId);
                dataChanged();
                go({ name: 'sites' });
              } catch (e) {
                reportError(storeIssue(e));
              }
            }}
          >
            Delete site
          </button>
        )}
      </div>
    </section>
  );
}
