/** A plan saved with a reading, shown on its page: what was planned, the amounts, the predicted water. */

import { useApp } from '../app-context';
import { formatDateTime, formatNumber } from '../numbers';
import { outputDef } from '../outputs';
import { asSavedPlan, summarizeSavedPlan } from '../plan/saved-plan';

const MEASURE_WORDS: Record<string, string> = {
  mass_g: 'g',
  stock_volume_ml: 'mL of stock',
  moles: 'mol',
  purity_percent: '% purity',
};

export function SavedPlanView(props: { plan: unknown }) {
  const { locale } = useApp();
  const p = asSavedPlan(props.plan);
  if (!p) return <p class="muted">A plan is saved with this reading, in a form this version cannot read.</p>;
  const s = summarizeSavedPlan(p);
  const zone = Intl.DateTimeFormat().resolvedOptions().timeZone;
  const n = (x: number | undefined) => (x === undefined ? '—' : formatNumber(x, locale, { digits: 4 }));
  return (
    <div class="saved-plan" data-testid="saved-plan">
      <h3>Saved plan</h3>
      <p>
        {s.what} <span class="muted">(saved {formatDateTime(s.savedAt, zone, locale)})</span>
      </p>
      {s.amounts.length > 0 && (
        <ol data-testid="saved-plan-amounts">
          {s.amounts.map((a, i) => (
            <li key={i}>
              {a.chemical}:{' '}
              {Object.entries(a.measure)
                .map(([k, v]) => `${formatNumber(v, locale, { digits: 4 })} ${MEASURE_WORDS[k] ?? k}`)
                .join(', ')}
            </li>
          ))}
        </ol>
      )}
      {s.water.length > 0 && (
        <table class="kv" data-testid="saved-plan-water">
          <caption>Predicted water</caption>
          <thead>
            <tr>
              <th scope="col">output</th>
              <th scope="col">before</th>
              <th scope="col">after</th>
            </tr>
          </thead>
          <tbody>
            {s.water.map((w) => {
              const d = outputDef(w.key);
              return (
                <tr key={w.key}>
                  <th scope="row">
                    {d.label}
                    {d.unit ? ` (${d.unit})` : ''}
                  </th>
                  <td>{n(w.before)}</td>
                  <td>{n(w.after)}</td>
                </tr>
              );
            })}
          </tbody>
        </table>
      )}
      <p class="muted small">
        A model estimate: dose slowly, in steps, re-measure, and follow product labels, local codes and
        licensed practice.
      </p>
    </div>
  );
}
