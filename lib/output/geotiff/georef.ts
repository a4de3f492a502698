/**
 * Georeferencing of a raster as GeoTIFF keys (OGC GeoTIFF 1.1): the CRS as a key directory with
 * its double and ASCII parameters, and the affine transform as ModelPixelScale + ModelTiepoint
 * (or ModelTransformation when the transform is rotated or not north-up). Rasters are
 * PixelIsArea: the transform's origin is the outer corner of the first cell.
 */
import type { Crs, EarthShape } from '../../grid/types.js';
import { ParameterError, UnsupportedError } from '../../errors.js';
import { Epsg, GeoKey, KEY_DIRECTORY_VERSION, ModelType, ProjMethod, RasterType, USER_DEFINED } from './geo-key-table.js';

export interface GeoKeySet {
  /** GeoKeyDirectoryTag values. */
  readonly directory: number[];
  /** GeoDoubleParamsTag values (empty when none). */
  readonly doubles: number[];
  /** GeoAsciiParamsTag text ('|'-terminated entries; empty when none). */
  readonly ascii: string;
}

type KeyValue = { id: number; short?: number; double?: number; text?: string };

function buildDirectory(keys: KeyValue[]): GeoKeySet {
  const sorted = [...keys].sort((a, b) => a.id - b.id);
  const directory: number[] = [...KEY_DIRECTORY_VERSION, sorted.length];
  const doubles: number[] = [];
  let ascii = '';
  for (const k of sorted) {
    if (k.short !== undefined) directory.push(k.id, 0, 1, k.short);
    else if (k.double !== undefined) {
      directory.push(k.id, 34736, 1, doubles.length);
      doubles.push(k.double);
    } else if (k.text !== undefined) {
      const t = k.text.replace(/\|/g, '/') + '|';
      directory.push(k.id, 34737, t.length, ascii.length);
      ascii += t;
    }
  }
  return { directory, doubles, ascii };
}

const isWgs84 = (e: EarthShape): boolean =>
  e.kind === 'ellipsoid' && e.semiMajorM === 6378137 && Math.abs(e.inverseFlattening - 298.257223563) < 1e-9;

function earthLabel(e: EarthShape): string {
  return e.kind === 'sphere' ? `sphere R=${e.radiusM} m` : `ellipsoid a=${e.semiMajorM} m 1/f=${e.inverseFlattening}`;
}

/** Keys of the geodetic (geographic) part of a CRS. */
function geodeticKeys(earth: EarthShape, epsg?: number): KeyValue[] {
  if (epsg !== undefined) return [{ id: GeoKey.GeodeticCRSGeoKey, short: epsg }];
  if (isWgs84(earth)) return [{ id: GeoKey.GeodeticCRSGeoKey, short: Epsg.wgs84Geographic2D }];
  const keys: KeyValue[] = [
    { id: GeoKey.GeodeticCRSGeoKey, short: USER_DEFINED },
    { id: GeoKey.GeodeticCitationGeoKey, text: `frostgrid geographic CRS on ${earthLabel(earth)}` },
    { id: GeoKey.GeodeticDatumGeoKey, short: USER_DEFINED },
    { id: GeoKey.PrimeMeridianGeoKey, short: Epsg.greenwich },
    { id: GeoKey.GeogAngularUnitsGeoKey, short: Epsg.degree },
    { id: GeoKey.EllipsoidGeoKey, short: USER_DEFINED },
  ];
  if (earth.kind === 'sphere') {
    if (!(earth.radiusM > 0)) throw new ParameterError(`earth radius must be positive, got ${earth.radiusM}`, 'crs');
    keys.push({ id: GeoKey.EllipsoidSemiMajorAxisGeoKey, double: earth.radiusM }, { id: GeoKey.EllipsoidSemiMinorAxisGeoKey, double: earth.radiusM });
  } else {
    if (!(earth.semiMajorM > 0) || !(earth.inverseFlattening > 0)) {
      throw new ParameterError('ellipsoid semi-major axis and inverse flattening must be positive', 'crs');
    }
    keys.push(
      { id: GeoKey.EllipsoidSemiMajorAxisGeoKey, double: earth.semiMajorM },
      { id: GeoKey.EllipsoidInvFlatteningGeoKey, double: earth.inverseFlattening },
    );
  }
  return keys;
}

/** Parses "+key=value" pairs of a proj4 definition. */
export function parseProj4(def: string): Record<string, string> {
  const out: Record<string, string> = {};
  for (const token of def.trim().split(/\s+/)) {
    const m = /^\+([A-Za-z_0-9]+)(?:=(.*))?$/.exec(token);
    if (m) out[m[1]] = m[2] ?? '';
  }
  return out;
}

function num(params: Record<string, string>, key: string, fallback?: number): number {
  const raw = params[key];
  if (raw === undefined) {
    if (fallback !== undefined) return fallback;
    throw new ParameterError(`the projection definition lacks +${key}`, 'crs');
  }
  const v = Number(raw);
  if (!Number.isFinite(v)) throw new ParameterError(`+${key}=${raw} in the projection definition is not a number`, 'crs');
  return v;
}

/** Longitude in −180..180. */
const lon180 = (lon: number): number => ((((lon + 180) % 360) + 360) % 360) - 180;

function projectionKeys(crs: Extract<Crs, { kind: 'projected' }>): KeyValue[] {
  const p = parseProj4(crs.proj4);
  const x0 = num(p, 'x_0', 0);
  const y0 = num(p, 'y_0', 0);
  if (p.units !== undefined && p.units !== 'm') {
    throw new UnsupportedError(`projected units ${p.units} are not supported (metres only)`, 'projected units', p.units);
  }
  const keys: KeyValue[] = [
    { id: GeoKey.ProjectedCRSGeoKey, short: USER_DEFINED },
    { id: GeoKey.ProjectionGeoKey, short: USER_DEFINED },
    { id: GeoKey.ProjLinearUnitsGeoKey, short: Epsg.metre },
  ];
  if (crs.projection === 'lambert_conformal_conic') {
    if (p.proj !== 'lcc') throw new ParameterError(`a Lambert conformal CRS needs +proj=lcc, got +proj=${p.proj}`, 'crs');
    const lat1 = num(p, 'lat_1');
    const lat2 = num(p, 'lat_2', lat1);
    const lat0 = num(p, 'lat_0', lat1);
    const lon0 = lon180(num(p, 'lon_0', 0));
    const k0 = num(p, 'k_0', num(p, 'k', 1));
    keys.push({ id: GeoKey.PCSCitationGeoKey, text: 'frostgrid Lambert conformal conic' });
    if (lat1 === lat2 && lat0 === lat1) {
      keys.push(
        { id: GeoKey.ProjMethodGeoKey, short: ProjMethod.lambertConformalConic1SP },
        { id: GeoKey.ProjNatOriginLatGeoKey, double: lat0 },
        { id: GeoKey.ProjNatOriginLongGeoKey, double: lon0 },
        { id: GeoKey.ProjScaleAtNatOriginGeoKey, double: k0 },
        { id: GeoKey.ProjFalseEastingGeoKey, double: x0 },
        { id: GeoKey.ProjFalseNorthingGeoKey, double: y0 },
      );
    } else {
      if (k0 !== 1) {
        throw new UnsupportedError('a two-standard-parallel Lambert conic with a scale factor has no GeoTIFF method', 'projection', 'lcc +k_0');
      }
      keys.push(
        { id: GeoKey.ProjMethodGeoKey, short: ProjMethod.lambertConformalConic2SP },
        { id: GeoKey.ProjStdParallel1GeoKey, double: lat1 },
        { id: GeoKey.ProjStdParallel2GeoKey, double: lat2 },
        { id: GeoKey.ProjFalseOriginLatGeoKey, double: lat0 },
        { id: GeoKey.ProjFalseOriginLongGeoKey, double: lon0 },
        { id: GeoKey.ProjFalseOriginEastingGeoKey, double: x0 },
        { id: GeoKey.ProjFalseOriginNorthingGeoKey, double: y0 },
      );
    }
  } else if (crs.projection === 'polar_stereographic') {
    if (p.proj !== 'stere') throw new ParameterError(`a polar stereographic CRS needs +proj=stere, got +proj=${p.proj}`, 'crs');
    const lat0 = num(p, 'lat_0');
    if (Math.abs(lat0) !== 90) {
      throw new UnsupportedError(`an oblique stereographic projection (lat_0=${lat0}) is not supported`, 'projection', 'stere');
    }
    const lon0 = lon180(num(p, 'lon_0', 0));
    // Variant B (standard parallel) carries lat_ts as the origin latitude; variant A carries ±90 and k0.
    const latTs = p.lat_ts !== undefined ? num(p, 'lat_ts') : undefined;
    const variantB = latTs !== undefined && Math.abs(latTs) !== 90;
    keys.push(
      { id: GeoKey.PCSCitationGeoKey, text: 'frostgrid polar stereographic' },
      { id: GeoKey.ProjMethodGeoKey, short: ProjMethod.polarStereographic },
      { id: GeoKey.ProjStraightVertPoleLongGeoKey, double: lon0 },
      { id: GeoKey.ProjNatOriginLatGeoKey, double: variantB ? (latTs as number) : lat0 },
      { id: GeoKey.ProjScaleAtNatOriginGeoKey, double: variantB ? 1 : num(p, 'k_0', num(p, 'k', 1)) },
      { id: GeoKey.ProjFalseEastingGeoKey, double: x0 },
      { id: GeoKey.ProjFalseNorthingGeoKey, double: y0 },
    );
  } else {
    const never: string = crs.projection;
    throw new UnsupportedError(`projection ${never} is not supported`, 'projection', never);
  }
  return keys;
}

/** True for EPSG codes taken as geographic 2D CRSs (the 4000–4999 block). */
export const isGeographicEpsg = (code: number): boolean => code >= 4000 && code <= 4999;

/** GeoKeys for a CRS. */
export function geoKeysFor(crs: Crs | { epsg: number }): GeoKeySet {
  const area = { id: GeoKey.GTRasterTypeGeoKey, short: RasterType.pixelIsArea };
  if (!('kind' in crs)) {
    const code = crs.epsg;
    if (!Number.isInteger(code) || code < 1024 || code > 32766) {
      throw new ParameterError(`EPSG code ${code} is not a valid CRS code`, 'crs');
    }
    if (isGeographicEpsg(code)) {
      return buildDirectory([{ id: GeoKey.GTModelTypeGeoKey, short: ModelType.geographic }, area, { id: GeoKey.GeodeticCRSGeoKey, short: code }]);
    }
    return buildDirectory([{ id: GeoKey.GTModelTypeGeoKey, short: ModelType.projected }, area, { id: GeoKey.ProjectedCRSGeoKey, short: code }]);
  }
  if (crs.kind === 'geographic') {
    return buildDirectory([{ id: GeoKey.GTModelTypeGeoKey, short: ModelType.geographic }, area, ...geodeticKeys(crs.earth, crs.epsg)]);
  }
  if (crs.kind === 'projected') {
    return buildDirectory([
      { id: GeoKey.GTModelTypeGeoKey, short: ModelType.projected },
      area,
      ...geodeticKeys(crs.earth),
      ...projectionKeys(crs),
    ]);
  }
  throw new UnsupportedError(`CRS kind ${String((crs as { kind: unknown }).kind)} is not supported`, 'crs', String((crs as { kind: unknown }).kind));
}

/** Model tags for an affine transform (GDAL order x0, dx, rx, y0, ry, dy). */
export function modelTags(t: readonly [number, number, number, number, number, number]): { pixelScale?: number[]; tiepoint?: number[]; transformation?: number[] } {
  const [x0, dx, rx, y0, ry, dy] = t;
  if (dx === 0 && rx === 0) throw new ParameterError('transform has a zero x pixel size', 'transform');
  if (rx === 0 && ry === 0 && dx > 0 && dy < 0) {
    return { pixelScale: [dx, -dy, 0], tiepoint: [0, 0, 0, x0, y0, 0] };
  }
  if (dx * dy - rx * ry === 0) throw new ParameterError('transform is singular', 'transform');
  return { transformation: [dx, rx, 0, x0, ry, dy, 0, y0, 0, 0, 0, 0, 0, 0, 0, 1] };
}
