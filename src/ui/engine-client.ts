/** The page's side of the engine worker: promise per request, one worker for the app's life. */

import type { SolveInput, SolveResult } from '../chem/api';
import type { PlanResult } from '../chem/plan/plan';
import type { ReadingFacts, ReadingRequest, RequestSettings } from '../reading/request';
import type { SiteDoc } from '../store/schema';
import type { EngineRequest, EngineResponse, ReadingJob, RequestSummary } from './engine.worker';

let worker: Worker | undefined;
let next = 1;
const pending = new Map<number, { resolve: (r: EngineResponse) => void; reject: (e: Error) => void }>();

function getWorker(): Worker {
  if (!worker) {
    worker = new Worker(new URL('./engine.worker.ts', import.meta.url), { type: 'module' });
    worker.onmessage = (ev: MessageEvent<EngineResponse>) => {
      const done = pending.get(ev.data.id);
      pending.delete(ev.data.id);
      done?.resolve(ev.data);
    };
    // A worker that dies fails its pending requests instead of leaving the screen waiting; the
    // next request starts a new one.
    worker.onerror = (ev) => {
      ev.preventDefault();
      worker?.terminate();
      worker = undefined;
      const e = new Error(`The engine worker stopped (${ev.message || 'no reason given'}).`);
      for (const p of pending.values()) p.reject(e);
      pending.clear();
    };
  }
  return worker;
}

type Req = EngineRequest extends infer R ? (R extends EngineRequest ? Omit<R, 'id'> : never) : never;

function ask(req: Req): Promise<EngineResponse> {
  const id = next++;
  return new Promise((resolve, reject) => {
    pending.set(id, { resolve, reject });
    getWorker().postMessage({ ...req, id } as EngineRequest);
  });
}

/** The settings a request depends on, copied out of the app's Settings (structured clone is cheap). */
function requestSettings(s: RequestSettings): RequestSettings {
  return {
    model: s.model,
    ph_scale: s.ph_scale,
    carbonic_constants: s.carbonic_constants,
    boron_total: s.boron_total,
    atmospheric_pco2_uatm: s.atmospheric_pco2_uatm,
    ph_uncertainty: s.ph_uncertainty,
  };
}

function job(reading: ReadingFacts, site: Pick<SiteDoc, 'defaults'> | undefined): ReadingJob {
  const facts: ReadingFacts = { values: reading.values };
  if (reading.titration) facts.titration = reading.titration;
  return site ? { reading: facts, defaults: site.defaults } : { reading: facts };
}

/** A reading's request (`src/reading/request.ts`, built in the worker) and its result. */
export async function solveReadingInWorker(
  reading: ReadingFacts,
  site: Pick<SiteDoc, 'defaults'> | undefined,
  settings: RequestSettings,
  uncertainty = false,
): Promise<{ request: ReadingRequest; result: SolveResult }> {
  const r = await ask({
    kind: 'reading',
    job: job(reading, site),
    settings: requestSettings(settings),
    uncertainty,
  });
  if (r.kind !== 'reading') throw new Error('engine worker answered the wrong request');
  return { request: r.request, result: r.result };
}

/**
 * Solves a request derived from a result (e.g. the same water at equilibrium with air). A stored
 * reading never comes this way: it goes through `solveReadingInWorker` and the one request function.
 */
export async function solveInWorker(input: SolveInput): Promise<SolveResult> {
  const r = await ask({ kind: 'solve', input });
  if (r.kind !== 'solve') throw new Error('engine worker answered the wrong request');
  return r.result;
}

/** A plan (`src/chem/plan/plan.ts`) computed in the worker: its dose searches never block the page. */
export async function planInWorker(request: unknown): Promise<PlanResult> {
  const r = await ask({ kind: 'plan', request });
  if (r.kind !== 'plan') throw new Error('engine worker answered the wrong request');
  return r.result;
}

/** Many readings through the one request function: slim results (with `keys`) and request summaries. */
export async function solveReadingsInWorker(
  readings: readonly (ReadingFacts & { siteId: string })[],
  sites: ReadonlyMap<string, Pick<SiteDoc, 'defaults'>>,
  settings: RequestSettings,
  keys?: readonly string[],
): Promise<{ requests: RequestSummary[]; results: SolveResult[] }> {
  const jobs = readings.map((r) => job(r, sites.get(r.siteId)));
  const base = { kind: 'readings' as const, jobs, settings: requestSettings(settings) };
  const r = await ask(keys ? { ...base, keys: [...keys] } : base);
  if (r.kind !== 'readings') throw new Error('engine worker answered the wrong request');
  return { requests: r.requests, results: r.results };
}

/** One column per output key from results (null where a reading did not solve: a gap on the chart). */
export function resultColumns(results: readonly SolveResult[], keys: readonly string[]): (number | null)[][] {
  return keys.map((k) =>
    results.map((r) => {
      const v = 'error' in r ? undefined : (r as unknown as Record<string, unknown>)[k];
      return typeof v === 'number' && Number.isFinite(v) ? v : null;
    }),
  );
}
