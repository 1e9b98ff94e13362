/** The page's side of the import worker (`import.worker.ts`): one worker per open data panel. */

import type { ColumnMapping } from '../../io/column-mapping';
import type { SiteDoc } from '../../io/docs';
import type { ImportPlan } from '../../io/import-plan';
import type { RowIssue } from '../../io/io-issues';
import type { RequestSettings } from '../../reading/request';
import type { FileSummary, ImportRequest, ImportResponse, PlanSummary } from './import.worker';

type Req = ImportRequest extends infer R ? (R extends ImportRequest ? Omit<R, 'id'> : never) : never;

export class ImportWorker {
  private worker: Worker | undefined;
  private next = 1;
  private pending = new Map<number, (r: ImportResponse) => void>();

  private ask(req: Req): Promise<ImportResponse> {
    if (!this.worker) {
      this.worker = new Worker(new URL('./import.worker.ts', import.meta.url), { type: 'module' });
      this.worker.onmessage = (ev: MessageEvent<ImportResponse>) => {
        const done = this.pending.get(ev.data.id);
        this.pending.delete(ev.data.id);
        done?.(ev.data);
      };
    }
    const id = this.next++;
    return new Promise((resolve) => {
      this.pending.set(id, resolve);
      this.worker!.postMessage({ ...req, id } as ImportRequest);
    });
  }

  private static expect<K extends ImportResponse['kind']>(
    r: ImportResponse,
    kind: K,
  ): Extract<ImportResponse, { kind: K }> {
    if (r.kind === 'failed') throw new Error(r.message);
    if (r.kind !== kind) throw new Error('import worker answered the wrong request');
    return r as Extract<ImportResponse, { kind: K }>;
  }

  async open(text: string): Promise<FileSummary> {
    return ImportWorker.expect(await this.ask({ kind: 'open', text }), 'open').file;
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

  /** The full plan of the last mapping, with the rows the engine could not compute. */
  async take(): Promise<{ plan: ImportPlan; warnings: RowIssue[] }> {
    const r = ImportWorker.expect(await this.ask({ kind: 'take' }), 'take');
    return { plan: r.plan, warnings: r.warnings };
  }

  close(): void {
    this.worker?.terminate();
    this.worker = undefined;
    for (const done of this.pending.values()) done({ id: 0, kind: 'failed', message: 'closed' });
    this.pending.clear();
  }
}
