/**
 * A small in-memory server speaking the part of the CouchDB API sync uses, on 127.0.0.1, that can
 * be told to misbehave: answers that are not JSON, `null` where a list belongs, rows with numeric
 * ids, full pages that never move on, requests that hang, 403/500, and documents stored as they
 * are (hostile, type-swapping, poison) without any validation. For the fuzz and hostile-server
 * tests only; every request it serves is bounded by the test's own loop and timeouts. One server
 * holds one database, whatever name the client uses.
 */

import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { Socket } from 'node:net';

export type FaultKind =
  | 'status-403'
  | 'status-500'
  | 'not-json'
  | 'null-body'
  | 'hang'
  /** `_changes`: `results: null`. */
  | 'null-results'
  /** `_changes` / `_bulk_docs` / `_all_docs`: rows that are null, have numeric ids or no revisions. */
  | 'junk-rows'
  /** `_changes`: a full page of real rows whose `last_seq` is the `since` asked for, forever. */
  | 'same-seq'
  /** `_changes`: full pages whose `last_seq` goes back and forth between two values. */
  | 'cycle-seq'
  /** `_bulk_docs`: stores the docs but leaves half the rows out of the answer. */
  | 'missing-rows';

export type Endpoint = '_changes' | '_bulk_docs' | '_all_docs' | '_local' | 'doc' | 'any';

export interface Fault {
  on: Endpoint;
  kind: FaultKind;
  /** How many matching requests it affects (then it is used up). */
  times: number;
}

interface Stored {
  rev: string;
  seq: number;
  body: Record<string, unknown>;
  deleted: boolean;
}

let revCounter = 0;
function nextRev(prev: string | undefined): string {
  const n = prev ? Number.parseInt(prev, 10) + 1 : 1;
  revCounter++;
  return `${n}-${revCounter.toString(16).padStart(8, '0')}`;
}

export class FakeCouch {
  readonly docs = new Map<string, Stored>();
  readonly locals = new Map<string, Record<string, unknown>>();
  faults: Fault[] = [];
  /** Requests served, by endpoint. */
  readonly counts = new Map<Endpoint, number>();
  private seq = 0;
  private server: Server | undefined;
  private readonly sockets = new Set<Socket>();
  private readonly hung = new Set<ServerResponse>();
  port = 0;

  get url(): string {
    return `http://127.0.0.1:${this.port}/`;
  }

  async start(): Promise<void> {
    this.server = createServer((req, res) => {
      this.handle(req, res).catch(() => {
        if (!res.headersSent) res.writeHead(500);
        res.end();
      });
    });
    this.server.on('connection', (s) => {
      this.sockets.add(s);
      s.on('close', () => this.sockets.delete(s));
    });
    await new Promise<void>((r) => this.server!.listen(0, '127.0.0.1', r));
    const a = this.server.address();
    this.port = typeof a === 'object' && a ? a.port : 0;
  }

  async stop(): Promise<void> {
    for (const r of this.hung) r.destroy();
    for (const s of this.sockets) s.destroy();
    await new Promise<void>((r) => (this.server ? this.server.close(() => r()) : r()));
  }

  /** Releases requests left hanging (the client has timed out on them long ago). */
  releaseHung(): void {
    for (const r of this.hung) r.destroy();
    this.hung.clear();
  }

  /** Stores a document exactly as given (no checks), as another tool writing to the database could. */
  inject(body: Record<string, unknown> & { _id: string }, opts: { deleted?: boolean } = {}): string {
    const cur = this.docs.get(body._id);
    const rev = nextRev(cur?.rev);
    const { _id, _rev, ...rest } = body;
    this.docs.set(_id, { rev, seq: ++this.seq, body: rest, deleted: opts.deleted ?? false });
    return rev;
  }

  docOf(id: string): (Record<string, unknown> & { _id: string; _rev: string }) | undefined {
    const s = this.docs.get(id);
    return s && !s.deleted ? { ...s.body, _id: id, _rev: s.rev } : undefined;
  }

  private takeFault(ep: Endpoint): FaultKind | undefined {
    const i = this.faults.findIndex((f) => (f.on === ep || f.on === 'any') && f.times > 0);
    if (i < 0) return undefined;
    const f = this.faults[i]!;
    f.times--;
    return f.kind;
  }

  private async handle(req: IncomingMessage, res: ServerResponse): Promise<void> {
    const u = new URL(req.url ?? '/', 'http://x');
    const parts = u.pathname.split('/').filter(Boolean).map(decodeURIComponent);
    const chunks: Buffer[] = [];
    for await (const c of req) chunks.push(c as Buffer);
    const text = Buffer.concat(chunks).toString('utf8');
    const body = text ? (JSON.parse(text) as Record<string, unknown>) : undefined;
    const send = (status: number, json: unknown) => {
      res.writeHead(status, { 'content-type': 'application/json' });
      res.end(JSON.stringify(json));
    };
    if (parts.length === 0) return send(200, { couchdb: 'Welcome' });
    if (parts.length === 1) {
      if (req.method === 'PUT') return send(201, { ok: true });
      return send(200, { db_name: parts[0], update_seq: this.seq });
    }
    const rest = parts.slice(1);
    const ep: Endpoint =
      rest[0] === '_changes'
        ? '_changes'
        : rest[0] === '_bulk_docs'
          ? '_bulk_docs'
          : rest[0] === '_all_docs'
            ? '_all_docs'
            : rest[0] === '_local'
              ? '_local'
              : 'doc';
    this.counts.set(ep, (this.counts.get(ep) ?? 0) + 1);
    const fault = this.takeFault(ep);
    if (fault === 'hang') {
      this.hung.add(res);
      return;
    }
    if (fault === 'status-403') return send(403, { error: 'forbidden', reason: 'not for you' });
    if (fault === 'status-500') return send(500, { error: 'internal', reason: 'boom' });
    if (fault === 'not-json') {
      res.writeHead(200, { 'content-type': 'text/html' });
      return void res.end('<html>gateway says hello</html>');
    }
    if (fault === 'null-body') return send(200, null);

    if (ep === '_local') {
      const name = rest.slice(1).join('/');
      if (req.method === 'GET') {
        const l = this.locals.get(name);
        return l ? send(200, l) : send(404, { error: 'not_found' });
      }
      const cur = this.locals.get(name);
      const rev = `0-${Number.parseInt(String(cur?._rev ?? '0-0').slice(2), 10) + 1}`;
      this.locals.set(name, { ...body, _id: `_local/${name}`, _rev: rev });
      return send(201, { ok: true, id: `_local/${name}`, rev });
    }
    if (ep === '_changes') return this.changes(u, fault, send);
    if (ep === '_bulk_docs') return this.bulkDocs(body as { docs: Record<string, unknown>[] }, fault, send);
    if (ep === '_all_docs') {
      const keys = (body?.keys ?? []) as string[];
      if (fault === 'junk-rows')
        return send(200, { rows: [null, { id: 7 }, ...keys.map((k) => ({ key: k }))] });
      return send(200, {
        rows: keys.map((k) => {
          const s = this.docs.get(k);
          if (!s) return { key: k, error: 'not_found' };
          return s.deleted
            ? { id: k, key: k, value: { rev: s.rev, deleted: true }, doc: null }
            : { id: k, key: k, value: { rev: s.rev }, doc: { ...s.body, _id: k, _rev: s.rev } };
        }),
      });
    }
    // A single document.
    const id = rest.join('/');
    const s = this.docs.get(id);
    if (req.method === 'GET') {
      if (u.searchParams.get('open_revs') === 'all')
        return send(
          200,
          s ? [{ ok: { ...s.body, _id: id, _rev: s.rev, ...(s.deleted ? { _deleted: true } : {}) } }] : [],
        );
      if (!s || s.deleted) return send(404, { error: 'not_found', reason: s ? 'deleted' : 'missing' });
      return send(200, { ...s.body, _id: id, _rev: s.rev });
    }
    return send(405, { error: 'method_not_allowed' });
  }

  private changes(u: URL, fault: FaultKind | undefined, send: (s: number, j: unknown) => void): void {
    const since = Number(u.searchParams.get('since') ?? 0) || 0;
    const limit = Number(u.searchParams.get('limit') ?? 1000);
    const all = [...this.docs.entries()].sort((a, b) => a[1].seq - b[1].seq);
    const withDocs = u.searchParams.get('include_docs') === 'true';
    const row = ([id, s]: [string, Stored]) => ({
      id,
      seq: s.seq,
      changes: [{ rev: s.rev }],
      ...(s.deleted ? { deleted: true } : {}),
      ...(withDocs
        ? { doc: { ...s.body, _id: id, _rev: s.rev, ...(s.deleted ? { _deleted: true } : {}) } }
        : {}),
    });
    if (fault === 'null-results') {
      send(200, { results: null, last_seq: since });
      return;
    }
    if (fault === 'same-seq' || fault === 'cycle-seq') {
      const src = all.length
        ? all
        : [['ghost', { rev: '1-0', seq: 1, body: {}, deleted: false }] as [string, Stored]];
      const results = Array.from({ length: limit }, (_, i) => row(src[i % src.length]!));
      const last = fault === 'same-seq' ? since : since === 1 ? 2 : 1;
      // Keep the fault active: this server never moves on.
      this.faults.push({ on: '_changes', kind: fault, times: 1 });
      send(200, { results, last_seq: last });
      return;
    }
    const page = all.filter(([, s]) => s.seq > since).slice(0, limit);
    const results: unknown[] = page.map(row);
    if (fault === 'junk-rows')
      results.unshift(null, { id: 42, changes: [{ rev: '1-a' }] }, { id: 'no-revs' });
    const last = page.length ? page[page.length - 1]![1].seq : Math.max(since, this.seq);
    send(200, { results, last_seq: last });
  }

  private bulkDocs(
    body: { docs: Record<string, unknown>[] },
    fault: FaultKind | undefined,
    send: (s: number, j: unknown) => void,
  ): void {
    const rows = body.docs.map((d) => {
      const id = String(d._id);
      const cur = this.docs.get(id);
      const live = cur && !cur.deleted;
      if ((live && d._rev !== cur.rev) || (!live && cur && d._rev !== undefined && d._rev !== cur.rev))
        return { id, error: 'conflict', reason: 'Document update conflict.' };
      if (!cur && d._rev !== undefined) return { id, error: 'conflict', reason: 'Document update conflict.' };
      const rev = this.inject(d as Record<string, unknown> & { _id: string });
      return { id, ok: true, rev };
    });
    if (fault === 'junk-rows') send(201, [null, ...rows.map((r) => ({ ...r, id: 12345 }))]);
    else if (fault === 'missing-rows') send(201, rows.slice(0, Math.ceil(rows.length / 2)));
    else send(201, rows);
  }
}
