/**
 * Starts `tufa server` (the real command, `bin/tufa.mjs`) on a free loopback port
 * and a temporary folder, so a test can kill it (SIGKILL) and start it again on the same data.
 */

import { type ChildProcess, spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { freePort } from '../sync/couch-server';

export class TufaServer {
  private child: ChildProcess | undefined;
  readonly dir = mkdtempSync(join(tmpdir(), 'tufa-team-'));
  port = 0;
  output = '';

  constructor(
    readonly admin = 'root:field-admin-pass',
    readonly db = 'team',
  ) {}

  get url(): string {
    return `http://127.0.0.1:${this.port}/`;
  }

  async start(): Promise<void> {
    if (this.port === 0) this.port = await freePort();
    const child = spawn(
      process.execPath,
      [
        'bin/tufa.mjs',
        'server',
        '--dir',
        this.dir,
        '--port',
        String(this.port),
        '--admin',
        this.admin,
        '--db',
        this.db,
      ],
      { cwd: process.cwd(), stdio: ['ignore', 'pipe', 'pipe'] },
    );
    this.child = child;
    const ready = new Promise<void>((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error(`tufa server did not start:\n${this.output}`)), 60000);
      const onData = (b: Buffer) => {
        this.output += b.toString();
        if (this.output.includes('Stop with Ctrl-C.')) {
          clearTimeout(timer);
          resolve();
        }
      };
      child.stdout?.on('data', onData);
      child.stderr?.on('data', onData);
      child.once('exit', (code) => {
        clearTimeout(timer);
        reject(new Error(`tufa server exited (${code}):\n${this.output}`));
      });
    });
    await ready;
  }

  async kill(): Promise<void> {
    const c = this.child;
    if (!c || c.exitCode !== null) return;
    const exited = new Promise((r) => c.once('exit', r));
    c.kill('SIGKILL');
    await exited;
    this.child = undefined;
  }

  async stop(): Promise<void> {
    await this.kill();
    rmSync(this.dir, { recursive: true, force: true });
  }
}
