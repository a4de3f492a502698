#!/usr/bin/env node
/** The `frostgrid` command: a thin layer over the library's public API (see bin/cli/). */
import { main } from './cli/main.js';

process.exitCode = await main(process.argv.slice(2), {
  stdout: (s) => process.stdout.write(s),
  stderr: (s) => process.stderr.write(s),
  stderrIsTTY: process.stderr.isTTY === true,
});
