/**
 * Earth shapes of GRIB2 code table 3.2 (WMO-No. 306, Vol. I.2, Part B, master tables version 30)
 * read from template octets 15–30, and the proj4 definitions projected grids carry.
 */
import { describe, expect, it } from 'vitest';
import { readEarthShape } from '../../lib/formats/grib/edition2/earth.js';
import { buildGrid } from '../../lib/formats/grib/index.js';
import { REFERENCE, fixtureIndex } from './reference.js';

/** Octets 15–30: shape, then scale/value of radius, major axis, minor axis. */
function octets(shape: number, radius?: [number, number], major?: [number, number], minor?: [number, number]): Uint8Array {
  const b = new Uint8Array(16).fill(0xff);
  b[0] = shape;
  const put = (at: number, sv?: [number, number]) => {
    if (!sv) return;
    b[at] = sv[0];
    new DataView(b.buffer).setUint32(at + 1, sv[1], false);
  };
  put(1, radius);
  put(6, major);
  put(11, minor);
  return b;
}

describe('readEarthShape (code table 3.2)', () => {
  it.each([
    { shape: 0, want: { kind: 'sphere', radiusM: 6367470 } },
    { shape: 6, want: { kind: 'sphere', radiusM: 6371229 } },
    { shape: 8, want: { kind: 'sphere', radiusM: 6371200 } },
    { shape: 5, want: { kind: 'ellipsoid', semiMajorM: 6378137, inverseFlattening: 298.257223563 } },
    { shape: 4, want: { kind: 'ellipsoid', semiMajorM: 6378137, inverseFlattening: 298.257222101 } },
    { shape: 2, want: { kind: 'ellipsoid', semiMajorM: 6378160, inverseFlattening: 297 } },
  ])('code $shape', ({ shape, want }) => {
    expect(readEarthShape(octets(shape), 0)).toEqual({ ok: true, earth: want });
  });

  it('code 1: radius from the message (scale factor 1, value 63712290 → 6 371 229 m)', () => {
    expect(readEarthShape(octets(1, [1, 63712290]), 0)).toEqual({ ok: true, earth: { kind: 'sphere', radiusM: 6371229 } });
  });

  it('code 3: axes in km; code 7: axes in m', () => {
    const r3 = readEarthShape(octets(3, undefined, [0, 6378], [0, 6357]), 0);
    expect(r3).toEqual({ ok: true, earth: { kind: 'ellipsoid', semiMajorM: 6378000, inverseFlattening: 6378 / 21 } });
    const r7 = readEarthShape(octets(7, undefined, [0, 6378137], [2, 635675231]), 0);
    if (!r7.ok || r7.earth.kind !== 'ellipsoid') throw new Error('not an ellipsoid');
    expect(r7.earth.semiMajorM).toBe(6378137);
    expect(r7.earth.inverseFlattening).toBeCloseTo(298.2572, 3);
  });

  it('code 1 without a radius, and an unknown code, are reported', () => {
    expect(readEarthShape(octets(1), 0).ok).toBe(false);
    expect(readEarthShape(octets(42), 0)).toMatchObject({ ok: false, code: 42 });
  });
});

describe('projected grids carry a proj4 definition built from the message', () => {
  it('lambert.grib2 (shapeOfTheEarth 6, Latin 35/55, LaD 45, LoV 10)', async () => {
    const m = REFERENCE['lambert.grib2'].messages[0];
    expect(m.gridType).toBe('lambert');
    const { grid } = buildGrid((await fixtureIndex('lambert.grib2')).fields[0].grid);
    if (grid.crs.kind !== 'projected') throw new Error('not projected');
    expect(grid.crs.projection).toBe('lambert_conformal_conic');
    expect(grid.crs.proj4).toBe('+proj=lcc +lat_1=35 +lat_2=55 +lat_0=45 +lon_0=10 +x_0=0 +y_0=0 +R=6371229 +units=m +no_defs');
    expect(grid.crs.earth).toEqual({ kind: 'sphere', radiusM: 6371229 });
  });

  it('polar-ns.grib2 (LoV 315 → −45, north pole, LaD 60)', async () => {
    const { grid } = buildGrid((await fixtureIndex('polar-ns.grib2')).fields[0].grid);
    if (grid.crs.kind !== 'projected') throw new Error('not projected');
    expect(grid.crs.proj4).toBe('+proj=stere +lat_0=90 +lat_ts=60 +lon_0=-45 +x_0=0 +y_0=0 +R=6371229 +units=m +no_defs');
    expect(grid.kind === 'projected' && grid.y[1] < grid.y[0]).toBe(true); // rows north → south, as stored
  });
});
