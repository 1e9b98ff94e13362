/**
 * `tufa server`: the embedded team server in one command (`src/server/team-server.ts`).
 * Runs until stopped (Ctrl-C); its data stays in --dir and is there again on the next start.
 */

import { parseArgs } from 'node:util';
import { isLoopback, startTeamServer } from '../server/team-server';
import { checkDbName, parseAdmin, TeamError } from '../team/team-admin';
import { type CliIo, EXIT_ROW_FAILED as EXIT_FAILED, EXIT_OK, EXIT_USAGE } from './io';

export const SERVER_HELP = `tufa server — a team server on this computer, in one command

Usage:
  tufa server --dir DIR --admin NAME:PASSWORD [--port 5984] [--db tufa] [--host 127.0.0.1]

Keeps every database in DIR (created if missing) and serves the CouchDB API. The first start
makes NAME the server admin; later starts with the same DIR keep the data and check the admin.
It creates the team database (--db) and applies the same rules as "tufa team setup": only
signed-in people with a role read it; the server checks every change. Add people with
"tufa team add-user --url <address> ...".

--host 0.0.0.0 opens the server to the local network (phones on the same Wi-Fi). That is plain
http: passwords and data cross the network readable. On a network you do not control, put an
https proxy in front, or use a CouchDB server with https.
--admin may be left out when TUFA_ADMIN=NAME:PASSWORD is set.
`;

export async function runServer(args: string[], io: CliIo): Promise<number> {
  let v: Record<string, string | boolean | undefined>;
  try {
    v = parseArgs({
      args,
      options: {
        dir: { type: 'string' },
        port: { type: 'string', default: '5984' },
        host: { type: 'string', default: '127.0.0.1' },
        admin: { type: 'string' },
        db: { type: 'string', default: 'tufa' },
        help: { type: 'boolean', short: 'h' },
      },
      strict: true,
    }).values;
  } catch (e) {
    io.stderr.write(`error [server-usage]: ${(e as Error).message}\n\n${SERVER_HELP}`);
    return EXIT_USAGE;
  }
  if (v.help) {
    io.stdout.write(SERVER_HELP);
    return EXIT_OK;
  }
  try {
    const dir = v.dir as string | undefined;
    if (!dir) throw new TeamError('team-bad-name', '--dir is needed: the folder that keeps the databases.');
    const port = Number(v.port);
    if (!Number.isInteger(port) || port < 1 || port > 65535)
      throw new TeamError('team-bad-name', `--port must be a whole number from 1 to 65535, not "${v.port}".`);
    const host = v.host as string;
    const admin = parseAdmin((v.admin as string | undefined) ?? process.env.TUFA_ADMIN);
    const db = checkDbName(v.db as string);
    if (!isLoopback(host))
      io.stderr.write(
        `warning [server-plain-http]: listening on ${host} over plain http: passwords and readings cross the network readable. Use it only on a network you trust, or put https in front.\n`,
      );
    let s: Awaited<ReturnType<typeof startTeamServer>>;
    try {
      s = await startTeamServer({ dir, port, host, admin, db });
    } catch (e) {
      // The HTTP server may already listen in this process: end the process, not just the command.
      io.stderr.write(
        `error [${e instanceof TeamError ? e.code : 'team-server-error'}]: ${(e as Error).message}\n`,
      );
      process.exit(EXIT_FAILED);
    }
    for (const x of s.report.created) io.stdout.write(`set up: ${x}\n`);
    for (const x of s.report.hints) io.stdout.write(`note: ${x}\n`);
    io.stdout.write(`Tufa team server running, data in ${dir}\n`);
    io.stdout.write(`  on this computer: ${s.local}  (database ${db})\n`);
    if (s.network.length)
      for (const a of s.network) io.stdout.write(`  phones on this network: ${a}  (database ${db})\n`);
    else io.stdout.write('  only this computer can connect; start with --host 0.0.0.0 to let phones in\n');
    io.stdout.write(
      `Add people: npm run -s tufa -- team add-user --url ${s.local} --admin ${admin.name}:… --name N --password P --role member\n`,
    );
    io.stdout.write('Stop with Ctrl-C.\n');
    await new Promise(() => {});
    return EXIT_OK;
  } catch (e) {
    if (e instanceof TeamError) {
      io.stderr.write(`error [${e.code}]: ${e.message}\n`);
      // 2: the arguments cannot work; 1: the server could not do it.
      return e.code.startsWith('team-bad-') ? EXIT_USAGE : EXIT_FAILED;
    }
    throw e;
  }
}
