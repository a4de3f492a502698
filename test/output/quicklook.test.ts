/**
 * Quicklook PNGs read back by GDAL's PNG driver (gdalinfo, python3-gdal ReadAsArray). Coastline
 * positions are checked against proj4's forward projection and the affine transform of the
 * raster; the fields, masks and titles are invented.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import proj4 from 'proj4';
import {
  COAST_COLOUR,
  GLACIER_RAMP,
  MASK_COLOURS,
  NODATA_COLOUR,
  quicklookGeometry,
  writeQuicklook,
  type QuicklookImage,
} from '../../lib/output/index.js';
import { WGS84, type Crs } from '../../lib/grid/types.js';
import { OutputError } from '../../lib/errors.js';
import { gdalinfo, gdalReadBands, haveGdal, removeDir, tempDir } from './gdal.js';

const dir = tempDir('frostgrid-quicklook-');
afterAll(() => removeDir(dir));

interface Png {
  width: number;
  height: number;
  rgb(x: number, y: number): [number, number, number];
}

function readPng(path: string): Png {
  const info = gdalinfo(path);
  expect(info.driverShortName).toBe('PNG');
  expect(info.bands.length).toBe(4);
  const [width, height] = info.size as [number, number];
  const [r, g, b] = gdalReadBands(path, Uint8Array, 4);
  return { width, height, rgb: (x, y) => [r[y * width + x], g[y * width + x], b[y * width + x]] };
}

/** Whether a pixel of the given colour lies within `radius` pixels of (x, y). */
function colourNear(png: Png, x: number, y: number, radius: number, colour: readonly number[]): boolean {
  for (let j = Math.round(y) - radius; j <= Math.round(y) + radius; j++) {
    for (let i = Math.round(x) - radius; i <= Math.round(x) + radius; i++) {
      if (i < 0 || j < 0 || i >= png.width || j >= png.height) continue;
      const c = png.rgb(i, j);
      if (c[0] === colour[0] && c[1] === colour[1] && c[2] === colour[2]) return true;
    }
  }
  return false;
}

// Cabo da Roca, the westernmost point of mainland Europe, and open Atlantic water far from land.
const COAST_POINT: [number, number] = [-9.5, 38.78];
const OPEN_SEA: [number, number] = [-22, 45];

describe.skipIf(!haveGdal)('mask quicklook on a global latitude–longitude raster', () => {
  const W = 1440;
  const H = 721;
  const transform = [-180.125, 0.25, 0, 90.125, 0, -0.25] as const;
  const values = new Uint8Array(W * H);
  for (let y = 0; y < H; y++) for (let x = 0; x < W; x++) values[y * W + x] = y < 40 ? 255 : x >= 400 && x < 500 && y >= 300 && y < 380 ? 1 : 0;
  const image: QuicklookImage = { values, width: W, height: H, transform, crs: { kind: 'geographic', earth: WGS84 }, kind: 'mask', title: 'Invented mask, 250 hPa, 2031-04-05T06:00Z', nodata: 255 };

  it('GDAL reads a PNG of the documented geometry with the mask, nodata and coastline colours in place', async () => {
    const path = join(dir, 'mask.png');
    await writeQuicklook(path, image);
    const png = readPng(path);
    const g = quicklookGeometry(W, H);
    expect([png.width, png.height]).toEqual([g.width, g.height]);
    const at = (col: number, row: number): [number, number] => [g.map.x + ((col + 0.5) * g.map.w) / W, g.map.y + ((row + 0.5) * g.map.h) / H];
    expect(png.rgb(...at(450, 340).map(Math.floor) as [number, number])).toEqual([...MASK_COLOURS.on]);
    expect(png.rgb(...at(700, 600).map(Math.floor) as [number, number])).toEqual([...MASK_COLOURS.off]);
    expect(png.rgb(...at(720, 10).map(Math.floor) as [number, number])).toEqual([...NODATA_COLOUR]);
    // A coast drawn at Cabo da Roca's cell (affine transform), none over the open Atlantic.
    const cell = (lon: number, lat: number): [number, number] => [(lon - transform[0]) / transform[1] - 0.5, (lat - transform[3]) / transform[5] - 0.5];
    expect(colourNear(png, ...at(...cell(...COAST_POINT)), 3, COAST_COLOUR)).toBe(true);
    expect(colourNear(png, ...at(...cell(...OPEN_SEA)), 6, COAST_COLOUR)).toBe(false);
    // The title band holds dark text pixels; the band of an empty title holds none.
    const inTitle = (p: Png): number => {
      let n = 0;
      for (let y = 0; y < g.map.y - 2; y++) for (let x = 0; x < p.width; x++) if (p.rgb(x, y)[0] === 0) n++;
      return n;
    };
    expect(inTitle(png)).toBeGreaterThan(100);
    const blank = join(dir, 'blank-title.png');
    await writeQuicklook(blank, { ...image, title: '' });
    expect(inTitle(readPng(blank))).toBe(0);
  });

  it('the same map stored in 0..360 longitudes puts the coast in the same place', async () => {
    // Rotate columns: raster column c of the 0..360 version holds longitude c·0.25.
    const shifted = new Uint8Array(W * H);
    for (let y = 0; y < H; y++) for (let x = 0; x < W; x++) shifted[y * W + x] = values[y * W + ((x + 720) % W)];
    const t360 = [-0.125, 0.25, 0, 90.125, 0, -0.25] as const;
    const path = join(dir, 'mask-360.png');
    await writeQuicklook(path, { ...image, values: shifted, transform: t360 });
    const png = readPng(path);
    const g = quicklookGeometry(W, H);
    const lon = COAST_POINT[0] + 360;
    const px = g.map.x + ((lon - t360[0]) / 0.25) * (g.map.w / W);
    const py = g.map.y + ((COAST_POINT[1] - t360[3]) / -0.25) * (g.map.h / H);
    expect(colourNear(png, px, py, 3, COAST_COLOUR)).toBe(true);
  });
});

describe.skipIf(!haveGdal)('continuous quicklook on a Lambert conformal raster', () => {
  const crs: Extract<Crs, { kind: 'projected' }> = {
    kind: 'projected',
    projection: 'lambert_conformal_conic',
    proj4: '+proj=lcc +lat_1=35 +lat_2=55 +lat_0=45 +lon_0=10 +R=6371229 +units=m +no_defs',
    earth: { kind: 'sphere', radiusM: 6371229 },
    params: {},
  };
  const nx = 300;
  const ny = 250;
  const d = 10000;
  const p = proj4(crs.proj4);
  const [x0, y0] = p.forward([-15, 30]);
  const transform = [x0 - d / 2, d, 0, y0 + (ny - 1) * d + d / 2, 0, -d] as const;
  const values = new Float32Array(nx * ny).map((_, k) => (k % nx) / (nx - 1));
  values[5 * nx + 7] = NaN;

  it('ramp ends, nodata and the coast where proj4 puts it', async () => {
    const path = join(dir, 'lcc.png');
    await writeQuicklook(path, { values, width: nx, height: ny, transform, crs, kind: 'continuous', title: 'Invented field, 300 hPa', units: 'K', range: [0, 1] });
    const png = readPng(path);
    const g = quicklookGeometry(nx, ny);
    const k = g.map.w / nx;
    const px = (col: number, row: number): [number, number] => [Math.floor(g.map.x + (col + 0.5) * k), Math.floor(g.map.y + (row + 0.5) * k)];
    expect(png.rgb(...px(0, 100))).toEqual([...GLACIER_RAMP[0].rgb]);
    expect(png.rgb(...px(nx - 1, 100))).toEqual([...GLACIER_RAMP[GLACIER_RAMP.length - 1].rgb]);
    expect(png.rgb(...px(7, 5))).toEqual([...NODATA_COLOUR]);
    const toPixel = (lonLat: [number, number]): [number, number] => {
      const [x, y] = p.forward(lonLat);
      return [g.map.x + ((x - transform[0]) / d) * k, g.map.y + ((transform[3] - y) / d) * k];
    };
    // 110 m coastlines are generalised: allow the line within a few cells of the true point.
    expect(colourNear(png, ...toPixel(COAST_POINT), 3 * k, COAST_COLOUR)).toBe(true);
    expect(colourNear(png, ...toPixel(OPEN_SEA), 3 * k, COAST_COLOUR)).toBe(false);
  });
});

describe('quicklook bad input', () => {
  it('values of the wrong length are an OutputError and no file is written', async () => {
    const path = join(dir, 'bad', 'x.png');
    const err = await writeQuicklook(path, {
      values: new Float32Array(10),
      width: 4,
      height: 4,
      transform: [0, 1, 0, 4, 0, -1],
      crs: { epsg: 4326 },
      kind: 'continuous',
      title: 'invented',
    }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(OutputError);
    expect((err as Error).message).toBe('quicklook has 10 values but a 4 × 4 raster needs 16');
    expect(existsSync(path)).toBe(false);
    expect(readdirSync(dir).filter((f) => f.includes('partial'))).toEqual([]);
  });
});
