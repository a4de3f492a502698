/**
 * Georeferencing of projected and non-WGS 84 rasters. The GeoKeys written (OGC GeoTIFF 1.1) are
 * read by GDAL/OSR; the CRS GDAL builds must carry the parameters we gave, and must project
 * points to where proj4 (the projection library the grid model uses) puts them, within a metre.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { join } from 'node:path';
import proj4 from 'proj4';
import { rasterLayout, writeGeoTiff } from '../../lib/output/index.js';
import type { Crs, EarthShape, ProjectedGrid } from '../../lib/grid/types.js';
import { PYTHON, run } from '../support/tools.js';
import { gdalinfo, gdalSrs, haveGdal, removeDir, tempDir } from './gdal.js';

const dir = tempDir('frostgrid-proj-');
afterAll(() => removeDir(dir));

const SPHERE: EarthShape = { kind: 'sphere', radiusM: 6371229 };

/** GDAL/PROJ forward projection of lon/lat points with the CRS GDAL reads from the file. */
function gdalForward(path: string, lonLat: [number, number][]): [number, number][] {
  const script = `
import sys, json
from osgeo import gdal, osr
gdal.UseExceptions()
ds = gdal.Open(sys.argv[1])
dst = osr.SpatialReference(wkt=ds.GetProjection()); dst.SetAxisMappingStrategy(osr.OAMS_TRADITIONAL_GIS_ORDER)
src = dst.CloneGeogCS(); src.SetAxisMappingStrategy(osr.OAMS_TRADITIONAL_GIS_ORDER)
ct = osr.CoordinateTransformation(src, dst)
print(json.dumps([list(ct.TransformPoint(lon, lat)[0:2]) for lon, lat in json.loads(sys.argv[2])]))`;
  return JSON.parse(run(PYTHON, ['-c', script, path, JSON.stringify(lonLat)]));
}

/** GDAL/PROJ inverse projection of projected points to lon/lat on the file's own datum. */
function gdalInverse(path: string, xy: [number, number][]): [number, number][] {
  const script = `
import sys, json
from osgeo import gdal, osr
gdal.UseExceptions()
ds = gdal.Open(sys.argv[1])
src = osr.SpatialReference(wkt=ds.GetProjection()); src.SetAxisMappingStrategy(osr.OAMS_TRADITIONAL_GIS_ORDER)
dst = src.CloneGeogCS(); dst.SetAxisMappingStrategy(osr.OAMS_TRADITIONAL_GIS_ORDER)
ct = osr.CoordinateTransformation(src, dst)
print(json.dumps([list(ct.TransformPoint(x, y)[0:2]) for x, y in json.loads(sys.argv[2])]))`;
  return JSON.parse(run(PYTHON, ['-c', script, path, JSON.stringify(xy)]));
}

/** A projected grid in GRIB scanning mode 64 (first point south-west, rows northwards). */
function projectedGrid(crs: Extract<Crs, { kind: 'projected' }>, firstLonLat: [number, number], nx: number, ny: number, d: number): ProjectedGrid {
  const [x0, y0] = proj4(crs.proj4).forward(firstLonLat);
  return {
    kind: 'projected',
    crs,
    npoints: nx * ny,
    nx,
    ny,
    x: Float64Array.from({ length: nx }, (_, i) => x0 + i * d),
    y: Float64Array.from({ length: ny }, (_, j) => y0 + j * d),
    dx: d,
    dy: d,
  };
}

async function writeGrid(name: string, grid: ProjectedGrid): Promise<string> {
  const layout = rasterLayout(grid);
  const path = join(dir, name);
  const slice = new Float32Array(grid.npoints).map((_, k) => k % 251);
  await writeGeoTiff(path, { width: layout.width, height: layout.height, count: 1, dtype: 'float32', crs: layout.crs, transform: layout.transform }, [
    layout.toRasterOrder(slice),
  ]);
  return path;
}

/** Points spread over the grid's area, lon/lat. */
const SAMPLE_POINTS: Record<string, [number, number][]> = {
  europe: [[-15, 30], [10, 45], [19.2, 55.6], [-26, 51], [16.2, 33.2]],
  conus: [[-120, 22], [-95, 25], [-70, 45], [-100, 50]],
  arctic: [[-111, 60], [0, 75], [120, 80], [-60, 50]],
  antarctic: [[0, -71], [90, -80], [-150, -65]],
};

describe.skipIf(!haveGdal)('Lambert conformal conic, two standard parallels (GRIB2 template 3.30 grid)', () => {
  // The grid of data/grib/lcc.grib2 as recorded in the shared notes (§7): Latin1 35, Latin2 55,
  // LaD 45, LoV 10, sphere R = 6371229 m, first point 30°N 345°E, Dx = Dy = 10 km, 300 × 250.
  const crs: Extract<Crs, { kind: 'projected' }> = {
    kind: 'projected',
    projection: 'lambert_conformal_conic',
    proj4: '+proj=lcc +lat_1=35 +lat_2=55 +lat_0=45 +lon_0=10 +R=6371229 +units=m +no_defs',
    earth: SPHERE,
    params: { standardParallel1: 35, standardParallel2: 55, originLatitude: 45, centralMeridian: 10 },
  };
  const grid = projectedGrid(crs, [-15, 30], 300, 250, 10000);
  let path = '';

  it('GDAL reads the projection and its parameters', async () => {
    path = await writeGrid('lcc2.tif', grid);
    const srs = gdalSrs(path, ['standard_parallel_1', 'standard_parallel_2', 'latitude_of_origin', 'central_meridian', 'false_easting', 'false_northing']);
    expect(srs.projection).toBe('Lambert_Conformal_Conic_2SP');
    expect(srs.params).toEqual({ standard_parallel_1: 35, standard_parallel_2: 55, latitude_of_origin: 45, central_meridian: 10, false_easting: 0, false_northing: 0 });
    expect(srs.semiMajor).toBe(6371229);
    expect(srs.semiMinor).toBe(6371229);
  });

  it("the corners gdalinfo reports match proj4's forward projection of the grid corners within a metre", () => {
    const info = gdalinfo(path);
    const cc = info.cornerCoordinates as Record<string, [number, number]>;
    const h = 5000; // half a cell: gdalinfo reports outer corners, grid points are cell centres
    // Corner grid points, lat/lon as ecCodes reports them for this grid (shared notes §7).
    const corners: Record<string, [number, number]> = {
      lowerLeft: [-15, 30],
      lowerRight: [16.178394, 33.154384],
      upperLeft: [-26.003844, 50.996139],
      upperRight: [19.210818, 55.646651],
    };
    const sign: Record<string, [number, number]> = { lowerLeft: [1, 1], lowerRight: [-1, 1], upperLeft: [1, -1], upperRight: [-1, -1] };
    const p = proj4(crs.proj4);
    for (const [name, lonLat] of Object.entries(corners)) {
      const [x, y] = p.forward(lonLat);
      const centre = [cc[name][0] + sign[name][0] * h, cc[name][1] + sign[name][1] * h];
      expect(Math.abs(centre[0] - x), `${name} x`).toBeLessThan(1);
      expect(Math.abs(centre[1] - y), `${name} y`).toBeLessThan(1);
    }
    // And GDAL/PROJ takes those corner centres back to the ecCodes latitudes and longitudes.
    const names = Object.keys(corners);
    const back = gdalInverse(path, names.map((n) => [cc[n][0] + sign[n][0] * h, cc[n][1] + sign[n][1] * h]));
    names.forEach((n, k) => {
      expect(Math.abs(back[k][0] - corners[n][0])).toBeLessThan(1e-5);
      expect(Math.abs(back[k][1] - corners[n][1])).toBeLessThan(1e-5);
    });
  });

  it('GDAL and proj4 project points inside the grid to the same place', () => {
    const pts = SAMPLE_POINTS.europe;
    const viaGdal = gdalForward(path, pts);
    const p = proj4(crs.proj4);
    pts.forEach((pt, k) => {
      const [x, y] = p.forward(pt);
      expect(Math.hypot(viaGdal[k][0] - x, viaGdal[k][1] - y)).toBeLessThan(1);
    });
  });
});

const OTHER_PROJECTIONS: {
  name: string;
  crs: Extract<Crs, { kind: 'projected' }>;
  first: [number, number];
  points: [number, number][];
  gdalProjection: string;
  params: Record<string, number>;
  earth: { semiMajor: number; semiMinor: number };
}[] = [
  {
    name: 'Lambert conformal conic, one standard parallel, central meridian given as 265°',
    crs: { kind: 'projected', projection: 'lambert_conformal_conic', proj4: '+proj=lcc +lat_1=25 +lat_2=25 +lat_0=25 +lon_0=265 +R=6371229 +units=m +no_defs', earth: SPHERE, params: {} },
    first: [-130, 20],
    points: SAMPLE_POINTS.conus,
    gdalProjection: 'Lambert_Conformal_Conic_1SP',
    params: { latitude_of_origin: 25, central_meridian: -95, scale_factor: 1 },
    earth: { semiMajor: 6371229, semiMinor: 6371229 },
  },
  {
    name: 'north polar stereographic with a standard parallel (variant B), sphere',
    crs: { kind: 'projected', projection: 'polar_stereographic', proj4: '+proj=stere +lat_0=90 +lat_ts=60 +lon_0=249 +R=6371229 +units=m +no_defs', earth: SPHERE, params: {} },
    first: [-150, 40],
    points: SAMPLE_POINTS.arctic,
    gdalProjection: 'Polar_Stereographic',
    params: { latitude_of_origin: 60, central_meridian: -111 },
    earth: { semiMajor: 6371229, semiMinor: 6371229 },
  },
  {
    name: 'north polar stereographic with a scale factor (variant A), WGS 84, false origin',
    crs: {
      kind: 'projected',
      projection: 'polar_stereographic',
      proj4: '+proj=stere +lat_0=90 +k_0=0.994 +lon_0=0 +x_0=2000000 +y_0=2000000 +ellps=WGS84 +units=m +no_defs',
      earth: { kind: 'ellipsoid', semiMajorM: 6378137, inverseFlattening: 298.257223563 },
      params: {},
    },
    first: [-135, 45],
    points: SAMPLE_POINTS.arctic,
    gdalProjection: 'Polar_Stereographic',
    params: { latitude_of_origin: 90, scale_factor: 0.994, false_easting: 2000000, false_northing: 2000000 },
    earth: { semiMajor: 6378137, semiMinor: 6356752.314245179 },
  },
  {
    name: 'south polar stereographic, standard parallel 71°S, WGS 84',
    crs: {
      kind: 'projected',
      projection: 'polar_stereographic',
      proj4: '+proj=stere +lat_0=-90 +lat_ts=-71 +lon_0=0 +ellps=WGS84 +units=m +no_defs',
      earth: { kind: 'ellipsoid', semiMajorM: 6378137, inverseFlattening: 298.257223563 },
      params: {},
    },
    first: [-135, -50],
    points: SAMPLE_POINTS.antarctic,
    gdalProjection: 'Polar_Stereographic',
    params: { latitude_of_origin: -71, central_meridian: 0 },
    earth: { semiMajor: 6378137, semiMinor: 6356752.314245179 },
  },
];

describe.skipIf(!haveGdal)('other user-defined projections', () => {
  it.each(OTHER_PROJECTIONS)('$name', async ({ name, crs, first, points, gdalProjection, params, earth }) => {
    const grid = projectedGrid(crs, first, 120, 90, 50000);
    const path = await writeGrid(`${name.replace(/\W+/g, '-')}.tif`, grid);
    const srs = gdalSrs(path, Object.keys(params));
    expect(srs.projection).toBe(gdalProjection);
    for (const [k, v] of Object.entries(params)) expect(srs.params[k], k).toBeCloseTo(v, 9);
    expect(srs.semiMajor).toBeCloseTo(earth.semiMajor, 6);
    expect(srs.semiMinor).toBeCloseTo(earth.semiMinor, 6);
    const p = proj4(crs.proj4);
    const viaGdal = gdalForward(path, points);
    points.forEach((pt, k) => {
      const [x, y] = p.forward(pt);
      expect(Math.hypot(viaGdal[k][0] - x, viaGdal[k][1] - y), `point ${pt}`).toBeLessThan(1);
    });
    // The first grid point is the centre of the lower-left cell of GDAL's geotransform.
    const gt = gdalinfo(path).geoTransform as number[];
    const [fx, fy] = p.forward(first);
    expect(Math.abs(gt[0] + gt[1] / 2 - fx)).toBeLessThan(1e-6);
    expect(Math.abs(gt[3] + 90 * gt[5] - gt[5] / 2 - fy)).toBeLessThan(1e-6);
  });
});

describe.skipIf(!haveGdal)('geographic and EPSG CRSs', () => {
  const write = async (name: string, crs: Crs | { epsg: number }, transform: readonly [number, number, number, number, number, number]) => {
    const path = join(dir, name);
    await writeGeoTiff(path, { width: 20, height: 10, count: 1, dtype: 'uint8', crs, transform }, [new Uint8Array(200)]);
    return path;
  };

  it('a latitude–longitude grid on the GRIB sphere is a user-defined geographic CRS on that sphere', async () => {
    const path = await write('sphere.tif', { kind: 'geographic', earth: SPHERE }, [-10, 1, 0, 60, 0, -1]);
    const srs = gdalSrs(path);
    expect(srs.geographic).toBe(true);
    expect(srs.semiMajor).toBe(6371229);
    expect(srs.semiMinor).toBe(6371229);
    expect(srs.invFlattening).toBe(0);
    expect(srs.authority).toBeNull();
  });

  it('a geographic CRS on another ellipsoid keeps its axes', async () => {
    const path = await write('grs80.tif', { kind: 'geographic', earth: { kind: 'ellipsoid', semiMajorM: 6378137, inverseFlattening: 298.257222101 } }, [0, 1, 0, 10, 0, -1]);
    const srs = gdalSrs(path);
    expect(srs.semiMajor).toBe(6378137);
    expect(srs.invFlattening).toBeCloseTo(298.257222101, 9);
  });

  it.each([
    [{ epsg: 4258 }, '4258', true],
    [{ epsg: 3857 }, '3857', false],
    [{ kind: 'geographic' as const, earth: SPHERE, epsg: 4047 }, '4047', true],
  ])('EPSG code %o is reported by GDAL as EPSG:%s', async (crs, code, geographic) => {
    const path = await write(`epsg-${code}.tif`, crs, geographic ? [0, 1, 0, 10, 0, -1] : [0, 1000, 0, 10000, 0, -1000]);
    const info = gdalinfo(path);
    expect(info.coordinateSystem.wkt).toMatch(new RegExp(`ID\\["EPSG",${code}\\]\\]\\s*$`));
    expect(gdalSrs(path).geographic).toBe(geographic);
  });

  it('a south-up transform is kept as a model transformation', async () => {
    const path = await write('southup.tif', { epsg: 4326 }, [0, 1, 0, -10, 0, 1]);
    expect(gdalinfo(path).geoTransform).toEqual([0, 1, 0, -10, 0, 1]);
  });
});
