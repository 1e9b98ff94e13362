/**
 * The io preview (`previewImport`) takes a synchronous `Solver`; the app solves in its Web Worker
 * so the page never waits on the engine. This bridges the two for a few rows: solve the inputs in
 * the worker first, then hand io a solver that answers from those results, keyed by the input's
 * content (not by call order). An input it was not given is an error, never a guess. Whole files
 * do not come through here (a content key costs ~7 µs a row): import and export take results in
 * row order or by reading id instead (`commitImport`'s `results`, `exportReadingsCsv`'s `results`).
 */

import type { SolveInput, SolveResult } from '../../chem/api';
import type { Solver } from '../../io/solve-input';
import { solveManyInWorker } from '../engine-client';

function keyOf(input: SolveInput): string {
  return JSON.stringify(Object.entries(input).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)));
}

export function answeringSolver(inputs: readonly SolveInput[], results: readonly SolveResult[]): Solver {
  const byKey = new Map<string, SolveResult>();
  inputs.forEach((input, i) => {
    const r = results[i];
    if (r) byKey.set(keyOf(input), r);
  });
  return (input) =>
    byKey.get(keyOf(input)) ?? {
      error: {
        code: 'internal-error',
        message: 'This row was not computed (no result from the engine worker).',
      },
    };
}

/** Solves in the worker and returns a solver over the results (see the module comment). */
export async function workerSolver(inputs: SolveInput[], keys?: readonly string[]): Promise<Solver> {
  // The same water often repeats (a logger's rows share site defaults): solve each distinct one once.
  const distinct = new Map<string, SolveInput>();
  for (const input of inputs) distinct.set(keyOf(input), input);
  const unique = [...distinct.values()];
  return answeringSolver(unique, await solveManyInWorker(unique, keys));
}
