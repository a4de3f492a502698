/**
 * Rotated-pole coordinates against ecCodes (rotated.grib2: codes_get_array latitudes/longitudes),
 * and regridding of Gaussian and rotated grids to regular latitude–longitude grids: exact for
 * fields that the interpolation reproduces by construction, nearest neighbour checked against a
 * brute-force nearest search, NaN propagation.
 */
import { describe, expect, it } from 'vitest';
import { buildGrid } from '../../lib/formats/grib/index.js';
import { geographicToRotated, regridToLatLon, rotatedToGeographic } from '../../lib/grid/regrid.js';
import type { GaussianGrid, RotatedLatLonGrid } from '../../lib/grid/types.js';
import { REFERENCE, fixtureIndex } from './reference.js';

const dlon = (a: number, b: number) => ((((a - b) % 360) + 540) % 360) - 180;

async function rotatedGrid(): Promise<{ grid: RotatedLatLonGrid; order: Int32Array | undefined }> {
  const index = await fixtureIndex('rotated.grib2');
  const g = buildGrid(index.fields[0].grid);
  if (g.grid.kind !== 'rotated_ll') throw new Error('not rotated');
  return { grid: g.grid, order: g.order };
}

async function gaussianGrid(k: number): Promise<GaussianGrid> {
  const index = await fixtureIndex('gaussian.grib2');
  const g = buildGrid(index.fields[k].grid).grid;
  if (g.kind !== 'gaussian') throw new Error('not Gaussian');
  return g;
}

describe('rotated pole', () => {
  it('rotated → geographic equals ecCodes latitudes/longitudes of rotated.grib2 (1e-5 degree, about 1 m)', async () => {
    const { grid, order } = await rotatedGrid();
    const m = REFERENCE['rotated.grib2'].messages[0];
    let worst = 0;
    for (let r = 0, q = 0; r < grid.ny; r++) {
      for (let c = 0; c < grid.nx; c++, q++) {
        const src = order ? order[q] : q;
        const [lon, lat] = rotatedToGeographic(grid.rlon[c], grid.rlat[r], grid.southPoleLat, grid.southPoleLon);
        worst = Math.max(worst, Math.abs(lat - m.latitudes![src]), Math.abs(dlon(lon, m.longitudes![src])));
      }
    }
    expect(worst).toBeLessThan(1e-5);
  });

  it('geographic → rotated inverts it', () => {
    for (const [rl, rp] of [[-10, -7], [0, 0], [9, 7], [35, 60]]) {
      const [lo, la] = rotatedToGeographic(rl, rp, -30, 15);
      const [rl2, rp2] = geographicToRotated(lo, la, -30, 15);
      expect(rl2).toBeCloseTo(rl, 10);
      expect(rp2).toBeCloseTo(rp, 10);
    }
  });
});

describe('regridToLatLon, rotated grid', () => {
  it('bilinear reproduces a field linear in the rotated coordinates; outside the grid is NaN', async () => {
    const { grid } = await rotatedGrid();
    const src = new Float32Array(grid.npoints);
    for (let r = 0; r < grid.ny; r++) for (let c = 0; c < grid.nx; c++) src[r * grid.nx + c] = 2 * grid.rlon[c] - 3 * grid.rlat[r];
    const rg = regridToLatLon(grid, 'bilinear');
    const out = rg.apply(src);
    let inside = 0;
    for (let t = 0; t < rg.target.ny; t++) {
      for (let c = 0; c < rg.target.nx; c++) {
        const [rl, rp] = geographicToRotated(rg.target.lon[c], rg.target.lat[t], grid.southPoleLat, grid.southPoleLon);
        const v = out[t * rg.target.nx + c];
        const within = rl >= grid.rlon[0] - 1e-9 && rl <= grid.rlon[grid.nx - 1] + 1e-9 && rp >= grid.rlat[0] - 1e-9 && rp <= grid.rlat[grid.ny - 1] + 1e-9;
        if (!within) {
          expect(v).toBeNaN();
          continue;
        }
        inside++;
        expect(v).toBeCloseTo(2 * rl - 3 * rp, 3);
      }
    }
    expect(inside).toBeGreaterThan(rg.target.npoints / 3);
  });

  it('nearest takes the value of the nearest point in the rotated frame', async () => {
    const { grid } = await rotatedGrid();
    const src = Float32Array.from({ length: grid.npoints }, (_, k) => k);
    const rg = regridToLatLon(grid, 'nearest');
    const out = rg.apply(src);
    for (let k = 0; k < out.length; k += 7) {
      if (Number.isNaN(out[k])) continue;
      const t = Math.floor(k / rg.target.nx);
      const c = k % rg.target.nx;
      const [rl, rp] = geographicToRotated(rg.target.lon[c], rg.target.lat[t], grid.southPoleLat, grid.southPoleLon);
      let best = -1;
      let bd = Infinity;
      for (let r = 0; r < grid.ny; r++) {
        for (let i = 0; i < grid.nx; i++) {
          const d = (grid.rlon[i] - rl) ** 2 + (grid.rlat[r] - rp) ** 2;
          if (d < bd - 1e-12) (bd = d), (best = r * grid.nx + i);
        }
      }
      expect(out[k]).toBe(best);
    }
  });
});

describe('regridToLatLon, Gaussian grids', () => {
  it.each([0, 1, 3])('gaussian.grib2 field %i: bilinear is exact for a field linear in latitude, between the outermost rows', async (k) => {
    const grid = await gaussianGrid(k);
    const src = new Float32Array(grid.npoints);
    for (let r = 0, q = 0; r < grid.ny; r++) for (let c = 0; c < grid.pointsPerRow[r]; c++, q++) src[q] = 3 * grid.lat[r] + 7;
    const rg = regridToLatLon(grid, 'bilinear');
    const out = rg.apply(src);
    expect(rg.target.ny).toBe(2 * grid.N);
    for (let t = 0; t < rg.target.ny; t++) {
      const la = rg.target.lat[t];
      const edge = la > grid.lat[0] ? grid.lat[0] : la < grid.lat[grid.ny - 1] ? grid.lat[grid.ny - 1] : la;
      for (let c = 0; c < rg.target.nx; c++) expect(out[t * rg.target.nx + c]).toBeCloseTo(3 * edge + 7, 4);
    }
  });

  it.each([1, 3])('gaussian.grib2 field %i (reduced): bilinear follows a wave in longitude to its interpolation error', async (k) => {
    const grid = await gaussianGrid(k);
    const f = (lon: number) => Math.sin((lon * Math.PI) / 180);
    const src = new Float32Array(grid.npoints);
    for (let r = 0, q = 0; r < grid.ny; r++) for (let c = 0; c < grid.pointsPerRow[r]; c++, q++) src[q] = f(grid.lonFirst[r] + c * grid.dLonPerRow[r]);
    const rg = regridToLatLon(grid, 'bilinear');
    const out = rg.apply(src);
    let worst = 0;
    for (let t = 0; t < rg.target.ny; t++) for (let c = 0; c < rg.target.nx; c++) worst = Math.max(worst, Math.abs(out[t * rg.target.nx + c] - f(rg.target.lon[c])));
    // Linear interpolation error ≤ h²/8·max|f''| with h the widest row spacing in radians.
    let h = 0;
    for (let r = 0; r < grid.ny; r++) h = Math.max(h, (grid.dLonPerRow[r] * Math.PI) / 180);
    expect(worst).toBeLessThanOrEqual((h * h) / 8 + 1e-6);
  });

  it('nearest picks the nearest row, then the nearest point of that row; NaN spreads only where weighted', async () => {
    const grid = await gaussianGrid(1);
    const src = Float32Array.from({ length: grid.npoints }, (_, k) => k);
    const rg = regridToLatLon(grid, 'nearest');
    const out = rg.apply(src);
    const starts: number[] = [0];
    for (let r = 1; r < grid.ny; r++) starts.push(starts[r - 1] + grid.pointsPerRow[r - 1]);
    for (let t = 0; t < rg.target.ny; t++) {
      let row = 0;
      for (let r = 1; r < grid.ny; r++) if (Math.abs(grid.lat[r] - rg.target.lat[t]) < Math.abs(grid.lat[row] - rg.target.lat[t])) row = r;
      for (let c = 0; c < rg.target.nx; c += 5) {
        // Distance of the chosen point must be the smallest distance in the row (ties either way).
        const dist = (i: number) => Math.abs(dlon(grid.lonFirst[row] + i * grid.dLonPerRow[row], rg.target.lon[c]));
        let best = Infinity;
        for (let i = 0; i < grid.pointsPerRow[row]; i++) best = Math.min(best, dist(i));
        const chosen = out[t * rg.target.nx + c] - starts[row];
        expect(chosen).toBeGreaterThanOrEqual(0);
        expect(chosen).toBeLessThan(grid.pointsPerRow[row]);
        expect(dist(chosen)).toBeCloseTo(best, 9);
      }
    }
    const holes = new Float32Array(grid.npoints).fill(1);
    holes[starts[10] + 3] = Number.NaN;
    const bil = regridToLatLon(grid, 'bilinear').apply(holes);
    const nan = bil.filter((v) => Number.isNaN(v)).length;
    expect(nan).toBeGreaterThan(0);
    expect(nan).toBeLessThan(12);
  });
});

describe('regridToLatLon, what it does not do', () => {
  it('refuses a rotated grid with an angle of rotation, naming it', async () => {
    const { grid } = await rotatedGrid();
    expect(() => regridToLatLon({ ...grid, rotationAngle: 10 }, 'bilinear')).toThrow(/angle of rotation \(10°\)/);
  });
});
