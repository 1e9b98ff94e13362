/** Preferences (units, constants, pH scale, air pCO2, theme) and the state of on-device storage. */

import { useEffect, useState } from 'preact/hooks';
import { QUANTITIES } from '../../quantities';
import type { Settings, ThemeChoice } from '../../store/settings';
import { useApp } from '../app-context';
import { formatNumber, parseDecimal } from '../numbers';
import {
  askPersistence,
  evictionWarning,
  formatBytes,
  type StorageState,
  storageState,
} from '../storage-state';

type DataPanelType = typeof import('../data/DataPanel').DataPanel;
type SyncPanelType = typeof import('../sync/SyncPanel').SyncPanel;

export function SettingsScreen() {
  const { settings, saveSettings, locale, notify, repo, sync, syncState, dataChanged } = useApp();
  const [storage, setStorage] = useState<StorageState>();
  const [pco2Text, setPco2Text] = useState(
    formatNumber(settings.atmospheric_pco2_uatm, locale, { digits: 6 }),
  );
  const [pco2Issue, setPco2Issue] = useState<string>();

  // CSV parsing, import planning and backups are loaded with Settings, not with the app shell.
  const [Data, setData] = useState<DataPanelType>();
  const [dataIssue, setDataIssue] = useState<string>();
  const [Sync, setSync] = useState<SyncPanelType>();

  useEffect(() => {
    storageState().then(setStorage);
    import('../data/DataPanel').then(
      (m) => setData(() => m.DataPanel),
      (e) =>
        setDataIssue(`data-unavailable: The import and export tools could not be loaded (${String(e)}).`),
    );
    import('../sync/SyncPanel').then(
      (m) => setSync(() => m.SyncPanel),
      () => undefined, // shown below as sync not available
    );
  }, []);

  const set = (patch: Partial<Settings>) => saveSettings(patch);
  // A pH's scale is chosen below (and per site), not as a preferred unit.
  const multiUnit = QUANTITIES.filter((q) => q.form && q.units.filter((u) => !u.options).length > 1);
  const warning = storage && evictionWarning(storage);

  return (
    <section aria-labelledby="settings-h" class="stack">
      <h1 id="settings-h">Settings</h1>

      <fieldset>
        <legend>Preferred units</legend>
        {multiUnit.map((q) => (
          <label class="field" key={q.id}>
            <span>{q.label}</span>
            <select
              value={settings.units[q.id] ?? q.units[0]!.id}
              onChange={(e) => set({ units: { ...settings.units, [q.id]: e.currentTarget.value } })}
            >
              {q.units.map((u) => (
                <option key={u.id} value={u.id}>
                  {u.label}
                </option>
              ))}
            </select>
          </label>
        ))}
      </fieldset>

      <fieldset>
        <legend>Chemistry defaults</legend>
        <label class="field">
          <span>Water model</span>
          <select
            value={settings.model}
            onChange={(e) => set({ model: e.currentTarget.value as Settings['model'] })}
          >
            <option value="auto">From salinity or conductance</option>
            <option value="fresh">Fresh water</option>
            <option value="saline">Sea or brackish water</option>
          </select>
        </label>
        <label class="field">
          <span>pH is measured on the</span>
          <select
            value={settings.ph_scale}
            onChange={(e) => set({ ph_scale: e.currentTarget.value as Settings['ph_scale'] })}
          >
            <option value="nbs">NBS scale (NBS/IUPAC buffers)</option>
            <option value="total">total scale (TRIS buffers)</option>
            <option value="seawater">seawater scale</option>
            <option value="free">free scale</option>
          </select>
        </label>
        <label class="field">
          <span>Carbonic acid constants (sea and brackish water)</span>
          <select
            value={settings.carbonic_constants}
            onChange={(e) =>
              set({ carbonic_constants: e.currentTarget.value as Settings['carbonic_constants'] })
            }
          >
            <option value="auto">by salinity (default)</option>
            <option value="lueker2000">Lueker et al. 2000 (sea, S 19–43)</option>
            <option value="millero2010">Millero 2010 (estuarine, S 1–50)</option>
          </select>
        </label>
        <label class="field">
          <span>Total boron from salinity</span>
          <select
            value={settings.boron_total}
            onChange={(e) => set({ boron_total: e.currentTarget.value as Settings['boron_total'] })}
          >
            <option value="lee2010">Lee et al. 2010</option>
            <option value="uppstrom1974">Uppström 1974</option>
          </select>
        </label>
        <label class="field">
          <span>Atmospheric pCO₂ (µatm)</span>
          <input
            type="text"
            inputMode="decimal"
            value={pco2Text}
            aria-invalid={pco2Issue ? 'true' : undefined}
            aria-describedby="pco2-msg"
            onInput={(e) => setPco2Text(e.currentTarget.value)}
            onBlur={() => {
              const p = parseDecimal(pco2Text, locale);
              if (!p.ok) return setPco2Issue(`${p.issue.code}: ${p.issue.message}`);
              if (p.value <= 0 || p.value > 100000)
                return setPco2Issue('input-out-of-range: Give a pCO₂ between 0 and 100 000 µatm.');
              setPco2Issue(undefined);
              set({ atmospheric_pco2_uatm: p.value });
            }}
          />
        </label>
        <p id="pco2-msg" class={pco2Issue ? 'issue error' : 'muted small'}>
          {pco2Issue ?? 'Used to compare a water with air (how far it is from equilibrium).'}
        </p>
        <label class="field">
          <span>Uncertainty of a pH reading (pH units)</span>
          <select
            value={String(settings.ph_uncertainty)}
            onChange={(e) => set({ ph_uncertainty: Number(e.currentTarget.value) })}
          >
            {[0.005, 0.01, 0.02, 0.05, 0.1].map((u) => (
              <option key={u} value={String(u)}>
                ± {formatNumber(u, locale, { digits: 2 })}
              </option>
            ))}
          </select>
        </label>
      </fieldset>

      <fieldset>
        <legend>Display</legend>
        <label class="field">
          <span>Theme</span>
          <select
            value={settings.theme}
            onChange={(e) => set({ theme: e.currentTarget.value as ThemeChoice })}
          >
            <option value="system">Follow the device</option>
            <option value="light">Light</option>
            <option value="dark">Dark</option>
            <option value="contrast">High contrast (bright sunlight)</option>
          </select>
        </label>
        <label class="field">
          <span>Number and date format</span>
          <select value={settings.locale} onChange={(e) => set({ locale: e.currentTarget.value })}>
            <option value="">This device’s language</option>
            <option value="en-GB">English (1,234.5)</option>
            <option value="de-DE">Deutsch (1.234,5)</option>
            <option value="fr-FR">Français (1 234,5)</option>
            <option value="es-ES">Español (1234,5)</option>
          </select>
        </label>
      </fieldset>

      <section class="panel" aria-labelledby="storage-h">
        <h2 id="storage-h">Storage on this device</h2>
        {storage ? (
          <ul class="plain">
            <li>
              Persistent storage:{' '}
              <strong>
                {storage.persisted === true ? 'yes' : storage.persisted === false ? 'no' : 'unknown'}
              </strong>
            </li>
            <li>
              Used: <strong>{formatBytes(storage.usage, locale)}</strong> of about{' '}
              <strong>{formatBytes(storage.quota, locale)}</strong> the browser allows
            </li>
          </ul>
        ) : (
          <p class="muted">Checking…</p>
        )}
        {warning && (
          <p class="issue warn" role="note">
            {warning}
          </p>
        )}
        {storage?.persisted !== true && (
          <button
            type="button"
            onClick={async () => {
              const ok = await askPersistence();
              setStorage(await storageState());
              notify({
                kind: ok ? 'info' : 'error',
                text: ok
                  ? 'The browser will keep Tufa’s data.'
                  : 'The browser did not grant persistent storage. Sync or export regularly.',
              });
            }}
          >
            Ask the browser to keep the data
          </button>
        )}
      </section>

      {sync && Sync ? (
        <Sync service={sync} locale={locale} onDataChanged={dataChanged} />
      ) : syncState === 'failed' ? (
        <p class="issue warn">
          sync-unavailable: Sharing with a server could not start on this device. Readings stay here; export
          them to move them.
        </p>
      ) : (
        <p class="muted">Loading sharing with a server…</p>
      )}
      {Data ? (
        <Data repo={repo} onDataChanged={dataChanged} settings={settings} />
      ) : (
        <p class={dataIssue ? 'issue error' : 'muted'}>{dataIssue ?? 'Loading import and export…'}</p>
      )}
    </section>
  );
}
