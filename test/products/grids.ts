/**
 * Grid descriptors for the products tests (plain objects of the grid model; no file behind them).
 */
import type {
  EarthShape,
  Encoding,
  Field,
  GaussianGrid,
  GridDataset,
  HorizontalGrid,
  ProjectedGrid,
  Quantity,
  RegularLatLonGrid,
  RhConventionRecord,
  RotatedLatLonGrid,
  TimeCoordinate,
} from '../../lib/grid/types.js';
import { WGS84 } from '../../lib/grid/types.js';

/** Regular global grid with rows from 90 to −90 and columns from 0 east. */
export function globalRegularGrid(step: number, earth: EarthShape = WGS84): RegularLatLonGrid {
  const ny = Math.round(180 / step) + 1;
  const nx = Math.round(360 / step);
  const lat = Float64Array.from({ length: ny }, (_, j) => 90 - j * step);
  const lon = Float64Array.from({ length: nx }, (_, i) => i * step);
  return {
    kind: 'regular_ll',
    crs: { kind: 'geographic', earth },
    npoints: nx * ny,
    nx,
    ny,
    lat,
    lon,
    dLat: step,
    dLon: step,
    latitudeOrder: 'north_to_south',
    longitudeConvention: '0..360',
    globalLongitude: true,
  };
}

/** Regional regular grid, rows south to north. */
export function regionalGrid(lat0: number, lon0: number, step: number, ny: number, nx: number): RegularLatLonGrid {
  const lat = Float64Array.from({ length: ny }, (_, j) => lat0 + j * step);
  const lon = Float64Array.from({ length: nx }, (_, i) => lon0 + i * step);
  return {
    kind: 'regular_ll',
    crs: { kind: 'geographic', earth: WGS84 },
    npoints: nx * ny,
    nx,
    ny,
    lat,
    lon,
    dLat: step,
    dLon: step,
    latitudeOrder: 'south_to_north',
    longitudeConvention: lon0 < 0 ? '-180..180' : '0..360',
    globalLongitude: false,
  };
}

/**
 * Gaussian latitudes (degrees, north to south) of a grid with N lines per hemisphere: the roots of
 * the Legendre polynomial P_2N(sin φ), by Newton's method from the Tricomi first guess
 * (Abramowitz & Stegun 1964, §22.16; standard numerical practice — from memory).
 */
export function gaussianLatitudes(N: number): Float64Array {
  const n = 2 * N;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let x = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5));
    for (let it = 0; it < 100; it++) {
      let p0 = 1;
      let p1 = x;
      for (let k = 2; k <= n; k++) {
        const p2 = ((2 * k - 1) * x * p1 - (k - 1) * p0) / k;
        p0 = p1;
        p1 = p2;
      }
      const dp = (n * (x * p1 - p0)) / (x * x - 1);
      const dx = p1 / dp;
      x -= dx;
      if (Math.abs(dx) < 1e-15) break;
    }
    out[i] = (Math.asin(x) * 180) / Math.PI;
  }
  return out;
}

/** Global Gaussian grid; octahedral rows (20 + 4i points) when `octahedral`, else 4N per row. */
export function gaussianGrid(N: number, octahedral: boolean): GaussianGrid {
  const lat = gaussianLatitudes(N);
  const ny = 2 * N;
  const pointsPerRow = Int32Array.from({ length: ny }, (_, j) => (octahedral ? 20 + 4 * (j < N ? j : ny - 1 - j) : 4 * N));
  const npoints = pointsPerRow.reduce((a, b) => a + b, 0);
  return {
    kind: 'gaussian',
    crs: { kind: 'geographic', earth: WGS84 },
    npoints,
    N,
    ny,
    lat,
    pointsPerRow,
    lonFirst: new Float64Array(ny),
    dLonPerRow: Float64Array.from(pointsPerRow, (n) => 360 / n),
    reduced: octahedral,
    octahedral,
  };
}

/** Polar stereographic grid centred on the north pole on a sphere of radius R, true scale at the pole. */
export function polarStereoGrid(R: number, halfWidthM: number, n: number): ProjectedGrid {
  const dx = (2 * halfWidthM) / n;
  const c = Float64Array.from({ length: n }, (_, i) => -halfWidthM + (i + 0.5) * dx);
  const def = `+proj=stere +lat_0=90 +lat_ts=90 +lon_0=0 +k=1 +x_0=0 +y_0=0 +R=${R} +units=m +no_defs`;
  return {
    kind: 'projected',
    crs: { kind: 'projected', projection: 'polar_stereographic', proj4: def, earth: { kind: 'sphere', radiusM: R }, params: { lat_0: 90, lon_0: 0 } },
    npoints: n * n,
    nx: n,
    ny: n,
    x: c,
    y: Float64Array.from(c).reverse(),
    dx,
    dy: dx,
  };
}

/** Rotated grid covering the whole rotated sphere with rows −90..90 at `step`. */
export function rotatedGlobalGrid(step: number, southPoleLat: number, southPoleLon: number, R: number): RotatedLatLonGrid {
  const ny = Math.round(180 / step) + 1;
  const nx = Math.round(360 / step);
  return {
    kind: 'rotated_ll',
    crs: { kind: 'geographic', earth: { kind: 'sphere', radiusM: R } },
    npoints: nx * ny,
    nx,
    ny,
    rlat: Float64Array.from({ length: ny }, (_, j) => -90 + j * step),
    rlon: Float64Array.from({ length: nx }, (_, i) => -180 + i * step),
    dLat: step,
    dLon: step,
    southPoleLat,
    southPoleLon,
    rotationAngle: 0,
  };
}

/** A time coordinate on the standard calendar. */
export function timeAt(iso: string): TimeCoordinate {
  const d = new Date(iso);
  return {
    valid: {
      calendar: 'standard',
      year: d.getUTCFullYear(),
      month: d.getUTCMonth() + 1,
      day: d.getUTCDate(),
      hour: d.getUTCHours(),
      minute: d.getUTCMinutes(),
      second: d.getUTCSeconds(),
      iso: d.toISOString().replace('.000Z', 'Z'),
      epochMs: d.getTime(),
    },
  };
}

/** An in-memory field whose slices come from `values(t, k, i)`. */
export function memoryField(spec: {
  name: string;
  quantity: Quantity | undefined;
  units: string;
  grid: HorizontalGrid;
  levelsPa: number[];
  times: TimeCoordinate[];
  values: (t: number, k: number, i: number) => number;
  quantizationStep?: number;
  rhConvention?: RhConventionRecord;
  attrs?: Record<string, string | number>;
}): Field {
  const encoding: Encoding = {
    storedType: spec.quantizationStep ? 'int16' : 'float32',
    sourceUnits: spec.units,
    unitScale: 1,
    unitOffset: 0,
    quantizationStep: spec.quantizationStep ?? 0,
  };
  return {
    name: spec.name,
    quantity: spec.quantity,
    units: spec.units,
    grid: spec.grid,
    levelsPa: Float64Array.from(spec.levelsPa),
    times: spec.times,
    rhConvention: spec.rhConvention,
    encoding,
    attrs: spec.attrs ?? {},
    async readSlice(t: number, k: number, out?: Float32Array): Promise<Float32Array> {
      const o = out ?? new Float32Array(spec.grid.npoints);
      for (let i = 0; i < o.length; i++) o[i] = spec.values(t, k, i);
      return o;
    },
  };
}

/** A dataset of in-memory fields. */
export function memoryDataset(fields: Field[], path = 'memory.nc'): GridDataset {
  return { path, format: 'netcdf4', attrs: {}, fields, notes: [], async close() {} };
}
