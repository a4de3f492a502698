/**
 * A plain, JSON-ready description of a dataset: what `frostgrid info` prints. Built from the grid
 * model only, so it reads the same for every format.
 */
import type { Crs, Field, GridDataset, HorizontalGrid, TimeCoordinate } from '../grid/types.js';

export interface GridDescription {
  readonly kind: HorizontalGrid['kind'];
  /** [rows, columns]; reduced Gaussian grids give [rows, max points per row]. */
  readonly shape: readonly [number, number];
  readonly points: number;
  readonly first: { readonly lat: number; readonly lon: number } | { readonly x: number; readonly y: number };
  readonly last: { readonly lat: number; readonly lon: number } | { readonly x: number; readonly y: number };
  /** Spacing in degrees (lat/lon grids) or metres (projected grids). */
  readonly spacing: { readonly lat?: number; readonly lon?: number; readonly x?: number; readonly y?: number };
  readonly crs: string;
  readonly latitude_order?: string;
  readonly longitude_convention?: string;
  readonly extra?: Readonly<Record<string, number | boolean | string>>;
}

export interface VariableDescription {
  readonly name: string;
  readonly quantity: string | null;
  readonly long_name: string | null;
  readonly units: string;
  readonly si_units: string;
  readonly rh_convention: string | null;
  readonly levels_hPa: readonly number[];
  readonly times: readonly string[];
  readonly stored_as: string;
  readonly grid: GridDescription;
}

export interface DatasetDescription {
  readonly file: string;
  readonly format: string;
  readonly variables: readonly VariableDescription[];
  readonly notes: readonly string[];
}

export function describeDataset(ds: GridDataset): DatasetDescription {
  return {
    file: ds.path,
    format: ds.format,
    variables: ds.fields.map(describeField),
    notes: ds.notes,
  };
}

export function describeField(f: Field): VariableDescription {
  return {
    name: f.name,
    quantity: f.quantity ?? null,
    long_name: f.longName ?? null,
    units: f.encoding.sourceUnits,
    si_units: f.units,
    rh_convention: f.rhConvention ? `${f.rhConvention.convention} (${f.rhConvention.source})` : null,
    levels_hPa: Array.from(f.levelsPa, (p) => roundTo(p / 100, 6)),
    times: f.times.map(timeLabel),
    stored_as: f.encoding.storedType,
    grid: describeGrid(f.grid),
  };
}

/** "2026-03-04T06:00:00Z", plus reference time and member when a forecast file has them. */
export function timeLabel(t: TimeCoordinate): string {
  let s = t.valid.iso;
  if (t.reference !== undefined && t.reference.iso !== t.valid.iso) s += ` (ref ${t.reference.iso})`;
  if (t.member !== undefined) s += ` member ${t.member}`;
  return s;
}

export function describeCrs(crs: Crs): string {
  if (crs.kind === 'projected') return crs.proj4;
  if (crs.epsg !== undefined) return `EPSG:${crs.epsg}`;
  const e = crs.earth;
  return e.kind === 'sphere'
    ? `geographic, sphere R=${e.radiusM} m`
    : `geographic, ellipsoid a=${e.semiMajorM} m 1/f=${e.inverseFlattening}`;
}

export function describeGrid(g: HorizontalGrid): GridDescription {
  const crs = describeCrs(g.crs);
  switch (g.kind) {
    case 'regular_ll':
      return {
        kind: g.kind,
        shape: [g.ny, g.nx],
        points: g.npoints,
        first: { lat: g.lat[0], lon: g.lon[0] },
        last: { lat: g.lat[g.ny - 1], lon: g.lon[g.nx - 1] },
        spacing: { lat: g.dLat, lon: g.dLon },
        crs,
        latitude_order: g.latitudeOrder,
        longitude_convention: g.longitudeConvention,
        extra: { global_longitude: g.globalLongitude },
      };
    case 'rotated_ll':
      return {
        kind: g.kind,
        shape: [g.ny, g.nx],
        points: g.npoints,
        first: { lat: g.rlat[0], lon: g.rlon[0] },
        last: { lat: g.rlat[g.ny - 1], lon: g.rlon[g.nx - 1] },
        spacing: { lat: g.dLat, lon: g.dLon },
        crs,
        extra: { south_pole_lat: g.southPoleLat, south_pole_lon: g.southPoleLon, rotation_angle: g.rotationAngle },
      };
    case 'gaussian': {
      let maxRow = 0;
      for (const n of g.pointsPerRow) maxRow = Math.max(maxRow, n);
      const lastRow = g.ny - 1;
      return {
        kind: g.kind,
        shape: [g.ny, maxRow],
        points: g.npoints,
        first: { lat: g.lat[0], lon: g.lonFirst[0] },
        last: { lat: g.lat[lastRow], lon: g.lonFirst[lastRow] + g.dLonPerRow[lastRow] * (g.pointsPerRow[lastRow] - 1) },
        spacing: { lon: g.dLonPerRow[0] },
        crs,
        latitude_order: g.lat[0] > g.lat[lastRow] ? 'north_to_south' : 'south_to_north',
        extra: { N: g.N, reduced: g.reduced, octahedral: g.octahedral },
      };
    }
    case 'projected':
      return {
        kind: g.kind,
        shape: [g.ny, g.nx],
        points: g.npoints,
        first: { x: g.x[0], y: g.y[0] },
        last: { x: g.x[g.nx - 1], y: g.y[g.ny - 1] },
        spacing: { x: g.dx, y: g.dy },
        crs,
      };
  }
}

function roundTo(x: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(x * f) / f;
}
