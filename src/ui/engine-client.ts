/** The page's side of the engine worker: promise per request, one worker for the app's life. */

import type { SolveInput, SolveResult } from '../chem/api';
import type { PlanResult } from '../chem/plan/plan';
import type { TitrateOutcome } from '../chem/titration/titrate';
import type { TitrationInput } from '../chem/titration/types';
import type { EngineRequest, EngineResponse } from './engine.worker';

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

export async function solveInWorker(input: SolveInput): Promise<SolveResult> {
  const r = await ask({ kind: 'solve', input });
  if (r.kind !== 'solve') throw new Error('engine worker answered the wrong request');
  return r.result;
}

/** Solves many inputs and returns the chosen numeric outputs as columns (null = did not solve). */
export async function solveColumns(inputs: SolveInput[], keys: string[]): Promise<(number | null)[][]> {
  const r = await ask({ kind: 'columns', inputs, keys });
  if (r.kind !== 'columns') throw new Error('engine worker answered the wrong request');
  return r.columns;
}

/** A plan (`src/chem/plan/plan.ts`) computed in the worker: its dose searches never block the page. */
export async function planInWorker(request: unknown): Promise<PlanResult> {
  const r = await ask({ kind: 'plan', request });
  if (r.kind !== 'plan') throw new Error('engine worker answered the wrong request');
  return r.result;
}

export async function titrateInWorker(input: TitrationInput): Promise<TitrateOutcome> {
  const r = await ask({ kind: 'titrate', input });
  if (r.kind !== 'titrate') throw new Error('engine worker answered the wrong request');
  return r.result;
}

/**
 * Solves many inputs in the worker. With `keys`, each success carries only those outputs plus
 * `model` and `warnings` (a 100 000-row import needs no more, and copying less back is faster).
 */
export async function solveManyInWorker(
  inputs: SolveInput[],
  keys?: readonly string[],
): Promise<SolveResult[]> {
  const r = await ask(keys ? { kind: 'many', inputs, keys: [...keys] } : { kind: 'many', inputs });
  if (r.kind !== 'many') throw new Error('engine worker answered the wrong request');
  return r.results;
}
