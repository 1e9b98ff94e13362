/** Creating or editing a site: name, kind of water, optional location, defaults for its readings. */

import { useEffect, useState } from 'preact/hooks';
import type { Issue } from '../../chem/errors';
import { TRADES, type Trade, tradeOfKind } from '../../quantities';
import { storeIssue } from '../../store/errors';
import {
  SITE_KINDS,
  type SiteDefaults,
  type SiteDoc,
  type SiteKind,
  type SiteLocation,
} from '../../store/schema';
import { useApp } from '../app-context';
import { formatNumber, parseDecimal } from '../numbers';
import { go } from '../router';
import { kindLabel } from './SitesScreen';

export function SiteFormScreen(props: { siteId?: string }) {
  const { repo, locale, dataChanged, notify } = useApp();
  const [existing, setExisting] = useState<SiteDoc>();
  const [name, setName] = useState('');
  const [kind, setKind] = useState<SiteKind>('stream');
  /** Empty: the trade follows the kind of water. */
  const [trade, setTrade] = useState<Trade | ''>('');
  const [model, setModel] = useState<NonNullable<SiteDefaults['model']>>('auto');
  const [salinity, setSalinity] = useState('');
  const [lat, setLat] = useState('');
  const [lon, setLon] = useState('');
  const [locSource, setLocSource] = useState<SiteLocation['source']>('typed');
  const [notes, setNotes] = useState('');
  const [issue, setIssue] = useState<Issue>();

  useEffect(() => {
    if (!props.siteId) return;
    repo.getSite(props.siteId).then((s) => {
      if (!s) return;
      setExisting(s);
      setName(s.name);
      setKind(s.kind);
      setModel(s.defaults.model ?? 'auto');
      setTrade(s.defaults.trade ?? '');
      setSalinity(
        s.defaults.salinity !== undefined ? formatNumber(s.defaults.salinity, locale, { digits: 6 }) : '',
      );
      if (s.location) {
        setLat(String(s.location.latitude));
        setLon(String(s.location.longitude));
        setLocSource(s.location.source);
      }
      setNotes(s.notes);
    });
  }, [props.siteId]);

  function locate() {
    if (!('geolocation' in navigator)) {
      setIssue({
        code: 'geolocation-unavailable',
        message: 'This device cannot report its location; type it instead.',
      });
      return;
    }
    navigator.geolocation.getCurrentPosition(
      (p) => {
        setLat(p.coords.latitude.toFixed(5));
        setLon(p.coords.longitude.toFixed(5));
        setLocSource('device');
      },
      (e) => setIssue({ code: 'geolocation-failed', message: `Location not available: ${e.message}` }),
      { enableHighAccuracy: true, timeout: 20000 },
    );
  }

  async function save(ev: Event) {
    ev.preventDefault();
    setIssue(undefined);
    if (name.trim() === '') return setIssue({ code: 'site-name-missing', message: 'Give the site a name.' });
    const defaults: SiteDefaults = { ...(existing?.defaults ?? {}), model };
    if (trade && trade !== tradeOfKind(kind)) defaults.trade = trade;
    else delete defaults.trade;
    if (salinity.trim() !== '') {
      const p = parseDecimal(salinity, locale);
      if (!p.ok) return setIssue({ code: p.issue.code, message: `Salinity: ${p.issue.message}` });
      defaults.salinity = p.value;
    } else delete defaults.salinity;
    let location: SiteLocation | undefined;
    if (lat.trim() !== '' || lon.trim() !== '') {
      const a = parseDecimal(lat, 'en');
      const b = parseDecimal(lon, 'en');
      if (!a.ok || !b.ok || Math.abs(a.value) > 90 || Math.abs(b.value) > 180) {
        return setIssue({
          code: 'site-location-invalid',
          message: 'Latitude must be −90…90 and longitude −180…180 (decimal degrees).',
        });
      }
      location = { latitude: a.value, longitude: b.value, source: locSource };
    }
    try {
      const fields = { name: name.trim(), kind, defaults, notes, ...(location ? { location } : {}) };
      const doc = existing ? await repo.updateSite(existing.id, fields) : await repo.createSite(fields);
      dataChanged();
      notify({ kind: 'info', text: existing ? 'Site updated.' : 'Site created.' });
      go({ name: 'site', siteId: doc.id });
    } catch (e) {
      setIssue(storeIssue(e));
    }
  }

  return (
    <form onSubmit={save} aria-labelledby="site-form-h" class="stack">
      <h1 id="site-form-h">{existing ? 'Edit site' : 'New site'}</h1>
      <label class="field">
        <span>Name</span>
        <input type="text" value={name} onInput={(e) => setName(e.currentTarget.value)} required />
      </label>
      <label class="field">
        <span>Kind of water</span>
        <select value={kind} onChange={(e) => setKind(e.currentTarget.value as SiteKind)}>
          {SITE_KINDS.map((k) => (
            <option key={k} value={k}>
              {kindLabel(k)}
            </option>
          ))}
        </select>
      </label>
      <label class="field">
        <span>Trade (sets units, answers and cautions)</span>
        <select value={trade || tradeOfKind(kind)} onChange={(e) => setTrade(e.currentTarget.value as Trade)}>
          {TRADES.map((t) => (
            <option key={t.id} value={t.id}>
              {t.label}
            </option>
          ))}
        </select>
      </label>
      <label class="field">
        <span>Water model</span>
        <select value={model} onChange={(e) => setModel(e.currentTarget.value as typeof model)}>
          <option value="auto">From salinity or conductance</option>
          <option value="fresh">Fresh water (activities)</option>
          <option value="saline">Sea or brackish water</option>
        </select>
      </label>
      <label class="field">
        <span>Usual salinity (optional, PSS-78)</span>
        <input
          type="text"
          inputMode="decimal"
          value={salinity}
          onInput={(e) => setSalinity(e.currentTarget.value)}
        />
      </label>
      <fieldset class="inline">
        <legend>Location (optional, decimal degrees)</legend>
        <label class="field">
          <span>Latitude</span>
          <input
            type="text"
            inputMode="decimal"
            value={lat}
            onInput={(e) => {
              setLat(e.currentTarget.value);
              setLocSource('typed');
            }}
          />
        </label>
        <label class="field">
          <span>Longitude</span>
          <input
            type="text"
            inputMode="decimal"
            value={lon}
            onInput={(e) => {
              setLon(e.currentTarget.value);
              setLocSource('typed');
            }}
          />
        </label>
        <button type="button" onClick={locate}>
          Use this device’s location
        </button>
      </fieldset>
      <label class="field">
        <span>Notes</span>
        <textarea rows={3} value={notes} onInput={(e) => setNotes(e.currentTarget.value)} />
      </label>
      {issue && (
        <p class="issue error" role="alert">
          <code>{issue.code}</code> {issue.message}
        </p>
      )}
      <div class="actions">
        <button type="submit" class="primary">
          Save site
        </button>
        <a class="button" href={existing ? `#/site/${existing.id}` : '#/'}>
          Cancel
        </a>
      </div>
    </form>
  );
}
