/**
 * Grids of the grid model laid out as north-up rasters. The expectations come from GDAL: the
 * pixel GDAL reads at a cell (python3-gdal ReadAsArray, gdallocationinfo -geoloc) must hold the
 * value of the grid point whose coordinates GDAL's geotransform puts there. The field is
 * invented: value = f(lat, lon) so any misplacement shows.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { rasterLayout, writeGeoTiff } from '../../lib/output/index.js';
import { WGS84, type GaussianGrid, type ProjectedGrid, type RegularLatLonGrid, type RotatedLatLonGrid } from '../../lib/grid/types.js';
import { OutputError, UnsupportedError } from '../../lib/errors.js';
import { gdalinfo, gdalReadBands, gdalValueAt, haveGdal, removeDir, tempDir } from './gdal.js';

const dir = tempDir('frostgrid-layout-');
afterAll(() => removeDir(dir));

const lon180 = (lon: number): number => ((((lon + 180) % 360) + 360) % 360) - 180;
/** Invented field, exactly representable in float32, unique per (lat, lon) cell. */
const f = (lat: number, lon: number): number => Math.round((lat + 90) * 4) * 2000 + Math.round((lon180(lon) + 180) * 4);

function latLonGrid(lat: number[], lon: number[], d: number, convention: '0..360' | '-180..180', global: boolean): RegularLatLonGrid {
  return {
    kind: 'regular_ll',
    crs: { kind: 'geographic', earth: WGS84 },
    npoints: lat.length * lon.length,
    nx: lon.length,
    ny: lat.length,
    lat: Float64Array.from(lat),
    lon: Float64Array.from(lon),
    dLat: d,
    dLon: d,
    latitudeOrder: lat[0] > lat[lat.length - 1] ? 'north_to_south' : 'south_to_north',
    longitudeConvention: convention,
    globalLongitude: global,
  };
}

/** A slice in storage order: value f(lat[j], lon[i]) at j·nx + i. */
function storageSlice(g: RegularLatLonGrid): Float32Array {
  const s = new Float32Array(g.npoints);
  for (let j = 0; j < g.ny; j++) for (let i = 0; i < g.nx; i++) s[j * g.nx + i] = f(g.lat[j], g.lon[i]);
  return s;
}

const range = (a: number, n: number, d: number): number[] => Array.from({ length: n }, (_, k) => a + k * d);

async function writeAndReadBack(name: string, g: RegularLatLonGrid, keep = false) {
  const layout = rasterLayout(g, { keepLongitude0To360: keep });
  const path = join(dir, name);
  await writeGeoTiff(path, { width: layout.width, height: layout.height, count: 1, dtype: 'float32', crs: layout.crs, transform: layout.transform }, [
    layout.toRasterOrder(storageSlice(g)),
  ]);
  const info = gdalinfo(path);
  const [pixels] = gdalReadBands(path, Float32Array, 1);
  return { layout, path, gt: info.geoTransform as number[], pixels };
}

/** Every pixel GDAL reads holds f at the cell centre GDAL's geotransform gives it. */
function expectPlacedByGdal(gt: number[], pixels: Float32Array, width: number, height: number): void {
  let bad = -1;
  for (let r = 0; r < height && bad < 0; r++) {
    for (let c = 0; c < width; c++) {
      const lon = gt[0] + (c + 0.5) * gt[1];
      const lat = gt[3] + (r + 0.5) * gt[5];
      if (pixels[r * width + c] !== f(lat, lon)) {
        bad = r * width + c;
        break;
      }
    }
  }
  expect(bad).toBe(-1);
}

describe.skipIf(!haveGdal)('regular latitude–longitude grids', () => {
  it('a global 0..360 grid stored south to north becomes −180..180, north-up', async () => {
    const g = latLonGrid(range(-90, 181, 1), range(0, 360, 1), 1, '0..360', true);
    const { gt, pixels, path } = await writeAndReadBack('global-0-360.tif', g);
    expect(gt).toEqual([-180.5, 1, 0, 90.5, 0, -1]);
    expectPlacedByGdal(gt, pixels, 360, 181);
    // gdallocationinfo at a few places, in the georeferenced coordinates.
    expect(gdalValueAt(path, -75, 45)).toEqual([f(45, 285)]);
    expect(gdalValueAt(path, 179, -89)).toEqual([f(-89, 179)]);
    expect(gdalValueAt(path, 0, 0)).toEqual([f(0, 0)]);
  });

  it('keepLongitude0To360 keeps the grid as stored (west edge at −dLon/2)', async () => {
    const g = latLonGrid(range(90, 73, -2.5), range(0, 144, 2.5), 2.5, '0..360', true);
    const { gt, pixels, path } = await writeAndReadBack('global-keep.tif', g, true);
    expect(gt).toEqual([-1.25, 2.5, 0, 91.25, 0, -2.5]);
    expectPlacedByGdal(gt, pixels, 144, 73);
    expect(gdalValueAt(path, 270, 10)).toEqual([f(10, 270)]);
  });

  it('a regional grid given in 0..360 longitudes is placed in −180..180', async () => {
    const g = latLonGrid(range(20, 41, 0.5), range(300, 61, 0.5), 0.5, '0..360', false);
    const { gt, pixels } = await writeAndReadBack('regional.tif', g);
    expect(gt).toEqual([-60.25, 0.5, 0, 40.25, 0, -0.5]);
    expectPlacedByGdal(gt, pixels, 61, 41);
  });

  it('a global −180..180 grid stored north to south is unchanged', async () => {
    const g = latLonGrid(range(89.75, 360, -0.5), range(-179.75, 720, 0.5), 0.5, '-180..180', true);
    const layout = rasterLayout(g);
    const s = storageSlice(g);
    expect(layout.toRasterOrder(s)).toEqual(s);
    const { gt, pixels } = await writeAndReadBack('global-180.tif', g);
    expect(gt).toEqual([-180, 0.5, 0, 90, 0, -0.5]);
    expectPlacedByGdal(gt, pixels, 720, 360);
  });
});

describe.skipIf(!haveGdal)('projected grids', () => {
  it('rows stored south to north (GRIB scanning mode 64) are flipped north-up', async () => {
    const nx = 40;
    const ny = 30;
    const dx = 10000;
    const x0 = -1.5e6;
    const y0 = 2.0e6;
    const grid: ProjectedGrid = {
      kind: 'projected',
      crs: {
        kind: 'projected',
        projection: 'lambert_conformal_conic',
        proj4: '+proj=lcc +lat_1=35 +lat_2=55 +lat_0=45 +lon_0=10 +R=6371229 +units=m +no_defs',
        earth: { kind: 'sphere', radiusM: 6371229 },
        params: {},
      },
      npoints: nx * ny,
      nx,
      ny,
      x: Float64Array.from(range(x0, nx, dx)),
      y: Float64Array.from(range(y0, ny, dx)),
      dx,
      dy: dx,
    };
    const slice = new Float32Array(nx * ny).map((_, k) => k); // value = storage index j·nx + i
    const layout = rasterLayout(grid);
    const path = join(dir, 'proj-flip.tif');
    await writeGeoTiff(path, { width: nx, height: ny, count: 1, dtype: 'float32', crs: layout.crs, transform: layout.transform }, [layout.toRasterOrder(slice)]);
    const gt = gdalinfo(path).geoTransform as number[];
    expect(gt).toEqual([x0 - dx / 2, dx, 0, y0 + (ny - 1) * dx + dx / 2, 0, -dx]);
    // GDAL at the projected coordinates of storage point (i, j) reads value j·nx + i.
    for (const [i, j] of [[0, 0], [nx - 1, 0], [0, ny - 1], [17, 11]]) {
      expect(gdalValueAt(path, x0 + i * dx, y0 + j * dx)).toEqual([j * nx + i]);
    }
  });
});

describe('grids without an affine transform and misuse', () => {
  it('a Gaussian grid is an UnsupportedError asking for regridding', () => {
    const g = { kind: 'gaussian', crs: { kind: 'geographic', earth: WGS84 }, npoints: 0 } as unknown as GaussianGrid;
    expect(() => rasterLayout(g)).toThrow(UnsupportedError);
    expect(() => rasterLayout(g)).toThrow(/Gaussian grid cannot be written as a GeoTIFF without regridding/);
  });

  it('a rotated-pole grid is an UnsupportedError', () => {
    const g = { kind: 'rotated_ll', crs: { kind: 'geographic', earth: WGS84 }, npoints: 0 } as unknown as RotatedLatLonGrid;
    let caught: unknown;
    try {
      rasterLayout(g);
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(UnsupportedError);
    expect((caught as UnsupportedError).id).toBe('rotated_ll');
  });

  it('a slice of the wrong length is an OutputError; Uint8Array slices keep their type; out is filled', () => {
    const g = { ...latLonGrid(range(-1, 3, 1), range(0, 4, 90), 90, '0..360', true), dLat: 1 };
    const layout = rasterLayout(g);
    expect(() => layout.toRasterOrder(new Uint8Array(11))).toThrow(new OutputError('slice has 11 values but the 4 × 3 grid has 12'));
    const src = Uint8Array.from({ length: 12 }, (_, k) => k);
    const out = new Uint8Array(12);
    const res = layout.toRasterOrder(src, out);
    expect(res).toBe(out);
    // Rows reversed (north first); columns 180, 270, 0, 90 → storage 2, 3, 0, 1.
    expect([...out]).toEqual([10, 11, 8, 9, 6, 7, 4, 5, 2, 3, 0, 1]);
    expect(layout.transform).toEqual([-225, 90, 0, 1.5, 0, -1]);
  });
});
