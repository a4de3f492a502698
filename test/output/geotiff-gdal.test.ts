/**
 * The GeoTIFF writer read back by outside readers: GDAL (gdalinfo -json, python3-gdal
 * ReadAsArray, the COG validator, gdal_translate's COG driver for the overview pyramid) and
 * geotiff.js. Sources of the expectations are named beside each check.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fromFile } from 'geotiff';
import { encodeGeoTiff, writeGeoTiff, type RasterDtype, type RasterProfile } from '../../lib/output/index.js';
import { WGS84 } from '../../lib/grid/types.js';
import { run } from '../support/tools.js';
import { cogErrors, cogValidatorVerdict, gdalinfo, gdalReadBands, haveGdal, prng, removeDir, tempDir } from './gdal.js';

const dir = tempDir();
afterAll(() => removeDir(dir));

type AnyArray = Uint8Array | Int16Array | Uint16Array | Int32Array | Float32Array | Float64Array;
type Ctor = { new (n: number): AnyArray; new (b: ArrayBuffer, o: number, l: number): AnyArray; BYTES_PER_ELEMENT: number };

/** Index of the first element whose bytes differ (NaN compared by bit pattern), or −1. */
function firstMismatch(a: AnyArray, b: AnyArray): number {
  if (a.length !== b.length) return -2;
  const n = a.BYTES_PER_ELEMENT;
  const ua = new Uint8Array(a.buffer, a.byteOffset, a.byteLength);
  const ub = new Uint8Array(b.buffer, b.byteOffset, b.byteLength);
  for (let i = 0; i < ua.length; i++) if (ua[i] !== ub[i]) return Math.floor(i / n);
  return -1;
}

/** Invented test field: a smooth ramp over half the raster and full-range noise over the rest. */
function field(ctor: Ctor, dtype: RasterDtype, width: number, height: number, seed: number): AnyArray {
  const r = prng(seed);
  const a = new ctor(width * height);
  const span: Record<RasterDtype, [number, number]> = {
    uint8: [0, 255],
    int16: [-32768, 32767],
    uint16: [0, 65535],
    int32: [-2147483648, 2147483647],
    float32: [-3e38, 3e38],
    float64: [-1e300, 1e300],
  };
  const [lo, hi] = span[dtype];
  const isFloat = dtype.startsWith('float');
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const i = y * width + x;
      let v: number;
      if (x < width / 2) v = isFloat ? Math.sin(x / 7) * Math.cos(y / 5) * 250 + y : ((x * 3 + y * 5) % 200) + lo + (hi - lo) / 3;
      else v = isFloat ? (r() - 0.5) * 2 * (r() < 0.5 ? 1e-3 : hi) : Math.floor(lo + r() * (hi - lo + 1));
      a[i] = isFloat ? v : Math.round(v);
    }
  }
  if (isFloat) {
    a[1] = NaN;
    a[2] = Infinity;
    a[3] = -Infinity;
    a[4] = -0;
    a[5] = dtype === 'float32' ? 1.4e-45 : 5e-324; // smallest subnormal
  }
  return a;
}

const DTYPES: { dtype: RasterDtype; ctor: Ctor; predictors: ('none' | 'horizontal' | 'float')[] }[] = [
  { dtype: 'uint8', ctor: Uint8Array as unknown as Ctor, predictors: ['none', 'horizontal'] },
  { dtype: 'int16', ctor: Int16Array as unknown as Ctor, predictors: ['none', 'horizontal'] },
  { dtype: 'uint16', ctor: Uint16Array as unknown as Ctor, predictors: ['none', 'horizontal'] },
  { dtype: 'int32', ctor: Int32Array as unknown as Ctor, predictors: ['none', 'horizontal'] },
  { dtype: 'float32', ctor: Float32Array as unknown as Ctor, predictors: ['none', 'float'] },
  { dtype: 'float64', ctor: Float64Array as unknown as Ctor, predictors: ['none', 'float'] },
];

const CASES = DTYPES.flatMap((d) =>
  d.predictors.flatMap((predictor) =>
    (['tiles', 'strips', 'uncompressed'] as const)
      .filter((layout) => layout !== 'uncompressed' || predictor === 'none')
      .map((layout) => ({ ...d, predictor, layout })),
  ),
);

describe.skipIf(!haveGdal)('pixel values round-trip through GDAL and geotiff.js', () => {
  // 150 × 97 with 64-pixel tiles: partial edge tiles on both axes (TIFF 6.0 §15 pads them).
  const W = 150;
  const H = 97;
  it.each(CASES)('$dtype, predictor $predictor, $layout', async ({ dtype, ctor, predictor, layout }) => {
    const bands = [0, 1, 2].map((b) => field(ctor, dtype, W, H, 17 + b));
    const path = join(dir, `rt-${dtype}-${predictor}-${layout}.tif`);
    const profile: RasterProfile = {
      width: W,
      height: H,
      count: 3,
      dtype,
      crs: { epsg: 4326 },
      transform: [10, 0.1, 0, 60, 0, -0.1],
      predictor,
      compress: layout === 'uncompressed' ? 'none' : 'deflate',
      tiled: layout === 'tiles',
      blockSize: 64,
    };
    await writeGeoTiff(path, profile, bands);

    // GDAL's reader (python3-gdal ReadAsArray) returns the bytes we wrote, band by band.
    const viaGdal = gdalReadBands(path, ctor, 3);
    for (let b = 0; b < 3; b++) expect(firstMismatch(viaGdal[b] as AnyArray, bands[b]), `GDAL band ${b + 1}`).toBe(-1);

    // gdalinfo reports the structure we asked for.
    const info = gdalinfo(path);
    expect(info.bands[0].type).toBe({ uint8: 'Byte', int16: 'Int16', uint16: 'UInt16', int32: 'Int32', float32: 'Float32', float64: 'Float64' }[dtype]);
    expect(info.metadata.IMAGE_STRUCTURE.COMPRESSION).toBe(layout === 'uncompressed' ? undefined : 'DEFLATE');
    expect(info.metadata.IMAGE_STRUCTURE.PREDICTOR).toBe(predictor === 'none' ? undefined : predictor === 'horizontal' ? '2' : '3');
    expect(info.bands[0].block).toEqual(layout === 'tiles' ? [64, 64] : [W, expect.any(Number)]);

    // geotiff.js (an independent TIFF decoder) reads the same values.
    const tiff = await fromFile(path);
    const image = await tiff.getImage();
    const rasters = (await image.readRasters({ interleave: false })) as unknown as AnyArray[];
    for (let b = 0; b < 3; b++) expect(firstMismatch(rasters[b], bands[b]), `geotiff.js band ${b + 1}`).toBe(-1);
  });
});

/** Overview sizes gdaladdo chooses by itself for a W × H GeoTIFF. */
function gdaladdoPyramid(width: number, height: number): { size: [number, number] }[] {
  const path = join(dir, `gdaladdo-${width}x${height}.tif`);
  run('/usr/bin/python3', ['-c', `from osgeo import gdal\ngdal.GetDriverByName('GTiff').Create('${path}', ${width}, ${height}, 1, gdal.GDT_Byte)`]);
  run('gdaladdo', ['-q', path]);
  return gdalinfo(path).bands[0].overviews ?? [];
}

describe.skipIf(!haveGdal)('overview pyramid', () => {
  it.each([
    [720, 361],
    [257, 100],
    [300, 1000],
    [513, 513],
    [256, 256],
  ])('%i × %i gets the levels gdaladdo picks', async (w, h) => {
    const path = join(dir, `pyr-${w}x${h}.tif`);
    await writeGeoTiff(path, { width: w, height: h, count: 1, dtype: 'uint8', crs: { epsg: 4326 }, transform: [0, 0.01, 0, 10, 0, -0.01], cog: true }, [new Uint8Array(w * h)]);
    expect(gdalinfo(path).bands[0].overviews ?? []).toEqual(gdaladdoPyramid(w, h));
    expect(cogErrors(path)).toEqual([]);
  });
});

describe.skipIf(!haveGdal)('EPSG:4326 products as GDAL describes them', () => {
  const W = 720;
  const H = 361;
  const transform = [-180.25, 0.5, 0, 90.25, 0, -0.5] as const;
  const descriptions = ['250 hPa (FL340)', '300 hPa (FL300)', '350 hPa (FL265)', '400 hPa (FL235)', 'tricky <&> "quoted" \'single\' °'];
  const items = {
    QUANTITY: 'invented_mask',
    UNITS: '1',
    VALID_TIME: '2031-04-05T06:00:00Z',
    PARAMETERS: 'threshold=1.0 & efficiency=0.3 <test>',
    INPUT_FILE: '/data/invented file.nc',
  };
  const maskBands = descriptions.map((_, b) => {
    const a = new Uint8Array(W * H);
    for (let y = 0; y < H; y++) for (let x = 0; x < W; x++) a[y * W + x] = (x + b * 40) % 90 < 30 ? 1 : y % 50 < 3 ? 255 : 0;
    return a;
  });

  it('uint8 mask COG: CRS, geotransform, bands, descriptions, nodata, DEFLATE, blocks, overviews', async () => {
    const path = join(dir, 'mask4326.tif');
    const res = await writeGeoTiff(
      path,
      { width: W, height: H, count: 5, dtype: 'uint8', crs: { kind: 'geographic', earth: WGS84 }, transform, nodata: 255, cog: true, overviewResampling: 'mode' },
      maskBands,
      { bandDescriptions: descriptions, items, bandItems: [{ LEVEL_PA: '25000' }, {}, {}, {}, { NOTE: 'a<b' }] },
    );
    expect(res).toEqual({ path, bytes: readFileSync(path).length, bigTiff: false });
    const info = gdalinfo(path);
    // OGC GeoTIFF 1.1: GeodeticCRSGeoKey 4326 → GDAL reports EPSG:4326.
    expect(info.coordinateSystem.wkt).toMatch(/ID\["EPSG",4326\]\]\s*$/);
    // PixelIsArea with the tie point at the outer corner: the exact transform we gave.
    expect(info.geoTransform).toEqual([...transform]);
    expect(info.metadata[''].AREA_OR_POINT).toBe('Area');
    expect(info.size).toEqual([W, H]);
    expect(info.bands.map((b: { description: string }) => b.description)).toEqual(descriptions);
    expect(info.bands.map((b: { noDataValue: number }) => b.noDataValue)).toEqual([255, 255, 255, 255, 255]);
    expect(info.metadata.IMAGE_STRUCTURE).toMatchObject({ COMPRESSION: 'DEFLATE', INTERLEAVE: 'BAND', LAYOUT: 'COG' });
    expect(info.metadata['']).toMatchObject(items);
    expect(info.bands[0].metadata[''].LEVEL_PA).toBe('25000');
    expect(info.bands[4].metadata[''].NOTE).toBe('a<b');
    for (const b of info.bands) expect(b.block).toEqual([256, 256]);

    // GDAL's gdaladdo, left to choose the levels itself (GDAL ≥ 3.2: halvings until the
    // overview fits in 256 pixels, sizes rounded up), builds the same pyramid.
    expect(info.bands[0].overviews).toEqual(gdaladdoPyramid(W, H));

    // The COG validator shipped with python3-gdal finds nothing wrong (full check of block
    // order, leader and trailer bytes).
    expect(cogErrors(path)).toEqual([]);
    expect(cogValidatorVerdict(path)).toContain('is a valid cloud optimized GeoTIFF');
  });

  it('overview pixels read by GDAL are the block modes (masks) and NaN-aware means (fields)', async () => {
    const path = join(dir, 'mask-ovr.tif');
    await writeGeoTiff(path, { width: W, height: H, count: 1, dtype: 'uint8', crs: { epsg: 4326 }, transform, nodata: 255, cog: true, overviewResampling: 'mode' }, [maskBands[0]]);
    const info = gdalinfo(path);
    info.bands[0].overviews.forEach((o: { size: [number, number] }, level: number) => {
      const f = 2 ** (level + 1);
      const [ow, oh] = o.size;
      const [got] = gdalReadBands(path, Uint8Array, 1, level);
      // Reference mode over each f × f block, ignoring nodata; ties to the smaller value.
      const want = new Uint8Array(ow * oh);
      for (let oy = 0; oy < oh; oy++) {
        for (let ox = 0; ox < ow; ox++) {
          const counts = new Map<number, number>();
          for (let y = oy * f; y < Math.min(H, oy * f + f); y++) {
            for (let x = ox * f; x < Math.min(W, ox * f + f); x++) {
              const v = maskBands[0][y * W + x];
              if (v !== 255) counts.set(v, (counts.get(v) ?? 0) + 1);
            }
          }
          let best = 255;
          let bestN = 0;
          for (const [v, n] of [...counts].sort((a, b) => a[0] - b[0])) if (n > bestN) [best, bestN] = [v, n];
          want[oy * ow + ox] = best;
        }
      }
      expect(firstMismatch(got, want), `overview ${level}`).toBe(-1);
    });

    const field = new Float32Array(W * H);
    for (let i = 0; i < field.length; i++) field[i] = i % 11 === 0 ? NaN : Math.fround(Math.sin(i / 1000) * 100);
    const fpath = join(dir, 'field-ovr.tif');
    await writeGeoTiff(fpath, { width: W, height: H, count: 1, dtype: 'float32', crs: { epsg: 4326 }, transform, nodata: NaN, cog: true }, [field]);
    const [ov] = gdalReadBands(fpath, Float32Array, 1, 0);
    const ow = Math.ceil(W / 2);
    for (const [ox, oy] of [[0, 0], [100, 77], [ow - 1, Math.ceil(H / 2) - 1], [359, 180]]) {
      const vals: number[] = [];
      for (let y = oy * 2; y < Math.min(H, oy * 2 + 2); y++) for (let x = ox * 2; x < Math.min(W, ox * 2 + 2); x++) vals.push(field[y * W + x]);
      const valid = vals.filter((v) => !Number.isNaN(v));
      const mean = valid.length ? valid.reduce((s, v) => s + v, 0) / valid.length : NaN;
      if (Number.isNaN(mean)) expect(ov[oy * ow + ox]).toBeNaN();
      else expect(ov[oy * ow + ox]).toBeCloseTo(mean, 4);
    }
    expect(cogErrors(fpath)).toEqual([]);
  });

  it('float32 field with a numeric nodata value', async () => {
    const path = join(dir, 'field4326.tif');
    const band = new Float32Array(W * H).map((_, i) => (i % 97 === 0 ? -9999 : (i % W) / 10));
    await writeGeoTiff(path, { width: W, height: H, count: 1, dtype: 'float32', crs: { epsg: 4326 }, transform, nodata: -9999 }, [band], {
      bandDescriptions: ['invented field at 250 hPa'],
    });
    const info = gdalinfo(path);
    expect(info.bands[0].noDataValue).toBe(-9999);
    expect(info.bands[0].description).toBe('invented field at 250 hPa');
    expect(info.metadata.IMAGE_STRUCTURE).toMatchObject({ COMPRESSION: 'DEFLATE', PREDICTOR: '3' });
    expect(info.bands[0].overviews ?? []).toEqual([]);
    const [got] = gdalReadBands(path, Float32Array, 1);
    expect(firstMismatch(got, band)).toBe(-1);
  });

  it('NaN nodata is reported as NaN', async () => {
    const path = join(dir, 'nan.tif');
    await writeGeoTiff(path, { width: 16, height: 16, count: 1, dtype: 'float64', crs: { epsg: 4326 }, transform: [0, 1, 0, 16, 0, -1], nodata: NaN }, [new Float64Array(256)]);
    expect(gdalinfo(path).bands[0].noDataValue).toBe('NaN');
  });
});

describe.skipIf(!haveGdal)('BigTIFF', () => {
  it('is chosen above the size threshold; GDAL and geotiff.js read it and the COG layout stays valid', async () => {
    const W = 300;
    const H = 200;
    const bands = [1, 2].map((s) => field(Float32Array as unknown as Ctor, 'float32', W, H, s) as Float32Array);
    const path = join(dir, 'big.tif');
    const res = await writeGeoTiff(
      path,
      { width: W, height: H, count: 2, dtype: 'float32', crs: { epsg: 4326 }, transform: [0, 0.1, 0, 20, 0, -0.1], cog: true, blockSize: 64 },
      bands,
      { bandDescriptions: ['a', 'b'] },
      { bigTiffThresholdBytes: 1000 },
    );
    expect(res.bigTiff).toBe(true);
    const head = readFileSync(path).subarray(0, 16);
    // BigTIFF header: "II", version 43, offset byte size 8, constant 0, 8-byte first IFD offset.
    expect([...head.subarray(0, 8)]).toEqual([0x49, 0x49, 43, 0, 8, 0, 0, 0]);
    const viaGdal = gdalReadBands(path, Float32Array, 2);
    for (let b = 0; b < 2; b++) expect(firstMismatch(viaGdal[b], bands[b])).toBe(-1);
    expect(gdalinfo(path).bands.map((b: { description: string }) => b.description)).toEqual(['a', 'b']);
    expect(cogErrors(path)).toEqual([]);
    const image = await (await fromFile(path)).getImage();
    const rasters = (await image.readRasters({ interleave: false })) as unknown as Float32Array[];
    expect(firstMismatch(rasters[1], bands[1])).toBe(-1);

    // Without the lowered threshold the same data is a classic TIFF ("II", 42).
    const small = join(dir, 'classic.tif');
    expect((await writeGeoTiff(small, { width: W, height: H, count: 2, dtype: 'float32', crs: { epsg: 4326 }, transform: [0, 0.1, 0, 20, 0, -0.1] }, bands)).bigTiff).toBe(false);
    expect([...readFileSync(small).subarray(0, 4)]).toEqual([0x49, 0x49, 42, 0]);
  });
});

describe.skipIf(!haveGdal)('GDAL_METADATA text', () => {
  it('GDAL reads back exactly the strings its own writer would store', async () => {
    const tricky = ['a & b', '<tag>', 'quote " and \'', 'tab\tand\nnewline', 'µ° ü €', '&amp; literal'];
    const path = join(dir, 'text.tif');
    await writeGeoTiff(
      path,
      { width: 16, height: 16, count: tricky.length, dtype: 'uint8', crs: { epsg: 4326 }, transform: [0, 1, 0, 16, 0, -1] },
      tricky.map(() => new Uint8Array(256)),
      { bandDescriptions: tricky, items: Object.fromEntries(tricky.map((t, i) => [`KEY_${i}`, t])) },
    );
    const info = gdalinfo(path);
    expect(info.bands.map((b: { description: string }) => b.description)).toEqual(tricky);
    for (let i = 0; i < tricky.length; i++) expect(info.metadata[''][`KEY_${i}`]).toBe(tricky[i]);
    // Cross-check against GDAL's own writer: the same strings set through python3-gdal read back equal.
    const script = `
import sys, json
from osgeo import gdal
t = json.loads(sys.argv[2])
ds = gdal.GetDriverByName('GTiff').Create(sys.argv[1], 4, 4, len(t), gdal.GDT_Byte)
for i, s in enumerate(t): ds.GetRasterBand(i + 1).SetDescription(s)
ds = None
ds = gdal.Open(sys.argv[1])
print(json.dumps([ds.GetRasterBand(i + 1).GetDescription() for i in range(len(t))]))`;
    const gdalOwn = join(dir, 'text-gdal.tif');
    const back = JSON.parse(run('/usr/bin/python3', ['-c', script, gdalOwn, JSON.stringify(tricky)]));
    expect(info.bands.map((b: { description: string }) => b.description)).toEqual(back);
  });
});


describe('in-memory encoding', () => {
  it.each(['uint8', 'int16', 'float32'] as const)('encodeGeoTiff gives the bytes writeGeoTiff writes (%s COG)', async (dtype) => {
    const ctor = DTYPES.find((d) => d.dtype === dtype)!.ctor;
    const bands = [3, 4].map((s) => field(ctor, dtype, 300, 280, s));
    const profile: RasterProfile = { width: 300, height: 280, count: 2, dtype, crs: { epsg: 4326 }, transform: [0, 0.1, 0, 28, 0, -0.1], cog: true, blockSize: 128 };
    const path = join(dir, `mem-${dtype}.tif`);
    await writeGeoTiff(path, profile, bands, { bandDescriptions: ['x', 'y'] });
    const mem = encodeGeoTiff(profile, bands, { bandDescriptions: ['x', 'y'] });
    expect(Buffer.compare(Buffer.from(mem), readFileSync(path))).toBe(0);
  });
});
