/// <reference lib="webworker" />
/**
 * Runs the engine off the main thread, so typing stays smooth while a reading (or a whole log for
 * a chart) is solved, and a plan's dose search never freezes the page.
 */

import type { SolveInput, SolveResult } from '../chem/api';
import { toIssue } from '../chem/errors';
import type { PlanResult } from '../chem/plan/plan';
import {
  type ReadingFacts,
  type ReadingRequest,
  type RequestSettings,
  readingRequest,
  withUncertainty,
} from '../reading/request';
import type { SiteDefaults } from '../store/schema';
import { plan, solve } from './engine-source';

/** A reading as the worker needs it: its facts and the defaults of its site. */
export interface ReadingJob {
  reading: ReadingFacts;
  defaults?: SiteDefaults;
}

/** What a bulk consumer gets back of a request: the inputs and where they came from. */
export type RequestSummary = Pick<ReadingRequest, 'input' | 'sources'>;

export type EngineRequest =
  /** One stored (or draft) reading through `readingRequest`, solved; with its uncertainties when asked. */
  | { id: number; kind: 'reading'; job: ReadingJob; settings: RequestSettings; uncertainty: boolean }
  /** Many readings through `readingRequest`: slim results (with `keys`) and each request's summary. */
  | { id: number; kind: 'readings'; jobs: ReadingJob[]; settings: RequestSettings; keys?: string[] }
  /** A plan (`src/chem/plan/plan.ts`): its dose searches never block the page. */
  | { id: number; kind: 'plan'; request: unknown }
  /** A request derived from a result, not from a reading (the same water at equilibrium with air). */
  | { id: number; kind: 'solve'; input: SolveInput };

export type EngineResponse =
  | { id: number; kind: 'reading'; request: ReadingRequest; result: SolveResult }
  | { id: number; kind: 'readings'; requests: RequestSummary[]; results: SolveResult[] }
  | { id: number; kind: 'plan'; result: PlanResult }
  | { id: number; kind: 'solve'; result: SolveResult };

function slim(r: SolveResult, keys: readonly string[] | undefined): SolveResult {
  if (!keys || 'error' in r) return r;
  const out: Record<string, unknown> = { model: r.model, warnings: r.warnings };
  for (const k of keys) out[k] = (r as unknown as Record<string, unknown>)[k];
  return out as unknown as SolveResult;
}

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
  if (req.kind === 'reading') {
    const request = readingRequest(req.job.reading, { defaults: req.job.defaults ?? {} }, req.settings);
    const result = safeSolve(req.uncertainty ? withUncertainty(request) : request.input);
    scope.postMessage({ id: req.id, kind: 'reading', request, result } satisfies EngineResponse);
    return;
  }
  if (req.kind === 'readings') {
    const requests: RequestSummary[] = [];
    const results: SolveResult[] = [];
    for (const job of req.jobs) {
      const { input, sources } = readingRequest(job.reading, { defaults: job.defaults ?? {} }, req.settings);
      requests.push({ input, sources });
      results.push(slim(safeSolve(input), req.keys));
    }
    scope.postMessage({ id: req.id, kind: 'readings', requests, results } satisfies EngineResponse);
    return;
  }
  if (req.kind === 'solve') {
    scope.postMessage({ id: req.id, kind: 'solve', result: safeSolve(req.input) } satisfies EngineResponse);
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
};
