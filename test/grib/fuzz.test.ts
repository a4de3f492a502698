/**
 * Damaged bytes (a seeded generator flips bytes of committed fixtures): indexing and decoding must
 * end, and every failure must be a typed frostgrid error — never a RangeError, a TypeError or a
 * hang. No outside reference: the property is that nothing escapes untyped.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { FrostgridError } from '../../lib/errors.js';
import { readGribIndex } from '../../lib/formats/grib/index.js';
import { fixture } from './reference.js';

function lcg(seed: number) {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 4294967296);
}

const dir = mkdtempSync(join(tmpdir(), 'frostgrid-fuzz-'));

describe.each(['ll-packings.grib2', 'multi-field.grib2', 'complex-spatial.grib2', 'gaussian.grib2', 'mixed.grib2'])('%s with flipped bytes', (name) => {
  it('indexes and decodes, failing only with typed errors', async () => {
    const original = readFileSync(fixture(name));
    const rnd = lcg(name.length * 7919);
    let typed = 0;
    for (let trial = 0; trial < 60; trial++) {
      const b = Uint8Array.from(original);
      const flips = 1 + Math.floor(rnd() * 4);
      for (let f = 0; f < flips; f++) b[Math.floor(rnd() * b.length)] = Math.floor(rnd() * 256);
      const path = join(dir, `${trial}-${name}`);
      writeFileSync(path, b);
      const index = await readGribIndex(path);
      for (const p of index.problems) expect(p).toBeInstanceOf(FrostgridError);
      typed += index.problems.length;
      for (const f of index.fields) {
        try {
          const v = f.decodeAsync ? await f.decodeAsync() : f.decode();
          expect(v.length).toBe(f.numberOfPoints);
        } catch (e) {
          if (!(e instanceof FrostgridError)) throw new Error(`trial ${trial}, message ${f.location.number}: untyped ${String(e)}`);
          typed++;
        }
      }
    }
    expect(typed).toBeGreaterThan(0);
  });
});
