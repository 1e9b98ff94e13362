/**
 * The engine's benchmarks (pure `src/chem`, no browser). `npm run bench` runs this file from an
 * esbuild bundle (`tests/bench/run-bundled.ts`), because that is how the engine ships: Vite
 * bundles it into the app's Web Worker. Run straight through tsx, every imported binding is read
 * through a module getter and the same code measures up to twice as slow.
 */

import { benchFresh } from './fresh';
import { benchPlan } from './plan';
import { benchRequest } from './request';
import { benchSolve } from './solve';
import { benchSolveUncertainty, benchTitration } from './titration';
import { benchTitrationUncertainty } from './titration-uncertainty';

const sections: [string, () => string[]][] = [
  ['Saline solver (100 000 rows)', benchSolve],
  ['Titration: one 50-point titration by every method', benchTitration],
  ['Titration uncertainty, 50 to 20 000 points, against the plain reduction', benchTitrationUncertainty],
  ['Solve with uncertainties', benchSolveUncertainty],
  ['Fresh model beside saline, solve() JSON path (20 000 rows each)', benchFresh],
  ['Planning: dose, dose to target, target in steps (plan() JSON path)', benchPlan],
  ['A reading to its engine request (src/reading/request.ts)', benchRequest],
];

for (const [title, run] of sections) {
  console.log(`\n## ${title}`);
  for (const line of run()) console.log(line);
}
