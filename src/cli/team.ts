/**
 * `tufa team`: set up a team database and its people on any CouchDB-API server, over the CouchDB
 * HTTP API (`src/team/team-admin.ts`). Errors print as `error [code]: message`.
 */

import { parseArgs } from 'node:util';
import { ROLE_NAMES } from '../team/doc-rules';
import {
  type AdminTarget,
  addUser,
  checkDbName,
  checkRole,
  checkUserName,
  listUsers,
  parseAdmin,
  parseUrl,
  removeUser,
  setupTeam,
  TeamError,
} from '../team/team-admin';
import { type CliIo, EXIT_ROW_FAILED as EXIT_FAILED, EXIT_OK, EXIT_USAGE } from './io';

export const TEAM_HELP = `tufa team — a team database and its people on a CouchDB server (Apache CouchDB or tufa server)

Usage:
  tufa team setup       --url URL --admin NAME:PASSWORD --db NAME
  tufa team add-user    --url URL --admin NAME:PASSWORD --name N --password P --role ROLE
  tufa team list-users  --url URL --admin NAME:PASSWORD
  tufa team remove-user --url URL --admin NAME:PASSWORD --name N

setup creates the database (and _users), lets only signed-in team members in (_security) and
stores the rules the server checks every change against (_design/tufa-team). Running it again
changes nothing, or brings the rules up to date after a Tufa update.

Roles (${ROLE_NAMES.join(', ')}):
  viewer   reads everything, changes nothing
  member   adds sites and readings; changes or deletes only what they created
  lead     changes and deletes anything
  Server admins (--admin) manage people; a role holds on every team database of the server.

--admin may be left out when TUFA_ADMIN=NAME:PASSWORD is set (keeps the password out of the
shell history). Over plain http the password crosses the network readable: use https beyond
this computer.
`;

const OPTIONS = {
  url: { type: 'string' },
  admin: { type: 'string' },
  db: { type: 'string' },
  name: { type: 'string' },
  password: { type: 'string' },
  role: { type: 'string' },
  help: { type: 'boolean', short: 'h' },
} as const;

export async function runTeam(args: string[], io: CliIo): Promise<number> {
  const [sub, ...rest] = args;
  if (sub === undefined || sub === '--help' || sub === '-h' || sub === 'help') {
    io.stdout.write(TEAM_HELP);
    return sub === undefined ? EXIT_USAGE : EXIT_OK;
  }
  let v: Record<string, string | boolean | undefined>;
  try {
    v = parseArgs({ args: rest, options: OPTIONS, strict: true }).values;
  } catch (e) {
    io.stderr.write(`error [team-usage]: ${(e as Error).message}\n\n${TEAM_HELP}`);
    return EXIT_USAGE;
  }
  if (v.help) {
    io.stdout.write(TEAM_HELP);
    return EXIT_OK;
  }
  try {
    const t: AdminTarget = {
      url: parseUrl(v.url as string | undefined),
      admin: parseAdmin((v.admin as string | undefined) ?? process.env.TUFA_ADMIN),
    };
    switch (sub) {
      case 'setup': {
        const db = checkDbName(v.db as string | undefined);
        const r = await setupTeam(t, db);
        for (const x of r.created) io.stdout.write(`set up: ${x}\n`);
        for (const x of r.unchanged) io.stdout.write(`already there: ${x}\n`);
        for (const x of r.hints) io.stdout.write(`note: ${x}\n`);
        io.stdout.write(`Team database ${db} is ready at ${t.url}${db}\n`);
        return EXIT_OK;
      }
      case 'add-user': {
        const name = checkUserName(v.name as string | undefined);
        const role = checkRole(v.role as string | undefined);
        const password = v.password as string | undefined;
        if (!password)
          throw new TeamError('team-bad-name', '--password is needed for a new or changed user.');
        const how = await addUser(t, name, password, role);
        io.stdout.write(`${how === 'created' ? 'added' : 'updated'}: ${name} (${role})\n`);
        return EXIT_OK;
      }
      case 'list-users': {
        const users = await listUsers(t);
        if (users.length === 0) io.stdout.write('(no users yet; add one with tufa team add-user)\n');
        for (const u of users) {
          const team = u.roles.filter((r) => (ROLE_NAMES as string[]).includes(r));
          io.stdout.write(`${u.name}\t${team.join(',') || '(no Tufa role)'}\n`);
        }
        return EXIT_OK;
      }
      case 'remove-user': {
        const name = checkUserName(v.name as string | undefined);
        await removeUser(t, name);
        io.stdout.write(`removed: ${name} (what they created stays, with their name on it)\n`);
        return EXIT_OK;
      }
      default:
        io.stderr.write(`error [team-usage]: unknown team command ${sub}\n\n${TEAM_HELP}`);
        return EXIT_USAGE;
    }
  } catch (e) {
    if (e instanceof TeamError) {
      io.stderr.write(`error [${e.code}]: ${e.message}\n`);
      // 2: the arguments cannot work; 1: the server could not do it.
      return e.code.startsWith('team-bad-') ? EXIT_USAGE : EXIT_FAILED;
    }
    throw e;
  }
}
