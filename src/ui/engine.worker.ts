/// <reference lib="webworker" />
/**
 * Runs the engine off the main thread, so typing stays smooth while a reading (or a whole log for
 * a chart) is solved, and a plan's dose search never freezes the page.
 */

import type { SolveInput, SolveResult } from '../chem/api';
import { toIssue } from '../chem/errors';
import type { PlanResult } from '../chem/plan/plan';
import type { TitrateOutcome } from '../chem/titration/titrate';
import type { TitrationInput } from '../chem/titration/types';
import { plan, solve, titrate, titrationConstants } from './engine-source';

export type EngineRequest =
  | { id: number; kind: 'solve'; input: SolveInput }
  | { id: number; kind: 'columns'; inputs: SolveInput[]; keys: string[] }
  | { id: number; kind: 'titrate'; input: TitrationInput }
  | { id: number; kind: 'plan'; request: unknown }
  /** Full results, or (with `keys`) only those outputs plus model and warnings: less to copy back. */
  | { id: number; kind: 'many'; inputs: SolveInput[]; keys?: string[] };

export type EngineResponse =
  | { id: number; kind: 'solve'; result: SolveResult }
  | { id: number; kind: 'columns'; columns: (number | null)[][] }
  | { id: number; kind: 'titrate'; result: TitrateOutcome }
  | { id: number; kind: 'plan'; result: PlanResult }
  | { id: number; kind: 'many'; results: SolveResult[] };

function safeSolve(input: SolveInput): SolveResult {
  try {
    return solve(input);
  } catch (e) {
    return { error: toIssue(e) };
  }
}

const scope = self as unknown as DedicatedWorkerGlobalScope;
scope.onmessage = (ev: MessageEvent<EngineRequest>) => {
  const req = ev.data;
  if (req.kind === 'titrate') {
    let result: TitrateOutcome;
    try {
      result = titrate(req.input, titrationConstants);
    } catch (e) {
      result = { error: toIssue(e) };
    }
    scope.postMessage({ id: req.id, kind: 'titrate', result } satisfies EngineResponse);
    return;
  }
  if (req.kind === 'plan') {
    let result: PlanResult;
    try {
      result = plan(req.request);
    } catch (e) {
      result = { error: toIssue(e) };
    }
    scope.postMessage({ id: req.id, kind: 'plan', result } satisfies EngineResponse);
    return;
  }
  if (req.kind === 'solve') {
    scope.postMessage({ id: req.id, kind: 'solve', result: safeSolve(req.input) } satisfies EngineResponse);
    return;
  }
  if (req.kind === 'many') {
    const keys = req.keys;
    const results = req.inputs.map((input) => {
      const r = safeSolve(input);
      if (!keys || 'error' in r) return r;
      const slim: Record<string, unknown> = { model: r.model, warnings: r.warnings };
      for (const k of keys) slim[k] = (r as unknown as Record<string, unknown>)[k];
      return slim as unknown as SolveResult;
    });
    scope.postMessage({ id: req.id, kind: 'many', results } satisfies EngineResponse);
    return;
  }
  // One column per requested output key; null where a row did not solve (a gap on the chart).
  const columns = req.keys.map(() => new Array<number | null>(req.inputs.length).fill(null));
  req.inputs.forEach((input, i) => {
    const r = safeSolve(input) as Record<string, unknown>;
    if ('error' in r) return;
    req.keys.forEach((k, j) => {
      const v = r[k];
      if (typeof v === 'number' && Number.isFinite(v)) columns[j]![i] = v;
    });
  });
  scope.postMessage({ id: req.id, kind: 'columns', columns } satisfies EngineResponse);
};
