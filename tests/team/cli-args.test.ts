/** `tufa server` and `tufa team` refuse unusable arguments with a code, before touching any server. */

import { describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main';

async function tufa(...args: string[]) {
  let out = '';
  let err = '';
  const code = await main(args, {
    stdin: process.stdin,
    stdout: { write: (s: string) => (out += s) },
    stderr: { write: (s: string) => (err += s) },
  });
  return { code, out, err };
}

describe('argument errors', () => {
  it('server: folder, port and admin are checked', async () => {
    expect((await tufa('server', '--admin', 'a:b')).err).toMatch(/^error \[team-bad-name\]: --dir is needed/);
    expect((await tufa('server', '--dir', 'x', '--port', '99999', '--admin', 'a:b')).err).toMatch(
      /--port must be a whole number from 1 to 65535/,
    );
    const noAdmin = await tufa('server', '--dir', 'x');
    expect(noAdmin.code).toBe(2);
    expect(noAdmin.err).toMatch(/^error \[team-bad-admin\]: --admin must be NAME:PASSWORD/);
    expect((await tufa('server', '--help')).out).toMatch(/plain\s+http/);
  });

  it('team: url, database name, user name and role are checked', async () => {
    expect((await tufa('team', 'setup', '--url', 'ftp://x', '--admin', 'a:b', '--db', 'tufa')).err).toMatch(
      /^error \[team-bad-url\]/,
    );
    expect(
      (await tufa('team', 'setup', '--url', 'http://127.0.0.1:9/', '--admin', 'a:b', '--db', 'Team')).err,
    ).toMatch(/^error \[team-bad-name\]: --db must be a database name in lower case/);
    expect(
      (
        await tufa(
          'team',
          'add-user',
          '--url',
          'http://127.0.0.1:9/',
          '--admin',
          'a:b',
          '--name',
          '_x',
          '--password',
          'p',
          '--role',
          'member',
        )
      ).err,
    ).toMatch(/^error \[team-bad-name\]: --name/);
    expect((await tufa('team', 'frobnicate', '--url', 'http://127.0.0.1:9/', '--admin', 'a:b')).err).toMatch(
      /unknown team command frobnicate/,
    );
    // Nothing listens on the discard port: said in words, exit status 1 (not an argument error).
    const down = await tufa('team', 'list-users', '--url', 'http://127.0.0.1:9/', '--admin', 'a:b');
    expect(down.err).toMatch(/^error \[team-unreachable\]: No CouchDB server answers/);
    expect(down.code).toBe(1);
  });
});
