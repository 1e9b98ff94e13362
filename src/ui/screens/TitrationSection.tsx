/** The field-titration part of the reading form, and the summary of a reduction. */

import type { Issue } from '../../chem/errors';
import { ACID_HANDLING_CAUTION } from '../../chem/titration/acidCautions';
import type { TitrateOutcome } from '../../chem/titration/titrate';
import {
  DEFAULT_TITRATION_METHOD,
  TITRATION_METHODS,
  type TitrationMethod,
} from '../../chem/titration/types';
import type { TitrationRecord } from '../../store/schema';
import { useApp } from '../app-context';
import { formatNumber, parseDecimal } from '../numbers';
import { METHOD_LABELS, parsePoints } from '../titration';

export interface TitrationForm {
  sampleVolume: string;
  normality: string;
  correction: string;
  method: TitrationMethod;
  endpoint: string;
  pointsText: string;
}

export const EMPTY_TITRATION: TitrationForm = {
  sampleVolume: '',
  normality: '',
  correction: '',
  method: DEFAULT_TITRATION_METHOD,
  endpoint: '',
  pointsText: '',
};

export function formFromRecord(r: TitrationRecord | undefined): TitrationForm {
  if (!r) return EMPTY_TITRATION;
  return {
    sampleVolume: String(r.sampleVolumeMl),
    normality: String(r.titrantNormality),
    correction: r.correctionFactor !== undefined ? String(r.correctionFactor) : '',
    method: (r.method as TitrationMethod | undefined) ?? 'gran',
    endpoint: r.endpointPh !== undefined ? String(r.endpointPh) : '',
    pointsText: r.points.map((p) => `${p.volumeMl}\t${p.ph}`).join('\n'),
  };
}

/** The record to store, or the problems that stop it; `undefined` record when nothing was entered. */
export function recordFromForm(
  f: TitrationForm,
  locale: string | undefined,
): { record?: TitrationRecord; issues: Issue[] } {
  if ([f.sampleVolume, f.normality, f.correction, f.endpoint, f.pointsText].every((s) => s.trim() === ''))
    return { issues: [] };
  const issues: Issue[] = [];
  const num = (text: string, label: string, required: boolean): number | undefined => {
    if (text.trim() === '') {
      if (required)
        issues.push({ code: 'titration-field-missing', message: `${label}: required for a titration.` });
      return undefined;
    }
    const p = parseDecimal(text, locale);
    if (!p.ok) {
      issues.push({ code: p.issue.code, message: `${label}: ${p.issue.message}` });
      return undefined;
    }
    return p.value;
  };
  const sampleVolumeMl = num(f.sampleVolume, 'Sample volume', true);
  const titrantNormality = num(f.normality, 'Acid normality', true);
  const correctionFactor = num(f.correction, 'Correction factor', false);
  const endpointPh = num(f.endpoint, 'Endpoint pH', false);
  const { points, issues: pointIssues } = parsePoints(f.pointsText, locale);
  issues.push(...pointIssues);
  if (points.length === 0)
    issues.push({
      code: 'titration-no-points',
      message: 'Enter the titration points: acid volume (mL) and pH per line.',
    });
  if (issues.length || sampleVolumeMl === undefined || titrantNormality === undefined) return { issues };
  const record: TitrationRecord = { sampleVolumeMl, titrantNormality, method: f.method, points };
  if (correctionFactor !== undefined) record.correctionFactor = correctionFactor;
  if (endpointPh !== undefined) record.endpointPh = endpointPh;
  return { record, issues };
}

export function TitrationSummary(props: { outcome: TitrateOutcome | undefined }) {
  const { locale } = useApp();
  const o = props.outcome;
  if (!o) return null;
  if ('error' in o) {
    return (
      <p class="issue error" role="alert">
        <code>{o.error.code}</code> {o.error.message}
      </p>
    );
  }
  return (
    <div class="titration-result" data-testid="titration-result">
      <dl class="outputs">
        <div class="output" data-key="titration-alkalinity">
          <dt>Alkalinity ({METHOD_LABELS[o.method].split(' (')[0]})</dt>
          <dd>
            <span class="value">{formatNumber(o.alkalinity_meq_l, locale, { digits: 4 })}</span>
            <span class="unit"> meq/L</span>
          </dd>
        </div>
        <div class="output">
          <dt>as CaCO₃</dt>
          <dd>
            <span class="value">{formatNumber(o.alkalinity_mg_l_caco3, locale, { digits: 4 })}</span>
            <span class="unit"> mg/L</span>
          </dd>
        </div>
        <div class="output">
          <dt>Equivalence volume</dt>
          <dd>
            <span class="value">{formatNumber(o.equivalence_volume_ml, locale, { digits: 4 })}</span>
            <span class="unit"> mL</span>
          </dd>
        </div>
        <div class="output">
          <dt>Fit r²</dt>
          <dd>
            <span class="value">
              {o.fit.r2 === null ? '—' : formatNumber(o.fit.r2, locale, { decimals: 4 })}
            </span>
            <span class="unit"> ({o.fit.points_used.length} points)</span>
          </dd>
        </div>
        {o.confidence.level !== 'not_estimated' && (
          <div class="output" data-key="titration-confidence">
            <dt>Confidence</dt>
            <dd>
              <span class="value">{o.confidence.level}</span>
              {o.confidence.alkalinity_se_meq_l !== undefined && (
                <span class="unit">
                  {' '}
                  (± {formatNumber(o.confidence.alkalinity_se_meq_l, locale, { digits: 2 })} meq/L)
                </span>
              )}
            </dd>
          </div>
        )}
      </dl>
      {o.warnings.map((w, i) => (
        <p key={`${w.code}-${i}`} class="issue warn">
          <code>{w.code}</code> {w.message}
        </p>
      ))}
    </div>
  );
}

export function TitrationFields(props: {
  form: TitrationForm;
  onChange: (f: TitrationForm) => void;
  outcome: TitrateOutcome | undefined;
  issues: Issue[];
}) {
  const f = props.form;
  const set = (patch: Partial<TitrationForm>) => props.onChange({ ...f, ...patch });
  const hasAny = f.pointsText.trim() !== '' || f.sampleVolume.trim() !== '';
  return (
    <details class="titration" open={hasAny}>
      <summary>Field titration (optional)</summary>
      <p class="caution" role="note">
        {ACID_HANDLING_CAUTION}
      </p>
      <div class="two">
        <label class="field">
          <span>Sample volume (mL)</span>
          <input
            type="text"
            inputMode="decimal"
            value={f.sampleVolume}
            onInput={(e) => set({ sampleVolume: e.currentTarget.value })}
          />
        </label>
        <label class="field">
          <span>Acid normality (eq/L)</span>
          <input
            type="text"
            inputMode="decimal"
            value={f.normality}
            onInput={(e) => set({ normality: e.currentTarget.value })}
          />
        </label>
        <label class="field">
          <span>Correction factor (optional)</span>
          <input
            type="text"
            inputMode="decimal"
            value={f.correction}
            onInput={(e) => set({ correction: e.currentTarget.value })}
          />
        </label>
        <label class="field">
          <span>Endpoint pH (optional, default 4.5)</span>
          <input
            type="text"
            inputMode="decimal"
            value={f.endpoint}
            onInput={(e) => set({ endpoint: e.currentTarget.value })}
          />
        </label>
      </div>
      <label class="field">
        <span>Reduction</span>
        <select value={f.method} onChange={(e) => set({ method: e.currentTarget.value as TitrationMethod })}>
          {TITRATION_METHODS.map((m) => (
            <option key={m} value={m}>
              {METHOD_LABELS[m]}
            </option>
          ))}
        </select>
      </label>
      <label class="field">
        <span>Points: acid added (mL) and pH, one pair per line</span>
        <textarea
          rows={6}
          value={f.pointsText}
          spellcheck={false}
          onInput={(e) => set({ pointsText: e.currentTarget.value })}
        />
      </label>
      {props.issues.map((i, k) => (
        <p key={`${i.code}-${k}`} class="issue error">
          <code>{i.code}</code> {i.message}
        </p>
      ))}
      <TitrationSummary outcome={props.outcome} />
      <p class="muted small">
        When no alkalinity is entered above, the titration’s alkalinity is used for the results.
      </p>
    </details>
  );
}
