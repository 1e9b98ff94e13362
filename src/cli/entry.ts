/** What bin/tufa.mjs runs: the command line on this process's arguments and streams. */

import { EXIT_USAGE } from './io';
import { main } from './main';

// A reader that stops early (`tufa solve < big.jsonl | head`) closes the pipe: stop quietly.
process.stdout.on('error', (e: NodeJS.ErrnoException) => {
  if (e.code === 'EPIPE') process.exit(process.exitCode ?? 0);
  throw e;
});

main(process.argv.slice(2), { stdin: process.stdin, stdout: process.stdout, stderr: process.stderr }).then(
  (code) => {
    process.exitCode = code;
  },
  (e: unknown) => {
    process.stderr.write(`tufa: internal-error: ${(e as Error).stack ?? String(e)}\n`);
    process.exitCode = EXIT_USAGE;
  },
);
