/**
 * unpackUnsigned against outside references: GRIB2 simple-packing data sections written by
 * ecCodes (data-samples/fixtures/codecs/simple; expected: codes_get_values through
 * Y = (R + X·2^E)/10^D) and numpy's unpackbits run now on random bytes (Debian python3-numpy).
 */
import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { unpackUnsigned } from '../../lib/codecs/index.js';
import { PYTHON, toolAvailable } from '../support/tools.js';

const DIR = fileURLToPath(new URL('../../data-samples/fixtures/codecs/simple/', import.meta.url));
interface Case {
  name: string;
  file: string;
  bitsPerValue: number;
  numberOfValues: number;
  referenceValue: number;
  binaryScaleFactor: number;
  decimalScaleFactor: number;
  eccodesValues: number[];
  eccodesSha256OfFloat32: string;
}
const { cases } = JSON.parse(readFileSync(DIR + 'fixtures.json', 'utf8')) as { cases: Case[] };

describe('unpackUnsigned on ecCodes simple-packed data sections', () => {
  it.each(cases.map((c) => [c.name, c] as const))('%s', (_n, c) => {
    const bytes = new Uint8Array(readFileSync(DIR + c.file));
    const x = new Uint32Array(c.numberOfValues);
    unpackUnsigned(bytes, 0, c.bitsPerValue, c.numberOfValues, x);
    const scale = 2 ** c.binaryScaleFactor;
    const div = 10 ** c.decimalScaleFactor;
    const y = Float32Array.from(x, (v) => (c.referenceValue + v * scale) / div);
    expect([...y.subarray(0, 4), ...y.subarray(y.length - 2)]).toEqual(c.eccodesValues.map((v) => Math.fround(v)));
    expect(createHash('sha256').update(new Uint8Array(y.buffer)).digest('hex')).toBe(c.eccodesSha256OfFloat32);
  });
});

describe('unpackUnsigned against numpy.unpackbits (run now)', () => {
  const bytes = new Uint8Array(600);
  let s = 987654321;
  for (let i = 0; i < bytes.length; i++) bytes[i] = (s = (Math.imul(s, 1103515245) + 12345) >>> 0) >>> 24;
  const widths = Array.from({ length: 32 }, (_, i) => i + 1);

  it.each(widths)('%i bits per value at bit offsets 0..9 and 61', (bpv) => {
    if (!toolAvailable('python', 'numpy')) return;
    const offsets = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 61];
    const count = Math.floor((bytes.length * 8 - 61) / bpv);
    const script = `
import sys, json, numpy as np
data = np.frombuffer(bytes.fromhex(sys.stdin.read().strip()), dtype=np.uint8)
bits = np.unpackbits(data).astype(np.uint64)
out = {}
for off in ${JSON.stringify(offsets)}:
    b = bits[off:off + ${bpv} * ${count}].reshape(${count}, ${bpv})
    w = (np.uint64(1) << np.arange(${bpv} - 1, -1, -1, dtype=np.uint64))
    out[off] = [int(v) for v in (b * w).sum(axis=1)]
print(json.dumps(out))`;
    const hex = Buffer.from(bytes).toString('hex');
    const expected = JSON.parse(execFileSync(PYTHON, ['-c', script], { input: hex, encoding: 'utf8' })) as Record<string, number[]>;
    for (const off of offsets) {
      for (const out of [new Uint32Array(count), new Float64Array(count)]) {
        unpackUnsigned(bytes, off, bpv, count, out);
        expect(Array.from(out), `offset ${off}, ${out.constructor.name}`).toEqual(expected[off]);
      }
    }
  });
});

describe('unpackUnsigned bounds', () => {
  it('refuses packed data that runs past the buffer', () => {
    expect(() => unpackUnsigned(new Uint8Array(3), 0, 12, 3, new Uint32Array(3))).toThrow(/needs 5 bytes, 3 available/);
  });
  it('refuses widths outside 0..32 and too small an output', () => {
    expect(() => unpackUnsigned(new Uint8Array(8), 0, 33, 1, new Uint32Array(1))).toThrow(/outside 0\.\.32/);
    expect(() => unpackUnsigned(new Uint8Array(8), 0, 8, 4, new Uint32Array(2))).toThrow(/holds 2 values, 4 requested/);
  });
  it('12-bit fast path with an odd count: nibbles read MSB first (WMO simple packing)', () => {
    const bytes = new Uint8Array([0xab, 0xcd, 0xef, 0x12, 0x34, 0x56, 0x78, 0x9a]);
    const out = new Uint32Array(5);
    unpackUnsigned(bytes, 0, 12, 5, out);
    expect(Array.from(out)).toEqual([0xabc, 0xdef, 0x123, 0x456, 0x789]);
  });
  it('0 bits per value writes zeros', () => {
    const out = new Uint32Array([5, 6, 7]);
    unpackUnsigned(new Uint8Array(0), 0, 0, 2, out);
    expect(Array.from(out)).toEqual([0, 0, 7]);
  });
});
