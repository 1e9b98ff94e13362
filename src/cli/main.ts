/**
 * The `tufa` command line: `npx tufa <command> [options]` or `npm run -s tufa -- <command>`.
 * `bin/tufa.mjs` runs an esbuild bundle of `entry.ts` made at install time (see bin/build-cli.mjs).
 * A new command is one import and one row of COMMANDS.
 */

import { runConvert } from './convert';
import { type CliIo, EXIT_OK, EXIT_USAGE } from './io';
import { runPlan } from './plan';
import { runRecompute } from './recompute';
import { runServer } from './server';
import { runSolve } from './solve';
import { runTeam } from './team';
import { runTitrate } from './titrate';

export type Command = (args: string[], io: CliIo) => Promise<number>;

export const COMMANDS: Record<string, { run: Command; summary: string }> = {
  solve: {
    run: runSolve,
    summary: 'carbonate system from two or more measured parameters (JSON Lines or CSV)',
  },
  recompute: {
    run: runRecompute,
    summary: 'results for every row of a logger or spreadsheet CSV (columns recognized from the header)',
  },
  titrate: {
    run: runTitrate,
    summary: 'alkalinity (and DIC) from a field acid titration: Gran, inflection, endpoint, curve fit',
  },
  convert: {
    run: runConvert,
    summary: 'a value between units; salinity, conductance, density and specific gravity',
  },
  plan: {
    run: runPlan,
    summary: 'what a water will be after a dose, CO2 exchange or mixing; the dose for a target',
  },
  server: { run: runServer, summary: 'a team server on this computer (CouchDB API), set up in one command' },
  team: { run: runTeam, summary: 'set up a team database, add and remove people, on any CouchDB server' },
};

export const MAIN_HELP = `tufa — carbonate system of natural waters

Usage: npx tufa <command> [options]     (or npm run -s tufa -- <command>; each command has --help)

Commands:
${Object.entries(COMMANDS)
  .map(([name, c]) => `  ${name.padEnd(10)} ${c.summary}`)
  .join('\n')}
`;

export async function main(argv: string[], io: CliIo): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    io.stdout.write(MAIN_HELP);
    return name === undefined ? EXIT_USAGE : EXIT_OK;
  }
  const command = COMMANDS[name];
  if (!command) {
    io.stderr.write(`tufa: unknown command ${name}\n\n${MAIN_HELP}`);
    return EXIT_USAGE;
  }
  return command.run(rest, io);
}
