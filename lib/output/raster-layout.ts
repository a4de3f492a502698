/**
 * From a grid of the grid model to a north-up raster: the affine transform (GDAL order, outer
 * corner of the first cell), the CRS, and the reordering of a slice from the grid's storage order
 * into raster order (rows north to south, columns west to east). Global 0..360 longitudes are
 * rotated to −180..180 unless asked to keep them.
 *
 * Only grids an affine transform describes are accepted: regular latitude–longitude and
 * projected grids. Gaussian and rotated-pole grids must be regridded first.
 */
import type { Crs, HorizontalGrid, ProjectedGrid, RegularLatLonGrid } from '../grid/types.js';
import { OutputError, ParameterError, UnsupportedError } from '../errors.js';

export interface RasterLayout {
  readonly width: number;
  readonly height: number;
  readonly crs: Crs;
  /** GDAL order: x0, dx, 0, y0, 0, −dy. */
  readonly transform: readonly [number, number, number, number, number, number];
  /** Storage row of each raster row. */
  readonly rowOrder: Int32Array;
  /** Storage column of each raster column. */
  readonly columnOrder: Int32Array;
  /** Reorders one slice (storage order, nx·ny values) into raster order. */
  toRasterOrder<T extends Float32Array | Uint8Array>(src: T, out?: T): T;
}

export interface RasterLayoutOptions {
  /** Keep 0..360 longitudes of a global grid instead of rotating them to −180..180. */
  keepLongitude0To360?: boolean;
}

const lon180 = (lon: number): number => ((((lon + 180) % 360) + 360) % 360) - 180;

/** Indices 0..n−1, reversed when `reverse`. */
function order(n: number, reverse: boolean): Int32Array {
  const o = new Int32Array(n);
  for (let i = 0; i < n; i++) o[i] = reverse ? n - 1 - i : i;
  return o;
}

function checkSpacing(coords: ArrayLike<number>, idx: Int32Array, step: number, what: string, wrap: boolean): void {
  const tol = Math.max(1e-6, Math.abs(step) * 1e-3);
  for (let i = 1; i < idx.length; i++) {
    let d = coords[idx[i]] - coords[idx[i - 1]];
    if (wrap) d = ((d % 360) + 360) % 360;
    if (Math.abs(d - step) > tol) {
      throw new ParameterError(`${what} are not evenly spaced by ${step} (step ${d} at index ${i}); an affine transform cannot describe them`, 'grid');
    }
  }
}

function latLonLayout(grid: RegularLatLonGrid, options: RasterLayoutOptions): Omit<RasterLayout, 'toRasterOrder'> {
  const { nx, ny, lat, lon, dLat, dLon } = grid;
  if (lat.length !== ny || lon.length !== nx) throw new ParameterError(`grid has ${lat.length} latitudes and ${lon.length} longitudes for ${ny} × ${nx} points`, 'grid');
  if (!(dLat > 0) || !(dLon > 0)) throw new ParameterError('grid spacing must be positive', 'grid');
  const rowOrder = order(ny, ny > 1 && lat[0] < lat[ny - 1]);
  checkSpacing(lat, rowOrder, -dLat, 'latitudes', false);
  // Storage direction of longitudes, taking the wrap at 360° into account.
  const step01 = nx > 1 ? lon180(lon[1] - lon[0]) : dLon;
  let columnOrder = order(nx, step01 < 0);
  let x0 = lon[columnOrder[0]];
  const rotate = grid.globalLongitude && !options.keepLongitude0To360;
  if (rotate) {
    // Start at the westernmost column in −180..180 and wrap round.
    let start = 0;
    let best = Infinity;
    for (let j = 0; j < nx; j++) {
      const v = lon180(lon[columnOrder[j]]);
      if (v < best - 1e-9) {
        best = v;
        start = j;
      }
    }
    const rotated = new Int32Array(nx);
    for (let j = 0; j < nx; j++) rotated[j] = columnOrder[(start + j) % nx];
    columnOrder = rotated;
    x0 = best;
    checkSpacing(lon, columnOrder, dLon, 'longitudes', true);
  } else {
    checkSpacing(lon, columnOrder, dLon, 'longitudes', true);
    if (!grid.globalLongitude && !options.keepLongitude0To360 && x0 >= 180) x0 -= 360;
  }
  const yTop = lat[rowOrder[0]];
  return {
    width: nx,
    height: ny,
    crs: grid.crs,
    transform: [x0 - dLon / 2, dLon, 0, yTop + dLat / 2, 0, -dLat],
    rowOrder,
    columnOrder,
  };
}

function projectedLayout(grid: ProjectedGrid): Omit<RasterLayout, 'toRasterOrder'> {
  const { nx, ny, x, y, dx, dy } = grid;
  if (x.length !== nx || y.length !== ny) throw new ParameterError(`grid has ${x.length} x and ${y.length} y coordinates for ${ny} × ${nx} points`, 'grid');
  if (!(dx > 0) || !(dy > 0)) throw new ParameterError('grid spacing must be positive', 'grid');
  const columnOrder = order(nx, nx > 1 && x[0] > x[nx - 1]);
  const rowOrder = order(ny, ny > 1 && y[0] < y[ny - 1]);
  checkSpacing(x, columnOrder, dx, 'x coordinates', false);
  checkSpacing(y, rowOrder, -dy, 'y coordinates', false);
  return {
    width: nx,
    height: ny,
    crs: grid.crs,
    transform: [x[columnOrder[0]] - dx / 2, dx, 0, y[rowOrder[0]] + dy / 2, 0, -dy],
    rowOrder,
    columnOrder,
  };
}

/** Runs of consecutive ascending storage columns: [rasterStart, storageStart, length]. */
function runs(columnOrder: Int32Array): number[][] {
  const out: number[][] = [];
  let j = 0;
  while (j < columnOrder.length) {
    let k = j + 1;
    while (k < columnOrder.length && columnOrder[k] === columnOrder[k - 1] + 1) k++;
    out.push([j, columnOrder[j], k - j]);
    j = k;
  }
  return out;
}

/** The raster layout of a grid, or a typed error for grids an affine transform cannot describe. */
export function rasterLayout(grid: HorizontalGrid, options: RasterLayoutOptions = {}): RasterLayout {
  let base: Omit<RasterLayout, 'toRasterOrder'>;
  if (grid.kind === 'regular_ll') base = latLonLayout(grid, options);
  else if (grid.kind === 'projected') base = projectedLayout(grid);
  else {
    throw new UnsupportedError(
      `a ${grid.kind === 'gaussian' ? 'Gaussian' : 'rotated-pole'} grid cannot be written as a GeoTIFF without regridding; regrid it to a regular latitude–longitude grid first`,
      'grid',
      grid.kind,
    );
  }
  const { width, height, rowOrder, columnOrder } = base;
  const colRuns = runs(columnOrder);
  const contiguous = colRuns.length <= 4;
  const n = width * height;
  return {
    ...base,
    toRasterOrder<T extends Float32Array | Uint8Array>(src: T, out?: T): T {
      if (src.length !== n) throw new OutputError(`slice has ${src.length} values but the ${width} × ${height} grid has ${n}`);
      const dst = (out ?? new (src.constructor as new (n: number) => T)(n)) as T;
      if (dst.length !== n) throw new OutputError(`output array has ${dst.length} values, ${n} needed`);
      if (dst === src) throw new ParameterError('toRasterOrder cannot reorder in place', 'out');
      for (let r = 0; r < height; r++) {
        const s = rowOrder[r] * width;
        const d = r * width;
        if (contiguous) {
          for (const [j, c, len] of colRuns) dst.set(src.subarray(s + c, s + c + len), d + j);
        } else {
          for (let j = 0; j < width; j++) dst[d + j] = src[s + columnOrder[j]];
        }
      }
      return dst;
    },
  };
}
