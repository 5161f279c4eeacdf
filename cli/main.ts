#!/usr/bin/env node
/**
 * The executable: runs the program on the process's arguments and streams and exits with its code.
 * On SIGINT or SIGTERM it removes the temporary files and folders of unfinished outputs, says
 * what was not written, and exits with 128 + the signal number. When the reader of stdout goes
 * away (`termsplit … --json | head`), it stops quietly with 141, the code of a command ended by
 * SIGPIPE, as other command-line tools do: no stack trace, and no temporary file left behind.
 * Any other failure to write stdout gets one line and exit code 1; a closed stderr ends it
 * silently the same way.
 */

import { removeTemporaries } from './files.js';
import { processIo } from './io.js';
import { run } from './program.js';

const SIGNAL_NUMBERS = { SIGINT: 2, SIGTERM: 15 } as const;

for (const [signal, number] of Object.entries(SIGNAL_NUMBERS)) {
  process.once(signal, () => {
    const undone = removeTemporaries();
    const what = undone.length > 0 ? undone.join('; ') : 'no file was left half-written';
    process.stderr.write(`\ntermsplit: interrupted (${signal}): ${what}\n`);
    process.exit(128 + number);
  });
}

/** SIGPIPE's number: Node ignores the signal, so a closed pipe shows up as EPIPE on write. */
const SIGPIPE = 13;

process.stdout.on('error', (e: NodeJS.ErrnoException) => {
  removeTemporaries();
  if (e.code === 'EPIPE') process.exit(128 + SIGPIPE);
  process.stderr.write(`termsplit: cannot write the output: ${e.message}\n`);
  process.exit(1);
});
// With stderr gone there is no one left to tell: stop the same way, silently.
process.stderr.on('error', (e: NodeJS.ErrnoException) => {
  removeTemporaries();
  process.exit(e.code === 'EPIPE' ? 128 + SIGPIPE : 1);
});

process.exitCode = await run(process.argv.slice(2), processIo());
