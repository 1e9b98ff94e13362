/**
 * Data in and out, self-contained for the settings (or a data) screen:
 * `<DataPanel repo={repo} onDataChanged={...} />`. CSV import with column mapping (remembered per
 * header), a preview computed by the engine, an all-or-nothing import with a per-row report; CSV
 * export of one site or all; JSON backup and restore.
 */

import { useEffect, useMemo, useState } from 'preact/hooks';
import { isSolveError, type SolveResult } from '../../chem/api';
import { TufaError } from '../../chem/errors';
import { backupToJson, createBackup, parseBackup, restoreBackup } from '../../io/backup';
import { type ColumnMapping, type ColumnRole, defaultMapping, layoutKey } from '../../io/column-mapping';
import type { ImportReport, PreviewRow } from '../../io/import-commit';
import { mappingFromRecord, mappingToRecord, roleFromString, roleToString } from '../../io/layout-memory';
import { formatWithOffset } from '../../io/timestamps';
import { QUANTITIES } from '../../quantities';
import type { RequestSettings } from '../../reading/request';
import { storeIssue } from '../../store/errors';
import type { Repository } from '../../store/repository';
import type { SiteDoc } from '../../store/schema';
import { DEFAULT_SETTINGS } from '../../store/settings';
import { RepositoryStore } from '../../sync/repository-store';
import { askPersistenceAfterSave } from '../storage-state';
import { showValue } from '../sync/conflict-fields';
import { downloadText as download, readingsCsvWithNote } from './csv-download';
import type { FileSummary, PlanSummary } from './import.worker';
import { ImportWorker } from './import-client';

const ROLE_OPTIONS: { value: string; label: string }[] = [
  { value: 'ignore', label: '— not imported —' },
  { value: 'timestamp', label: 'Date and time' },
  { value: 'date', label: 'Date' },
  { value: 'time', label: 'Time of day' },
  { value: 'time-zone', label: 'Time zone' },
  { value: 'site', label: 'Site' },
  { value: 'notes', label: 'Notes' },
  { value: 'ph-scale', label: 'pH scale' },
  { value: 'reading-id', label: 'Reading id (same reading, never a copy)' },
  { value: 'site-id', label: 'Site id (same site, never a copy)' },
  { value: 'updated-at', label: 'Last changed (replaces only older copies)' },
  { value: 'site-kind', label: 'Kind of site' },
  { value: 'site-defaults', label: 'Site defaults (model, salinity, …)' },
  { value: 'titration-value:alkalinity:meq_l', label: 'Alkalinity from a titration — meq/L' },
  { value: 'titration-value:dic:umol_kg', label: 'DIC from a titration — µmol/kg' },
  ...QUANTITIES.flatMap((q) =>
    q.units.map((u) => ({ value: `value:${q.id}:${u.id}`, label: `${q.label} — ${u.label}` })),
  ),
];

/** "1 reading", "2 readings". */
function plural(n: number, word: string): string {
  return `${n} ${n === 1 ? word : `${word}s`}`;
}

function fmt(v: unknown, digits = 4): string {
  return typeof v === 'number' && Number.isFinite(v) ? v.toPrecision(digits) : '—';
}

function PreviewTable({ rows, sites }: { rows: PreviewRow[]; sites: Map<string, SiteDoc> }) {
  return (
    <table class="kv">
      <caption class="muted small">
        First rows as they will be stored, with what the engine computes from them
      </caption>
      <thead>
        <tr>
          <th scope="col">Line</th>
          <th scope="col">Site and time</th>
          <th scope="col">Values</th>
          <th scope="col">pH (total)</th>
          <th scope="col">DIC µmol/kg</th>
          <th scope="col">Ω calcite</th>
        </tr>
      </thead>
      <tbody>
        {rows.map(({ line, reading, result }) => (
          <tr key={line}>
            <td>{line}</td>
            <td>
              {sites.get(reading.siteId)?.name ?? '?'}
              <br />
              <span class="small">{formatWithOffset(Date.parse(reading.takenAt), reading.timeZone)}</span>
            </td>
            <td class="small">{showValue('values', reading.values)}</td>
            {isSolveError(result as SolveResult) ? (
              <td colSpan={3} class="small">
                {(result as { error: { message: string } }).error.message}
              </td>
            ) : (
              <>
                <td>{fmt((result as Record<string, unknown>).ph_total)}</td>
                <td>{fmt((result as Record<string, unknown>).dic_umol_kg, 5)}</td>
                <td>{fmt((result as Record<string, unknown>).omega_calcite, 3)}</td>
              </>
            )}
          </tr>
        ))}
      </tbody>
    </table>
  );
}

const PREVIEW_ROWS = 8;

function failure(code: string, what: string, e: unknown): string {
  return `${code}: ${what} (${e instanceof Error ? e.message : String(e)}). Nothing was written.`;
}

export function DataPanel({
  repo,
  onDataChanged,
  settings = DEFAULT_SETTINGS,
}: {
  repo: Repository;
  onDataChanged?: () => void;
  /** The settings readings are computed with (as on their pages). */
  settings?: RequestSettings;
}) {
  const store = new RepositoryStore(repo);
  // Parsing, planning and solving a file run in this worker; the page only shows and stores.
  const worker = useMemo(() => new ImportWorker(), []);
  useEffect(() => () => worker.close(), [worker]);
  const [sites, setSites] = useState<SiteDoc[]>([]);
  const [csv, setCsv] = useState<FileSummary>();
  const [fileName, setFileName] = useState('');
  const [mapping, setMapping] = useState<ColumnMapping>();
  const [plan, setPlan] = useState<PlanSummary>();
  const [report, setReport] = useState<ImportReport>();
  const [busy, setBusy] = useState('');
  const [previewIssue, setPreviewIssue] = useState('');
  const [exportSite, setExportSite] = useState('');
  const [restoreMsg, setRestoreMsg] = useState('');
  const [exportMsg, setExportMsg] = useState('');
  const [encoding, setEncoding] = useState('UTF-8');

  useEffect(() => {
    repo.listSites().then(setSites);
  }, [repo, report]);

  const zone = Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC';

  const openFile = async (file: File) => {
    setBusy('Reading the file…');
    setPlan(undefined);
    setReport(undefined);
    setPreviewIssue('');
    try {
      // Decoding and parsing happen in the worker; the page hands over the bytes.
      const parsed = await worker.open(await file.arrayBuffer());
      setEncoding(parsed.encoding === 'UTF-8' ? 'UTF-8' : 'Windows-1252 (not UTF-8)');
      setFileName(file.name);
      setCsv(parsed);
      const [remembered] = await repo.findLayouts(layoutKey(parsed.header));
      setMapping(
        remembered
          ? mappingFromRecord(parsed.header, remembered.columns, zone)
          : defaultMapping(parsed.header, zone),
      );
    } catch (e) {
      setPreviewIssue(failure('import-unavailable', 'The file could not be read', e));
    } finally {
      setBusy('');
    }
  };

  // Re-plan and re-preview (first rows solved by the engine) whenever the mapping changes.
  useEffect(() => {
    if (!csv || !mapping) return;
    let live = true;
    worker.plan(mapping, sites, PREVIEW_ROWS, settings).then(
      (p) => {
        if (live) setPlan(p);
      },
      (e) => {
        if (live) setPreviewIssue(failure('import-unavailable', 'The file could not be planned', e));
      },
    );
    return () => {
      live = false;
    };
  }, [csv, mapping, sites]);

  const setRole = (i: number, value: string) => {
    if (!mapping) return;
    const columns = [...mapping.columns];
    columns[i] = roleFromString(value) as ColumnRole;
    setMapping({ ...mapping, columns });
  };

  const doImport = async () => {
    if (!plan || !csv || !mapping) return;
    setBusy('Computing…');
    try {
      // The worker solves every row (only to report rows that cannot be computed; outputs are not
      // stored, they are recomputed whenever a reading is shown) and stores the documents itself.
      const r = await worker.commit((p) =>
        setBusy(p.phase === 'computing' ? `Computing ${p.done} of ${p.total}…` : 'Importing…'),
      );
      if (r.ok) {
        void askPersistenceAfterSave();
        await repo.putLayout({
          name: fileName || 'CSV file',
          headerSignature: layoutKey(csv.header),
          columns: mappingToRecord(csv.header, mapping),
          delimiter: csv.sniff.delimiter,
          decimalComma: csv.sniff.decimalComma,
        });
        onDataChanged?.();
      }
      setReport(r);
    } catch (e) {
      setPreviewIssue(
        e instanceof TufaError
          ? `${e.code}: ${e.message} Nothing was written.`
          : failure('import-unavailable', 'The import could not be prepared', e),
      );
    } finally {
      setBusy('');
    }
  };

  const siteById = new Map([...sites, ...(plan?.newSites ?? [])].map((s) => [s.id, s]));
  const errors = report?.errors ?? plan?.errors ?? [];

  return (
    <section aria-labelledby="data-h" class="stack">
      <h2 id="data-h">Data in and out</h2>

      <div class="panel">
        <h3>Import a CSV file</h3>
        <label class="field">
          <span>File from a logger or spreadsheet</span>
          <input
            type="file"
            accept=".csv,.txt,text/csv"
            onChange={(e) => {
              const f = e.currentTarget.files?.[0];
              if (f) void openFile(f);
            }}
          />
        </label>
        {csv && mapping && (
          <>
            <p class="small muted">
              {csv.rowCount} rows · {encoding} · fields separated by “
              {csv.sniff.delimiter === '\t' ? 'tab' : csv.sniff.delimiter}” · decimal{' '}
              {csv.sniff.decimalComma ? 'comma' : 'point'}
              {csv.sniff.hadBom ? ' · byte-order mark removed' : ''}
            </p>
            <fieldset>
              <legend>What each column holds</legend>
              {csv.header.map((h, i) => (
                <label class="field" key={`${h}-${i}`}>
                  <span>{h || `(column ${i + 1})`}</span>
                  <select
                    aria-label={`Column ${h || i + 1}`}
                    value={roleToString(mapping.columns[i] ?? { role: 'ignore' })}
                    onChange={(e) => setRole(i, e.currentTarget.value)}
                  >
                    {ROLE_OPTIONS.map((o) => (
                      <option key={o.value} value={o.value}>
                        {o.label}
                      </option>
                    ))}
                  </select>
                </label>
              ))}
            </fieldset>
            <fieldset class="inline">
              <legend>Times and site</legend>
              <label class="field">
                <span>Time zone of times without offset</span>
                <input
                  value={mapping.timeZone}
                  onInput={(e) => setMapping({ ...mapping, timeZone: e.currentTarget.value })}
                />
              </label>
              <label class="field">
                <span>Dates like 03/06/2026 are</span>
                <select
                  value={mapping.dateOrder}
                  onChange={(e) =>
                    setMapping({ ...mapping, dateOrder: e.currentTarget.value as ColumnMapping['dateOrder'] })
                  }
                >
                  <option value="dmy">day/month/year</option>
                  <option value="mdy">month/day/year</option>
                  <option value="ymd">year/month/day</option>
                </select>
              </label>
              <label class="field">
                <span>Site for rows without one</span>
                <select
                  value={mapping.siteId ?? ''}
                  onChange={(e) => {
                    const { siteId: _old, ...rest } = mapping;
                    setMapping(e.currentTarget.value ? { ...rest, siteId: e.currentTarget.value } : rest);
                  }}
                >
                  <option value="">— from the file —</option>
                  {sites.map((s) => (
                    <option key={s.id} value={s.id}>
                      {s.name}
                    </option>
                  ))}
                </select>
              </label>
            </fieldset>
            {plan && plan.preview.length > 0 && <PreviewTable rows={plan.preview} sites={siteById} />}
            {previewIssue && <p class="issue error">{previewIssue}</p>}
            {plan && (
              <p>
                {plural(plan.readingCount, 'reading')} ready
                {plan.newSites.length
                  ? `, new ${plan.newSites.length === 1 ? 'site' : 'sites'}: ${plan.newSites.map((s) => s.name).join(', ')}`
                  : ''}
                {plan.duplicateRows.length ? `, ${plan.duplicateRows.length} repeated rows skipped` : ''}.
              </p>
            )}
            {errors.length > 0 && (
              <div role="alert">
                <p class="issue error">
                  {plural(errors.length, 'problem')}: nothing is imported until every row reads cleanly. Fix
                  the file or the column choices.
                </p>
                <table class="kv">
                  <thead>
                    <tr>
                      <th scope="col">Line</th>
                      <th scope="col">Column</th>
                      <th scope="col">Problem</th>
                    </tr>
                  </thead>
                  <tbody>
                    {errors.slice(0, 100).map((e) => (
                      <tr key={`${e.row}-${e.column}-${e.code}`}>
                        <td>{e.row}</td>
                        <td>{e.column ?? '—'}</td>
                        <td>
                          {e.message} <code>{e.code}</code>
                        </td>
                      </tr>
                    ))}
                  </tbody>
                </table>
                {errors.length > 100 && <p class="small">…and {errors.length - 100} more.</p>}
              </div>
            )}
            {report?.ok && (
              <p class={`issue ${report.warnings.length ? 'warn' : 'ok'}`} role="status">
                Imported {plural(report.written, 'reading')}
                {report.sitesCreated
                  ? ` and ${report.sitesCreated} new ${report.sitesCreated === 1 ? 'site' : 'sites'}`
                  : ''}
                {report.replaced ? `; ${report.replaced} replaced older copies of the same readings` : ''}
                {report.alreadyPresent
                  ? `; ${report.alreadyPresent} were already here and were left as they are`
                  : ''}
                {report.warnings.length
                  ? `; ${report.warnings.length} rows are stored but cannot be computed yet`
                  : ''}
                .
              </p>
            )}
            <div class="actions">
              <button
                type="button"
                class="primary"
                disabled={!plan || plan.errors.length > 0 || !!busy}
                onClick={doImport}
              >
                {busy || `Import ${plan?.readingCount ?? 0} readings`}
              </button>
            </div>
          </>
        )}
      </div>

      <div class="panel">
        <h3>Export</h3>
        <label class="field">
          <span>Readings of</span>
          <select value={exportSite} onChange={(e) => setExportSite(e.currentTarget.value)}>
            <option value="">all sites</option>
            {sites.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </select>
        </label>
        <div class="actions">
          <button
            type="button"
            onClick={async () => {
              try {
                const { text, note } = await readingsCsvWithNote(repo, settings, exportSite || undefined);
                download(`tufa-readings-${new Date().toISOString().slice(0, 10)}.csv`, text, 'text/csv');
                setExportMsg(note ?? '');
              } catch (e) {
                setExportMsg(
                  failure('export-failed', 'The CSV file could not be made', e).replace('written', 'changed'),
                );
              }
            }}
          >
            Download CSV
          </button>
          <button
            type="button"
            onClick={async () => {
              const b = await createBackup(store);
              download(`tufa-backup-${b.created_at.slice(0, 10)}.json`, backupToJson(b), 'application/json');
            }}
          >
            Download backup (JSON)
          </button>
        </div>
        {exportMsg && (
          <p class="issue warn" role="status">
            {exportMsg}
          </p>
        )}
        <label class="field">
          <span>
            Restore a backup (merged: nothing already here is duplicated or replaced by older copies)
          </span>
          <input
            type="file"
            accept=".json,application/json"
            onChange={async (e) => {
              const f = e.currentTarget.files?.[0];
              if (!f) return;
              const b = parseBackup(await f.text());
              if ('error' in b) {
                setRestoreMsg(`${b.error.message} (${b.error.code})`);
                return;
              }
              try {
                const r = await restoreBackup(store, b);
                const skipped = r.settingsRejected.length
                  ? ` Settings not restored (store-invalid-setting): ${r.settingsRejected.map((x) => `${x.key} ${x.reason}`).join('; ')}.`
                  : '';
                setRestoreMsg(
                  `Restored: ${r.added} added, ${r.replaced} replaced by newer copies, ${r.unchanged} unchanged.${skipped}`,
                );
              } catch (err) {
                const i = storeIssue(err);
                setRestoreMsg(`The backup could not be restored: ${i.message} (${i.code})`);
              }
              setReport(undefined);
              onDataChanged?.();
            }}
          />
        </label>
        {restoreMsg && (
          <p class={`issue ${restoreMsg.startsWith('Restored') ? 'ok' : 'error'}`} role="status">
            {restoreMsg}
          </p>
        )}
      </div>
    </section>
  );
}
