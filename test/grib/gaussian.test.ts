/**
 * Gaussian latitudes (Legendre roots by Newton iteration) against ecCodes' distinctLatitudes
 * (gaussian-latitudes.json, from ecCodes' reduced Gaussian samples N32…N1280, and the N16 and N32
 * grids of gaussian.grib2), and the rows of Gaussian fixtures.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { buildGrid, gaussianLatitudes } from '../../lib/formats/grib/index.js';
import { FIXTURES, REFERENCE, fixtureIndex } from './reference.js';

const eccodes: { latitudes: Record<string, number[]> } = JSON.parse(readFileSync(`${FIXTURES}/gaussian-latitudes.json`, 'utf8'));

describe('gaussianLatitudes', () => {
  it.each(Object.entries(eccodes.latitudes))('N%s equals ecCodes to 1e-9 degree, symmetric about the equator', (n, want) => {
    const got = gaussianLatitudes(Number(n));
    expect(got.length).toBe(2 * Number(n));
    let worst = 0;
    for (let k = 0; k < want.length; k++) {
      worst = Math.max(worst, Math.abs(got[k] - want[k]));
      expect(got[2 * Number(n) - 1 - k]).toBe(-got[k]);
    }
    expect(worst).toBeLessThan(1e-9);
  });

  it('is not evenly spaced (Legendre roots): N16 spacing varies', () => {
    const l = gaussianLatitudes(16);
    const d0 = l[0] - l[1];
    const dm = l[15] - l[16];
    expect(Math.abs(d0 - dm)).toBeGreaterThan(1e-3);
  });

  it('rejects an absurd N', () => {
    expect(() => gaussianLatitudes(0)).toThrow(RangeError);
    expect(() => gaussianLatitudes(1e7)).toThrow(RangeError);
  });
});

describe('Gaussian grids of gaussian.grib2', () => {
  const ref = REFERENCE['gaussian.grib2'].messages;
  it.each(ref.map((m, k) => [k, m] as const))('field %i: rows, points per row, octahedral flag as ecCodes reports', async (k, m) => {
    const index = await fixtureIndex('gaussian.grib2');
    const { grid } = buildGrid(index.fields[k].grid);
    if (grid.kind !== 'gaussian') throw new Error('not a Gaussian grid');
    expect(grid.N).toBe(m.N);
    const distinct = m.distinctLatitudes!.slice().sort((a, b) => b - a);
    expect(Array.from(grid.lat).map((x) => x.toFixed(6))).toEqual(distinct.map((x) => x.toFixed(6)));
    if (m.gridType === 'reduced_gg') expect(Array.from(grid.pointsPerRow)).toEqual(m.pl);
    expect(grid.reduced).toBe(m.gridType === 'reduced_gg');
    // Octahedral: 20 + 4i points on the i-th row from a pole (the rule, not ecCodes' key).
    const pl = Array.from(grid.pointsPerRow);
    const octa = m.gridType === 'reduced_gg' && pl.every((p, r) => p === 20 + 4 * Math.min(r, pl.length - 1 - r));
    expect(grid.octahedral).toBe(octa);
  });
});
