/**
 * CCSDS decoder on bad parameters and corrupt streams: typed errors whose wording names what is
 * malformed, and no hang or read outside the input. Streams come from the committed libaec
 * vectors (data-samples/fixtures/codecs/aec) or are built from CCSDS 121.0-B-3 §5.1 definitions.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { AEC_GRIB_DEFAULT_FLAGS, AEC_RESTRICTED, aecDecode } from '../../lib/codecs/index.js';
import { DecodeError } from '../../lib/errors.js';

const DIR = fileURLToPath(new URL('../../data-samples/fixtures/codecs/aec/', import.meta.url));
const manifest = JSON.parse(readFileSync(DIR + 'vectors.json', 'utf8')) as {
  vectors: { name: string; file: string; bitsPerSample: number; blockSize: number; rsi: number; flags: number; sampleCount: number }[];
};
const vector = (name: string) => {
  const v = manifest.vectors.find((x) => x.name === name)!;
  return { v, stream: new Uint8Array(readFileSync(DIR + v.file)) };
};

const grib = (n: number) => ({ bitsPerSample: n, blockSize: 32, rsi: 128, flags: AEC_GRIB_DEFAULT_FLAGS });

describe('parameter checks (RangeError naming the parameter)', () => {
  it.each([
    [{ ...grib(0) }, /bits per sample 0 is outside 1\.\.32/],
    [{ ...grib(33) }, /bits per sample 33 is outside 1\.\.32/],
    [{ ...grib(16), blockSize: 12 }, /block size 12 is not one of 8, 16, 32, 64/],
    [{ ...grib(16), rsi: 0 }, /reference sample interval 0 is outside 1\.\.4096/],
    [{ ...grib(16), rsi: 4097 }, /reference sample interval 4097/],
    [{ ...grib(16), flags: 64 }, /flags 64 set bits other than 0\.\.5/],
    [{ ...grib(5), flags: AEC_RESTRICTED }, /restricted code options need 1\.\.4 bits per sample, not 5/],
  ])('%o', (params, message) => {
    expect(() => aecDecode(new Uint8Array(8), params, 8)).toThrow(RangeError);
    expect(() => aecDecode(new Uint8Array(8), params, 8)).toThrow(message);
  });

  it('rejects a negative or fractional sample count', () => {
    expect(() => aecDecode(new Uint8Array(8), grib(16), -1)).toThrow(/sample count -1/);
    expect(() => aecDecode(new Uint8Array(8), grib(16), 1.5)).toThrow(RangeError);
  });

  it('returns no samples for a count of zero', () => {
    expect(aecDecode(new Uint8Array(0), grib(16), 0).length).toBe(0);
  });
});

describe('malformed streams (DecodeError naming the fault)', () => {
  it('a truncated stream reports the sample it stopped before', () => {
    const { v, stream } = vector('grib-n16-smooth');
    const cut = stream.subarray(0, stream.length >> 1);
    expect(() => aecDecode(cut, v, v.sampleCount)).toThrow(DecodeError);
    expect(() => aecDecode(cut, v, v.sampleCount)).toThrow(/stream ends before sample \d+ of 3000/);
  });

  it('asking for more samples than the stream holds is a truncation', () => {
    const { v, stream } = vector('grib-n16-random');
    expect(() => aecDecode(stream, v, v.sampleCount + 4096)).toThrow(/stream ends before sample/);
  });

  it('an absurd sample count for the stream size is refused before allocating', () => {
    expect(() => aecDecode(new Uint8Array(4), grib(16), 1e9)).toThrow(/stream of 4 bytes cannot hold 1000000000 samples/);
  });

  it('an all-zero stream (endless zero-block count) ends with an error, not a hang', () => {
    const params = { bitsPerSample: 16, blockSize: 16, rsi: 64, flags: 0 };
    expect(() => aecDecode(new Uint8Array(4), params, 1024)).toThrow(/stream ends before sample 0 of 1024 \(in a zero-block count/);
    expect(() => aecDecode(new Uint8Array(64), params, 1024)).toThrow(/zero-block count \d+ exceeds 64/);
  });

  it('a fundamental-sequence code larger than n bits allow', () => {
    // n = 8, ID 001 (fundamental sequence), then 300 zeros and a one: 300 > 255
    const bits = '001' + '0'.repeat(300) + '1' + '1'.repeat(7);
    const bytes = new Uint8Array(Math.ceil(bits.length / 8));
    for (let i = 0; i < bits.length; i++) if (bits[i] === '1') bytes[i >> 3] |= 0x80 >> (i & 7);
    const params = { bitsPerSample: 8, blockSize: 8, rsi: 1, flags: 0 };
    expect(() => aecDecode(bytes, params, 8)).toThrow(/exceeds 8 bits|runs past the end/);
  });

  it('a zero-block run longer than the reference sample interval', () => {
    // n = 8, ID 000, selector 0, FS 2 (three blocks) in an interval of two blocks
    const bytes = new Uint8Array([0b00000011, 0, 0, 0]);
    const params = { bitsPerSample: 8, blockSize: 8, rsi: 2, flags: 0 };
    expect(() => aecDecode(bytes, params, 64)).toThrow(/zero-block run of 3 blocks exceeds the 2 left/);
  });

  it.each(['grib-n16-smooth', 'grib-n24-runs', 'grib-n32-random', 'j64-r4096-n16-runs', 'nopp-n12-lowent', 'grib-n09-lowent'])(
    'corrupted bytes in %s: values within n bits or DecodeError, nothing else',
    (name) => {
      const { v, stream } = vector(name);
      let seed = 12345;
      const rand = () => ((seed = (seed * 1103515245 + 12345) >>> 0) / 2 ** 32);
      const limit = 2 ** v.bitsPerSample;
      let threw = 0;
      for (let trial = 0; trial < 150; trial++) {
        const bad = stream.slice();
        const flips = 1 + Math.floor(rand() * 4);
        for (let f = 0; f < flips; f++) bad[Math.floor(rand() * bad.length)] ^= 1 << Math.floor(rand() * 8);
        const cut = rand() < 0.3 ? bad.subarray(0, Math.floor(rand() * bad.length)) : bad;
        try {
          const got = aecDecode(cut, v, v.sampleCount);
          expect(got.length).toBe(v.sampleCount);
          expect(got.every((x) => x < limit)).toBe(true);
        } catch (e) {
          expect(e).toBeInstanceOf(DecodeError);
          threw++;
        }
      }
      expect(threw).toBeGreaterThan(0);
    },
  );
});
