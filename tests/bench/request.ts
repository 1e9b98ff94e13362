/**
 * The cost of the one request function (src/reading/request.ts) on bulk paths (export, chart,
 * import check): per reading, as a ratio to the solve it feeds, measured in the same run.
 * Typed readings only cost a conversion; a reading with a titration is reduced again each time.
 */

import { solve } from '../../src/chem/solve';
import type { ReadingFacts } from '../../src/reading/request';
import { readingRequest } from '../../src/reading/request';
import type { SiteDoc } from '../../src/store/schema';
import { KESTREL } from '../reading/fixtures';

function time(n: number, f: (i: number) => unknown): number {
  const t0 = performance.now();
  for (let i = 0; i < n; i++) f(i);
  return (performance.now() - t0) / n;
}

export function benchRequest(): string[] {
  const site = { defaults: { model: 'fresh' } } as SiteDoc;
  const typed = (i: number): ReadingFacts => ({
    values: [
      { quantity: 'temperature', value: 9 + (i % 10) * 0.1, unit: 'c' },
      { quantity: 'ph', value: 7.2 + (i % 7) * 0.01, unit: 'ph' },
      { quantity: 'alkalinity', value: 4 + (i % 5) * 0.1, unit: 'meq_l' },
      { quantity: 'conductance', value: 480, unit: 'us_cm' },
    ],
  });
  const titrated = (i: number): ReadingFacts => ({
    values: typed(i).values.filter((v) => v.quantity !== 'alkalinity'),
    titration: KESTREL,
  });
  const n = 20_000;
  const inputs = Array.from({ length: n }, (_, i) => readingRequest(typed(i), site).input);
  time(2000, (i) => solve(inputs[i]!)); // warm up
  const solveMs = time(n, (i) => solve(inputs[i]!));
  const requestMs = time(n, (i) => readingRequest(typed(i), site));
  const m = 2000;
  const titrationMs = time(m, (i) => readingRequest(titrated(i), site));
  return [
    `solve(), fresh water with conductance: ${(solveMs * 1000).toFixed(1)} µs per reading (${n})`,
    `readingRequest(), typed reading: ${(requestMs * 1000).toFixed(2)} µs = ${((100 * requestMs) / solveMs).toFixed(1)} % of its solve`,
    `readingRequest(), 30-point Gran titration reduced: ${(titrationMs * 1000).toFixed(0)} µs = ${(titrationMs / solveMs).toFixed(1)} × its solve (${m})`,
  ];
}
