/**
 * Recognising coordinate axes of 1-D coordinate variables, never assuming them (CF 1.11 §4):
 * latitude and longitude by standard_name, then units (degrees_north / degrees_east and their
 * CF §4.1/§4.2 variants), then `axis`, then common names; the vertical axis as pressure when its
 * units are a pressure (Pa, hPa, mbar, millibars …) or its standard_name is air_pressure, other
 * vertical axes by standard_name / `positive` / axis Z (CF §4.3); time by "<unit> since" units,
 * standard_name time or axis T (CF §4.4); the reanalysis `expver` dimension by name.
 */
import type { Attributes } from './types.js';

export type AxisKind = 'latitude' | 'longitude' | 'pressure' | 'vertical' | 'time' | 'expver' | 'other';

/** CF §4.1 latitude units and §4.2 longitude units. */
const LAT_UNITS = new Set(['degrees_north', 'degree_north', 'degree_n', 'degrees_n', 'degreen', 'degreesn']);
const LON_UNITS = new Set(['degrees_east', 'degree_east', 'degree_e', 'degrees_e', 'degreee', 'degreese']);
/** Common names (common practice, no source). */
const LAT_NAMES = new Set(['lat', 'latitude', 'lats', 'nav_lat', 'g0_lat_0']);
const LON_NAMES = new Set(['lon', 'long', 'longitude', 'lons', 'nav_lon', 'g0_lon_1']);
const PRESSURE_STANDARD_NAMES = new Set(['air_pressure']);
/** Pressure units as UDUNITS and common files spell them; their factor to Pa comes from lib/cf/units.ts. */
const PRESSURE_UNITS = /^(pa|hpa|kpa|mbar|mb|millibar|millibars|bar|pascal|pascals|atm)$/i;

function text(attrs: Attributes, key: string): string | undefined {
  const v = attrs[key];
  return typeof v === 'string' ? v.trim() : undefined;
}

export function recogniseAxis(name: string, attrs: Attributes, isTime: (units: string | undefined) => boolean): AxisKind {
  const sn = text(attrs, 'standard_name')?.toLowerCase();
  const units = text(attrs, 'units');
  const lunits = units?.toLowerCase();
  const axis = text(attrs, 'axis')?.toUpperCase();
  const lname = name.toLowerCase();
  if (sn === 'latitude') return 'latitude';
  if (sn === 'longitude') return 'longitude';
  if (sn === 'time' || isTime(units)) return 'time';
  if (lunits !== undefined && LAT_UNITS.has(lunits)) return 'latitude';
  if (lunits !== undefined && LON_UNITS.has(lunits)) return 'longitude';
  if (sn !== undefined && PRESSURE_STANDARD_NAMES.has(sn)) return 'pressure';
  if (lunits !== undefined && PRESSURE_UNITS.test(lunits)) return 'pressure';
  if (lname === 'expver') return 'expver';
  if (axis === 'Y' && (lunits === undefined || lunits.startsWith('degree'))) return 'latitude';
  if (axis === 'X' && (lunits === undefined || lunits.startsWith('degree'))) return 'longitude';
  if (axis === 'T') return 'time';
  const positive = text(attrs, 'positive')?.toLowerCase();
  if (axis === 'Z' || positive === 'up' || positive === 'down') return 'vertical';
  if (sn !== undefined && /(level|height|altitude|depth|sigma|hybrid|coordinate)/.test(sn)) return 'vertical';
  if ((lunits === undefined || lunits.startsWith('degree')) && LAT_NAMES.has(lname)) return 'latitude';
  if ((lunits === undefined || lunits.startsWith('degree')) && LON_NAMES.has(lname)) return 'longitude';
  return 'other';
}
