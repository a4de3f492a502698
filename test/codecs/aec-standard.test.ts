/**
 * CCSDS 121.0-B decoder on streams built bit by bit from the definitions of the standard
 * (CCSDS 121.0-B-3, Lossless Data Compression, Blue Book, August 2020): §4.3 preprocessor
 * (unit-delay predictor, prediction error mapper), §5.1 coded data set formats, Table 5-1 option
 * identifiers, §5.1.3.3 zero-block option with the remainder-of-segment (ROS) code, §5.1.3.4 second
 * extension, §5.1.3.1 split-sample and fundamental sequence, §5.1.3.5 no compression.
 * Expected values are the samples the test encodes, not decoder output.
 */
import { describe, expect, it } from 'vitest';
import { AEC_DATA_PREPROCESS, AEC_DATA_SIGNED, aecDecode } from '../../lib/codecs/index.js';

class BitWriter {
  private bits: number[] = [];
  put(value: number, width: number): this {
    for (let b = width - 1; b >= 0; b--) this.bits.push(Math.floor(value / 2 ** b) % 2);
    return this;
  }
  /** Fundamental sequence codeword of m: m zeros then a one (§5.1.2). */
  fs(m: number): this {
    for (let i = 0; i < m; i++) this.bits.push(0);
    this.bits.push(1);
    return this;
  }
  bytes(): Uint8Array {
    const out = new Uint8Array(Math.ceil(this.bits.length / 8));
    this.bits.forEach((b, i) => {
      if (b) out[i >> 3] |= 0x80 >> (i & 7);
    });
    return out;
  }
}

/** ID length, Table 5-1 (basic set). */
const idLength = (n: number) => (n <= 8 ? 3 : n <= 16 ? 4 : 5);

/** Prediction error mapper, §4.3.2.3, equations (12)-(13), for x_min = 0, x_max = 2^n − 1. */
function mapUnsigned(x: number, prediction: number, n: number): number {
  const xmax = 2 ** n - 1;
  const delta = x - prediction;
  const theta = Math.min(prediction, xmax - prediction);
  if (delta >= 0 && delta <= theta) return 2 * delta;
  if (delta < 0 && delta >= -theta) return 2 * -delta - 1;
  return theta + Math.abs(delta);
}

/** Same for signed samples, x_min = −2^(n−1), x_max = 2^(n−1) − 1. */
function mapSigned(x: number, prediction: number, n: number): number {
  const xmin = -(2 ** (n - 1));
  const xmax = 2 ** (n - 1) - 1;
  const delta = x - prediction;
  const theta = Math.min(prediction - xmin, xmax - prediction);
  if (delta >= 0 && delta <= theta) return 2 * delta;
  if (delta < 0 && delta >= -theta) return 2 * -delta - 1;
  return theta + Math.abs(delta);
}

const params = (n: number, J: number, rsi: number, flags = 0) => ({ bitsPerSample: n, blockSize: J, rsi, flags });

describe('coded data sets of CCSDS 121.0-B-3 §5.1', () => {
  it('fundamental sequence option (ID 001 for n ≤ 8)', () => {
    const samples = [0, 1, 2, 3, 0, 0, 5, 1];
    const w = new BitWriter().put(0b001, 3);
    samples.forEach((s) => w.fs(s));
    expect(Array.from(aecDecode(w.bytes(), params(8, 8, 1), 8))).toEqual(samples);
  });

  it.each([1, 2, 5])('split-sample option k = %i (ID k+1): FS of the high parts, then k-bit low parts', (k) => {
    const samples = [0, 200, 37, 255, 12, 64, 128, 3];
    const w = new BitWriter().put(k + 1, 3);
    samples.forEach((s) => w.fs(s >>> k));
    samples.forEach((s) => w.put(s & ((1 << k) - 1), k));
    expect(Array.from(aecDecode(w.bytes(), params(8, 8, 1), 8))).toEqual(samples);
  });

  it.each([
    [8, [0, 255, 1, 254, 128, 127, 7, 9]],
    [16, [0, 65535, 1, 40000, 32768, 12345, 7, 9]],
    [24, [0, 16777215, 1, 8388608, 65536, 12345, 7, 9]],
    [32, [0, 4294967295, 1, 2147483648, 2147483647, 305419896, 7, 9]],
  ])('no-compression option (ID all ones) at n = %i', (n, samples) => {
    const w = new BitWriter().put(2 ** idLength(n) - 1, idLength(n));
    samples.forEach((s) => w.put(s, n));
    expect(Array.from(aecDecode(w.bytes(), params(n, 8, 4), 8))).toEqual(samples);
  });

  it('zero-block option: FS code m means m+1 zero blocks for m < 4', () => {
    // 3 zero blocks (m = 2), then one uncompressed block
    const w = new BitWriter().put(0, 3).put(0, 1).fs(2).put(7, 3);
    const tail = [1, 2, 3, 4, 5, 6, 7, 8];
    tail.forEach((s) => w.put(s, 8));
    expect(Array.from(aecDecode(w.bytes(), params(8, 8, 16), 32))).toEqual([...new Array(24).fill(0), ...tail]);
  });

  it('zero-block option: m ≥ 5 means m zero blocks', () => {
    const w = new BitWriter().put(0, 3).put(0, 1).fs(6).put(7, 3);
    for (let i = 0; i < 8; i++) w.put(9, 8);
    const got = aecDecode(w.bytes(), params(8, 8, 64), 7 * 8);
    expect(Array.from(got)).toEqual([...new Array(48).fill(0), ...new Array(8).fill(9)]);
  });

  it('zero-block option: ROS (m = 4) runs to the end of the 64-block segment', () => {
    // RSI of 100 blocks: ROS at block 0 covers blocks 0..63; then an uncompressed block 64.
    const w = new BitWriter().put(0, 3).put(0, 1).fs(4).put(7, 3);
    for (let i = 0; i < 8; i++) w.put(200 + i, 8);
    const got = aecDecode(w.bytes(), params(8, 8, 100), 65 * 8);
    expect(got.subarray(0, 512).every((v) => v === 0)).toBe(true);
    expect(Array.from(got.subarray(512))).toEqual([200, 201, 202, 203, 204, 205, 206, 207]);
  });

  it('zero-block option: ROS stops at the end of the reference sample interval', () => {
    // RSI of 10 blocks: ROS covers 10; the next interval starts with an uncompressed block.
    const w = new BitWriter().put(0, 3).put(0, 1).fs(4).put(7, 3);
    for (let i = 0; i < 8; i++) w.put(1 + i, 8);
    const got = aecDecode(w.bytes(), params(8, 8, 10), 11 * 8);
    expect(got.subarray(0, 80).every((v) => v === 0)).toBe(true);
    expect(Array.from(got.subarray(80))).toEqual([1, 2, 3, 4, 5, 6, 7, 8]);
  });

  it('second-extension option: γ = (a+b)(a+b+1)/2 + b for each pair', () => {
    const pairs = [
      [1, 0],
      [0, 2],
      [3, 1],
      [0, 0],
    ];
    const w = new BitWriter().put(0, 3).put(1, 1);
    for (const [a, b] of pairs) w.fs(((a + b) * (a + b + 1)) / 2 + b);
    expect(Array.from(aecDecode(w.bytes(), params(8, 8, 1), 8))).toEqual(pairs.flat());
  });

  it('second extension with γ beyond the 13 smallest sums (β = 20)', () => {
    const w = new BitWriter().put(0, 4).put(1, 1);
    const pairs = [
      [5, 15],
      [0, 0],
      [20, 0],
      [1, 1],
    ];
    for (const [a, b] of pairs) w.fs(((a + b) * (a + b + 1)) / 2 + b);
    expect(Array.from(aecDecode(w.bytes(), params(12, 8, 1), 8))).toEqual(pairs.flat());
  });

  it('option identifiers are 4 bits for 9..16-bit and 5 bits for 17..32-bit samples', () => {
    const samples = [3, 1, 4, 1, 5, 9, 2, 6];
    for (const n of [12, 16, 17, 32]) {
      const w = new BitWriter().put(1, idLength(n)); // ID ...0001: fundamental sequence
      samples.forEach((s) => w.fs(s));
      expect(Array.from(aecDecode(w.bytes(), params(n, 8, 1), 8)), `n = ${n}`).toEqual(samples);
    }
  });

  it('split sample with k = 20 at n = 32 (k > 24 needs a two-part read: k = 27)', () => {
    for (const k of [20, 27]) {
      const samples = [4294967295, 0, 123456789, 2 ** 31, 99, 2 ** k, 2 ** k - 1, 3000000000];
      const w = new BitWriter().put(k + 1, 5);
      samples.forEach((s) => w.fs(Math.floor(s / 2 ** k)));
      samples.forEach((s) => w.put(s % 2 ** k, k));
      expect(Array.from(aecDecode(w.bytes(), params(32, 8, 1), 8)), `k = ${k}`).toEqual(samples);
    }
  });
});

describe('preprocessor inverse (§4.3: unit-delay predictor and prediction error mapper)', () => {
  /** Encodes blocks of J samples, one RSI per `rsi` blocks, with the no-compression option. */
  function encodePreprocessed(samples: number[], n: number, J: number, rsi: number, signed: boolean): Uint8Array {
    const w = new BitWriter();
    const id = idLength(n);
    for (let b = 0; b * J < samples.length; b++) {
      const first = b * J;
      w.put(2 ** id - 1, id);
      for (let i = first; i < first + J; i++) {
        if (i % (J * rsi) === 0) {
          const ref = samples[i];
          w.put(ref < 0 ? ref + 2 ** n : ref, n); // reference sample, n-bit two's complement
        } else {
          w.put((signed ? mapSigned : mapUnsigned)(samples[i], samples[i - 1], n), n);
        }
      }
    }
    return w.bytes();
  }

  it.each([4, 8, 12, 16, 24, 31, 32])('unsigned, n = %i, including jumps to both ends of the range', (n) => {
    const top = 2 ** n - 1;
    const samples = [5, 6, 4, top, 0, top - 1, 1, Math.floor(top / 2), top, top, 0, 0, 3, 2, 7, 1];
    const got = aecDecode(encodePreprocessed(samples, n, 8, 1, false), params(n, 8, 1, AEC_DATA_PREPROCESS), 16);
    expect(Array.from(got)).toEqual(samples);
  });

  it.each([4, 8, 16, 24, 32])('signed, n = %i: results sign-extended (read as Int32Array)', (n) => {
    const lo = -(2 ** (n - 1));
    const hi = 2 ** (n - 1) - 1;
    const samples = [-1, 0, 1, hi, lo, hi - 1, lo + 1, 0, -3, -3, 2, lo, lo, hi, -1, 0];
    const flags = AEC_DATA_PREPROCESS | AEC_DATA_SIGNED;
    const got = aecDecode(encodePreprocessed(samples, n, 8, 2, true), params(n, 8, 2, flags), 16);
    expect(Array.from(new Int32Array(got.buffer, got.byteOffset, got.length))).toEqual(samples);
  });

  it('the reference sample restarts prediction at every interval', () => {
    const samples = [100, 101, 102, 103, 104, 105, 106, 107, 7, 6, 5, 4, 3, 2, 1, 0];
    const got = aecDecode(encodePreprocessed(samples, 8, 8, 1, false), params(8, 8, 1, AEC_DATA_PREPROCESS), 16);
    expect(Array.from(got)).toEqual(samples);
  });

  it('with a reference sample, split-sample blocks code J − 1 mapped errors', () => {
    // n = 8, J = 8: ID 010 (k = 1), reference 50, then seven mapped errors.
    const samples = [50, 52, 51, 51, 60, 40, 41, 45];
    const mapped = samples.slice(1).map((x, i) => mapUnsigned(x, samples[i], 8));
    const w = new BitWriter().put(2, 3).put(50, 8);
    mapped.forEach((d) => w.fs(d >>> 1));
    mapped.forEach((d) => w.put(d & 1, 1));
    expect(Array.from(aecDecode(w.bytes(), params(8, 8, 4, AEC_DATA_PREPROCESS), 8))).toEqual(samples);
  });

  it('with a reference sample, the first second-extension codeword codes one error only', () => {
    const samples = [9, 9, 10, 10, 10, 11, 11, 11];
    const d = samples.slice(1).map((x, i) => mapUnsigned(x, samples[i], 8)); // 7 errors
    const w = new BitWriter().put(0, 3).put(1, 1).put(9, 8);
    w.fs((d[0] * (d[0] + 1)) / 2 + d[0]); // pair (reference position, d0): a = 0, b = d0
    for (let i = 1; i < 7; i += 2) w.fs(((d[i] + d[i + 1]) * (d[i] + d[i + 1] + 1)) / 2 + d[i + 1]);
    expect(Array.from(aecDecode(w.bytes(), params(8, 8, 4, AEC_DATA_PREPROCESS), 8))).toEqual(samples);
  });

  it('with a reference sample, a zero block repeats the reference', () => {
    const w = new BitWriter().put(0, 3).put(0, 1).put(77, 8).fs(1); // two zero blocks
    const got = aecDecode(w.bytes(), params(8, 8, 2, AEC_DATA_PREPROCESS), 16);
    expect(Array.from(got)).toEqual(new Array(16).fill(77));
  });
});
