/**
 * Grid coordinates against ecCodes (reference.json.gz: codes_get_array 'latitudes'/'longitudes', in
 * the message's scanning order): after frostgrid reorders the points (rows west → east, rows in
 * the message's j order), point k's coordinates must equal ecCodes' coordinates of the message
 * point it came from.
 */
import { describe, expect, it } from 'vitest';
import { buildGrid, gridLonLat } from '../../lib/formats/grib/index.js';
import { REFERENCE, fixtureIndex } from './reference.js';

const files = Object.keys(REFERENCE).filter((f) => !f.startsWith('bad-'));

/** Difference of two longitudes, degrees, in −180..180. */
const dlon = (a: number, b: number) => ((((a - b) % 360) + 540) % 360) - 180;

describe.each(files)('%s: grid coordinates against ecCodes', (file) => {
  const ref = REFERENCE[file];
  it.each(ref.messages.map((m, k) => [k, m] as const))('field %i', async (k, m) => {
    if (!m.latitudes || !m.longitudes) return;
    const index = await fixtureIndex(file);
    const { grid, order } = buildGrid(index.fields[k].grid, file);
    if (grid.kind === 'rotated_ll') return; // rotated coordinates: see rotated.test.ts
    expect(grid.npoints).toBe(m.latitudes.length);
    const { lon, lat } = gridLonLat(grid);
    let worstLat = 0;
    let worstLon = 0;
    for (let q = 0; q < grid.npoints; q++) {
      const src = order ? order[q] : q;
      worstLat = Math.max(worstLat, Math.abs(lat[q] - m.latitudes[src]));
      // Longitude is undefined at the poles.
      if (Math.abs(m.latitudes[src]) < 89.999) worstLon = Math.max(worstLon, Math.abs(dlon(lon[q], m.longitudes[src])));
    }
    const tol = grid.kind === 'projected' ? 1e-6 : 1e-6;
    expect(worstLat).toBeLessThan(tol);
    expect(worstLon).toBeLessThan(tol);
  });
});

describe('longitude numbering of regular grids (frostgrid convention, checked against the span)', () => {
  const def = (lon1: number, lon2: number, ni: number) => ({
    type: 'regular_ll' as const, template: '3.0', earth: { kind: 'sphere' as const, radiusM: 6371229 },
    ni, nj: 2, lat1: 10, lon1, lat2: 0, lon2, di: NaN, dj: 10, scanningMode: 0,
  });
  it.each([
    { lon1: 0, lon2: 359, ni: 360, first: 0, last: 359, conv: '0..360', global: true },
    { lon1: 180, lon2: 179, ni: 360, first: -180, last: 179, conv: '-180..180', global: true },
    { lon1: 340, lon2: 52.5, ni: 30, first: -20, last: 52.5, conv: '-180..180', global: false },
    { lon1: 250, lon2: 300, ni: 11, first: 250, last: 300, conv: '0..360', global: false },
  ])('$lon1 → $lon2 ($ni columns)', ({ lon1, lon2, ni, first, last, conv, global }) => {
    const g = buildGrid(def(lon1, lon2, ni)).grid;
    if (g.kind !== 'regular_ll') throw new Error('not regular');
    expect(g.lon[0]).toBeCloseTo(first, 9);
    expect(g.lon[ni - 1]).toBeCloseTo(last, 9);
    expect(g.longitudeConvention).toBe(conv);
    expect(g.globalLongitude).toBe(global);
  });
});
