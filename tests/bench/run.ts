/**
 * `npm run bench`: every benchmark of the project, printing figures (never a pass/fail test).
 * Record the figures in the README when they change.
 */

import { benchFresh } from './fresh';
import { benchPlan } from './plan';
import { benchSolve } from './solve';

const sections: [string, () => string[] | Promise<string[]>][] = [
  ['Saline solver (100 000 rows)', benchSolve],
  ['Fresh model beside saline, solve() JSON path (20 000 rows each)', benchFresh],
  ['Planning: dose, dose to target, target in steps (plan() JSON path)', benchPlan],
];

for (const [title, run] of sections) {
  console.log(`\n## ${title}`);
  for (const line of await run()) console.log(line);
}
