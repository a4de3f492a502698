/**
 * The band-by-band GeoTIFF writer (GeoTiffBandWriter). Each file is checked three ways, the source
 * named beside each check:
 *  - in-house: byte-identical to writeGeoTiff's file for the same bands;
 *  - GDAL: python3-gdal's ReadAsArray returns the bands and overviews (overviews against the
 *    nearest / NaN-aware block mean of the profile's resampling, recomputed here from the pixels),
 *    and GDAL's COG validator (--full-check=yes) calls the file valid;
 *  - geotiff.js: an independent TIFF decoder reads the same main-image pixels.
 * Then misuse: wrong band counts and lengths, concurrent adds, aborts and failed writes, each
 * with its wording and no file (not even a temporary one) left behind.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fromFile } from 'geotiff';
import { GeoTiffBandWriter, openGeoTiffWriter, writeGeoTiff, type RasterProfile } from '../../lib/output/index.js';
import { OutputError, ParameterError } from '../../lib/errors.js';
import { PYTHON, run, toolAvailable } from '../support/tools.js';
import { gdalReadBands, prng, removeDir, tempDir } from './gdal.js';

const dir = tempDir('frostgrid-stream-writer-');
afterAll(() => removeDir(dir));

const haveGdalPython = toolAvailable('python', 'osgeo');
const haveCogValidator = haveGdalPython && toolAvailable('python', 'osgeo_utils.samples.validate_cloud_optimized_geotiff');

type Band = Uint8Array | Float32Array;

async function rejection(p: Promise<unknown>): Promise<Error> {
  try {
    await p;
  } catch (e) {
    return e as Error;
  }
  throw new Error('expected a rejection');
}

/** Index of the first element whose bytes differ (NaN compared by bit pattern), −2 on a length mismatch, else −1. */
function firstMismatch(a: Band, b: Band): number {
  if (a.length !== b.length) return -2;
  const ua = new Uint8Array(a.buffer, a.byteOffset, a.byteLength);
  const ub = new Uint8Array(b.buffer, b.byteOffset, b.byteLength);
  for (let i = 0; i < ua.length; i++) if (ua[i] !== ub[i]) return Math.floor(i / a.BYTES_PER_ELEMENT);
  return -1;
}

/** Invented mask: blobs of 1 on 0 that move with the band, nodata (255) in a corner strip. */
function mask(width: number, height: number, b: number): Uint8Array {
  const a = new Uint8Array(width * height);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) a[y * width + x] = x < 3 && y < height / 3 ? 255 : Math.sin(x / 9 + b) * Math.cos(y / 7) > 0.2 ? 1 : 0;
  }
  return a;
}

/** Invented field: a smooth wave with float32 noise, NaN in a patch and at scattered pixels. */
function field(width: number, height: number, b: number): Float32Array {
  const r = prng(101 + b);
  const a = new Float32Array(width * height);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const inPatch = x >= width / 2 && x < width / 2 + 20 && y < 40;
      a[y * width + x] = inPatch || r() < 0.01 ? NaN : 220 + 30 * Math.sin(x / 11 + b) * Math.cos(y / 13) + r() * 0.25;
    }
  }
  return a;
}

/** Overview level of `factor` as the profile's resampling defines it (overviews.ts doc comment), in float64. */
function expectedOverview(band: Band, width: number, height: number, factor: number, resampling: 'nearest' | 'average', nodata: number): Float64Array {
  const ow = Math.ceil(width / factor);
  const oh = Math.ceil(height / factor);
  const out = new Float64Array(ow * oh);
  for (let oy = 0; oy < oh; oy++) {
    for (let ox = 0; ox < ow; ox++) {
      if (resampling === 'nearest') {
        out[oy * ow + ox] = band[oy * factor * width + ox * factor];
        continue;
      }
      let sum = 0;
      let n = 0;
      for (let y = oy * factor; y < Math.min(height, (oy + 1) * factor); y++) {
        for (let x = ox * factor; x < Math.min(width, (ox + 1) * factor); x++) {
          const v = band[y * width + x];
          if (Number.isNaN(v) || v === nodata) continue;
          sum += v;
          n++;
        }
      }
      out[oy * ow + ox] = n === 0 ? nodata : sum / n;
    }
  }
  return out;
}

interface Case {
  name: string;
  dtype: 'uint8' | 'float32';
  width: number;
  height: number;
  count: number;
}

// 64-pixel tiles keep the files small while giving several overview levels; every size but the
// first leaves partial tiles on the right and bottom edges.
const CASES: Case[] = [
  { name: 'uint8 mask, one band, 128 × 64 (whole tiles)', dtype: 'uint8', width: 128, height: 64, count: 1 },
  { name: 'uint8 mask, 3 bands, 150 × 97', dtype: 'uint8', width: 150, height: 97, count: 3 },
  { name: 'uint8 mask, 4 bands, 361 × 181', dtype: 'uint8', width: 361, height: 181, count: 4 },
  { name: 'float32 field, one band, 65 × 1', dtype: 'float32', width: 65, height: 1, count: 1 },
  { name: 'float32 field, 2 bands, 150 × 97', dtype: 'float32', width: 150, height: 97, count: 2 },
  { name: 'float32 field, 5 bands, 361 × 181', dtype: 'float32', width: 361, height: 181, count: 5 },
];

function profileOf(c: Case): RasterProfile {
  const base = { width: c.width, height: c.height, count: c.count, crs: { epsg: 4326 }, transform: [-180, 1, 0, 90, 0, -1] as const, cog: true, blockSize: 64 };
  return c.dtype === 'uint8'
    ? { ...base, dtype: 'uint8', nodata: 255, overviewResampling: 'nearest' }
    : { ...base, dtype: 'float32', nodata: NaN, overviewResampling: 'average' };
}

function bandsOf(c: Case): Band[] {
  return Array.from({ length: c.count }, (_, b) => (c.dtype === 'uint8' ? mask(c.width, c.height, b) : field(c.width, c.height, b)));
}

/** Overview factors of the case's COG: halvings until both sides fit in one 64-pixel block. */
function overviewFactors(c: Case): number[] {
  const out: number[] = [];
  for (let f = 2; Math.ceil(c.width / (f / 2)) > 64 || Math.ceil(c.height / (f / 2)) > 64; f *= 2) out.push(f);
  return out;
}

async function streamed(path: string, profile: RasterProfile, bands: readonly Band[]): Promise<{ path: string; bytes: number; bigTiff: boolean }> {
  const writer = openGeoTiffWriter(path, profile, { bandDescriptions: bands.map((_, b) => `level ${b + 1}`) });
  for (const band of bands) await writer.addBand(band);
  return writer.finish();
}

describe('streamed files', () => {
  it.each(CASES)('$name: byte-identical to writeGeoTiff, and read back by geotiff.js', async (c) => {
    const profile = profileOf(c);
    const bands = bandsOf(c);
    const path = join(dir, `stream-${c.dtype}-${c.width}x${c.height}x${c.count}.tif`);
    const reference = join(dir, `whole-${c.dtype}-${c.width}x${c.height}x${c.count}.tif`);
    const result = await streamed(path, profile, bands);
    await writeGeoTiff(reference, profile, bands, { bandDescriptions: bands.map((_, b) => `level ${b + 1}`) });

    // In-house check: the all-at-once writer's bytes.
    const a = readFileSync(path);
    const b = readFileSync(reference);
    expect(result).toEqual({ path, bytes: b.length, bigTiff: false });
    expect(a.length).toBe(b.length);
    expect(Buffer.compare(a, b)).toBe(0);

    // geotiff.js: the main image's pixels, band by band.
    const tiff = await fromFile(path);
    expect(await tiff.getImageCount()).toBe(1 + overviewFactors(c).length);
    const image = await tiff.getImage();
    const rasters = (await image.readRasters({ interleave: false })) as unknown as Band[];
    for (let k = 0; k < c.count; k++) expect(firstMismatch(rasters[k], bands[k]), `geotiff.js band ${k + 1}`).toBe(-1);
  });

  it('metadata given at finish replaces the opening metadata, as writeGeoTiff with that metadata writes it', async () => {
    const c = CASES[0];
    const path = join(dir, 'stream-late-metadata.tif');
    const reference = join(dir, 'whole-late-metadata.tif');
    const late = { bandDescriptions: bandsOf(c).map((_, b) => `band ${b + 1}`), items: { flag_known_at_end: 'true' } };
    const writer = openGeoTiffWriter(path, profileOf(c), { items: { flag_known_at_end: 'unknown' } });
    for (const band of bandsOf(c)) await writer.addBand(band);
    await writer.finish(late);
    await writeGeoTiff(reference, profileOf(c), bandsOf(c), late);
    expect(Buffer.compare(readFileSync(path), readFileSync(reference))).toBe(0);
    if (haveGdalPython) {
      // GDAL reads the replaced items back (python3-gdal GetMetadataItem).
      const py = `from osgeo import gdal\nds = gdal.Open(${JSON.stringify(path)})\nprint(ds.GetMetadataItem('flag_known_at_end'))`;
      expect(run(PYTHON, ['-c', py]).trim()).toBe('true');
    }
  });

  it('a BigTIFF threshold in the options reaches the layout as writeGeoTiff applies it', async () => {
    const c = CASES[1];
    const path = join(dir, 'stream-big.tif');
    const reference = join(dir, 'whole-big.tif');
    const writer = new GeoTiffBandWriter(path, profileOf(c), undefined, { bigTiffThresholdBytes: 1000 });
    for (const band of bandsOf(c)) await writer.addBand(band);
    const result = await writer.finish();
    await writeGeoTiff(reference, profileOf(c), bandsOf(c), undefined, { bigTiffThresholdBytes: 1000 });
    expect(result.bigTiff).toBe(true);
    // BigTIFF header, TIFF 6.0 BigTIFF extension: "II", 43, offset size 8.
    expect([...readFileSync(path).subarray(0, 6)]).toEqual([0x49, 0x49, 43, 0, 8, 0]);
    expect(Buffer.compare(readFileSync(path), readFileSync(reference))).toBe(0);
  });
});

describe.skipIf(!haveGdalPython)('streamed files read by GDAL', () => {
  it.each(CASES)('$name: python3-gdal reads the bands and overviews back', async (c) => {
    const profile = profileOf(c);
    const bands = bandsOf(c);
    const path = join(dir, `gdal-${c.dtype}-${c.width}x${c.height}x${c.count}.tif`);
    await streamed(path, profile, bands);
    const ctor = (c.dtype === 'uint8' ? Uint8Array : Float32Array) as unknown as { new (b: ArrayBuffer, o: number, l: number): Band; BYTES_PER_ELEMENT: number };

    // GDAL ReadAsArray of the main image: the bytes that were added.
    const main = gdalReadBands(path, ctor, c.count);
    for (let k = 0; k < c.count; k++) expect(firstMismatch(main[k], bands[k]), `GDAL band ${k + 1}`).toBe(-1);

    // GDAL ReadAsArray of each overview: nearest pixels of the mask exactly, NaN-aware block means
    // of the field to float32 precision (summation order may differ in the last float64 bits).
    for (const [level, factor] of overviewFactors(c).entries()) {
      const ovr = gdalReadBands(path, ctor, c.count, level);
      for (let k = 0; k < c.count; k++) {
        const want = expectedOverview(bands[k], c.width, c.height, factor, profile.overviewResampling as 'nearest' | 'average', profile.nodata as number);
        expect(ovr[k].length, `overview ${factor} band ${k + 1} size`).toBe(want.length);
        let bad = -1;
        for (let i = 0; i < want.length && bad < 0; i++) {
          const got = ovr[k][i];
          if (Number.isNaN(want[i]) ? !Number.isNaN(got) : Math.abs(got - want[i]) > Math.abs(want[i]) * 1e-6) bad = i;
        }
        expect(bad, `overview ${factor} band ${k + 1}: first wrong pixel`).toBe(-1);
      }
    }
  });

  it.skipIf(!haveCogValidator).each(CASES)('$name: the COG validator (--full-check=yes) finds no errors', async (c) => {
    const path = join(dir, `cog-${c.dtype}-${c.width}x${c.height}x${c.count}.tif`);
    await streamed(path, profileOf(c), bandsOf(c));
    // GDAL's validate_cloud_optimized_geotiff exits non-zero (run throws) on errors and prints its verdict.
    const verdict = run(PYTHON, ['-m', 'osgeo_utils.samples.validate_cloud_optimized_geotiff', '--full-check=yes', path]);
    expect(verdict).toContain(`${path} is a valid cloud optimized GeoTIFF`);
    expect(verdict).not.toMatch(/error/i);
  });
});

describe('misuse', () => {
  const profile: RasterProfile = { width: 10, height: 10, count: 2, dtype: 'uint8', crs: { epsg: 4326 }, transform: [0, 1, 0, 10, 0, -1], cog: true, nodata: 255 };

  /** A fresh empty directory for one test, so "nothing left behind" is exact. */
  function emptyDir(name: string): string {
    const d = join(dir, name);
    mkdirSync(d);
    return d;
  }

  it('a band of the wrong length is the OutputError writeGeoTiff throws, and the writer stays usable', async () => {
    const d = emptyDir('short');
    const path = join(d, 'x.tif');
    const writer = openGeoTiffWriter(path, profile);
    const err = await rejection(writer.addBand(new Uint8Array(99)));
    const reference = await rejection(writeGeoTiff(path, profile, [new Uint8Array(99), new Uint8Array(100)]));
    expect(err).toBeInstanceOf(OutputError);
    expect(err.message).toBe('band 1 has 99 values but a 10 × 10 raster needs 100');
    expect(err.message).toBe(reference.message);
    expect(writer.bandsAdded).toBe(0);
    await writer.addBand(new Uint8Array(100));
    const second = await rejection(writer.addBand(new Uint8Array(101)));
    expect(second.message).toBe('band 2 has 101 values but a 10 × 10 raster needs 100');
    await writer.addBand(new Uint8Array(100).fill(1));
    await writer.finish();
    expect(readdirSync(d)).toEqual(['x.tif']);
  });

  it('values that do not fit the data type are the OutputError writeGeoTiff throws', async () => {
    const bad = Array.from({ length: 100 }, (_, i) => (i === 42 ? 300 : 0));
    const writer = openGeoTiffWriter(join(dir, 'never.tif'), profile);
    const err = await rejection(writer.addBand(bad));
    const reference = await rejection(writeGeoTiff(join(dir, 'never.tif'), profile, [bad, bad]));
    expect(err).toBeInstanceOf(OutputError);
    expect(err.message).toBe('band 1 value 300 at pixel 42 cannot be stored as uint8');
    expect(err.message).toBe(reference.message);
    const fraction = await rejection(writer.addBand(Array.from({ length: 100 }, (_, i) => (i === 7 ? 0.5 : 0))));
    expect(fraction.message).toBe('band 1 value 0.5 at pixel 7 cannot be stored as uint8');
    await writer.abort();
    expect(existsSync(join(dir, 'never.tif'))).toBe(false);
  });

  it('plain number arrays are converted like writeGeoTiff converts them', async () => {
    const d = emptyDir('plain');
    const bands = [Array.from({ length: 100 }, (_, i) => i % 3), Array.from({ length: 100 }, (_, i) => (i * 7) % 256)];
    const writer = openGeoTiffWriter(join(d, 'a.tif'), profile);
    for (const band of bands) await writer.addBand(band);
    await writer.finish();
    await writeGeoTiff(join(d, 'b.tif'), profile, bands);
    expect(Buffer.compare(readFileSync(join(d, 'a.tif')), readFileSync(join(d, 'b.tif')))).toBe(0);
  });

  it('finishing with fewer bands than the profile declares is an OutputError and writes nothing', async () => {
    const d = emptyDir('few');
    const writer = openGeoTiffWriter(join(d, 'x.tif'), profile);
    await writer.addBand(new Uint8Array(100));
    const err = await rejection(writer.finish());
    expect(err).toBeInstanceOf(OutputError);
    expect(err.message).toBe('the profile has 2 band(s) but 1 band(s) were added');
    expect(readdirSync(d)).toEqual([]);
    // The writer is still open: the missing band can follow.
    await writer.addBand(new Uint8Array(100));
    await writer.finish();
    expect(readdirSync(d)).toEqual(['x.tif']);
  });

  it('finishing with no band at all is an OutputError', async () => {
    const err = await rejection(openGeoTiffWriter(join(dir, 'none.tif'), profile).finish());
    expect(err).toBeInstanceOf(OutputError);
    expect(err.message).toBe('the profile has 2 band(s) but 0 band(s) were added');
    expect(existsSync(join(dir, 'none.tif'))).toBe(false);
  });

  it('adding more bands than the profile declares is an OutputError', async () => {
    const path = join(dir, 'many.tif');
    const writer = openGeoTiffWriter(path, profile);
    await writer.addBand(new Uint8Array(100));
    await writer.addBand(new Uint8Array(100));
    const err = await rejection(writer.addBand(new Uint8Array(100)));
    expect(err).toBeInstanceOf(OutputError);
    expect(err.message).toBe('the profile has 2 band(s) but band 3 was added');
    expect((err as OutputError).file).toBe(path);
    await writer.abort();
    expect(existsSync(path)).toBe(false);
  });

  it('a second addBand before the first settles is an OutputError; the first still lands', async () => {
    const path = join(dir, 'concurrent.tif');
    const writer = openGeoTiffWriter(path, { ...profile, width: 300, height: 300, dtype: 'float32', nodata: undefined });
    const first = writer.addBand(new Float32Array(90000).fill(1.5));
    const err = await rejection(writer.addBand(new Float32Array(90000)));
    await first;
    expect(err).toBeInstanceOf(OutputError);
    expect(err.message).toBe(`cannot add a band while band 1 of ${path} is being encoded; await each addBand before the next call`);
    expect(writer.bandsAdded).toBe(1);
    await writer.abort();
  });

  it('abort drops everything: the pending band, later calls, and no file', async () => {
    const d = emptyDir('abort');
    const path = join(d, 'x.tif');
    const writer = openGeoTiffWriter(path, { ...profile, width: 300, height: 300, dtype: 'float32', nodata: undefined });
    const pending = writer.addBand(new Float32Array(90000).fill(2));
    await writer.abort();
    const dropped = await rejection(pending);
    expect(dropped).toBeInstanceOf(OutputError);
    expect(dropped.message).toBe(`band 1 of ${path} was dropped: the writer was aborted`);
    const later = await rejection(writer.finish());
    expect(later.message).toBe(`cannot finish: the writer of ${path} is closed`);
    const add = await rejection(writer.addBand(new Float32Array(90000)));
    expect(add.message).toBe(`cannot add a band: the writer of ${path} is closed`);
    await writer.abort();
    expect(readdirSync(d)).toEqual([]);
  });

  it('an invalid profile is the ParameterError writeGeoTiff throws, before any band', () => {
    expect(() => openGeoTiffWriter(join(dir, 'p.tif'), { ...profile, tiled: false })).toThrow(new ParameterError('a cloud-optimized GeoTIFF must be tiled', 'tiled'));
    expect(() => new GeoTiffBandWriter(join(dir, 'p.tif'), { ...profile, blockSize: 100 })).toThrow(ParameterError);
  });

  it('a target in a missing directory is an OutputError naming the file, and the writer is closed', async () => {
    const path = join(dir, 'no', 'such', 'dir', 'x.tif');
    const writer = openGeoTiffWriter(path, profile);
    await writer.addBand(new Uint8Array(100));
    await writer.addBand(new Uint8Array(100));
    const err = await rejection(writer.finish());
    expect(err).toBeInstanceOf(OutputError);
    expect((err as OutputError).file).toBe(path);
    expect(err.message).toMatch(new RegExp(`^cannot write ${path.replace(/[/.]/g, '\\$&')} \\(ENOENT\\)`));
    expect((await rejection(writer.finish())).message).toBe(`cannot finish: the writer of ${path} is closed`);
    expect(existsSync(join(dir, 'no'))).toBe(false);
  });

  it('a target that cannot be replaced (a directory) leaves no temporary file and the directory as it was', async () => {
    const d = emptyDir('busy');
    const target = join(d, 'out.tif');
    mkdirSync(target);
    writeFileSync(join(target, 'keep'), 'x');
    const writer = openGeoTiffWriter(target, profile);
    await writer.addBand(new Uint8Array(100));
    await writer.addBand(new Uint8Array(100));
    const err = await rejection(writer.finish());
    expect(err).toBeInstanceOf(OutputError);
    expect((err as OutputError).file).toBe(target);
    expect(readdirSync(d)).toEqual(['out.tif']);
    expect(readdirSync(target)).toEqual(['keep']);
    expect(readFileSync(join(target, 'keep'), 'utf8')).toBe('x');
  });
});

describe('spooling to disk', () => {
  /** A fresh empty directory for one test, so "nothing left behind" is exact. */
  function emptyDir(name: string): string {
    const d = join(dir, name);
    mkdirSync(d);
    return d;
  }

  it.each(CASES)('$name: a spooled writer writes the bytes of writeGeoTiff and removes its spool file', async (c) => {
    const spool = emptyDir(`spool-${c.dtype}-${c.width}x${c.height}x${c.count}`);
    const out = emptyDir(`spool-out-${c.dtype}-${c.width}x${c.height}x${c.count}`);
    const bands = bandsOf(c);
    const writer = openGeoTiffWriter(join(out, 'a.tif'), profileOf(c), { bandDescriptions: bands.map((_, b) => `level ${b + 1}`) }, { spoolDirectory: spool });
    for (const band of bands) {
      await writer.addBand(band);
      // The compressed chunks are on disk, in one spool file.
      expect(readdirSync(spool)).toHaveLength(1);
      expect(readdirSync(spool)[0]).toMatch(/^\.a\.tif\.\d+\.[0-9a-f]{8}\.spool$/);
    }
    await writer.finish();
    await writeGeoTiff(join(out, 'b.tif'), profileOf(c), bands, { bandDescriptions: bands.map((_, b) => `level ${b + 1}`) });
    expect(Buffer.compare(readFileSync(join(out, 'a.tif')), readFileSync(join(out, 'b.tif')))).toBe(0);
    expect(readdirSync(spool)).toEqual([]);
    expect(readdirSync(out)).toEqual(['a.tif', 'b.tif']);
  });

  it.skipIf(!haveCogValidator)('GDAL reads a spooled BigTIFF and the COG validator accepts it', async () => {
    const c = CASES[5];
    const spool = emptyDir('spool-big');
    const path = join(spool, 'big.tif');
    const writer = openGeoTiffWriter(path, profileOf(c), undefined, { spoolDirectory: spool, bigTiffThresholdBytes: 1000 });
    for (const band of bandsOf(c)) await writer.addBand(band);
    const written = await writer.finish();
    expect(written.bigTiff).toBe(true);
    expect(readdirSync(spool)).toEqual(['big.tif']);
    // python3-gdal ReadAsArray: every band of the main image equals what was added.
    const read = gdalReadBands(path, Float32Array, c.count);
    bandsOf(c).forEach((band, k) => expect(firstMismatch(read[k], band), `GDAL band ${k + 1}`).toBe(-1));
    const verdict = run(PYTHON, ['-m', 'osgeo_utils.samples.validate_cloud_optimized_geotiff', '--full-check=yes', path]);
    expect(verdict).toContain(`${path} is a valid cloud optimized GeoTIFF`);
  });

  it('abort and a failed finish remove the spool file', async () => {
    const c = CASES[2];
    const spool = emptyDir('spool-abort');
    const aborted = openGeoTiffWriter(join(spool, 'x.tif'), profileOf(c), undefined, { spoolDirectory: spool });
    await aborted.addBand(bandsOf(c)[0]);
    expect(readdirSync(spool)).toHaveLength(1);
    await aborted.abort();
    expect(readdirSync(spool)).toEqual([]);

    const failing = openGeoTiffWriter(join(spool, 'no', 'such', 'x.tif'), profileOf(c), undefined, { spoolDirectory: spool });
    for (const band of bandsOf(c)) await failing.addBand(band);
    const err = await rejection(failing.finish());
    expect(err).toBeInstanceOf(OutputError);
    expect(err.message).toMatch(/\(ENOENT\)/);
    expect(readdirSync(spool)).toEqual([]);
  });

  it('a spool directory that does not exist is an OutputError at the first band, and nothing is left', async () => {
    const c = CASES[0];
    const missing = join(dir, 'no-spool-here');
    const writer = openGeoTiffWriter(join(dir, 'spool-missing.tif'), profileOf(c), undefined, { spoolDirectory: missing });
    const err = await rejection(writer.addBand(bandsOf(c)[0]));
    expect(err).toBeInstanceOf(OutputError);
    expect(err.message).toMatch(/ENOENT/);
    expect(existsSync(missing)).toBe(false);
    expect(existsSync(join(dir, 'spool-missing.tif'))).toBe(false);
  });
});
