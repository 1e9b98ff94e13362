/**
 * Plan throughput through the `plan()` JSON path: a forward dose (two solves), a dose to a target
 * (root finding, ~20–40 solves), and the same split into steps. Waters are invented: a reef tank
 * (saline) and a planted tank with major ions (fresh). Prints figures; never a pass/fail test.
 */

import { plan } from '../../src/chem/plan/plan';

const REEF = { temperature_c: 25.5, salinity: 35, alkalinity_dkh: 7.5, ph: 8.05 };
const PLANTED = {
  temperature_c: 25,
  alkalinity_dkh: 4,
  ph: 7.4,
  calcium_mg_l: 30,
  magnesium_mg_l: 8,
  sodium_mg_l: 10,
  chloride_mg_l: 15,
  sulfate_mg_l: 12,
};

function perPlan(n: number, req: unknown): number {
  plan(req);
  const t0 = performance.now();
  for (let i = 0; i < n; i++) plan(req);
  return (performance.now() - t0) / n;
}

export function benchPlan(): string[] {
  const lines: string[] = [];
  for (const [name, water] of [
    ['reef (saline)', REEF],
    ['planted (fresh, major ions)', PLANTED],
  ] as const) {
    const add = perPlan(300, {
      water,
      volume_l: 300,
      actions: [{ action: 'add', chemical: 'sodium_bicarbonate', mass_g: 10 }],
    });
    const reach = perPlan(100, {
      water,
      volume_l: 300,
      actions: [{ action: 'reach', chemical: 'sodium_carbonate', target: { alkalinity_dkh: 9 } }],
    });
    const steps = perPlan(30, {
      water,
      volume_l: 300,
      actions: [
        {
          action: 'reach',
          chemical: 'sodium_carbonate',
          target: { alkalinity_dkh: 9 },
          max_ph_step: 0.05,
          max_alkalinity_step_dkh: 0.5,
        },
      ],
    });
    lines.push(
      `${name}: add ${add.toFixed(2)} ms/plan, reach ${reach.toFixed(2)} ms/plan, reach in steps ${steps.toFixed(1)} ms/plan`,
    );
  }
  return lines;
}
