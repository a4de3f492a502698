/**
 * CCSDS 121.0-B decoder against the committed libaec test vectors
 * (data-samples/fixtures/codecs/aec: made by make-vectors.py with libaec-tools' `aec`).
 * Source of every expected value: `aec -d` output, recorded in vectors.json.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import {
  AEC_DATA_3BYTE,
  AEC_DATA_MSB,
  AEC_DATA_SIGNED,
  aecDecode,
  emptyAecOptionCounts,
} from '../../lib/codecs/aec/index.js';

const DIR = fileURLToPath(new URL('../../data-samples/fixtures/codecs/aec/', import.meta.url));

interface Vector {
  name: string;
  file: string;
  kind: string;
  bitsPerSample: number;
  blockSize: number;
  rsi: number;
  flags: number;
  aecArgs: string;
  sampleCount: number;
  decodedSha256: string;
  head: number[];
  tail: number[];
}

const manifest = JSON.parse(readFileSync(DIR + 'vectors.json', 'utf8')) as { source: string; vectors: Vector[] };
const vectors = manifest.vectors;

/** libaec's sample layout: 1, 2, 3 or 4 bytes, MSB or LSB first, n-bit patterns. */
function layoutBytes(values: Uint32Array, n: number, flags: number): Uint8Array {
  const size = n <= 8 ? 1 : n <= 16 ? 2 : n <= 24 && (flags & AEC_DATA_3BYTE) !== 0 ? 3 : 4;
  const msb = (flags & AEC_DATA_MSB) !== 0;
  const mask = n === 32 ? 0xffffffff : 2 ** n - 1;
  const out = new Uint8Array(values.length * size);
  for (let i = 0; i < values.length; i++) {
    let v = (values[i] & mask) >>> 0;
    for (let b = 0; b < size; b++) {
      out[i * size + (msb ? size - 1 - b : b)] = v & 0xff;
      v >>>= 8;
    }
  }
  return out;
}

function decodeVector(v: Vector, counts = emptyAecOptionCounts()) {
  const stream = new Uint8Array(readFileSync(DIR + v.file));
  const params = { bitsPerSample: v.bitsPerSample, blockSize: v.blockSize, rsi: v.rsi, flags: v.flags };
  return aecDecode(stream, params, v.sampleCount, counts);
}

describe('CCSDS decoder reproduces libaec `aec -d` (committed vectors)', () => {
  it('has vectors for every bit depth 1..32 and every block size', () => {
    const depths = new Set(vectors.map((v) => v.bitsPerSample));
    const blocks = new Set(vectors.map((v) => v.blockSize));
    expect([...depths].sort((a, b) => a - b)).toEqual(Array.from({ length: 32 }, (_, i) => i + 1));
    expect([...blocks].sort((a, b) => a - b)).toEqual([8, 16, 32, 64]);
  });

  it.each(vectors.map((v) => [v.name, v] as const))('%s', (_name, v) => {
    const values = decodeVector(v);
    expect(values.length).toBe(v.sampleCount);
    const asNumbers = (flagsSigned: boolean, a: Uint32Array) =>
      Array.from(flagsSigned ? new Int32Array(a.buffer, a.byteOffset, a.length) : a);
    const signed = (v.flags & AEC_DATA_SIGNED) !== 0;
    expect(asNumbers(signed, values.subarray(0, v.head.length))).toEqual(v.head);
    expect(asNumbers(signed, values.subarray(values.length - v.tail.length))).toEqual(v.tail);
    const sha = createHash('sha256').update(layoutBytes(values, v.bitsPerSample, v.flags)).digest('hex');
    expect(sha).toBe(v.decodedSha256);
  });

  it('the vectors exercise every coding option of CCSDS 121.0-B', () => {
    const counts = emptyAecOptionCounts();
    for (const v of vectors) decodeVector(v, counts);
    expect(counts.zeroBlockCodes).toBeGreaterThan(0);
    expect(counts.remainderOfSegment).toBeGreaterThan(0);
    expect(counts.zeroBlocks).toBeGreaterThan(counts.zeroBlockCodes);
    expect(counts.secondExtension).toBeGreaterThan(0);
    expect(counts.noCompression).toBeGreaterThan(0);
    expect(counts.referenceSamples).toBeGreaterThan(0);
    // fundamental sequence (k = 0) and split-sample k = 1..29 (k ≤ 29 is the largest option,
    // CCSDS 121.0-B-3 Table 5-1, for 17..32-bit samples)
    for (let k = 0; k <= 29; k++) expect(counts.splitSample[k], `k = ${k}`).toBeGreaterThan(0);
  });
});
