/**
 * The README's TypeScript example for notebooks is run as written (with the package import
 * pointed at the library source), and what it prints is checked against the summary that the
 * command writes for the same level.
 */
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { describe, expect, it, vi } from 'vitest';
import { cli } from './cli/support.js';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';

describe('README', () => {
  const readme = readFileSync('README.md', 'utf8');

  it('opens with the job paragraph and the two set-up commands', () => {
    const firstParagraph = readme.split('\n\n')[1];
    expect(firstParagraph).toMatch(/ice-supersaturated/);
    expect(readme).toContain('npm ci && npm run demo');
    expect(readme).toContain('npm test');
    expect(readme).toMatch(/not an operational flight-planning/);
  });

  it('links only to files that exist, and the package ships them', () => {
    const pkg = JSON.parse(readFileSync('package.json', 'utf8')) as { files: string[] };
    for (const doc of ['README.md', 'REFERENCES.md']) {
      const text = readFileSync(doc, 'utf8');
      const links = [...text.matchAll(/\]\(([^)#\s]+)\)/g)].map((m) => m[1]).filter((l) => !/^[a-z]+:/.test(l));
      if (doc === 'README.md') expect(links).toContain('REFERENCES.md');
      for (const link of links) {
        expect(existsSync(link), `${doc} links to ${link}`).toBe(true);
        expect(pkg.files.some((f) => link === f || link.startsWith(`${f}/`)), `${link} is in package.json files`).toBe(true);
      }
    }
  });

  it('its library example runs and agrees with frostgrid masks', async () => {
    const m = /```ts\n([\s\S]*?)```/.exec(readme);
    expect(m).not.toBeNull();
    const code = (m as RegExpExecArray)[1].replace(/from 'frostgrid'/g, `from '${resolve('lib/index.js')}'`);
    const dir = resolve('test/.generated');
    mkdirSync(dir, { recursive: true });
    const file = join(dir, 'readme-example.ts');
    writeFileSync(file, code);
    const lines: string[] = [];
    const spy = vi.spyOn(console, 'log').mockImplementation((...a: unknown[]) => {
      lines.push(a.join(' '));
    });
    try {
      await import(/* @vite-ignore */ file);
    } finally {
      spy.mockRestore();
    }
    expect(lines).toHaveLength(1);
    const km2 = Number(/^(\d+) km² of persistent contrails at 250 hPa$/.exec(lines[0])?.[1]);

    const out = mkdtempSync(join(tmpdir(), 'frostgrid-readme-'));
    const r = await cli('masks', 'data-samples/demo/frostgrid-demo.nc', '--out', out, '--levels', '250', '--times', '2029-10-17T06:00Z', '--quiet');
    expect(r.code).toBe(0);
    const summary = JSON.parse(readFileSync(join(out, 'frostgrid-demo', '20291017T0600Z', 'summary.json'), 'utf8'));
    const expected = summary.times[0].levels[0].persistent_contrail.area_km2;
    expect(expected).toBeGreaterThan(0);
    expect(km2).toBe(Math.round(expected));
  });
});
