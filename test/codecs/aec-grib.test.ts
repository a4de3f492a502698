/**
 * CCSDS decoder on GRIB2 template 5.42 data sections written by ecCodes
 * (data-samples/fixtures/codecs/aec-grib, made by make-fixtures.py with python3-eccodes).
 * Expected values: ecCodes' codes_get_values, through Y = (R + X·2^E)/10^D, compared as float32.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { aecDecode } from '../../lib/codecs/index.js';

const DIR = fileURLToPath(new URL('../../data-samples/fixtures/codecs/aec-grib/', import.meta.url));
interface Case {
  name: string;
  file: string;
  bitsPerSample: number;
  ccsdsFlags: number;
  ccsdsBlockSize: number;
  ccsdsRsi: number;
  numberOfValues: number;
  referenceValue: number;
  binaryScaleFactor: number;
  decimalScaleFactor: number;
  eccodesValues: number[];
  eccodesSha256OfFloat32: string;
}
const { cases } = JSON.parse(readFileSync(DIR + 'fixtures.json', 'utf8')) as { cases: Case[] };

describe('CCSDS decoder on ecCodes grid_ccsds data sections', () => {
  it.each(cases.map((c) => [c.name, c] as const))('%s', (_n, c) => {
    const stream = new Uint8Array(readFileSync(DIR + c.file));
    const params = { bitsPerSample: c.bitsPerSample, blockSize: c.ccsdsBlockSize, rsi: c.ccsdsRsi, flags: c.ccsdsFlags };
    const x = aecDecode(stream, params, c.numberOfValues);
    const R = c.referenceValue;
    const scale = 2 ** c.binaryScaleFactor;
    const div = 10 ** c.decimalScaleFactor;
    const y = Float32Array.from(x, (v) => (R + v * scale) / div);
    const some = [...y.subarray(0, 4), ...y.subarray(y.length - 2)];
    expect(some).toEqual(c.eccodesValues.map((v) => Math.fround(v)));
    expect(createHash('sha256').update(new Uint8Array(y.buffer)).digest('hex')).toBe(c.eccodesSha256OfFloat32);
  });
});
