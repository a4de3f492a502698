/**
 * Regridding of Gaussian (regular or reduced, incl. octahedral) and rotated latitude–longitude
 * grids to a regular latitude–longitude grid, for raster output. Products are computed on the
 * native grid; only what is written as a raster is regridded.
 *
 * Methods (the output should record which was used):
 *  - 'nearest' — for masks and categories: each target point takes the value of the source point
 *    nearest to it (Gaussian: nearest row by latitude, then nearest point of that row by
 *    longitude; rotated: nearest point in the rotated frame).
 *  - 'bilinear' — for continuous fields. Gaussian: linear in longitude along the two rows that
 *    bracket the target latitude, then linear in latitude between them; target points poleward of
 *    the outermost row take that row's value (no extrapolation). Rotated: the target point is
 *    rotated into the grid's frame and interpolated bilinearly between the four surrounding points;
 *    outside the grid the value is NaN. Where any point with a non-zero weight is NaN, the result
 *    is NaN.
 *
 * Target grids: for a Gaussian grid, 2N rows at latitudes 90 − (k + ½)·90/N (clipped to the rows the
 * grid covers) and as many columns as its longest row, from its first longitude; for a rotated grid,
 * the geographic box around all its points at its own spacing.
 *
 * Rotated poles (GRIB2 template 3.1): the grid's frame has its south pole at (φp, λp). A point of
 * the frame at (λr, φr) is rotated about the y axis by θ = 90° + φp and then by λp about the polar
 * axis:  x' = cosθ·x − sinθ·z,  z' = sinθ·x + cosθ·z,  λ = atan2(y, x') + λp,  φ = asin z'.
 */
import { UnsupportedError } from '../errors.js';
import type { GaussianGrid, RegularLatLonGrid, RotatedLatLonGrid } from './types.js';

export type RegridMethod = 'nearest' | 'bilinear';

export interface Regridder {
  readonly target: RegularLatLonGrid;
  readonly method: RegridMethod;
  /** For target point k: source indices index[4k..4k+3] and weights weight[4k..4k+3] (−1: unused). */
  readonly index: Int32Array;
  readonly weight: Float64Array;
  /** Interpolates source values (source grid order) to the target (row-major, north → south). */
  apply(source: ArrayLike<number>, out?: Float32Array): Float32Array;
}

const RAD = Math.PI / 180;
const wrap360 = (x: number) => ((x % 360) + 360) % 360;

/** Rotated-frame coordinates → geographic [lon, lat], degrees. */
export function rotatedToGeographic(rlon: number, rlat: number, southPoleLat: number, southPoleLon: number): [number, number] {
  const th = (90 + southPoleLat) * RAD;
  const x = Math.cos(rlat * RAD) * Math.cos(rlon * RAD);
  const y = Math.cos(rlat * RAD) * Math.sin(rlon * RAD);
  const z = Math.sin(rlat * RAD);
  const x2 = Math.cos(th) * x - Math.sin(th) * z;
  const z2 = Math.sin(th) * x + Math.cos(th) * z;
  let lon = Math.atan2(y, x2) / RAD + southPoleLon;
  lon = ((((lon + 180) % 360) + 360) % 360) - 180;
  return [lon, Math.asin(Math.max(-1, Math.min(1, z2))) / RAD];
}

/** Geographic → rotated-frame [rlon, rlat], degrees (rlon in −180..180). */
export function geographicToRotated(lon: number, lat: number, southPoleLat: number, southPoleLon: number): [number, number] {
  const th = (90 + southPoleLat) * RAD;
  const l = (lon - southPoleLon) * RAD;
  const x2 = Math.cos(lat * RAD) * Math.cos(l);
  const y = Math.cos(lat * RAD) * Math.sin(l);
  const z2 = Math.sin(lat * RAD);
  const x = Math.cos(th) * x2 + Math.sin(th) * z2;
  const z = -Math.sin(th) * x2 + Math.cos(th) * z2;
  return [Math.atan2(y, x) / RAD, Math.asin(Math.max(-1, Math.min(1, z))) / RAD];
}

function makeTarget(lat: Float64Array, lon0: number, dLon: number, nx: number, dLat: number, earth: RegularLatLonGrid['crs']): RegularLatLonGrid {
  const lon = new Float64Array(nx);
  for (let c = 0; c < nx; c++) lon[c] = lon0 + c * dLon;
  return {
    kind: 'regular_ll',
    crs: earth,
    npoints: nx * lat.length,
    nx,
    ny: lat.length,
    lat,
    lon,
    dLat,
    dLon,
    latitudeOrder: 'north_to_south',
    longitudeConvention: lon[nx - 1] > 180 ? '0..360' : '-180..180',
    globalLongitude: Math.abs(nx * dLon - 360) < dLon * 1e-6,
  };
}

/** Weighted sums; a NaN source point with non-zero weight makes the result NaN. */
function applier(index: Int32Array, weight: Float64Array, n: number) {
  return (source: ArrayLike<number>, out?: Float32Array): Float32Array => {
    const o = out ?? new Float32Array(n);
    for (let k = 0, q = 0; k < n; k++, q += 4) {
      let s = 0;
      for (let m = 0; m < 4; m++) {
        const i = index[q + m];
        if (i >= 0 && weight[q + m] !== 0) s += weight[q + m] * source[i];
      }
      o[k] = index[q] < 0 ? Number.NaN : s;
    }
    return o;
  };
}

/** Regridder from a Gaussian grid. */
export function regridGaussian(grid: GaussianGrid, method: RegridMethod): Regridder {
  const N = grid.N;
  const dLat = 90 / N;
  const rowLat = grid.lat;
  const north = Math.max(rowLat[0], rowLat[grid.ny - 1]);
  const south = Math.min(rowLat[0], rowLat[grid.ny - 1]);
  const lats: number[] = [];
  for (let k = 0; k < 2 * N; k++) {
    const la = 90 - (k + 0.5) * dLat;
    if (la <= north + dLat / 2 && la >= south - dLat / 2) lats.push(la);
  }
  let maxPl = 0;
  let widest = 0;
  for (let r = 0; r < grid.ny; r++) if (grid.pointsPerRow[r] > maxPl) (maxPl = grid.pointsPerRow[r]), (widest = r);
  const dLon = grid.dLonPerRow[widest];
  const target = makeTarget(Float64Array.from(lats), grid.lonFirst[widest], dLon, maxPl, dLat, grid.crs);
  const rowStart = new Int32Array(grid.ny);
  for (let r = 1; r < grid.ny; r++) rowStart[r] = rowStart[r - 1] + grid.pointsPerRow[r - 1];
  const n = target.npoints;
  const index = new Int32Array(4 * n).fill(-1);
  const weight = new Float64Array(4 * n);
  const descending = grid.ny < 2 || rowLat[0] > rowLat[grid.ny - 1];
  // Position of a longitude in row r: fractional index, and whether the row closes the circle.
  const position = (r: number, lon: number) => {
    const pl = grid.pointsPerRow[r];
    const global = Math.abs(pl * grid.dLonPerRow[r] - 360) < 1e-6;
    const d = grid.dLonPerRow[r];
    let x = wrap360(lon - grid.lonFirst[r]) / d;
    if (!global && x > pl - 1) {
      // Outside a partial row: the nearer end.
      x = x - (pl - 1) < 360 / d - x ? pl - 1 : 0;
    }
    return { x, pl, global };
  };
  for (let t = 0; t < target.ny; t++) {
    const la = target.lat[t];
    // Rows bracketing la (indices in storage order).
    let r0 = -1;
    for (let r = 0; r < grid.ny - 1; r++) {
      const a = rowLat[r];
      const b = rowLat[r + 1];
      if ((descending && la <= a && la >= b) || (!descending && la >= a && la <= b)) {
        r0 = r;
        break;
      }
    }
    for (let c = 0; c < target.nx; c++) {
      const k = t * target.nx + c;
      const lo = target.lon[c];
      const q = 4 * k;
      if (method === 'nearest') {
        let best = 0;
        for (let r = 1; r < grid.ny; r++) if (Math.abs(rowLat[r] - la) < Math.abs(rowLat[best] - la)) best = r;
        const { x, pl, global } = position(best, lo);
        let i = Math.round(x);
        if (i >= pl) i = global ? 0 : pl - 1;
        index[q] = rowStart[best] + i;
        weight[q] = 1;
        continue;
      }
      let rows: [number, number][];
      if (r0 < 0) {
        const edge = Math.abs(la - rowLat[0]) < Math.abs(la - rowLat[grid.ny - 1]) ? 0 : grid.ny - 1;
        rows = [[edge, 1]];
      } else {
        const w1 = (la - rowLat[r0]) / (rowLat[r0 + 1] - rowLat[r0]);
        rows = [
          [r0, 1 - w1],
          [r0 + 1, w1],
        ];
      }
      let m = 0;
      for (const [r, wr] of rows) {
        const { x, pl, global } = position(r, lo);
        const i0 = Math.floor(x);
        const f = x - i0;
        const i1 = i0 + 1 >= pl ? (global ? 0 : i0) : i0 + 1;
        index[q + m] = rowStart[r] + Math.min(i0, pl - 1);
        weight[q + m] = wr * (1 - f);
        index[q + m + 1] = rowStart[r] + i1;
        weight[q + m + 1] = wr * f;
        m += 2;
      }
    }
  }
  return { target, method, index, weight, apply: applier(index, weight, n) };
}

/** Regridder from a rotated latitude–longitude grid. */
export function regridRotated(grid: RotatedLatLonGrid, method: RegridMethod): Regridder {
  if (grid.rotationAngle !== 0) {
    throw new UnsupportedError(
      `rotated grids with an angle of rotation (${grid.rotationAngle}°) are not regridded`,
      'angle of rotation of a rotated grid',
      grid.rotationAngle,
    );
  }
  const { southPoleLat: spLat, southPoleLon: spLon } = grid;
  // Geographic box around all points, longitudes unwrapped about the centre point.
  const [cLon] = rotatedToGeographic(grid.rlon[grid.nx >> 1], grid.rlat[grid.ny >> 1], spLat, spLon);
  let minLat = 90;
  let maxLat = -90;
  let minLon = Infinity;
  let maxLon = -Infinity;
  for (let r = 0; r < grid.ny; r++) {
    for (let c = 0; c < grid.nx; c++) {
      const [lo, la] = rotatedToGeographic(grid.rlon[c], grid.rlat[r], spLat, spLon);
      const u = cLon + ((((lo - cLon) % 360) + 540) % 360) - 180;
      minLat = Math.min(minLat, la);
      maxLat = Math.max(maxLat, la);
      minLon = Math.min(minLon, u);
      maxLon = Math.max(maxLon, u);
    }
  }
  const dLat = grid.dLat;
  const dLon = grid.dLon;
  const ny = Math.floor((maxLat - minLat) / dLat + 1e-9) + 1;
  const nx = Math.floor((maxLon - minLon) / dLon + 1e-9) + 1;
  const lat = new Float64Array(ny);
  for (let k = 0; k < ny; k++) lat[k] = maxLat - k * dLat;
  const target = makeTarget(lat, minLon, dLon, nx, dLat, grid.crs);
  const n = target.npoints;
  const index = new Int32Array(4 * n).fill(-1);
  const weight = new Float64Array(4 * n);
  const r0lat = grid.rlat[0];
  const dr = grid.ny > 1 ? grid.rlat[1] - grid.rlat[0] : 1;
  const rlon0 = grid.rlon[0];
  for (let t = 0; t < ny; t++) {
    for (let c = 0; c < nx; c++) {
      const k = t * nx + c;
      const q = 4 * k;
      let [rl, rp] = geographicToRotated(target.lon[c], lat[t], spLat, spLon);
      rl = rlon0 + wrap360(rl - rlon0);
      const x = (rl - rlon0) / grid.dLon;
      const y = (rp - r0lat) / dr;
      if (x < -1e-9 || y < -1e-9 || x > grid.nx - 1 + 1e-9 || y > grid.ny - 1 + 1e-9) continue;
      if (method === 'nearest') {
        index[q] = Math.round(y) * grid.nx + Math.round(x);
        weight[q] = 1;
        continue;
      }
      const i0 = Math.min(Math.floor(x), grid.nx - 2 < 0 ? 0 : grid.nx - 2);
      const j0 = Math.min(Math.floor(y), grid.ny - 2 < 0 ? 0 : grid.ny - 2);
      const fx = Math.min(1, Math.max(0, x - i0));
      const fy = Math.min(1, Math.max(0, y - j0));
      const i1 = Math.min(i0 + 1, grid.nx - 1);
      const j1 = Math.min(j0 + 1, grid.ny - 1);
      index[q] = j0 * grid.nx + i0;
      weight[q] = (1 - fx) * (1 - fy);
      index[q + 1] = j0 * grid.nx + i1;
      weight[q + 1] = fx * (1 - fy);
      index[q + 2] = j1 * grid.nx + i0;
      weight[q + 2] = (1 - fx) * fy;
      index[q + 3] = j1 * grid.nx + i1;
      weight[q + 3] = fx * fy;
    }
  }
  return { target, method, index, weight, apply: applier(index, weight, n) };
}

/** Regrids a Gaussian or rotated grid to a regular latitude–longitude grid. */
export function regridToLatLon(grid: GaussianGrid | RotatedLatLonGrid, method: RegridMethod): Regridder {
  return grid.kind === 'gaussian' ? regridGaussian(grid, method) : regridRotated(grid, method);
}
