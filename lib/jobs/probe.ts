/**
 * Values of one variable at given points, taken at the nearest grid node, in the variable's own
 * units after CF unpacking (the numbers ecCodes and netCDF4-python report): what `frostgrid probe`
 * prints.
 */
import proj4 from 'proj4';
import { AmbiguityError, MissingQuantityError, ParameterError } from '../errors.js';
import type { Field, GridDataset, HorizontalGrid, Quantity } from '../grid/types.js';
import { geographicToRotated, rotatedToGeographic } from '../grid/regrid.js';
import { timeLabel } from './describe.js';

export interface ProbePoint {
  readonly lat: number;
  readonly lon: number;
}

export interface ProbeRow {
  readonly lat: number;
  readonly lon: number;
  readonly grid_lat: number;
  readonly grid_lon: number;
  readonly value: number | null;
}

export interface ProbeRequest {
  /** A CF standard name (air_temperature, …) or the file's own variable name. */
  readonly variable: string;
  readonly levelHPa: number;
  /** ISO 8601 valid time; may be omitted when the variable has one time. */
  readonly time?: string;
  readonly points: readonly ProbePoint[];
}

/** Finds a field by the file's own name first, then by CF standard name (quantity). */
export function fieldByName(ds: GridDataset, name: string): Field {
  const own = ds.fields.filter((f) => f.name === name);
  if (own.length === 1) return own[0];
  const byQuantity = ds.fields.filter((f) => f.quantity === (name as Quantity));
  if (byQuantity.length === 1) return byQuantity[0];
  if (byQuantity.length > 1) {
    const names = byQuantity.map((f) => f.name);
    throw new AmbiguityError(`${ds.path}: ${name} matches several variables (${names.join(', ')}); name one of them`, names, {
      file: ds.path,
    });
  }
  const found = ds.fields.map((f) => (f.quantity ? `${f.name} (${f.quantity})` : f.name));
  throw new MissingQuantityError(`${ds.path}: no variable ${name}; the file has ${found.join(', ') || 'no variables on a grid'}`, name, found, {
    file: ds.path,
    variable: name,
  });
}

/** Index of the level equal to levelHPa (to 0.001 hPa). */
export function levelIndex(field: Field, levelHPa: number, file: string): number {
  for (let k = 0; k < field.levelsPa.length; k++) {
    if (Math.abs(field.levelsPa[k] / 100 - levelHPa) < 1e-3) return k;
  }
  const have = Array.from(field.levelsPa, (p) => p / 100).join(', ');
  throw new ParameterError(
    `${file}: variable ${field.name} has no ${levelHPa} hPa level; levels: ${have || 'none (not on pressure levels)'}`,
    'level',
    { file, variable: field.name },
  );
}

/** Parses an ISO 8601 UTC time leniently ("2026-03-04T06Z", "2026-03-04 06:00") to epoch ms. */
export function parseIsoTime(s: string): number | undefined {
  const m = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2})(?::?(\d{2}))?(?::?(\d{2}(?:\.\d+)?))?)?\s*(Z|[+-]00:?00)?$/i.exec(s.trim());
  if (!m) return undefined;
  return Date.UTC(+m[1], +m[2] - 1, +m[3], +(m[4] ?? 0), +(m[5] ?? 0), 0) + Math.round(Number(m[6] ?? 0) * 1000);
}

/** Index of the time matching an ISO string (or the only time when none is given). */
export function timeIndex(field: Field, time: string | undefined, file: string): number {
  if (time === undefined) {
    if (field.times.length <= 1) return 0;
    throw new ParameterError(
      `${file}: variable ${field.name} has ${field.times.length} times; choose one with --time (${field.times.map(timeLabel).join(', ')})`,
      'time',
      { file, variable: field.name },
    );
  }
  const ms = parseIsoTime(time);
  for (let i = 0; i < field.times.length; i++) {
    const t = field.times[i].valid;
    if (ms !== undefined && t.epochMs !== undefined ? t.epochMs === ms : t.iso.startsWith(time)) return i;
  }
  throw new ParameterError(
    `${file}: variable ${field.name} has no time ${time}; times: ${field.times.map(timeLabel).join(', ')}`,
    'time',
    { file, variable: field.name },
  );
}

export async function probe(ds: GridDataset, req: ProbeRequest): Promise<ProbeRow[]> {
  const field = fieldByName(ds, req.variable);
  const k = field.levelsPa.length === 0 ? 0 : levelIndex(field, req.levelHPa, ds.path);
  const t = timeIndex(field, req.time, ds.path);
  const slice = await field.readSlice(t, k);
  const locate = nodeLocator(field.grid);
  const { unitScale, unitOffset } = field.encoding;
  return req.points.map((pt) => {
    const node = locate(pt.lat, pt.lon);
    if (node === undefined) return { lat: pt.lat, lon: pt.lon, grid_lat: Number.NaN, grid_lon: Number.NaN, value: null };
    const si = slice[node.index];
    // Back to the file's own units: SI = source·scale + offset.
    const value = Number.isNaN(si) ? null : (si - unitOffset) / unitScale;
    return { lat: pt.lat, lon: pt.lon, grid_lat: node.lat, grid_lon: node.lon, value };
  });
}

interface Node {
  readonly index: number;
  readonly lat: number;
  readonly lon: number;
}

function nearestInSorted(values: Float64Array, v: number): number {
  let best = 0;
  let bestD = Infinity;
  for (let i = 0; i < values.length; i++) {
    const d = Math.abs(values[i] - v);
    if (d < bestD) {
      bestD = d;
      best = i;
    }
  }
  return best;
}

/** Longitude difference folded into [-180, 180). */
function dLon(a: number, b: number): number {
  return ((((a - b + 180) % 360) + 360) % 360) - 180;
}

function nearestLon(lons: Float64Array, lon: number, first: number, count: number, wrap: boolean): number {
  let best = -1;
  let bestD = Infinity;
  for (let i = 0; i < count; i++) {
    const d = wrap ? Math.abs(dLon(lons[first + i], lon)) : Math.abs(lons[first + i] - lon);
    if (d < bestD) {
      bestD = d;
      best = i;
    }
  }
  return best;
}

/** A function from (lat, lon) to the nearest node, or undefined outside the grid. */
export function nodeLocator(grid: HorizontalGrid): (lat: number, lon: number) => Node | undefined {
  switch (grid.kind) {
    case 'regular_ll':
      return (lat, lon) => {
        const j = nearestInSorted(grid.lat, lat);
        const lonIn = grid.longitudeConvention === '0..360' ? ((lon % 360) + 360) % 360 : lon;
        const i = nearestLon(grid.lon, lonIn, 0, grid.nx, true);
        if (!grid.globalLongitude && Math.abs(dLon(grid.lon[i], lonIn)) > grid.dLon) return undefined;
        if (Math.abs(grid.lat[j] - lat) > grid.dLat) return undefined;
        return { index: j * grid.nx + i, lat: grid.lat[j], lon: grid.lon[i] };
      };
    case 'gaussian': {
      const rowStart = new Int32Array(grid.ny);
      for (let j = 1; j < grid.ny; j++) rowStart[j] = rowStart[j - 1] + grid.pointsPerRow[j - 1];
      return (lat, lon) => {
        const j = nearestInSorted(grid.lat, lat);
        const n = grid.pointsPerRow[j];
        let best = 0;
        let bestD = Infinity;
        for (let i = 0; i < n; i++) {
          const d = Math.abs(dLon(grid.lonFirst[j] + i * grid.dLonPerRow[j], lon));
          if (d < bestD) {
            bestD = d;
            best = i;
          }
        }
        return { index: rowStart[j] + best, lat: grid.lat[j], lon: grid.lonFirst[j] + best * grid.dLonPerRow[j] };
      };
    }
    case 'projected': {
      if (grid.crs.kind !== 'projected') throw new ParameterError('projected grid without a projected CRS', 'grid');
      const proj = proj4(grid.crs.proj4);
      return (lat, lon) => {
        const [x, y] = proj.forward([lon, lat]);
        const i = nearestInSorted(grid.x, x);
        const j = nearestInSorted(grid.y, y);
        if (Math.abs(grid.x[i] - x) > Math.abs(grid.dx) || Math.abs(grid.y[j] - y) > Math.abs(grid.dy)) return undefined;
        const [glon, glat] = proj.inverse([grid.x[i], grid.y[j]]);
        return { index: j * grid.nx + i, lat: glat, lon: glon };
      };
    }
    case 'rotated_ll':
      return (lat, lon) => {
        const [rlon0, rlat] = geographicToRotated(lon, lat, grid.southPoleLat, grid.southPoleLon);
        const rlon = rlon0 - grid.rotationAngle;
        const j = nearestInSorted(grid.rlat, rlat);
        const i = nearestLon(grid.rlon, rlon, 0, grid.nx, false);
        if (Math.abs(grid.rlat[j] - rlat) > grid.dLat || Math.abs(dLon(grid.rlon[i], rlon)) > grid.dLon) return undefined;
        const [glon, glat] = rotatedToGeographic(grid.rlon[i] + grid.rotationAngle, grid.rlat[j], grid.southPoleLat, grid.southPoleLon);
        return { index: j * grid.nx + i, lat: glat, lon: glon };
      };
  }
}
