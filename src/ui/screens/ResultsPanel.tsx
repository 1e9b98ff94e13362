/**
 * The computed numbers of a reading: the trade's headline answers first (in that trade's units),
 * then every output behind "All outputs", with the engine's warnings and the cautions that fit
 * the water.
 */

import { useEffect, useState } from 'preact/hooks';
import type { OutputUncertainty, SolveInput, SolveResult } from '../../chem/api';
import { isSolveError } from '../../chem/api';
import type { Profile } from '../../quantities';
import { quantityForKey } from '../../quantities';
import type { MeasuredValue } from '../../store/schema';
import { useApp } from '../app-context';
import { resultAlerts, resultCaution } from '../cautions';
import { solveInWorker } from '../engine-client';
import { airEquilibriumInput, degassingSentence, type HeadRow, headlineRows } from '../headline';
import { formatNumber, formatUncertainty } from '../numbers';
import { numericOutputs, pairLabel, visibleOutput } from '../outputs';
import { plainKey, plainWords } from '../plain-words';

function HeadValue({ row, locale }: { row: HeadRow; locale: string | undefined }) {
  const text = formatNumber(
    row.value,
    locale,
    row.decimals !== undefined ? { decimals: row.decimals } : { digits: row.digits ?? 3 },
  );
  return (
    <div class="output" data-head={row.id}>
      <dt>{row.label}</dt>
      <dd>
        <span class="value">
          {row.signed && row.value > 0 && !/^0([.,]0*)?$/.test(text) ? `+${text}` : text}
        </span>
        {row.unit && <span class="unit"> {row.unit}</span>}
      </dd>
    </div>
  );
}

export function ResultsPanel(props: {
  result: SolveResult | undefined;
  busy?: boolean;
  full?: boolean;
  profile?: Profile;
  values?: MeasuredValue[];
  /** The pH range of the reading's day at this site (two readings or more). */
  daySwing?: { lo: number; hi: number; n: number } | undefined;
  /** The engine request the result came from (the same water in air is solved from it). */
  request?: SolveInput | undefined;
}) {
  const { locale, settings } = useApp();
  const { result, profile } = props;
  const [air, setAir] = useState<Record<string, unknown>>();
  const airInput =
    result && !isSolveError(result) && profile?.trade === 'field' && props.request
      ? airEquilibriumInput(
          props.request,
          result as unknown as Record<string, unknown>,
          settings.atmospheric_pco2_uatm,
        )
      : undefined;
  const airKey = JSON.stringify(airInput ?? null);
  useEffect(() => {
    let live = true;
    if (!airInput) setAir(undefined);
    else
      solveInWorker(airInput).then((r) => {
        if (live) setAir(isSolveError(r) ? undefined : (r as unknown as Record<string, unknown>));
      });
    return () => {
      live = false;
    };
  }, [airKey]);

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
  const rows = numericOutputs(record).filter((r) => visibleOutput(r, record));
  // Warnings about an input are shown beside that input on the entry screen; here the rest.
  const general = result.warnings.filter(
    (w) =>
      (props.full || !w.field || !quantityForKey(w.field)) &&
      // A reef keeper's magnesium is a record of its own; the sea-water model takes ions from salinity.
      !(profile?.trade === 'aquarium' && w.code === 'fresh-keys-unused'),
  );
  const keptAsRecord =
    profile?.trade === 'aquarium' && result.warnings.some((w) => w.code === 'fresh-keys-unused');
  const alerts = resultAlerts(record, profile);
  const alkUnit = props.values?.find((v) => v.quantity === 'alkalinity')?.unit;
  const head = profile ? headlineRows(profile, record, props.values, alkUnit) : [];
  const sentence =
    profile?.trade === 'field'
      ? degassingSentence(record, air, (x, d) => formatNumber(x, locale, { decimals: d }))
      : undefined;
  const caution = resultCaution(profile);
  return (
    <section class={`results${props.busy ? ' busy' : ''}`} aria-live="polite" aria-label="Results">
      {head.length > 0 && (
        <dl class="outputs headline" aria-label="Answers">
          {head.map((row) => (
            <HeadValue key={row.id} row={row} locale={locale} />
          ))}
        </dl>
      )}
      {props.daySwing && (
        <p class="degassing" data-head="ph-swing">
          pH swung {formatNumber(props.daySwing.hi - props.daySwing.lo, locale, { decimals: 1 })} today (
          {formatNumber(props.daySwing.lo, locale, { decimals: 1 })}–
          {formatNumber(props.daySwing.hi, locale, { decimals: 1 })} in {props.daySwing.n} readings).
        </p>
      )}
      {sentence && (
        <p class="degassing" data-head="degassing">
          {sentence}
        </p>
      )}
      <details class="all-outputs" open={!profile}>
        <summary>All outputs ({rows.length})</summary>
        <dl class="outputs">
          {rows.map(({ def, value }) => {
            const opts =
              def.decimals !== undefined ? { decimals: def.decimals } : { digits: def.digits ?? 4 };
            const u = uncertainty?.[def.key];
            const uText =
              props.full && u ? formatUncertainty(u.standard_uncertainty, value, opts, locale) : '';
            return (
              // data-value: the engine's number in full, so tests (and copy tools) can compare exactly.
              <div class="output" key={def.key} data-key={def.key} data-value={String(value)}>
                <dt>{def.label}</dt>
                <dd>
                  <span class="value">{formatNumber(value, locale, opts)}</span>
                  {def.unit && <span class="unit"> {def.unit}</span>}
                  {uText && u && (
                    <span class="uncertainty" title={`largest contribution: ${plainKey(u.dominant_input)}`}>
                      {' '}
                      ± {uText}
                      <span class="small"> ({plainKey(u.dominant_input)})</span>
                    </span>
                  )}
                </dd>
              </div>
            );
          })}
        </dl>
        {typeof result.pco2_uatm === 'number' && record.pco2_excess_ratio === undefined && (
          <p class="small" data-key="pco2-air">
            pCO₂ is {formatNumber(result.pco2_uatm / settings.atmospheric_pco2_uatm, locale, { digits: 3 })} ×
            that of air ({formatNumber(settings.atmospheric_pco2_uatm, locale, { digits: 4 })} µatm, set in
            Settings).
          </p>
        )}
        <p class="muted small">
          Model: {result.model === 'fresh' ? 'fresh water' : 'sea or brackish water'}
          {typeof record.model_reason === 'string' ? ` (${plainWords(record.model_reason)})` : ''}
          {result.pair ? ` · solved from ${pairLabel(result.pair)}` : ''}
        </p>
        {props.full && uncertainty && (
          <p class="muted small">
            ± is one standard uncertainty from the published uncertainties of the constants and a pH reading
            uncertain by {formatNumber(settings.ph_uncertainty, locale, { digits: 2 })} (Settings); in
            brackets the largest contribution. Uncertainties smaller than the last digit shown are left out.
          </p>
        )}
      </details>
      {general.length > 0 && (
        <ul class="warnings">
          {general.map((w, k) => (
            <li key={`${w.code}-${k}`} class="issue warn">
              <code>{w.code}</code> {plainWords(w.message)}
            </li>
          ))}
        </ul>
      )}
      {keptAsRecord && (
        <p class="muted small">
          Magnesium and other ions are kept as measured; the sea-water model takes the water’s ions from its
          salinity.
        </p>
      )}
      {alerts.map((a) => (
        <p key={a} class="issue warn">
          {a}
        </p>
      ))}
      {caution && (
        <p class="caution" role="note">
          {caution}
        </p>
      )}
    </section>
  );
}
