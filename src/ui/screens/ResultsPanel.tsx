/** The computed numbers of a reading, with the engine's warnings and the dosing caution beside them. */

import type { OutputUncertainty, SolveResult } from '../../chem/api';
import { isSolveError } from '../../chem/api';
import { useApp } from '../app-context';
import { RESULT_CAUTION, resultAlerts } from '../cautions';
import { formatNumber } from '../numbers';
import { numericOutputs, pairLabel } from '../outputs';
import { plainKey, plainWords } from '../plain-words';
import { quantityForKey } from '../quantities';

export function ResultsPanel(props: { result: SolveResult | undefined; busy?: boolean; full?: boolean }) {
  const { locale, settings } = useApp();
  const { result } = props;
  if (!result) {
    return (
      <section class="results" aria-live="polite" aria-label="Results">
        <p class="muted">
          Enter temperature and two carbonate measurements (for example pH and alkalinity) to see the water’s
          carbonate system.
        </p>
      </section>
    );
  }
  if (isSolveError(result)) {
    return (
      <section class="results" aria-live="polite" aria-label="Results">
        <p class="issue error" role="alert">
          <strong>Cannot compute yet</strong> <code>{result.error.code}</code>:{' '}
          {plainWords(result.error.message)}
        </p>
      </section>
    );
  }
  const record = result as unknown as Record<string, unknown>;
  const uncertainty = record.uncertainty as Record<string, OutputUncertainty> | undefined;
  const rows = numericOutputs(record).filter((r) => props.full || r.def.headline);
  // Warnings about an input are shown beside that input on the entry screen; here the rest.
  const general = result.warnings.filter((w) => props.full || !w.field || !quantityForKey(w.field));
  const alerts = resultAlerts(record);
  return (
    <section class={`results${props.busy ? ' busy' : ''}`} aria-live="polite" aria-label="Results">
      <dl class="outputs">
        {rows.map(({ def, value }) => (
          // data-value: the engine's number in full, so tests (and copy tools) can compare exactly.
          <div class="output" key={def.key} data-key={def.key} data-value={String(value)}>
            <dt>{def.label}</dt>
            <dd>
              <span class="value">
                {formatNumber(
                  value,
                  locale,
                  def.decimals !== undefined ? { decimals: def.decimals } : { digits: def.digits ?? 4 },
                )}
              </span>
              {def.unit && <span class="unit"> {def.unit}</span>}
              {props.full && uncertainty?.[def.key] && uncertainty[def.key]!.standard_uncertainty > 0 && (
                <span
                  class="uncertainty"
                  title={`largest contribution: ${plainKey(uncertainty[def.key]!.dominant_input)}`}
                >
                  {' '}
                  ± {formatNumber(uncertainty[def.key]!.standard_uncertainty, locale, { digits: 2 })}
                  <span class="small"> ({plainKey(uncertainty[def.key]!.dominant_input)})</span>
                </span>
              )}
            </dd>
          </div>
        ))}
      </dl>
      {typeof result.pco2_uatm === 'number' && record.pco2_excess_ratio === undefined && (
        <p class="small" data-key="pco2-air">
          pCO₂ is {formatNumber(result.pco2_uatm / settings.atmospheric_pco2_uatm, locale, { digits: 3 })} ×
          that of air ({formatNumber(settings.atmospheric_pco2_uatm, locale, { digits: 4 })} µatm, set in
          Settings).
        </p>
      )}
      <p class="muted small">
        Model: {result.model}
        {typeof record.model_reason === 'string' ? ` (${plainWords(record.model_reason)})` : ''}
        {result.pair ? ` · solved from ${pairLabel(result.pair)}` : ''}
      </p>
      {general.length > 0 && (
        <ul class="warnings">
          {general.map((w, k) => (
            <li key={`${w.code}-${k}`} class="issue warn">
              <code>{w.code}</code> {plainWords(w.message)}
            </li>
          ))}
        </ul>
      )}
      {alerts.map((a) => (
        <p key={a} class="issue warn">
          {a}
        </p>
      ))}
      {typeof record.treatment_caution === 'string' && (
        <p class="caution" role="note">
          {record.treatment_caution}
        </p>
      )}
      {props.full && uncertainty && (
        <p class="muted small">
          ± is one standard uncertainty from the published uncertainties of the constants and a pH reading
          uncertain by {formatNumber(settings.ph_uncertainty, locale, { digits: 2 })} (Settings); in brackets
          the largest contribution.
        </p>
      )}
      <p class="caution" role="note">
        {RESULT_CAUTION}
      </p>
    </section>
  );
}
