/**
 * Planning panel for one reading: pick an action (add a chemical, exchange CO2, mix, or dose to a
 * target), see the water before and after side by side for every output and the speciation of
 * DIC before and after, with the cautions of the plan, and save the plan with the reading.
 * Self-contained: its styles are inline and read CSS variables with fallbacks, so it follows the
 * app's theme when mounted inside it.
 */

import { useEffect, useState } from 'preact/hooks';
import type { SolveOutput } from '../../chem/api';
import { CHEMICAL_IDS, CHEMICALS, type ChemicalId } from '../../chem/plan/chemicals';
import { TARGET_QUANTITIES, type TargetQuantity } from '../../chem/plan/inverse';
import { isPlanError, type PlanOutput, type PlanResult } from '../../chem/plan/plan';
import { planInWorker } from '../engine-client';
import { plainWords } from '../plain-words';
import {
  type AmountUnit,
  change,
  compareRows,
  DEFAULT_FORM,
  FieldError,
  massText,
  type PanelAction,
  type PanelForm,
  planRequest,
  show,
  speciation,
  volumeText,
} from './plan-model';
import { formOfSavedPlan, type SavedPlan } from './saved-plan';

export type { SavedPlan } from './saved-plan';

export interface PlanPanelProps {
  /** The reading's solve input. */
  reading: Readonly<Record<string, unknown>>;
  onSave: (plan: SavedPlan) => void;
  /** Water volume to start with, litres. */
  volumeL?: number;
  /** A plan saved with the reading: the panel opens with its fields and shows it again. */
  saved?: SavedPlan;
  /** The site's trade: which limits the plan checks and which cautions it lists. */
  trade?: 'field' | 'aquarium' | 'aquaculture';
  /** The engine call; defaults to `plan()` in the engine worker (a search never blocks the page). */
  engine?: (request: unknown) => PlanResult | Promise<PlanResult>;
}

const v = (name: string, fallback: string) => `var(--${name}, ${fallback})`;
const FG = v('tufa-fg', '#1b1f23');
const BG = v('tufa-bg', '#ffffff');
const MUTED = v('tufa-muted', '#57606a');
const ACCENT = v('tufa-accent', '#0b6e4f');
const DANGER = v('tufa-danger', '#b42318');
const BORDER = v('tufa-border', '#d0d7de');

const S = {
  panel: { color: FG, background: BG, font: 'inherit', maxWidth: '60rem', padding: '0.75rem' },
  grid: { display: 'grid', gridTemplateColumns: 'repeat(auto-fit, minmax(12rem, 1fr))', gap: '0.75rem' },
  label: { display: 'flex', flexDirection: 'column' as const, gap: '0.25rem', fontSize: '0.95rem' },
  input: {
    minHeight: '44px',
    padding: '0 0.5rem',
    border: `1px solid ${BORDER}`,
    borderRadius: '6px',
    color: FG,
    background: BG,
    font: 'inherit',
  },
  button: {
    minHeight: '44px',
    minWidth: '44px',
    padding: '0 1rem',
    border: `2px solid ${ACCENT}`,
    borderRadius: '6px',
    font: 'inherit',
    cursor: 'pointer',
  },
  table: { borderCollapse: 'collapse' as const, width: '100%', fontVariantNumeric: 'tabular-nums' },
  cell: { borderBottom: `1px solid ${BORDER}`, padding: '0.35rem 0.3rem', textAlign: 'right' as const },
  error: { color: DANGER, fontWeight: 600 },
};

const ACTION_LABELS: Record<PanelAction, string> = {
  reach: 'Dose to a target',
  add: 'Add or remove a chemical',
  equilibrate: 'Aerate or add CO₂ gas',
  mix: 'Mix with another water',
};

const TARGET_LABELS: Partial<Record<TargetQuantity, string>> = {
  alkalinity_dkh: 'alkalinity (dKH)',
  alkalinity_meq_l: 'alkalinity (meq/L)',
  alkalinity_mg_l_caco3: 'alkalinity (mg/L as CaCO₃)',
  alkalinity_umol_kg: 'alkalinity (µmol/kg)',
  ph: 'pH',
  omega_aragonite: 'Ω aragonite',
  omega_calcite: 'Ω calcite',
  co2_mg_l: 'dissolved CO₂ (mg/L)',
  co2_umol_kg: 'dissolved CO₂ (µmol/kg)',
  pco2_uatm: 'pCO₂ (µatm)',
  dic_umol_kg: 'DIC (µmol/kg)',
  calcium_mg_l: 'calcium (mg/L)',
  calcium_umol_kg: 'calcium (µmol/kg)',
};

/** Runs the planner for the form; a field that cannot be read or an engine refusal becomes a problem. */
async function runPlan(
  reading: Readonly<Record<string, unknown>>,
  form: PanelForm,
  trade: PlanPanelProps['trade'],
  engine: (request: unknown) => PlanResult | Promise<PlanResult>,
): Promise<
  | { result: { request: Record<string, unknown>; out: PlanOutput } }
  | { problem: { field?: string; text: string } }
> {
  try {
    const request = { ...planRequest(reading, form), ...(trade ? { trade } : {}) };
    const r = await engine(request);
    if (isPlanError(r)) return { problem: { text: `${plainWords(r.error.message)} (${r.error.code})` } };
    return { result: { request, out: r } };
  } catch (err) {
    if (err instanceof FieldError) return { problem: { field: err.field, text: err.message } };
    return { problem: { text: `Unexpected failure: ${(err as Error).message}` } };
  }
}

export function PlanPanel({
  reading,
  onSave,
  volumeL,
  saved: savedPlan,
  trade,
  engine = planInWorker,
}: PlanPanelProps) {
  const [form, setForm] = useState<PanelForm>(() =>
    savedPlan
      ? formOfSavedPlan(savedPlan)
      : { ...DEFAULT_FORM, volumeL: volumeL === undefined ? DEFAULT_FORM.volumeL : String(volumeL) },
  );
  const [result, setResult] = useState<{ request: Record<string, unknown>; out: PlanOutput } | undefined>();
  const [problem, setProblem] = useState<{ field?: string; text: string } | undefined>();
  const [saved, setSaved] = useState(savedPlan !== undefined);
  const showRun = (r: Awaited<ReturnType<typeof runPlan>>) => {
    setResult('result' in r ? r.result : undefined);
    setProblem('problem' in r ? r.problem : undefined);
  };
  // A saved plan is shown again, computed now from this reading's request (its "before" is today's truth).
  useEffect(() => {
    if (savedPlan) void runPlan(reading, form, trade, engine).then(showRun);
  }, []);

  const set = <K extends keyof PanelForm>(k: K, value: PanelForm[K]) => {
    setForm({ ...form, [k]: value });
    setSaved(false);
  };
  const run = async (e: Event) => {
    e.preventDefault();
    showRun(await runPlan(reading, form, trade, engine));
  };

  const field = (k: keyof PanelForm, label: string, hint?: string) => (
    <label style={S.label}>
      <span>{label}</span>
      <input
        style={{ ...S.input, borderColor: problem?.field === k ? DANGER : undefined }}
        type="text"
        inputMode="decimal"
        value={form[k] as string}
        aria-invalid={problem?.field === k}
        aria-describedby={problem?.field === k ? 'plan-problem' : undefined}
        onInput={(e) => set(k, (e.currentTarget as HTMLInputElement).value as never)}
      />
      {hint && <small style={{ color: MUTED }}>{hint}</small>}
    </label>
  );
  const needsChemical = form.action === 'add' || form.action === 'reach';

  return (
    <section style={S.panel} aria-labelledby="plan-title">
      <h2 id="plan-title" style={{ marginTop: 0 }}>
        Plan a change
      </h2>
      <form onSubmit={run}>
        <div style={S.grid}>
          <label style={S.label}>
            <span>What to do</span>
            <select
              style={S.input}
              value={form.action}
              onChange={(e) => set('action', (e.currentTarget as HTMLSelectElement).value as PanelAction)}
            >
              {(Object.keys(ACTION_LABELS) as PanelAction[]).map((a) => (
                <option value={a}>{ACTION_LABELS[a]}</option>
              ))}
            </select>
          </label>
          {!(form.areaM2 || form.depthM) && field('volumeL', 'Water volume (L)')}
          {trade === 'aquaculture' &&
            field('areaM2', 'Pond area (m²)', 'with the depth, instead of the volume')}
          {trade === 'aquaculture' && field('depthM', 'Mean depth (m)')}
          {needsChemical && (
            <label style={S.label}>
              <span>Chemical</span>
              <select
                style={S.input}
                value={form.chemical}
                onChange={(e) => set('chemical', (e.currentTarget as HTMLSelectElement).value as ChemicalId)}
              >
                {CHEMICAL_IDS.map((id) => (
                  <option value={id}>
                    {CHEMICALS[id].name} ({CHEMICALS[id].formula})
                  </option>
                ))}
              </select>
            </label>
          )}
          {needsChemical && (
            <label style={S.label}>
              <span>{form.action === 'add' ? 'Amount in' : 'Dose as'}</span>
              <select
                style={S.input}
                value={form.amountUnit}
                onChange={(e) =>
                  set('amountUnit', (e.currentTarget as HTMLSelectElement).value as AmountUnit)
                }
              >
                <option value="g">grams of product</option>
                {form.action === 'add' && <option value="mol">moles</option>}
                <option value="ml_stock">mL of a stock solution</option>
              </select>
            </label>
          )}
          {form.action === 'add' && field('amount', 'Amount', 'negative removes CO₂ or precipitates CaCO₃')}
          {needsChemical && form.amountUnit === 'g' && field('purityPercent', 'Purity (%)')}
          {needsChemical && form.amountUnit === 'ml_stock' && field('stockMolL', 'Stock strength (mol/L)')}
          {form.action === 'equilibrate' && field('targetPco2', 'Gas pCO₂ (µatm)', '420 is outdoor air')}
          {form.action === 'equilibrate' && field('fractionPercent', 'Share of the way to equilibrium (%)')}
          {form.action === 'reach' && (
            <label style={S.label}>
              <span>Target quantity</span>
              <select
                style={S.input}
                value={form.targetQuantity}
                onChange={(e) =>
                  set('targetQuantity', (e.currentTarget as HTMLSelectElement).value as TargetQuantity)
                }
              >
                {TARGET_QUANTITIES.map((q) => (
                  <option value={q}>{TARGET_LABELS[q] ?? q}</option>
                ))}
              </select>
            </label>
          )}
          {form.action === 'reach' && field('targetValue', 'Target value')}
          {form.action === 'reach' &&
            field('maxPhStep', 'Largest pH change per step', 'common practice: about 0.2')}
          {form.action === 'reach' &&
            field(
              'maxAlkStepDkh',
              'Largest alkalinity change per step (dKH)',
              'common practice: about 1 a day',
            )}
          {form.action === 'mix' && field('mixVolumeL', 'Other water volume (L)')}
          {form.action === 'mix' && field('mixTemperatureC', 'Other water temperature (°C)')}
          {form.action === 'mix' && field('mixSalinity', 'Other water salinity (blank if fresh)')}
          {form.action === 'mix' && field('mixAlkalinity', 'Other water alkalinity (µmol/kg)')}
          {form.action === 'mix' && field('mixPh', 'Other water pH')}
        </div>
        <p>
          <button type="submit" style={{ ...S.button, background: ACCENT, color: '#fff' }}>
            Show the result
          </button>
        </p>
      </form>
      <div aria-live="polite">
        {problem && (
          <p id="plan-problem" role="alert" style={S.error}>
            {problem.text}
          </p>
        )}
      </div>
      {result && (
        <PlanResultView
          out={result.out}
          trade={trade}
          areaM2={
            typeof result.request.volume_l === 'number' && form.areaM2
              ? Number(form.areaM2.replace(',', '.'))
              : undefined
          }
        />
      )}
      {result && (
        <p>
          <button
            type="button"
            style={{ ...S.button, background: BG, color: ACCENT }}
            onClick={() => {
              onSave({
                request: result.request,
                result: result.out,
                saved_at: new Date().toISOString(),
                form,
              });
              setSaved(true);
            }}
          >
            Save plan with this reading
          </button>
          {saved && <span style={{ marginLeft: '0.75rem', color: MUTED }}>Saved.</span>}
        </p>
      )}
    </section>
  );
}

/** The rows each trade reads first in the before/after table. */
const FIRST_ROWS: Record<NonNullable<PlanPanelProps['trade']>, string[]> = {
  field: ['pco2_uatm', 'ph_nbs', 'saturation_index_calcite', 'alkalinity_meq_l', 'dic_umol_kg'],
  aquarium: ['alkalinity_dkh', 'ph_nbs', 'omega_aragonite', 'calcium_total_umol_kg'],
  aquaculture: ['alkalinity_mg_l_caco3', 'ph_nbs', 'co2_umol_kg', 'calcium_total_umol_kg'],
};

function PlanResultView({
  out,
  areaM2,
  trade,
}: {
  out: PlanOutput;
  areaM2?: number | undefined;
  trade?: PlanPanelProps['trade'];
}) {
  const step = out.steps[out.steps.length - 1]!;
  const rows = compareRows(out.before, out.after, trade ? FIRST_ROWS[trade] : []);
  return (
    <div>
      <h3>Dose</h3>
      <DoseSummary out={out} areaM2={areaM2} />
      {(out.limit_warnings ?? []).length > 0 && (
        <ul class="plan-limits">
          {out.limit_warnings.map((w) => (
            <li class="issue warn" data-code={w.code}>
              <code>{w.code}</code> {w.message}
            </li>
          ))}
        </ul>
      )}
      <h3>Speciation of DIC</h3>
      <SpeciationBars before={out.before} after={out.after} />
      <h3>Before and after</h3>
      <div style={{ overflowX: 'auto' }}>
        <table style={S.table} class="plan-table">
          <caption style={{ textAlign: 'left', color: MUTED }}>
            {modelWords(out.before.model)} before, {modelWords(out.after.model)} after; at{' '}
            {show(out.after.conditions.temperature_c)} °C
          </caption>
          <thead>
            <tr>
              <th scope="col" style={{ ...S.cell, textAlign: 'left' }}>
                Output
              </th>
              <th scope="col" style={S.cell}>
                Before
              </th>
              <th scope="col" style={S.cell}>
                After
              </th>
              <th scope="col" style={S.cell}>
                Change
              </th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr data-key={r.key} data-before={String(r.before)} data-after={String(r.after)}>
                <th scope="row" style={{ ...S.cell, textAlign: 'left', fontWeight: 400 }}>
                  {r.label}
                </th>
                <td style={S.cell}>{show(r.before)}</td>
                <td style={S.cell}>{show(r.after)}</td>
                <td style={S.cell}>
                  {r.before !== undefined && r.after !== undefined ? show(change(r.before, r.after)) : '—'}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {step.warnings.length > 0 && (
        <ul class="warnings">
          {step.warnings.map((w) => (
            <li class="issue warn">
              <code>{w.code}</code> {plainWords(w.message)}
            </li>
          ))}
        </ul>
      )}
      <h3>Cautions</h3>
      <ul>
        {out.cautions.general.map((g) => (
          <li>{g}</li>
        ))}
        {out.cautions.chemicals.map((c) => (
          <li>
            <strong>{c.chemical}:</strong> {c.hazards}
          </li>
        ))}
      </ul>
      {out.cautions.limits.length > 0 && (
        <>
          <p>Limits for animals (the plan checks its waters against them):</p>
          <ul>
            {out.cautions.limits.map((l) => (
              <li>
                {l.what}{' '}
                <span style={{ color: MUTED }}>({l.basis === 'sourced' ? l.source : 'common practice'})</span>
              </li>
            ))}
          </ul>
        </>
      )}
      <p style={{ fontWeight: 600 }}>{out.cautions.defer}</p>
    </div>
  );
}

function measureText(m: Record<string, number>): string {
  if (m.stock_volume_ml !== undefined) return `${volumeText(m.stock_volume_ml)} of stock`;
  if (m.mass_g !== undefined) return massText(m.mass_g);
  if (m.gas_volume_l !== undefined) return `${show(m.gas_volume_l)} L of gas`;
  return `${show(m.moles)} mol`;
}

function modelWords(model: string): string {
  return model === 'fresh' ? 'fresh-water model' : 'sea-water model';
}

/** g/m³ and kg/ha, how pond managers write a liming rate (1 ha = 10 000 m²). */
function perArea(g: number, out: PlanOutput, areaM2: number | undefined): string {
  if (!areaM2 || !(areaM2 > 0)) return '';
  const m3 = out.volume_l / 1000;
  return ` (${show(g / m3)} g/m³, ${show(g / 1000 / (areaM2 / 10000))} kg/ha)`;
}

function DoseSummary({ out, areaM2 }: { out: PlanOutput; areaM2?: number | undefined }) {
  const s = out.steps[out.steps.length - 1]!;
  if (s.dose) {
    return (
      <div>
        <p>
          {CHEMICALS[s.dose.chemical as ChemicalId]?.name ?? s.dose.chemical}:{' '}
          <strong>{measureText(s.dose.measure)}</strong>
          {s.dose.measure.mass_g !== undefined ? perArea(s.dose.measure.mass_g, out, areaM2) : ''} into{' '}
          {out.volume_l >= 10000
            ? `${Number((out.volume_l / 1000).toPrecision(4)).toLocaleString()} m³`
            : `${show(out.volume_l)} L`}
          {s.target && (
            <>
              {' '}
              to reach {TARGET_LABELS[s.target.quantity] ?? s.target.quantity} {show(s.target.value)}
            </>
          )}
          .
        </p>
        {s.substeps && s.substeps.length > 1 && (
          <ol>
            {s.substeps.map((p) => (
              <li>
                {measureText(p.dose.measure)}, then re-measure: pH {show(p.after.ph_nbs)} (meter)
              </li>
            ))}
          </ol>
        )}
      </div>
    );
  }
  if (s.exchange) {
    return (
      <p>
        CO₂ {s.exchange.co2_mol < 0 ? 'given off' : 'taken up'}: {show(Math.abs(s.exchange.co2_mol))} mol (
        {show(s.exchange.fraction * 100)} % of the way to {show(s.exchange.target_pco2_uatm)} µatm).
      </p>
    );
  }
  if (s.mix) return <p>Mixed {s.mix.volumes_l.map((x) => `${show(x)} L`).join(' + ')}.</p>;
  return null;
}

const SPECIES: { key: 'co2' | 'hco3' | 'co3'; label: string; fill: string }[] = [
  { key: 'co2', label: 'CO₂', fill: v('tufa-series-1', '#6a51a3') },
  { key: 'hco3', label: 'HCO₃⁻', fill: v('tufa-series-2', '#2171b5') },
  { key: 'co3', label: 'CO₃²⁻', fill: v('tufa-series-3', '#238b45') },
];

/** Two stacked bars of DIC fractions; each segment also says its percentage in text. */
function SpeciationBars({ before, after }: { before: SolveOutput; after: SolveOutput }) {
  const W = 560;
  const H = 28;
  const bar = (s: SolveOutput, y: number, name: string) => {
    const f = speciation(s);
    let x = 90;
    return (
      <g>
        <text x={0} y={y + 19} fill={FG} font-size="14">
          {name}
        </text>
        {SPECIES.map((sp) => {
          const w = Math.max(0, f[sp.key]) * (W - 90);
          const seg = (
            <g>
              <rect x={x} y={y} width={w} height={H} fill={sp.fill}>
                <title>{`${sp.label} ${(f[sp.key] * 100).toFixed(1)} %`}</title>
              </rect>
              {w > 60 && (
                <text x={x + 6} y={y + 19} fill="#fff" font-size="13">
                  {`${sp.label} ${(f[sp.key] * 100).toFixed(1)} %`}
                </text>
              )}
            </g>
          );
          x += w;
          return seg;
        })}
      </g>
    );
  };
  const fb = speciation(before);
  const fa = speciation(after);
  const summary = (f: { co2: number; hco3: number; co3: number }) =>
    SPECIES.map((sp) => `${sp.label} ${(f[sp.key] * 100).toFixed(1)} %`).join(', ');
  return (
    <svg
      viewBox={`0 0 ${W} ${2 * H + 16}`}
      width="100%"
      style={{ maxWidth: `${W}px` }}
      role="img"
      aria-label={`Before: ${summary(fb)}. After: ${summary(fa)}.`}
    >
      {bar(before, 0, 'Before')}
      {bar(after, H + 12, 'After')}
    </svg>
  );
}
