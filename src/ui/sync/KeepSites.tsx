/**
 * Partial sync: which sites this device keeps. "All sites" pulls everything; "Only these" pulls
 * every site's name (to choose from) and only the chosen sites' readings. Readings already on the
 * device stay; what the device changes is always sent.
 */

import { useContext, useEffect, useState } from 'preact/hooks';
import type { SiteDoc } from '../../store/schema';
import type { ConnectionSettings, SyncService } from '../../sync/sync-service';
import { AppContext } from '../app-context';

export function KeepSites({
  service,
  connection,
  onSaved,
}: {
  service: SyncService;
  connection: ConnectionSettings;
  onSaved: (keepSites: string[] | undefined) => void;
}) {
  // Outside the app (a panel shown on its own) there is no site list to choose from.
  const app = useContext(AppContext);
  const repo = app?.repo;
  const dataVersion = app?.dataVersion;
  const [sites, setSites] = useState<SiteDoc[]>([]);
  const [some, setSome] = useState(connection.keepSites !== undefined);
  const [chosen, setChosen] = useState(new Set(connection.keepSites ?? []));
  const [saved, setSaved] = useState(false);
  useEffect(() => {
    repo?.listSites().then((s) => setSites([...s].sort((a, b) => a.name.localeCompare(b.name))));
  }, [repo, dataVersion]);
  const save = async (e: Event) => {
    e.preventDefault();
    const ids = some ? [...chosen] : undefined;
    await service.setKeepSites(ids);
    onSaved(ids);
    setSaved(true);
    await service.syncNow();
  };
  const choose = (only: boolean) => {
    setSome(only);
    setSaved(false);
  };
  const toggle = (id: string, on: boolean) => {
    const next = new Set(chosen);
    if (on) next.add(id);
    else next.delete(id);
    setChosen(next);
    setSaved(false);
  };
  if (!repo) return null;
  return (
    <form class="panel" onSubmit={save} aria-labelledby="keep-h">
      <h3 id="keep-h">Sites on this device</h3>
      <label class="check">
        <input type="radio" name="keep" checked={!some} onChange={() => choose(false)} />
        <span>All sites</span>
      </label>
      <label class="check">
        <input type="radio" name="keep" checked={some} onChange={() => choose(true)} />
        <span>Only these sites (their readings are fetched; every site’s name stays listed)</span>
      </label>
      {some && (
        <fieldset class="keep-sites">
          <legend>Sites to keep</legend>
          {sites.map((s) => (
            <label class="check" key={s.id}>
              <input
                type="checkbox"
                checked={chosen.has(s.id)}
                onChange={(e) => toggle(s.id, e.currentTarget.checked)}
              />
              <span>{s.name}</span>
            </label>
          ))}
        </fieldset>
      )}
      <p class="muted small">
        Readings already on this device stay, and everything changed here is still sent.
      </p>
      <div class="actions">
        <button type="submit">
          Keep {some ? `${chosen.size} ${chosen.size === 1 ? 'site' : 'sites'}` : 'all sites'}
        </button>
        {saved && <span role="status">Saved; fetching.</span>}
      </div>
    </form>
  );
}
