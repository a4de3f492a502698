/**
 * Coastlines for quicklooks: Natural Earth land outlines (public domain) from the `world-atlas`
 * package, decoded with topojson-client and projected into raster cell coordinates
 * (column, row; 0,0 = outer corner of the first cell). Geographic rasters map longitude and
 * latitude through the affine transform (longitudes wrapped into the raster's 360° window);
 * projected rasters go through proj4 first.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import proj4 from 'proj4';
import { mesh } from 'topojson-client';
import type { Topology } from 'topojson-specification';
import type { Crs } from '../../grid/types.js';

export type Resolution = '110m' | '50m';

const cache = new Map<Resolution, [number, number][][]>();

/** Coastline polylines, lon/lat degrees. */
export function coastlineLonLat(resolution: Resolution): [number, number][][] {
  let lines = cache.get(resolution);
  if (!lines) {
    const require = createRequire(import.meta.url);
    const topology = JSON.parse(readFileSync(require.resolve(`world-atlas/land-${resolution}.json`), 'utf8')) as Topology;
    const m = mesh(topology, topology.objects.land as never);
    lines = m.coordinates as [number, number][][];
    cache.set(resolution, lines);
  }
  return lines;
}

/** Polylines in raster cell coordinates; a line is split where it leaves the map or jumps. */
export function coastlinesOnRaster(
  crs: Crs | { epsg: number },
  transform: readonly [number, number, number, number, number, number],
  width: number,
  height: number,
  resolution: Resolution,
): [number, number][][] {
  const [a, b, c, d, e, f] = transform;
  const det = b * f - c * e;
  const toCell = (x: number, y: number): [number, number] => [((x - a) * f - (y - d) * c) / det, ((y - d) * b - (x - a) * e) / det];
  let project: (lon: number, lat: number) => [number, number] | undefined;
  let maxJump: number;
  if ('kind' in crs && crs.kind === 'projected') {
    const p = proj4(crs.proj4);
    project = (lon, lat) => {
      const xy = p.forward([lon, lat]);
      return Number.isFinite(xy[0]) && Number.isFinite(xy[1]) ? toCell(xy[0], xy[1]) : undefined;
    };
    maxJump = Math.max(width, height) / 4;
  } else {
    const west = Math.min(a, a + b * width);
    project = (lon, lat) => {
      const l = west + ((((lon - west) % 360) + 360) % 360);
      return toCell(l, lat);
    };
    maxJump = Math.abs(180 / b);
  }
  const margin = Math.max(width, height);
  const out: [number, number][][] = [];
  for (const line of coastlineLonLat(resolution)) {
    let current: [number, number][] = [];
    let prev: [number, number] | undefined;
    for (const [lon, lat] of line) {
      const q = project(lon, lat);
      const usable = q !== undefined && q[0] > -margin && q[1] > -margin && q[0] < width + margin && q[1] < height + margin;
      if (!usable || (prev && Math.hypot(q[0] - prev[0], q[1] - prev[1]) > maxJump)) {
        if (current.length > 1) out.push(current);
        current = [];
      }
      if (usable) current.push(q);
      prev = usable ? q : undefined;
    }
    if (current.length > 1) out.push(current);
  }
  return out;
}
