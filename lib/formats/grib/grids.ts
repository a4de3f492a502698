/**
 * GribGridDefinition → HorizontalGrid, and the reordering of decoded values from the message's
 * scanning order (GRIB2 code table 3.4 / GRIB1 code table 8) into frostgrid's order: rows one
 * after another, points of a row west → east (i ascending eastward); rows in the order the message
 * scans j (the grid's latitudeOrder / lat / y arrays say which). Flag bits:
 *   0x80  points of a row run −i (east → west)        → reversed
 *   0x40  rows run +j (south → north)                 → kept, described by the grid
 *   0x20  points run along j first (column by column) → transposed
 *   0x10  adjacent rows (columns for 0x20) alternate direction → every second one reversed
 */
import proj4 from 'proj4';
import { UnsupportedError } from '../../errors.js';
import type { Crs, EarthShape, GaussianGrid, HorizontalGrid, ProjectedGrid, RegularLatLonGrid, RotatedLatLonGrid } from '../../grid/types.js';
import { gaussianLatitudes } from './gaussian.js';
import type { GribGridDefinition } from './types.js';

export const SCAN_I_NEGATIVE = 0x80;
export const SCAN_J_POSITIVE = 0x40;
export const SCAN_J_CONSECUTIVE = 0x20;
export const SCAN_ALTERNATE_ROWS = 0x10;

/** A grid and the permutation from message order to frostgrid's order. */
export interface GribGrid {
  readonly grid: HorizontalGrid;
  /**
   * order[k] = index in the message's values of the k-th point in frostgrid's order; undefined
   * when the message is already in that order.
   */
  readonly order: Int32Array | undefined;
}

/** Moves values from message order into frostgrid's order. */
export function reorder(values: ArrayLike<number>, order: Int32Array | undefined, out: Float32Array): Float32Array {
  if (!order) {
    for (let k = 0; k < out.length; k++) out[k] = values[k];
  } else {
    for (let k = 0; k < out.length; k++) out[k] = values[order[k]];
  }
  return out;
}

/** Permutation for a rectangular grid of ni columns and nj rows. */
export function rectangularOrder(ni: number, nj: number, scanningMode: number): Int32Array | undefined {
  const iNeg = (scanningMode & SCAN_I_NEGATIVE) !== 0;
  const jCons = (scanningMode & SCAN_J_CONSECUTIVE) !== 0;
  const alt = (scanningMode & SCAN_ALTERNATE_ROWS) !== 0;
  if (!iNeg && !jCons && !alt) return undefined;
  const order = new Int32Array(ni * nj);
  for (let r = 0; r < nj; r++) {
    for (let c = 0; c < ni; c++) {
      // c: column counted west → east in the output; ci: its position in the message's i order.
      const ci = iNeg ? ni - 1 - c : c;
      let k: number;
      if (!jCons) {
        const pos = alt && (r & 1) ? ni - 1 - ci : ci;
        k = r * ni + pos;
      } else {
        const pos = alt && (ci & 1) ? nj - 1 - r : r;
        k = ci * nj + pos;
      }
      order[r * ni + c] = k;
    }
  }
  return order;
}

function geographic(earth: EarthShape): Crs {
  return { kind: 'geographic', earth };
}

/** Evenly spaced coordinates from a to b (n values). */
function linspace(a: number, b: number, n: number): Float64Array {
  const out = new Float64Array(n);
  if (n === 1) out[0] = a;
  else for (let k = 0; k < n; k++) out[k] = a + ((b - a) * k) / (n - 1);
  return out;
}

/** Columns west → east: first longitude, spacing, convention. */
function longitudes(lon1: number, lon2: number, ni: number, di: number, iNeg: boolean) {
  const west = iNeg ? lon2 : lon1;
  const east = iNeg ? lon1 : lon2;
  let span = (((east - west) % 360) + 360) % 360;
  if (span === 0 && ni > 1) span = Number.isFinite(di) ? di * (ni - 1) : 360 - 360 / ni;
  const d = ni > 1 ? span / (ni - 1) : Number.isFinite(di) ? di : 0;
  let start = ((west % 360) + 360) % 360;
  // Columns that cross 0° are numbered from −180 when they fit there (e.g. 340..52.5 → −20..52.5,
  // 180..179.75 → −180..179.75); otherwise 0..360 (and beyond 360 for the rare grid that fits neither).
  if (start + span > 360 + 1e-9 && start - 360 >= -180 - 1e-9) start -= 360;
  const lon = new Float64Array(ni);
  for (let k = 0; k < ni; k++) lon[k] = Math.round((start + d * k) * 1e9) / 1e9;
  let maxLon = -Infinity;
  for (const v of lon) maxLon = Math.max(maxLon, v);
  return {
    lon,
    dLon: d,
    convention: (maxLon > 180 + 1e-9 ? '0..360' : '-180..180') as '0..360' | '-180..180',
    global: ni > 1 && Math.abs(d * ni - 360) < d * 1e-3,
  };
}

function regular(def: Extract<GribGridDefinition, { type: 'regular_ll' }>): GribGrid {
  const iNeg = (def.scanningMode & SCAN_I_NEGATIVE) !== 0;
  const L = longitudes(def.lon1, def.lon2, def.ni, def.di, iNeg);
  const lat = linspace(def.lat1, def.lat2, def.nj);
  const grid: RegularLatLonGrid = {
    kind: 'regular_ll',
    crs: geographic(def.earth),
    npoints: def.ni * def.nj,
    nx: def.ni,
    ny: def.nj,
    lat,
    lon: L.lon,
    dLat: def.nj > 1 ? Math.abs(def.lat2 - def.lat1) / (def.nj - 1) : Number.isFinite(def.dj) ? def.dj : 0,
    dLon: L.dLon,
    latitudeOrder: def.nj > 1 && def.lat2 > def.lat1 ? 'south_to_north' : 'north_to_south',
    longitudeConvention: L.convention,
    globalLongitude: L.global,
  };
  return { grid, order: rectangularOrder(def.ni, def.nj, def.scanningMode) };
}

function rotated(def: Extract<GribGridDefinition, { type: 'rotated_ll' }>): GribGrid {
  const iNeg = (def.scanningMode & SCAN_I_NEGATIVE) !== 0;
  const west = iNeg ? def.lon2 : def.lon1;
  const east = iNeg ? def.lon1 : def.lon2;
  // Rotated longitudes stay as the message numbers them, made increasing.
  let e = east;
  while (e < west) e += 360;
  const rlon = linspace(west > 180 ? west - 360 : west, (west > 180 ? west - 360 : west) + (e - west), def.ni);
  const grid: RotatedLatLonGrid = {
    kind: 'rotated_ll',
    crs: geographic(def.earth),
    npoints: def.ni * def.nj,
    nx: def.ni,
    ny: def.nj,
    rlat: linspace(def.lat1, def.lat2, def.nj),
    rlon,
    dLat: def.nj > 1 ? Math.abs(def.lat2 - def.lat1) / (def.nj - 1) : def.dj,
    dLon: def.ni > 1 ? (e - west) / (def.ni - 1) : def.di,
    southPoleLat: def.southPoleLat,
    southPoleLon: def.southPoleLon,
    rotationAngle: def.rotationAngle,
  };
  return { grid, order: rectangularOrder(def.ni, def.nj, def.scanningMode) };
}

function gaussian(def: Extract<GribGridDefinition, { type: 'gaussian' }>, file: string): GribGrid {
  const all = gaussianLatitudes(def.N);
  const nearest = (lat: number) => {
    let best = 0;
    for (let k = 1; k < all.length; k++) if (Math.abs(all[k] - lat) < Math.abs(all[best] - lat)) best = k;
    return best;
  };
  const a = nearest(def.lat1);
  const b = nearest(def.lat2);
  const step = b >= a ? 1 : -1;
  const ny = Math.abs(b - a) + 1;
  if (ny !== def.nj) {
    throw new UnsupportedError(
      `${file}: Gaussian grid N${def.N} from ${def.lat1}° to ${def.lat2}° spans ${ny} Gaussian latitudes, the message says Nj = ${def.nj}`,
      'Gaussian grid rows',
      `N${def.N}`,
      { file },
    );
  }
  if (def.scanningMode & (SCAN_J_CONSECUTIVE | SCAN_ALTERNATE_ROWS)) {
    throw new UnsupportedError(`${file}: scanning mode ${def.scanningMode} on a Gaussian grid`, 'scanning mode (Gaussian grid)', def.scanningMode, { file });
  }
  const lat = new Float64Array(ny);
  for (let k = 0; k < ny; k++) lat[k] = all[a + k * step];
  const reduced = def.pl !== undefined;
  const pl = def.pl ?? new Int32Array(ny).fill(def.ni ?? 0);
  const iNeg = (def.scanningMode & SCAN_I_NEGATIVE) !== 0;
  const lonFirst = new Float64Array(ny);
  const dLon = new Float64Array(ny);
  const west = iNeg ? def.lon2 : def.lon1;
  const east = iNeg ? def.lon1 : def.lon2;
  const span = ((((east - west) % 360) + 360) % 360) || 360;
  let maxPl = 0;
  for (const n of pl) maxPl = Math.max(maxPl, n);
  // A global row when the span reaches the last point before 360° of the longest row.
  const global = Math.abs(span - (360 - 360 / maxPl)) < 360 / maxPl / 2 || span >= 360;
  for (let r = 0; r < ny; r++) {
    lonFirst[r] = west;
    dLon[r] = global ? 360 / pl[r] : pl[r] > 1 ? span / (pl[r] - 1) : 0;
  }
  let octahedral = reduced;
  for (let r = 0; r < ny && octahedral; r++) {
    const fromPole = Math.min(a + r * step, all.length - 1 - (a + r * step));
    if (pl[r] !== 20 + 4 * fromPole) octahedral = false;
  }
  let npoints = 0;
  for (const n of pl) npoints += n;
  let order: Int32Array | undefined;
  if (iNeg) {
    order = new Int32Array(npoints);
    let k = 0;
    for (let r = 0; r < ny; r++) {
      for (let c = 0; c < pl[r]; c++) order[k + c] = k + pl[r] - 1 - c;
      k += pl[r];
    }
  }
  const grid: GaussianGrid = {
    kind: 'gaussian',
    crs: geographic(def.earth),
    npoints,
    N: def.N,
    ny,
    lat,
    pointsPerRow: Int32Array.from(pl),
    lonFirst,
    dLonPerRow: dLon,
    reduced,
    octahedral,
  };
  return { grid, order };
}

/** proj4 "+a/+rf" or "+R" terms for an earth shape. */
export function earthProj4(earth: EarthShape): string {
  return earth.kind === 'sphere' ? `+R=${earth.radiusM}` : `+a=${earth.semiMajorM} +rf=${earth.inverseFlattening}`;
}

const lon180 = (lon: number) => ((((lon + 180) % 360) + 360) % 360) - 180;

function projected(def: Extract<GribGridDefinition, { type: 'lambert_conformal' | 'polar_stereographic' }>): GribGrid {
  let proj4def: string;
  let projection: 'lambert_conformal_conic' | 'polar_stereographic';
  let params: Record<string, number>;
  const lov = lon180(def.lov);
  if (def.type === 'lambert_conformal') {
    projection = 'lambert_conformal_conic';
    params = { standard_parallel_1: def.latin1, standard_parallel_2: def.latin2, latitude_of_projection_origin: def.lad, longitude_of_central_meridian: lov };
    proj4def = `+proj=lcc +lat_1=${def.latin1} +lat_2=${def.latin2} +lat_0=${def.lad} +lon_0=${lov} +x_0=0 +y_0=0 ${earthProj4(def.earth)} +units=m +no_defs`;
  } else {
    projection = 'polar_stereographic';
    const pole = def.southPole ? -90 : 90;
    params = { latitude_of_projection_origin: pole, standard_parallel: def.lad, straight_vertical_longitude_from_pole: lov };
    proj4def = `+proj=stere +lat_0=${pole} +lat_ts=${def.lad} +lon_0=${lov} +x_0=0 +y_0=0 ${earthProj4(def.earth)} +units=m +no_defs`;
  }
  const [x0, y0] = proj4(proj4def).forward([lon180(def.lon1), def.lat1]);
  const iNeg = (def.scanningMode & SCAN_I_NEGATIVE) !== 0;
  const jPos = (def.scanningMode & SCAN_J_POSITIVE) !== 0;
  const xWest = iNeg ? x0 - (def.nx - 1) * def.dx : x0;
  const x = new Float64Array(def.nx);
  for (let c = 0; c < def.nx; c++) x[c] = xWest + c * def.dx;
  const y = new Float64Array(def.ny);
  for (let r = 0; r < def.ny; r++) y[r] = y0 + (jPos ? r : -r) * def.dy;
  const grid: ProjectedGrid = {
    kind: 'projected',
    crs: { kind: 'projected', projection, proj4: proj4def, earth: def.earth, params },
    npoints: def.nx * def.ny,
    nx: def.nx,
    ny: def.ny,
    x,
    y,
    dx: def.dx,
    dy: def.dy,
  };
  return { grid, order: rectangularOrder(def.nx, def.ny, def.scanningMode) };
}

/** Builds the horizontal grid of a GRIB grid definition. */
export function buildGrid(def: GribGridDefinition, file = ''): GribGrid {
  switch (def.type) {
    case 'regular_ll':
      return regular(def);
    case 'rotated_ll':
      return rotated(def);
    case 'gaussian':
      return gaussian(def, file);
    case 'lambert_conformal':
    case 'polar_stereographic':
      return projected(def);
  }
}

/** Longitude/latitude of every point of a grid in frostgrid's order (degrees), for tests and regridding. */
export function gridLonLat(grid: HorizontalGrid): { lon: Float64Array; lat: Float64Array } {
  const lon = new Float64Array(grid.npoints);
  const lat = new Float64Array(grid.npoints);
  switch (grid.kind) {
    case 'regular_ll':
      for (let r = 0, k = 0; r < grid.ny; r++) for (let c = 0; c < grid.nx; c++, k++) (lon[k] = grid.lon[c]), (lat[k] = grid.lat[r]);
      break;
    case 'rotated_ll':
      for (let r = 0, k = 0; r < grid.ny; r++) for (let c = 0; c < grid.nx; c++, k++) (lon[k] = grid.rlon[c]), (lat[k] = grid.rlat[r]);
      break;
    case 'gaussian':
      for (let r = 0, k = 0; r < grid.ny; r++) {
        for (let c = 0; c < grid.pointsPerRow[r]; c++, k++) (lon[k] = grid.lonFirst[r] + c * grid.dLonPerRow[r]), (lat[k] = grid.lat[r]);
      }
      break;
    case 'projected': {
      if (grid.crs.kind !== 'projected') break;
      const p = proj4(grid.crs.proj4);
      for (let r = 0, k = 0; r < grid.ny; r++) {
        for (let c = 0; c < grid.nx; c++, k++) {
          const [lo, la] = p.inverse([grid.x[c], grid.y[r]]);
          lon[k] = lo;
          lat[k] = la;
        }
      }
      break;
    }
  }
  return { lon, lat };
}
