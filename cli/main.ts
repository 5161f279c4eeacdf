#!/usr/bin/env node
/**
 * The executable: runs the program on the process's arguments and streams and exits with its code.
 */

import { processIo } from './io.js';
import { run } from './program.js';

process.exitCode = await run(process.argv.slice(2), processIo());
