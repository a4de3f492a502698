/**
 * Dispatch of `frostgrid <subcommand>`. Exit codes: 0 success, 1 data or file error, 2 usage
 * error. Errors are one line on stderr naming the file and the problem; `--debug` adds the stack
 * and the chain of causes.
 */
import { FrostgridError } from '../../lib/index.js';
import { EXIT_DATA, EXIT_USAGE, UsageError, type CliIo } from './io.js';
import { infoCommand, INFO_HELP } from './commands/info.js';
import { probeCommand, PROBE_HELP } from './commands/probe.js';
import { masksCommand, MASKS_HELP } from './commands/masks.js';
import { thresholdCommand, THRESHOLD_HELP } from './commands/threshold.js';

type Command = (args: readonly string[], io: CliIo) => Promise<number>;

const COMMANDS: Readonly<Record<string, { run: Command; help: string; summary: string }>> = {
  info: { run: infoCommand, help: INFO_HELP, summary: 'describe a NetCDF or GRIB file: variables, levels, times, grid' },
  probe: { run: probeCommand, help: PROBE_HELP, summary: 'values of a variable at points, at the nearest grid node' },
  masks: { run: masksCommand, help: MASKS_HELP, summary: 'RHi, ice-supersaturation and contrail masks as GeoTIFFs + summaries' },
  threshold: { run: thresholdCommand, help: THRESHOLD_HELP, summary: 'Schmidt–Appleman threshold temperatures at one pressure' },
};

export const MAIN_HELP = `Usage: frostgrid <command> [options]

Where the air is ice-supersaturated, where aircraft would form contrails (Schmidt–Appleman
criterion) and where those contrails would persist, level by level, from NetCDF or GRIB files.

Commands:
${Object.entries(COMMANDS)
  .map(([name, c]) => `  ${name.padEnd(10)} ${c.summary}`)
  .join('\n')}

Run "frostgrid <command> --help" for a command's options and an example.

Example:
  frostgrid masks forecast.grib2 --out results --levels 200-300 --quicklook

frostgrid informs research and planning. It is not an operational flight-planning or air-traffic
tool; route or level changes defer to the aviation authorities and licensed practice.
`;

export async function main(argv: readonly string[], io: CliIo): Promise<number> {
  const debug = argv.includes('--debug');
  const args = argv.filter((a) => a !== '--debug');
  const [name, ...rest] = args;
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    if (name === undefined) {
      io.stderr(MAIN_HELP);
      return EXIT_USAGE;
    }
    io.stdout(MAIN_HELP);
    return 0;
  }
  if (name === '--version') {
    io.stdout(`${(await import('../../lib/index.js')).VERSION}\n`);
    return 0;
  }
  const command = COMMANDS[name];
  if (command === undefined) {
    io.stderr(`frostgrid: unknown command "${name}"; commands: ${Object.keys(COMMANDS).join(', ')} (see frostgrid --help)\n`);
    return EXIT_USAGE;
  }
  try {
    return await command.run(rest, io);
  } catch (e) {
    if (e instanceof UsageError) {
      io.stderr(`frostgrid ${name}: ${e.message} (see frostgrid ${name} --help)\n`);
      return EXIT_USAGE;
    }
    io.stderr(`frostgrid ${name}: ${describeError(e)}\n`);
    if (debug) io.stderr(debugTrace(e));
    return EXIT_DATA;
  }
}

/** One line: the error's own message (which names the file), plus the innermost cause's. */
function describeError(e: unknown): string {
  if (!(e instanceof Error)) return String(e);
  let msg = oneLine(e.message);
  let cause: unknown = e.cause;
  while (cause instanceof Error) {
    const inner = oneLine(cause.message);
    if (!msg.includes(inner)) msg += `: ${inner}`;
    cause = cause.cause;
  }
  if (!(e instanceof FrostgridError)) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code === 'ENOENT' || code === 'EACCES' || code === 'EISDIR' || code === 'ENOTDIR') return msg;
    return `unexpected error: ${msg} (rerun with --debug for details)`;
  }
  return msg;
}

function oneLine(s: string): string {
  return s.replace(/\s*\n\s*/g, ' ').trim();
}

function debugTrace(e: unknown): string {
  const parts: string[] = [];
  let cur: unknown = e;
  while (cur instanceof Error) {
    parts.push(cur.stack ?? String(cur));
    cur = cur.cause;
  }
  return parts.join('\ncaused by: ') + '\n';
}
