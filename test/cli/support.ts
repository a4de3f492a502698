/** Runs the command line in-process and captures stdout, stderr and the exit code. */
import { main } from '../../bin/cli/main.js';

export interface CliRun {
  readonly code: number;
  readonly stdout: string;
  readonly stderr: string;
}

export async function cli(...argv: string[]): Promise<CliRun> {
  let stdout = '';
  let stderr = '';
  const code = await main(argv, {
    stdout: (s) => {
      stdout += s;
    },
    stderr: (s) => {
      stderr += s;
    },
    stderrIsTTY: false,
  });
  return { code, stdout, stderr };
}
