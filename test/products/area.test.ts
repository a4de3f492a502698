import { describe, expect, it } from 'vitest';
import {
  authalicRadius,
  bandArea,
  boundingBoxMask,
  cellAreas,
  longitudeInArc,
  parseBoundingBox,
  pointLonLat,
} from '../../lib/products/index.js';
import { WGS84 } from '../../lib/grid/types.js';
import { ParameterError } from '../../lib/errors.js';
import { gaussianGrid, globalRegularGrid, polarStereoGrid, regionalGrid, rotatedGlobalGrid } from './grids.js';

// WGS84 defining constants a = 6378137 m, 1/f = 298.257223563 (NIMA TR8350.2, 3rd ed., table 3.1).
const A = 6378137;
const F = 1 / 298.257223563;
const E2 = F * (2 - F);
const E = Math.sqrt(E2);
const B2 = A * A * (1 - E2);

// WGS84 derived constants (NIMA TR8350.2 table 3.5 — from memory): surface area of the ellipsoid
// 510,065,621.7 km², radius of the sphere of equal area 6,371,007.1810 m.
const WGS84_AREA_KM2 = 510065621.7;
const WGS84_AUTHALIC_M = 6371007.181;

/**
 * Surface of the oblate-spheroid zone between the equator and geodetic latitude φ, m², in the
 * textbook closed form π b² [ sin φ/(1 − e² sin² φ) + atanh(e sin φ)/e ] (integral of the meridian
 * and parallel radii of curvature; e.g. Snyder 1987, USGS PP 1395, eq. 3-12 times π a² — written
 * here in atanh form, independently of lib/products).
 */
function zoneArea(phiDeg: number): number {
  const s = Math.sin((phiDeg * Math.PI) / 180);
  return Math.PI * B2 * (s / (1 - E2 * s * s) + Math.atanh(E * s) / E);
}

const sum = (a: Float64Array): number => a.reduce((x, y) => x + y, 0);

describe('cell areas on the WGS84 ellipsoid', () => {
  it('authalic radius equals the published WGS84 value (NIMA TR8350.2, from memory)', () => {
    expect(authalicRadius(WGS84)).toBeCloseTo(WGS84_AUTHALIC_M, 2);
  });

  it('the closed-form total surface 2πa²(1 + (1−e²)/e·atanh e) is the published 510,065,621.7 km² (cross-check of the constants)', () => {
    // Surface of an oblate spheroid (standard geometry result — from memory).
    const total = 2 * Math.PI * A * A * (1 + ((1 - E2) / E) * Math.atanh(E));
    expect(Math.abs(total / 1e6 - WGS84_AREA_KM2) / WGS84_AREA_KM2).toBeLessThan(1e-9);
  });

  for (const step of [1, 0.25]) {
    it(`a global ${step}° grid (rows at ±90°, pole rows clipped) sums to 510.0656 million km² within 1e-6 (NIMA TR8350.2)`, () => {
      const areas = cellAreas(globalRegularGrid(step));
      expect(areas.length).toBe((180 / step + 1) * (360 / step));
      const totalKm2 = sum(areas) / 1e6;
      expect(Math.abs(totalKm2 - WGS84_AREA_KM2) / WGS84_AREA_KM2).toBeLessThan(1e-6);
    });
  }

  it('a single band area equals the closed-form spheroidal zone formula', () => {
    for (const [lat1, lat2] of [
      [10, 11],
      [-35.5, -34.5],
      [60, 61.25],
      [89.5, 90],
      [-3, 4],
    ]) {
      const expected = zoneArea(lat2) - zoneArea(lat1);
      // Narrow bands are differences of large numbers: agreement to 1e-9 is the float64 limit here.
      expect(Math.abs(bandArea(lat1, lat2, 360) - expected) / expected).toBeLessThan(1e-9);
      // A partial band scales with its longitude span.
      expect(Math.abs(bandArea(lat1, lat2, 7.5) - (expected * 7.5) / 360) / expected).toBeLessThan(1e-9);
    }
  });

  it('row cells of a 1° grid equal zone differences at the half-degree bounds; the pole row is the 89.5°–90° cap', () => {
    const g = globalRegularGrid(1);
    const areas = cellAreas(g);
    const row = (j: number): number => areas[j * g.nx];
    expect(row(0)).toBeCloseTo((zoneArea(90) - zoneArea(89.5)) / 360, -1);
    const j40 = 50; // latitude 40
    expect(g.lat[j40]).toBe(40);
    const exp40 = (zoneArea(40.5) - zoneArea(39.5)) / 360;
    expect(Math.abs(row(j40) - exp40) / exp40).toBeLessThan(1e-12);
    // Rows of the same latitude are equal in each hemisphere (symmetry of the ellipsoid).
    expect(row(30)).toBeCloseTo(row(150), 3);
  });

  it('a global Gaussian grid (regular and octahedral) sums to the WGS84 total; cells of a row are equal', () => {
    for (const octa of [false, true]) {
      const g = gaussianGrid(48, octa);
      const areas = cellAreas(g);
      expect(areas.length).toBe(g.npoints);
      expect(Math.abs(sum(areas) / 1e6 - WGS84_AREA_KM2) / WGS84_AREA_KM2).toBeLessThan(1e-9);
      // First row: band from the pole to the midpoint between the first two Gaussian latitudes.
      const mid = 0.5 * (g.lat[0] + g.lat[1]);
      const exp = (zoneArea(90) - zoneArea(mid)) / g.pointsPerRow[0];
      expect(Math.abs(areas[0] - exp) / exp).toBeLessThan(1e-12);
    }
  });

  it('a rotated grid covering the rotated sphere sums to 4πR² (area preserved by rotation)', () => {
    const R = 6371229;
    const areas = cellAreas(rotatedGlobalGrid(2, -40, 10, R));
    expect(Math.abs(sum(areas) - 4 * Math.PI * R * R) / (4 * Math.PI * R * R)).toBeLessThan(1e-12);
  });

  it('unrotates rotated coordinates: the rotated origin lies at (90° + southPoleLat, southPoleLon) (GRIB2 template 3.1 convention)', () => {
    const g = rotatedGlobalGrid(2, -40, 10, 6371229);
    const { lon, lat } = pointLonLat(g);
    const j = 45; // rlat 0
    const i = 90; // rlon 0
    expect(g.rlat[j]).toBe(0);
    expect(g.rlon[i]).toBe(0);
    expect(lat[j * g.nx + i]).toBeCloseTo(50, 10);
    expect(lon[j * g.nx + i]).toBeCloseTo(10, 10);
    // The rotated north pole row maps to latitude −southPoleLat.
    expect(lat[(g.ny - 1) * g.nx]).toBeCloseTo(40, 10);
  });

  it('a polar stereographic grid on the sphere: total equals the quadrature of the area scale 1/k², k = 1 + ρ²/4R² (Snyder 1987, eq. 21-4, from memory)', () => {
    const R = 6371007.181;
    const L = 2_000_000;
    const g = polarStereoGrid(R, L, 200);
    const areas = cellAreas(g);
    // Independent: composite Simpson in x and y of dx dy / k(x, y)².
    const n = 800;
    const h = (2 * L) / n;
    const w = (i: number): number => (i === 0 || i === n ? 1 : i % 2 === 1 ? 4 : 2);
    let q = 0;
    for (let i = 0; i <= n; i++) {
      const x = -L + i * h;
      for (let j = 0; j <= n; j++) {
        const y = -L + j * h;
        const k = 1 + (x * x + y * y) / (4 * R * R);
        q += (w(i) * w(j)) / (k * k);
      }
    }
    q *= (h * h) / 9;
    // 20 km cells: great-circle edges vs straight projected edges differ by ~8e-7 (see area.ts).
    expect(Math.abs(sum(areas) - q) / q).toBeLessThan(2e-6);
    // One cell at the pole: its area is dx·dy (k = 1) to second order in dx/R.
    const c = 100 * 200 + 100;
    expect(Math.abs(areas[c] - g.dx * g.dy) / (g.dx * g.dy)).toBeLessThan(1e-4);
  });
});

describe('projected grids on the WGS84 ellipsoid', () => {
  it('an equirectangular grid (PROJ eqc: x = aλ, y = aφ) has the zone-formula area of its lat/lon rectangle', () => {
    // Cells of 0.1° × 0.1° between 40°N and 45°N, 0°E and 5°E: inverse-projected corners are exact
    // lat/lon nodes, so the cells are ellipsoidal quadrangles with the closed-form zone area.
    const step = (A * 0.1 * Math.PI) / 180;
    const nx = 50;
    const ny = 50;
    const x = Float64Array.from({ length: nx }, (_, i) => (i + 0.5) * step);
    const y = Float64Array.from({ length: ny }, (_, j) => (A * 45 * Math.PI) / 180 - (j + 0.5) * step);
    const areas = cellAreas({
      kind: 'projected',
      crs: {
        kind: 'projected',
        projection: 'lambert_conformal_conic', // the kind label is not used by the area code; the proj4 string is
        proj4: '+proj=eqc +lat_ts=0 +lat_0=0 +lon_0=0 +x_0=0 +y_0=0 +ellps=WGS84 +units=m +no_defs',
        earth: WGS84,
        params: {},
      },
      npoints: nx * ny,
      nx,
      ny,
      x,
      y,
      dx: step,
      dy: step,
    });
    const exp = ((zoneArea(45) - zoneArea(40)) * 5) / 360;
    expect(Math.abs(sum(areas) - exp) / exp).toBeLessThan(1e-6); // measured 9e-8
    // One cell: the 44.9°–45° row, 0.1° wide.
    const cell = ((zoneArea(45) - zoneArea(44.9)) * 0.1) / 360;
    expect(Math.abs(areas[0] - cell) / cell).toBeLessThan(1e-6); // measured 1.2e-7 (great-circle vs parallel edges)
  });
});

describe('bounding boxes', () => {
  it('parses W,S,E,N and rejects malformed boxes', () => {
    expect(parseBoundingBox('-10,-5,10,5')).toEqual({ west: -10, south: -5, east: 10, north: 5 });
    expect(() => parseBoundingBox('1,2,3')).toThrow(ParameterError);
    expect(() => parseBoundingBox('0,10,20,5')).toThrow(/S < N/);
    expect(() => parseBoundingBox('a,1,2,3')).toThrow(ParameterError);
  });

  it('longitude arcs: conventions 0..360 and −180..180 agree; antimeridian crossing; full circle', () => {
    expect(longitudeInArc(355, -10, 10)).toBe(true);
    expect(longitudeInArc(-5, 350, 10)).toBe(true);
    expect(longitudeInArc(180, 170, -170)).toBe(true);
    expect(longitudeInArc(0, 170, -170)).toBe(false);
    expect(longitudeInArc(123, -180, 180)).toBe(true);
    expect(longitudeInArc(123, 0, 360)).toBe(true);
    expect(longitudeInArc(20, -10, 10)).toBe(false);
  });

  it('box masks on a 0..359 grid count cells by centre, across 0° and the antimeridian', () => {
    const g = globalRegularGrid(1);
    const count = (m: Uint8Array): number => m.reduce((a, b) => a + b, 0);
    expect(count(boundingBoxMask(g, { west: -10, south: -5, east: 10, north: 5 }))).toBe(21 * 11);
    expect(count(boundingBoxMask(g, { west: 350, south: -5, east: 10, north: 5 }))).toBe(21 * 11);
    expect(count(boundingBoxMask(g, { west: 170, south: -10, east: -170, north: 10 }))).toBe(21 * 21);
    expect(count(boundingBoxMask(g, { west: -180, south: -90, east: 180, north: 90 }))).toBe(g.npoints);
  });

  it('the area of a box of whole cells equals the zone formula over the cell bounds', () => {
    const g = regionalGrid(-20, -30, 0.5, 81, 121); // -20..20 N, -30..30 E
    const m = boundingBoxMask(g, { west: 0, south: 0, east: 10, north: 10 });
    const areas = cellAreas(g);
    let a = 0;
    for (let i = 0; i < m.length; i++) if (m[i]) a += areas[i];
    // Centres 0..10 by 0.5 → 21 × 21 cells spanning -0.25..10.25 in both directions.
    const exp = ((zoneArea(10.25) - zoneArea(-0.25)) * 10.5) / 360;
    expect(Math.abs(a - exp) / exp).toBeLessThan(1e-12);
  });
});
