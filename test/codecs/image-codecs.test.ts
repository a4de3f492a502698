/**
 * JPEG 2000 (GRIB2 5.40) and PNG (5.41) sample decoding against the committed fixtures
 * (data-samples/fixtures/codecs/image, made by make-fixtures.py): the bytes are GRIB2 data
 * sections written by ecCodes (and 1/2/4-bit PNGs written by GDAL). Expected integers: GDAL's
 * decode of the same bytes (SHA-256 and sample values in fixtures.json). Expected physical
 * values: ecCodes' codes_get_values, checked through Y = (R + X·2^E)/10^D.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { decodeJpeg2000, decodePngSamples } from '../../lib/codecs/index.js';
import { DecodeError } from '../../lib/errors.js';

const DIR = fileURLToPath(new URL('../../data-samples/fixtures/codecs/image/', import.meta.url));

interface Fixture {
  name: string;
  file: string;
  width: number;
  height: number;
  bitsPerSample: number;
  gdalSha256: string;
  gdalValues: number[];
  eccodes?: { referenceValue: number; binaryScaleFactor: number; decimalScaleFactor: number; numberOfValues: number };
  eccodesValues?: number[];
  eccodesSha256OfFloat32?: string;
}
const fixtures = JSON.parse(readFileSync(DIR + 'fixtures.json', 'utf8')) as { jpeg2000: Fixture[]; png: Fixture[] };

function read(f: Fixture): Uint8Array {
  return new Uint8Array(readFileSync(DIR + f.file));
}

function checkAgainstOracles(f: Fixture, got: { width: number; height: number; values: Uint32Array }): void {
  expect([got.width, got.height]).toEqual([f.width, f.height]);
  const v = got.values;
  expect([...v.subarray(0, 5), ...v.subarray(v.length - 3)]).toEqual(f.gdalValues);
  const le = new Uint8Array(new Uint32Array(v).buffer); // host order is little-endian on CI machines
  expect(createHash('sha256').update(le).digest('hex')).toBe(f.gdalSha256);
  if (f.eccodes !== undefined && f.eccodesSha256OfFloat32 !== undefined) {
    const { referenceValue: R, binaryScaleFactor: E, decimalScaleFactor: D } = f.eccodes;
    const y = Float32Array.from(v, (x) => (R + x * 2 ** E) / 10 ** D);
    expect(createHash('sha256').update(new Uint8Array(y.buffer)).digest('hex')).toBe(f.eccodesSha256OfFloat32);
  }
}

describe('decodeJpeg2000 (OpenJPEG wasm up to 16 bits, ours above) against GDAL and ecCodes', () => {
  it.each(fixtures.jpeg2000.map((f) => [f.name, f] as const))('%s', async (_n, f) => {
    const got = await decodeJpeg2000(read(f));
    expect(got.bitsPerSample).toBe(f.bitsPerSample);
    checkAgainstOracles(f, got);
  });

  it('rejects bytes that are not a J2K codestream', async () => {
    await expect(decodeJpeg2000(new Uint8Array([1, 2, 3, 4]))).rejects.toThrow(DecodeError);
    await expect(decodeJpeg2000(new Uint8Array([1, 2, 3, 4]))).rejects.toThrow(/SOC, SIZ/);
  });

  it('rejects a truncated codestream with DecodeError', async () => {
    const f = fixtures.jpeg2000.find((x) => x.bitsPerSample === 16)!;
    const cut = read(f).subarray(0, 60);
    await expect(decodeJpeg2000(cut)).rejects.toThrow(DecodeError);
    await expect(decodeJpeg2000(cut)).rejects.toThrow(/EOC marker/);
  });
});

describe('decodePngSamples (fast-png) against GDAL and ecCodes', () => {
  it.each(fixtures.png.map((f) => [f.name, f] as const))('%s', (_n, f) => {
    const got = decodePngSamples(read(f));
    checkAgainstOracles(f, got);
  });

  it('rejects bytes without the PNG signature', () => {
    expect(() => decodePngSamples(new Uint8Array(16))).toThrow(/PNG signature/);
  });

  it('rejects a truncated PNG with DecodeError', () => {
    const f = fixtures.png.find((x) => x.bitsPerSample === 16)!;
    expect(() => decodePngSamples(read(f).subarray(0, 40))).toThrow(DecodeError);
  });
});
