/** The home screen: the user's sites, a way to add one, and the Demo scenario. */

import { useEffect, useState } from 'preact/hooks';
import { storeIssue } from '../../store/errors';
import type { SiteDoc } from '../../store/schema';
import { useApp } from '../app-context';
import { demoDocs } from '../demo';

const KIND_LABEL: Record<SiteDoc['kind'], string> = {
  stream: 'Stream',
  spring: 'Spring',
  well: 'Well',
  lake: 'Lake',
  pond: 'Pond',
  tank: 'Freshwater tank',
  other: 'Other',
  reef: 'Reef tank',
  raceway: 'Raceway',
  recirculating: 'Recirculating system',
};

export function kindLabel(k: SiteDoc['kind']): string {
  return KIND_LABEL[k];
}

export function SitesScreen() {
  const { repo, dataVersion, dataChanged, notify, reportError } = useApp();
  const [sites, setSites] = useState<SiteDoc[]>();
  const [counts, setCounts] = useState<Record<string, number>>({});
  const [loadingDemo, setLoadingDemo] = useState(false);

  useEffect(() => {
    repo
      .listSites()
      .then(async (list) => {
        setSites(list);
        const c: Record<string, number> = {};
        for (const s of list) c[s.id] = await repo.countReadings(s.id);
        setCounts(c);
      })
      .catch((e) => reportError(storeIssue(e)));
  }, [dataVersion]);

  async function loadDemo() {
    setLoadingDemo(true);
    try {
      const docs = demoDocs();
      // Demo data is local only: never queued for sync to a shared server.
      await repo.bulkPut(docs, { queue: false });
      dataChanged();
      notify({
        kind: 'info',
        text: `Demo loaded: ${docs.filter((d) => d.type === 'site').length} invented sites with a season of readings.`,
      });
    } catch (e) {
      reportError(storeIssue(e));
    } finally {
      setLoadingDemo(false);
    }
  }

  return (
    <section aria-labelledby="sites-h">
      <div class="titlebar">
        <h1 id="sites-h">Sites</h1>
        <a class="button primary" href="#/sites/new">
          New site
        </a>
      </div>
      {sites && sites.length === 0 && (
        <div class="empty">
          <p>
            No sites yet. A site is a place you sample again and again: a spring, a well, a lake station, a
            pond, a tank.
          </p>
          <p>Add your first site, or load the demo to look around with invented data.</p>
        </div>
      )}
      <ul class="cards">
        {(sites ?? []).map((s) => (
          <li key={s.id}>
            <a class="card" href={`#/site/${s.id}`}>
              <span class="card-title">{s.name}</span>
              <span class="card-meta">
                {kindLabel(s.kind)} · {counts[s.id] ?? '…'} {counts[s.id] === 1 ? 'reading' : 'readings'}
              </span>
            </a>
          </li>
        ))}
      </ul>
      <div class="actions">
        <button type="button" onClick={loadDemo} disabled={loadingDemo}>
          {loadingDemo ? 'Loading demo…' : 'Load demo scenario'}
        </button>
      </div>
    </section>
  );
}
