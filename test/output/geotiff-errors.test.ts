/**
 * Bad input to the writer: typed errors (lib/errors.ts) with their wording, and no file — not
 * even a temporary one — left behind.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { writeGeoTiff, encodeGeoTiff, type RasterProfile } from '../../lib/output/index.js';
import { OutputError, ParameterError, UnsupportedError } from '../../lib/errors.js';
import { removeDir, tempDir } from './gdal.js';

const dir = tempDir('frostgrid-output-errors-');
afterAll(() => removeDir(dir));

const profile: RasterProfile = { width: 10, height: 10, count: 1, dtype: 'uint8', crs: { epsg: 4326 }, transform: [0, 1, 0, 10, 0, -1] };

async function rejection(p: Promise<unknown>): Promise<Error> {
  try {
    await p;
  } catch (e) {
    return e as Error;
  }
  throw new Error('expected a rejection');
}

describe('bad input', () => {
  it('a band of the wrong length is an OutputError and writes nothing', async () => {
    const path = join(dir, 'short.tif');
    const err = await rejection(writeGeoTiff(path, profile, [new Uint8Array(99)]));
    expect(err).toBeInstanceOf(OutputError);
    expect(err.message).toBe('band 1 has 99 values but a 10 × 10 raster needs 100');
    expect(existsSync(path)).toBe(false);
    expect(readdirSync(dir)).toEqual([]);
  });

  it('the wrong number of bands is an OutputError', async () => {
    const err = await rejection(writeGeoTiff(join(dir, 'count.tif'), { ...profile, count: 2 }, [new Uint8Array(100)]));
    expect(err).toBeInstanceOf(OutputError);
    expect(err.message).toBe('the profile has 2 band(s) but 1 band(s) were given');
    expect(readdirSync(dir)).toEqual([]);
  });

  it('an unsupported data type is an UnsupportedError naming it', async () => {
    const err = await rejection(writeGeoTiff(join(dir, 'int8.tif'), { ...profile, dtype: 'int8' as never }, [new Int8Array(100)]));
    expect(err).toBeInstanceOf(UnsupportedError);
    expect((err as UnsupportedError).what).toBe('raster dtype');
    expect((err as UnsupportedError).id).toBe('int8');
    expect(err.message).toMatch(/^raster data type int8 is not supported/);
    expect(readdirSync(dir)).toEqual([]);
  });

  it('values that do not fit the data type are an OutputError', () => {
    expect(() => encodeGeoTiff(profile, [Array.from({ length: 100 }, (_, i) => (i === 42 ? 300 : 0))])).toThrow(
      new OutputError('band 1 value 300 at pixel 42 cannot be stored as uint8'),
    );
  });

  it.each([
    [{ nodata: 256 }, 'nodata', 'nodata 256 cannot be stored as uint8'],
    [{ blockSize: 100 }, 'blockSize', 'blockSize must be a multiple of 16 between 16 and 4096, got 100'],
    [{ cog: true, tiled: false }, 'tiled', 'a cloud-optimized GeoTIFF must be tiled'],
    [{ predictor: 'float' as const }, 'predictor', 'the floating-point predictor needs a float data type, not uint8'],
    [{ width: 0 }, 'width', 'width must be a positive integer, got 0'],
    [{ deflateLevel: 12 }, 'deflateLevel', 'deflateLevel must be an integer 0–9, got 12'],
  ])('profile %o is a ParameterError on %s', (change, parameter, message) => {
    let caught: unknown;
    try {
      encodeGeoTiff({ ...profile, ...change }, [new Uint8Array(100)]);
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(ParameterError);
    expect((caught as ParameterError).parameter).toBe(parameter);
    expect((caught as Error).message).toBe(message);
  });

  it('a target in a missing directory is an OutputError naming the file', async () => {
    const path = join(dir, 'no', 'such', 'dir', 'x.tif');
    const err = await rejection(writeGeoTiff(path, profile, [new Uint8Array(100)]));
    expect(err).toBeInstanceOf(OutputError);
    expect((err as OutputError).file).toBe(path);
    expect(err.message).toMatch(new RegExp(`^cannot write ${path.replace(/[/.]/g, '\\$&')} \\(ENOENT\\)`));
    expect(readdirSync(dir)).toEqual([]);
  });

  it('a target that cannot be replaced (a directory) fails after encoding and leaves no temporary file', async () => {
    const sub = join(dir, 'busy');
    const target = join(sub, 'out.tif');
    mkdirSync(target, { recursive: true });
    writeFileSync(join(target, 'keep'), 'x');
    const err = await rejection(writeGeoTiff(target, profile, [new Uint8Array(100)]));
    expect(err).toBeInstanceOf(OutputError);
    expect((err as OutputError).file).toBe(target);
    expect(readdirSync(sub)).toEqual(['out.tif']);
    expect(readFileSync(join(target, 'keep'), 'utf8')).toBe('x');
    removeDir(sub);
  });

  it('a failed write leaves an existing file untouched', async () => {
    const path = join(dir, 'existing.tif');
    writeFileSync(path, 'previous');
    await rejection(writeGeoTiff(path, profile, [new Uint8Array(5)]));
    expect(readFileSync(path, 'utf8')).toBe('previous');
    expect(readdirSync(dir)).toEqual(['existing.tif']);
    removeDir(path);
  });
});
