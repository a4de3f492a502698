/** The version written into every output is the package's version. */
import { readFileSync } from 'node:fs';
import { expect, it } from 'vitest';
import { VERSION } from '../lib/index.js';
import { cli } from './cli/support.js';

it('VERSION equals package.json and frostgrid --version prints it', async () => {
  const pkg = JSON.parse(readFileSync('package.json', 'utf8'));
  expect(VERSION).toBe(pkg.version);
  const r = await cli('--version');
  expect(r.stdout).toBe(`${pkg.version}\n`);
});
