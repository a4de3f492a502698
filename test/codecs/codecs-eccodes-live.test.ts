/**
 * Live cross-check against ecCodes (python3-eccodes, run now): an invented field is packed by
 * ecCodes as grid_ccsds, grid_png and grid_jpeg; our codecs decode the data section and the
 * values Y = (R + X·2^E)/10^D must equal ecCodes' codes_get_values to float32 rounding. grid_jpeg
 * above 16 bits per value runs through our own JPEG 2000 decoder (lib/codecs/j2k).
 * Skipped locally without python3-eccodes, a failure in CI (test/support/tools.ts).
 */
import { execFileSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { aecDecode, decodeJpeg2000, decodePngSamples } from '../../lib/codecs/index.js';
import { PYTHON, toolAvailable } from '../support/tools.js';

interface Made {
  section7: string;
  bits: number;
  n: number;
  R: number;
  E: number;
  D: number;
  flags: number;
  block: number;
  rsi: number;
  values: number[];
}

function make(packing: string, bits: number, seed: number): Made {
  const script = `
import json, numpy as np, eccodes
gid = eccodes.codes_grib_new_from_samples('GRIB2')
rng = np.random.default_rng(${seed})
y, x = np.mgrid[0:31, 0:16]
v = 230 + 50 * np.sin(x / 3.0 + ${seed}) * np.cos(y / 5.0) + rng.random((31, 16)) * (0.5 if '${packing}' != 'grid_png' else 0)
v[5:9, :] = 240.0
eccodes.codes_set(gid, 'bitsPerValue', ${bits})
eccodes.codes_set_values(gid, v.ravel())
eccodes.codes_set(gid, 'packingType', '${packing}')
msg = eccodes.codes_get_message(gid)
off = eccodes.codes_get(gid, 'offsetSection7'); ln = eccodes.codes_get(gid, 'section7Length')
ccsds = '${packing}' == 'grid_ccsds'
print(json.dumps({
  'section7': msg[off + 5:off + ln].hex(), 'bits': eccodes.codes_get(gid, 'bitsPerValue'),
  'n': eccodes.codes_get(gid, 'numberOfValues'), 'R': eccodes.codes_get_double(gid, 'referenceValue'),
  'E': eccodes.codes_get(gid, 'binaryScaleFactor'), 'D': eccodes.codes_get(gid, 'decimalScaleFactor'),
  'flags': eccodes.codes_get(gid, 'ccsdsFlags') if ccsds else 0,
  'block': eccodes.codes_get(gid, 'ccsdsBlockSize') if ccsds else 0,
  'rsi': eccodes.codes_get(gid, 'ccsdsRsi') if ccsds else 0,
  'values': [float(a) for a in eccodes.codes_get_values(gid)]}))`;
  return JSON.parse(execFileSync(PYTHON, ['-c', script], { encoding: 'utf8' })) as Made;
}

function expectSameValues(m: Made, x: Uint32Array): void {
  expect(x.length).toBe(m.n);
  const y = Array.from(x, (v) => Math.fround((m.R + v * 2 ** m.E) / 10 ** m.D));
  expect(y).toEqual(m.values.map((v) => Math.fround(v)));
}

describe('codecs against ecCodes run now', () => {
  it.each([4, 10, 16, 21, 24])('grid_ccsds, %i bits', (bits) => {
    if (!toolAvailable('python', 'eccodes')) return;
    const m = make('grid_ccsds', bits, bits);
    const x = aecDecode(Buffer.from(m.section7, 'hex'), { bitsPerSample: m.bits, blockSize: m.block, rsi: m.rsi, flags: m.flags }, m.n);
    expectSameValues(m, x);
  });

  it.each([8, 16, 24])('grid_png, %i bits', (bits) => {
    if (!toolAvailable('python', 'eccodes')) return;
    const m = make('grid_png', bits, bits);
    expectSameValues(m, decodePngSamples(Buffer.from(m.section7, 'hex')).values);
  });

  it.each([10, 16, 17, 20, 24, 28, 31])('grid_jpeg, %i bits', async (bits) => {
    if (!toolAvailable('python', 'eccodes')) return;
    const m = make('grid_jpeg', bits, bits);
    expectSameValues(m, (await decodeJpeg2000(Buffer.from(m.section7, 'hex'))).values);
  });
});
