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
