/**
 * `npm run bench`: every benchmark of the project, printing figures (never a pass/fail test).
 * Record the figures in the README when they change.
 */

import { benchFresh } from './fresh';
import { benchPlan } from './plan';
import { benchSolve } from './solve';
import { benchSolveUncertainty, benchTitration } from './titration';

const sections: [string, () => string[] | Promise<string[]>][] = [
  ['Saline solver (100 000 rows)', benchSolve],
  ['Titration: one 50-point titration by every method', benchTitration],
  ['Solve with uncertainties', benchSolveUncertainty],
  ['Fresh model beside saline, solve() JSON path (20 000 rows each)', benchFresh],
  ['Planning: dose, dose to target, target in steps (plan() JSON path)', benchPlan],
];

for (const [title, run] of sections) {
  console.log(`\n## ${title}`);
  for (const line of await run()) console.log(line);
}
