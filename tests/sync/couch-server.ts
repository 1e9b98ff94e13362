/**
 * Starts a real CouchDB-API server (pouchdb-server from npm) on a free loopback port for a test
 * file, persisting into a temporary folder so it can be killed and restarted with its data.
 */

import { type ChildProcess, spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const BIN = join(process.cwd(), 'node_modules', 'pouchdb-server', 'bin', 'pouchdb-server');

/** A port nothing listens on at 127.0.0.1 right now. */
export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const addr = s.address();
      const port = typeof addr === 'object' && addr ? addr.port : 0;
      s.close(() => resolve(port));
    });
  });
}

export class CouchServer {
  private child: ChildProcess | undefined;
  readonly dir = mkdtempSync(join(tmpdir(), 'tufa-couch-'));
  port = 0;
  /** A server started outside the tests (`.ci/run` sets TUFA_COUCH_URL): used as it is, never killed. */
  private readonly external: string | undefined;

  /** `shared`: use the CI's server when there is one (tests that neither kill nor reconfigure it). */
  constructor(opts: { shared?: boolean } = {}) {
    const env = process.env.TUFA_COUCH_URL;
    this.external = opts.shared && env ? (env.endsWith('/') ? env : `${env}/`) : undefined;
  }

  get url(): string {
    return this.external ?? `http://127.0.0.1:${this.port}/`;
  }

  async start(): Promise<void> {
    if (this.external) return;
    if (this.port === 0) this.port = await freePort();
    this.child = spawn(
      process.execPath,
      [
        BIN,
        '--dir',
        join(this.dir, 'db'),
        '--config',
        join(this.dir, 'config.json'),
        '--port',
        String(this.port),
        '--host',
        '127.0.0.1',
        '--no-stdout-logs',
      ],
      { cwd: this.dir, stdio: 'ignore' },
    );
    const deadline = Date.now() + 20000;
    for (;;) {
      try {
        const r = await fetch(this.url);
        if (r.ok) return;
      } catch {
        // not up yet
      }
      if (Date.now() > deadline) throw new Error('pouchdb-server did not start within 20 s');
      await new Promise((r) => setTimeout(r, 100));
    }
  }

  /** Kills the process at once (SIGKILL), as a crash or a pulled plug would. */
  async kill(): Promise<void> {
    if (this.external) throw new Error('a shared server is not killed by tests');
    const c = this.child;
    if (!c || c.exitCode !== null) return;
    const exited = new Promise((r) => c.once('exit', r));
    c.kill('SIGKILL');
    await exited;
    this.child = undefined;
  }

  async createDb(name: string): Promise<void> {
    const r = await fetch(`${this.url}${name}`, { method: 'PUT' });
    if (!r.ok && r.status !== 412) throw new Error(`cannot create ${name}: ${r.status}`);
  }

  async allDocs(db: string): Promise<{ id: string; value: { rev: string } }[]> {
    const r = await fetch(`${this.url}${db}/_all_docs`);
    return ((await r.json()) as { rows: { id: string; value: { rev: string } }[] }).rows;
  }

  async stop(): Promise<void> {
    if (!this.external) await this.kill();
    rmSync(this.dir, { recursive: true, force: true });
  }
}
