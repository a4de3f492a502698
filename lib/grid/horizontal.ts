/**
 * Horizontal grid descriptors built from coordinate values: a regular latitude–longitude grid
 * on WGS 84 (EPSG:4326) with the order and longitude convention as stored.
 */
import { WGS84, type RegularLatLonGrid } from './types.js';

export interface RegularGridBuild {
  readonly grid: RegularLatLonGrid;
  /** Notes on irregularities (uneven spacing), empty when regular. */
  readonly notes: readonly string[];
}

function spacing(v: Float64Array): { step: number; even: boolean } {
  if (v.length < 2) return { step: 0, even: true };
  const step = Math.abs(v[v.length - 1] - v[0]) / (v.length - 1);
  let even = true;
  for (let i = 1; i < v.length; i++) {
    if (Math.abs(Math.abs(v[i] - v[i - 1]) - step) > Math.max(1e-6, step * 1e-4)) even = false;
  }
  return { step, even };
}

export function regularLatLonGrid(lat: Float64Array, lon: Float64Array): RegularGridBuild {
  const notes: string[] = [];
  const la = spacing(lat);
  const lo = spacing(lon);
  if (!la.even) notes.push('latitudes are not evenly spaced; dLat is their mean spacing');
  if (!lo.even) notes.push('longitudes are not evenly spaced; dLon is their mean spacing');
  let neg = false;
  for (let i = 0; i < lon.length; i++) if (lon[i] < 0) neg = true;
  const globalLongitude = lon.length > 1 && Math.abs(lon.length * lo.step - 360) < lo.step * 0.01;
  return {
    grid: {
      kind: 'regular_ll',
      crs: { kind: 'geographic', earth: WGS84, epsg: 4326 },
      npoints: lat.length * lon.length,
      nx: lon.length,
      ny: lat.length,
      lat,
      lon,
      dLat: la.step,
      dLon: lo.step,
      latitudeOrder: lat.length > 1 && lat[0] < lat[lat.length - 1] ? 'south_to_north' : 'north_to_south',
      longitudeConvention: neg ? '-180..180' : '0..360',
      globalLongitude,
    },
    notes,
  };
}
