/**
 * `tufa plan`: one plan as JSON (a water in the solve input format, its volume, and actions) in;
 * the resulting water(s) in the solve output format, the doses and the cautions out. `--text`
 * prints the same plan for reading at the tank side.
 */

import { readFileSync } from 'node:fs';
import { toIssue } from '../chem/errors';
import { CHEMICAL_IDS, CHEMICALS } from '../chem/plan/chemicals';
import { isPlanError, type PlanOutput, plan } from '../chem/plan/plan';
import { type CliIo, EXIT_OK, EXIT_ROW_FAILED, EXIT_USAGE, readAll } from './io';
import { deeperThan, keepFinite, lineError, MAX_DEPTH } from './json-lines';

export const PLAN_HELP = `tufa plan — what a water will be after a dose, degassing or mixing, and the dose for a target

Usage:
  npm run -s tufa -- plan < plan.json           JSON result on stdout
  npm run -s tufa -- plan --file plan.json --text
  npm run -s tufa -- plan --chemicals            the chemicals and what one mole changes

Input: one JSON object
  water        the water, in the solve input format (e.g. temperature_c, salinity, alkalinity_umol_kg, ph)
  volume_l | mass_kg   how much of it there is
  actions      a list, applied in order; each is one of
    {"action":"add", "chemical":ID, AMOUNT}
        AMOUNT: moles | mass_g [purity_percent] | stock_volume_ml with stock_mol_l, stock_g_l
                or stock_percent_w_w (+ stock_density_kg_l) | gas_volume_l [gas_temperature_c] (CO2)
        negative amounts remove CO2 (stripping) or CaCO3 (precipitation)
    {"action":"equilibrate", "target_pco2_uatm":420, "fraction":1}
        CO2 exchange at constant alkalinity; fraction = share of the DIC change to equilibrium
    {"action":"mix", "waters":[{"water":{...}, "volume_l":100}], ["temperature_c"], ["pressure_dbar"]}
    {"action":"reach", "chemical":ID, "target":{QUANTITY: value}, [purity_percent | stock strength],
        ["max_ph_step"], ["max_alkalinity_step_umol_kg" | "max_alkalinity_step_dkh"]}
        QUANTITY: alkalinity_umol_kg alkalinity_dkh alkalinity_meq_l alkalinity_mg_l_caco3 ph
                  omega_calcite omega_aragonite co2_umol_kg co2_mg_l pco2_uatm dic_umol_kg
                  calcium_umol_kg calcium_mg_l     (pH on the water's ph_scale)

Chemicals: ${CHEMICAL_IDS.join(', ')}

Output: {"before": SOLVE, "volume_l", "steps": [{"action", "dose", "change", "after": SOLVE, "water",
  "volume_l", "warnings", ["target"], ["substeps"], ["exchange"], ["mix"]}], "after": SOLVE, "water",
  "cautions"}   where SOLVE is a tufa solve output; a failed plan: {"error": {"code", "message", "field"}}.

Exit status: 0 planned, 1 the plan failed, 2 unusable arguments.

Every plan is a model estimate. Dose slowly and in steps, re-measure, wear eye and skin protection,
and follow product labels, local codes and licensed practice.

Example:
  echo '{"water":{"temperature_c":26,"salinity":35,"alkalinity_dkh":7,"ph":8.0},"volume_l":300,
         "actions":[{"action":"reach","chemical":"sodium_bicarbonate","target":{"alkalinity_dkh":9},
                     "max_alkalinity_step_dkh":1}]}' | npm run -s tufa -- plan --text
`;

export async function runPlan(args: string[], io: CliIo): Promise<number> {
  if (args.includes('--help') || args.includes('-h')) {
    io.stdout.write(PLAN_HELP);
    return EXIT_OK;
  }
  if (args.includes('--chemicals')) {
    io.stdout.write(chemicalTable());
    return EXIT_OK;
  }
  const fileAt = args.indexOf('--file');
  const known = new Set(['--text', '--pretty', '--file']);
  const unknown = args.filter((a, i) => !known.has(a) && !(fileAt >= 0 && i === fileAt + 1));
  if (unknown.length > 0 || (fileAt >= 0 && args[fileAt + 1] === undefined)) {
    io.stderr.write(
      unknown.length > 0
        ? `tufa plan: unknown argument ${unknown[0]}\n`
        : 'tufa plan: --file needs a file name\n',
    );
    io.stderr.write('Run "npm run -s tufa -- plan --help" for usage.\n');
    return EXIT_USAGE;
  }
  let text: string;
  try {
    text = fileAt >= 0 ? readFileSync(args[fileAt + 1]!, 'utf8') : await readAll(io.stdin);
  } catch (e) {
    io.stderr.write(`tufa plan: cannot read ${args[fileAt + 1]}: ${(e as Error).message}\n`);
    return EXIT_USAGE;
  }
  let request: unknown;
  try {
    request = JSON.parse(text.replace(/^\uFEFF/, ''));
  } catch (e) {
    io.stdout.write(
      `${JSON.stringify({ error: { code: 'invalid-json', message: `The plan is not JSON: ${(e as Error).message}` } })}\n`,
    );
    return EXIT_ROW_FAILED;
  }
  if (deeperThan(request, MAX_DEPTH)) {
    io.stdout.write(
      `${JSON.stringify(lineError('input-too-deep', `The plan nests values more than ${MAX_DEPTH} levels deep; no plan needs that.`))}\n`,
    );
    return EXIT_ROW_FAILED;
  }
  let r: ReturnType<typeof plan>;
  try {
    r = plan(request);
  } catch (e) {
    r = { error: toIssue(e) };
  }
  if (isPlanError(r)) {
    if (args.includes('--text')) io.stderr.write(`tufa plan: ${r.error.code}: ${r.error.message}\n`);
    else io.stdout.write(`${JSON.stringify(r)}\n`);
    return EXIT_ROW_FAILED;
  }
  if (args.includes('--text')) io.stdout.write(planText(r));
  else
    io.stdout.write(
      `${JSON.stringify(keepFinite(r as unknown as Record<string, unknown>), null, args.includes('--pretty') ? 2 : undefined)}\n`,
    );
  return EXIT_OK;
}

function chemicalTable(): string {
  const rows = CHEMICAL_IDS.map((id) => {
    const c = CHEMICALS[id];
    const p = c.perMole;
    return `${id.padEnd(28)} ${c.formula.padEnd(11)} ${c.molarMassGPerMol.toFixed(3).padStart(8)}  ${String(p.ta).padStart(3)} ${String(p.dic).padStart(4)} ${String(p.calcium).padStart(4)}${c.removable ? '   (may be negative)' : ''}`;
  });
  return `chemical                     formula     g/mol      TA  DIC   Ca   per mole added\n${rows.join('\n')}\n`;
}

const ROWS: [string, string, number][] = [
  ['alkalinity_umol_kg', 'alkalinity µmol/kg', 1],
  ['dic_umol_kg', 'DIC µmol/kg', 1],
  ['ph_total', 'pH (total)', 3],
  ['ph_nbs', 'pH (NBS)', 3],
  ['pco2_uatm', 'pCO2 µatm', 0],
  ['co2_umol_kg', 'CO2* µmol/kg', 2],
  ['hco3_umol_kg', 'HCO3- µmol/kg', 1],
  ['co3_umol_kg', 'CO3-- µmol/kg', 1],
  ['omega_calcite', 'Ω calcite', 2],
  ['omega_aragonite', 'Ω aragonite', 2],
  ['revelle_factor', 'Revelle factor', 2],
];

function cell(x: unknown, digits: number): string {
  return typeof x === 'number' && Number.isFinite(x) ? x.toFixed(digits) : '—';
}

export function planText(r: PlanOutput): string {
  const lines: string[] = [];
  const cols = [r.before, ...r.steps.map((s) => s.after)];
  lines.push(
    ['', 'before', ...r.steps.map((s, i) => `${i + 1} ${s.action}`)]
      .map((h, i) => (i === 0 ? h.padEnd(20) : h.padStart(14)))
      .join(''),
  );
  for (const [key, label, digits] of ROWS) {
    lines.push(
      label.padEnd(20) +
        cols.map((c) => cell((c as unknown as Record<string, unknown>)[key], digits).padStart(14)).join(''),
    );
  }
  lines.push(`${'model'.padEnd(20)}${cols.map((c) => c.model.padStart(14)).join('')}`);
  lines.push('');
  r.steps.forEach((s, i) => {
    const head = `${i + 1}. ${s.action}`;
    if (s.dose) {
      const m = s.dose.measure;
      const how =
        m.stock_volume_ml !== undefined
          ? `${m.stock_volume_ml.toPrecision(4)} mL of stock`
          : m.mass_g !== undefined
            ? `${m.mass_g.toPrecision(4)} g`
            : `${s.dose.moles.toPrecision(4)} mol`;
      lines.push(
        `${head}: ${s.dose.chemical} (${s.dose.formula}) ${how} = ${s.dose.moles.toPrecision(4)} mol into ${s.volume_l.toPrecision(4)} L`,
      );
    } else if (s.exchange) {
      lines.push(
        `${head}: to pCO2 ${s.exchange.target_pco2_uatm} µatm, ${(s.exchange.fraction * 100).toFixed(0)} % of the way; CO2 ${s.exchange.co2_mol >= 0 ? 'taken up' : 'given off'} ${Math.abs(s.exchange.co2_mol).toPrecision(3)} mol`,
      );
    } else if (s.mix) {
      lines.push(
        `${head}: ${s.mix.volumes_l.map((v) => `${v} L`).join(' + ')} (mass shares ${s.mix.mass_fractions.map((f) => f.toFixed(3)).join(', ')})`,
      );
    } else lines.push(head);
    if (s.target)
      lines.push(
        `   target ${s.target.quantity} ${s.target.value}: reached ${s.target.achieved.toPrecision(8)}`,
      );
    if (s.substeps && s.substeps.length > 1) {
      lines.push(`   in ${s.substeps.length} steps; re-measure before each:`);
      s.substeps.forEach((p, j) => {
        const m = p.dose.measure;
        const how =
          m.stock_volume_ml !== undefined
            ? `${m.stock_volume_ml.toPrecision(4)} mL`
            : `${(m.mass_g ?? 0).toPrecision(4)} g`;
        lines.push(
          `   ${String(j + 1).padStart(3)}. ${how.padStart(12)}  → pH ${(p.after.model === 'fresh' ? p.after.ph_nbs : p.after.ph_total).toFixed(3)} (${p.after.model === 'fresh' ? 'NBS' : 'total'}), alkalinity ${p.after.alkalinity_umol_kg.toFixed(0)} µmol/kg`,
        );
      });
    }
    for (const w of s.warnings) lines.push(`   warning ${w.code}: ${w.message}`);
  });
  lines.push('', 'Cautions:');
  for (const g of r.cautions.general) lines.push(`  - ${g}`);
  for (const c of r.cautions.chemicals) lines.push(`  - ${c.chemical}: ${c.hazards}`);
  lines.push('  Limits for animals:');
  for (const l of r.cautions.limits)
    lines.push(`  - ${l.what} [${l.basis === 'sourced' ? `source: ${l.source}` : 'common practice'}]`);
  lines.push(`  ${r.cautions.defer}`, '');
  return lines.join('\n');
}
