/**
 * Outside reference tools for tests. A test that needs one calls `requireTool`: locally, when the
 * tool is absent, the test is skipped with a message; with CI set, an absent tool fails the test,
 * because .ci/run installs it.
 */
import { execFileSync, spawnSync } from 'node:child_process';

/** Debian's python (python3-numpy, python3-netcdf4, … live there, not in a pyenv python). */
export const PYTHON = '/usr/bin/python3';

const cache = new Map<string, boolean>();

function probe(cmd: string, args: string[]): boolean {
  const key = [cmd, ...args].join(' ');
  let ok = cache.get(key);
  if (ok === undefined) {
    const r = spawnSync(cmd, args, { stdio: 'ignore' });
    ok = r.error === undefined && r.status === 0;
    cache.set(key, ok);
  }
  return ok;
}

/** True when a command-line tool is on PATH. */
export function hasCommand(name: string): boolean {
  return probe('sh', ['-c', `command -v ${name}`]);
}

/** True when Debian's python can import the module. */
export function hasPythonModule(module: string): boolean {
  return probe(PYTHON, ['-c', `import ${module}`]);
}

export const inCI = process.env.CI !== undefined && process.env.CI !== '' && process.env.CI !== 'false';

/**
 * Returns true when the tool is present. When absent: throws in CI (the test fails), otherwise
 * prints why and returns false so the caller can skip (`if (!requireTool(...)) return;` or use
 * `toolTest` below).
 */
export function toolAvailable(kind: 'command' | 'python', name: string): boolean {
  const ok = kind === 'command' ? hasCommand(name) : hasPythonModule(name);
  if (!ok && inCI) throw new Error(`reference tool ${name} (${kind}) is missing in CI; .ci/run should install it`);
  if (!ok) process.stderr.write(`skipping: reference tool ${name} (${kind}) is not installed\n`);
  return ok;
}

/** Runs a command and returns stdout as text; throws with stderr on failure. */
export function run(cmd: string, args: string[], input?: string): string {
  return execFileSync(cmd, args, { encoding: 'utf8', input, maxBuffer: 1 << 28, stdio: ['pipe', 'pipe', 'pipe'] });
}
