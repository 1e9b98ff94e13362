/** The page's side of the import worker (`import.worker.ts`): one worker per open data panel. */

import { TufaError } from '../../chem/errors';
import type { ColumnMapping } from '../../io/column-mapping';
import type { SiteDoc } from '../../io/docs';
import type { ImportReport } from '../../io/import-commit';
import type { RequestSettings } from '../../reading/request';
import type {
  FileSummary,
  ImportProgress,
  ImportRequest,
  ImportResponse,
  PlanSummary,
} from './import.worker';

type Req = ImportRequest extends infer R ? (R extends ImportRequest ? Omit<R, 'id'> : never) : never;

export class ImportWorker {
  private worker: Worker | undefined;
  private next = 1;
  private pending = new Map<number, (r: ImportResponse) => void>();
  private progress = new Map<number, (p: ImportProgress) => void>();

  private ask(
    req: Req,
    onProgress?: (p: ImportProgress) => void,
    transfer: Transferable[] = [],
  ): Promise<ImportResponse> {
    if (!this.worker) {
      this.worker = new Worker(new URL('./import.worker.ts', import.meta.url), { type: 'module' });
      this.worker.onmessage = (ev: MessageEvent<ImportResponse | ImportProgress>) => {
        const m = ev.data;
        if (m.kind === 'progress') {
          this.progress.get(m.id)?.(m);
          return;
        }
        const done = this.pending.get(m.id);
        this.pending.delete(m.id);
        this.progress.delete(m.id);
        done?.(m);
      };
      // A worker that dies (out of memory, a script error) must not leave the panel waiting.
      this.worker.onerror = (ev) => {
        ev.preventDefault();
        this.failAll(`The import worker stopped (${ev.message || 'no reason given'}). Nothing was written.`);
      };
      this.worker.onmessageerror = () =>
        this.failAll('The import worker sent a message that could not be read.');
    }
    const id = this.next++;
    if (onProgress) this.progress.set(id, onProgress);
    return new Promise((resolve) => {
      this.pending.set(id, resolve);
      this.worker!.postMessage({ ...req, id } as ImportRequest, transfer);
    });
  }

  private static expect<K extends ImportResponse['kind']>(
    r: ImportResponse,
    kind: K,
  ): Extract<ImportResponse, { kind: K }> {
    if (r.kind === 'failed') throw r.code ? new TufaError(r.code, r.message) : new Error(r.message);
    if (r.kind !== kind) throw new Error('import worker answered the wrong request');
    return r as Extract<ImportResponse, { kind: K }>;
  }

  /** Reads a file in the worker (decoding included); the bytes are handed over, not copied. */
  async open(bytes: ArrayBuffer): Promise<FileSummary> {
    return ImportWorker.expect(await this.ask({ kind: 'open', bytes }, undefined, [bytes]), 'open').file;
  }

  async plan(
    mapping: ColumnMapping,
    sites: SiteDoc[],
    previewRows: number,
    settings?: RequestSettings,
  ): Promise<PlanSummary> {
    const req = { kind: 'plan' as const, mapping, sites, previewRows };
    return ImportWorker.expect(await this.ask(settings ? { ...req, settings: { ...settings } } : req), 'plan')
      .plan;
  }

  /**
   * Imports the last plan: the worker solves every row and writes the documents to IndexedDB
   * itself (one transaction, all or nothing); the page gets progress and the report only.
   */
  async commit(onProgress?: (p: ImportProgress) => void): Promise<ImportReport> {
    return ImportWorker.expect(await this.ask({ kind: 'commit' }, onProgress), 'commit').report;
  }

  private failAll(message: string): void {
    for (const done of this.pending.values()) done({ id: 0, kind: 'failed', message });
    this.pending.clear();
    this.progress.clear();
  }

  close(): void {
    this.worker?.terminate();
    this.worker = undefined;
    this.failAll('closed');
  }
}
