/**
 * CCSDS 121.0-B-3 adaptive entropy decoder (the "Rice" coder of GRIB2 template 5.42).
 *
 * The coded stream is a sequence of coded data sets, one per block of J samples. Each starts with
 * an option identifier (ID, Table 5-1) that selects how the block is coded:
 *   - ID 0, then 1 bit: 0 → zero-block option (§5.1.3.3), 1 → second-extension option (§5.1.3.4)
 *   - ID 1: fundamental sequence (split sample with k = 0)
 *   - ID k+1: split-sample option with k least significant bits sent raw (§5.1.3.1)
 *   - ID all ones: no compression (§5.1.3.5)
 * With preprocessing, the first block of every reference sample interval (RSI) carries an n-bit
 * reference sample after the ID (and after the low-entropy selector bit); that block codes J − 1
 * mapped prediction errors.
 *
 * The decoder reads the bit stream MSB first from a copy of the input as big-endian 32-bit words
 * (zero-padded, so no read leaves it): any field of up to 32 bits is one two-word peek. Overruns
 * are detected from the number of bits consumed and reported as truncation.
 */
import { DecodeError } from '../../errors.js';
import { aecLayout, type AecParameters } from './params.js';
import { signExtend, unmapSigned, unmapUnsigned } from './postprocess.js';

/** Zero-block count code meaning "remainder of segment" (§5.1.3.3): fundamental sequence value 4. */
const ROS = 5;
/** Zero blocks are counted within segments of 64 blocks. */
const SEGMENT_BLOCKS = 64;
/**
 * Zero words after the input. Between two end-of-stream checks a block reads at most
 * 64 × (32 + 32) + 5 + 1 + 32 bits (131 words) plus the word after.
 */
const PAD_WORDS = 256;

const LITTLE_ENDIAN = new Uint8Array(new Uint32Array([1]).buffer)[0] === 1;

/** The input as big-endian 32-bit words, zero-padded (a byte copy, then a swap in place). */
function toWords(input: Uint8Array): Uint32Array {
  const full = input.length >>> 2;
  const words = new Uint32Array(full + 1 + PAD_WORDS);
  new Uint8Array(words.buffer).set(input);
  if (LITTLE_ENDIAN) {
    for (let i = 0; i <= full; i++) {
      const x = words[i];
      words[i] = (x >>> 24) | ((x >>> 8) & 0xff00) | ((x << 8) & 0xff0000) | (x << 24);
    }
  }
  return words;
}

/** Second extension: γ = β(β+1)/2 + δ₂ with β = δ₁ + δ₂. Tables of β and β(β+1)/2 by γ. */
const SE_TABLE = 91; // γ ≤ 90 ⇔ β ≤ 12
const SE_BETA = new Uint8Array(SE_TABLE);
const SE_BASE = new Uint8Array(SE_TABLE);
for (let beta = 0, m = 0; beta <= 12; beta++) {
  for (let j = 0; j <= beta; j++, m++) {
    SE_BETA[m] = beta;
    SE_BASE[m] = (beta * (beta + 1)) / 2;
  }
}

/** How many blocks used each coding option (filled by `aecDecode` when passed). */
export interface AecOptionCounts {
  /** Zero-block option codes (each covers one or more blocks). */
  zeroBlockCodes: number;
  /** Zero-block codes that used "remainder of segment" (ROS). */
  remainderOfSegment: number;
  /** Blocks covered by zero-block codes. */
  zeroBlocks: number;
  secondExtension: number;
  /** Split-sample blocks by k; index 0 is the fundamental sequence option. */
  splitSample: number[];
  noCompression: number;
  /** Blocks that carried a reference sample. */
  referenceSamples: number;
}

/** A fresh, all-zero `AecOptionCounts`. */
export function emptyAecOptionCounts(): AecOptionCounts {
  return {
    zeroBlockCodes: 0,
    remainderOfSegment: 0,
    zeroBlocks: 0,
    secondExtension: 0,
    splitSample: new Array<number>(30).fill(0),
    noCompression: 0,
    referenceSamples: 0,
  };
}

function truncated(sample: number, sampleCount: number, where: string, byteLength: number): DecodeError {
  return new DecodeError(
    `CCSDS stream: stream ends before sample ${Math.min(sample, sampleCount)} of ${sampleCount} (${where}, ${byteLength} bytes)`,
    { offset: byteLength },
  );
}

function malformed(what: string, block: number, bitOffset: number): DecodeError {
  return new DecodeError(`CCSDS stream: ${what} in block ${block} (bit offset ${bitOffset})`, {
    offset: Math.floor(bitOffset / 8),
  });
}

/**
 * Decodes `sampleCount` samples of a CCSDS 121.0-B adaptive entropy coded stream.
 *
 * @returns unsigned samples (a view that may end before its buffer does); with AEC_DATA_SIGNED
 *   the n-bit values are sign-extended to 32 bits (read them as
 *   `new Int32Array(out.buffer, out.byteOffset, out.length)`). The AEC_DATA_MSB and
 *   AEC_DATA_3BYTE flags only describe how libaec lays samples out in bytes and do not change
 *   the decoded values.
 * @throws RangeError for parameters outside the standard; DecodeError (with the byte offset)
 *   for a stream that is truncated or codes an impossible value.
 * @param counts when given, incremented with the coding options the stream used.
 */
export function aecDecode(
  input: Uint8Array,
  params: AecParameters,
  sampleCount: number,
  counts?: AecOptionCounts,
): Uint32Array {
  const layout = aecLayout(params);
  if (!Number.isInteger(sampleCount) || sampleCount < 0) {
    throw new RangeError(`CCSDS sample count ${sampleCount} is not a non-negative integer`);
  }
  if (sampleCount === 0) return new Uint32Array(0);
  const { bitsPerSample: n, blockSize: J, rsi, idLength, preprocess, padRsi } = layout;
  const totalBlocks = Math.ceil(sampleCount / J);
  const len = input.length;
  // Fewest bits a coded data set can take: ID + selector + a one-bit count, and one zero-block
  // code covers at most a 64-block segment.
  const maxBlocks = (Math.floor((len * 8) / (idLength + 2)) + 1) * SEGMENT_BLOCKS;
  if (totalBlocks > maxBlocks) {
    throw new DecodeError(`CCSDS stream of ${len} bytes cannot hold ${sampleCount} samples`, { offset: 0 });
  }

  const idMax = (1 << idLength) - 1;
  const idShift = 32 - idLength;
  const maxValue = n === 32 ? 0xffffffff : 2 ** n - 1;
  const lenBits = len * 8;
  // Written and read through Int32Array views: V8 keeps int32 loads in integer registers, while
  // Uint32Array loads above 2^31 would need float handling. The bit patterns are the same.
  const result = new Uint32Array(totalBlocks * J);
  const out = new Int32Array(result.buffer);
  const words = new Int32Array(toWords(input).buffer);

  // Bit position: word `wi`, bit `bp` (0 = most significant) of that word. `peek` is the 32
  // bits from there: (words[wi] << bp) | (words[wi + 1] >>> (32 − bp)), written so bp = 0 works.
  let wi = 0;
  let bp = 0;
  let block = 0;

  while (block < totalBlocks) {
    let inInterval = 0; // blocks already decoded in this RSI
    const intervalStart = block * J;
    while (inInterval < rsi && block < totalBlocks) {
      const blockStart = block * J;
      const blockEnd = blockStart + J;
      let i = blockStart;
      const ref = preprocess && inInterval === 0;

      let w = (words[wi] << bp) | ((words[wi + 1] >>> 1) >>> (31 - bp));
      const id = w >>> idShift;
      let lowEntropySecondExtension = false;
      let used = idLength;
      if (id === 0) {
        lowEntropySecondExtension = (w << idLength) < 0; // selector bit: 1 → second extension
        used += 1;
      }
      bp += used;
      if (bp >= 32) {
        bp -= 32;
        wi++;
      }
      if (counts !== undefined) {
        if (ref) counts.referenceSamples++;
        if (id === 0) {
          if (lowEntropySecondExtension) counts.secondExtension++;
          else counts.zeroBlockCodes++;
        } else if (id === idMax) counts.noCompression++;
        else counts.splitSample[id - 1]++;
      }
      if (ref) {
        // n-bit reference sample
        w = (words[wi] << bp) | ((words[wi + 1] >>> 1) >>> (31 - bp));
        out[i++] = w >>> (32 - n);
        bp += n;
        if (bp >= 32) {
          bp -= 32;
          wi++;
        }
      }

      if (id === 0 && !lowEntropySecondExtension) {
        // Zero-block option: fundamental-sequence count of all-zero blocks.
        let fs = 0;
        for (;;) {
          w = (words[wi] << bp) | ((words[wi + 1] >>> 1) >>> (31 - bp));
          if (w !== 0) break;
          fs += 32;
          wi++;
          if (wi * 32 + bp > lenBits) throw truncated(i, sampleCount, 'in a zero-block count', len);
          if (fs > SEGMENT_BLOCKS) throw malformed(`zero-block count ${fs} exceeds ${SEGMENT_BLOCKS}`, block, wi * 32 + bp);
        }
        const z = Math.clz32(w);
        fs += z;
        bp += z + 1;
        if (bp >= 32) {
          bp -= 32;
          wi++;
        }
        let zeroBlocks = fs + 1;
        if (zeroBlocks === ROS) {
          if (counts !== undefined) counts.remainderOfSegment++;
          zeroBlocks = Math.min(rsi - inInterval, SEGMENT_BLOCKS - (inInterval % SEGMENT_BLOCKS));
        } else if (zeroBlocks > ROS) {
          zeroBlocks -= 1;
        }
        if (zeroBlocks > SEGMENT_BLOCKS || zeroBlocks > rsi - inInterval) {
          throw malformed(
            `zero-block run of ${zeroBlocks} blocks exceeds the ${rsi - inInterval} left in the reference sample interval`,
            block,
            wi * 32 + bp,
          );
        }
        // `out` is zero-initialised: the run needs no writes.
        if (counts !== undefined) counts.zeroBlocks += zeroBlocks;
        inInterval += zeroBlocks;
        block += zeroBlocks;
      } else {
        if (id === 0) {
          // Second extension: one fundamental-sequence codeword γ per pair of samples. With a
          // reference sample the first pair's first member is the reference position.
          while (i < blockEnd) {
            let m = 0;
            for (;;) {
              w = (words[wi] << bp) | ((words[wi + 1] >>> 1) >>> (31 - bp));
              if (w !== 0) break;
              m += 32;
              wi++;
              if (wi * 32 + bp > lenBits) throw truncated(i, sampleCount, 'in a second-extension codeword', len);
            }
            const z = Math.clz32(w);
            m += z;
            bp += z + 1;
            if (bp >= 32) {
              bp -= 32;
              wi++;
            }
            let beta: number;
            let base: number;
            if (m < SE_TABLE) {
              beta = SE_BETA[m];
              base = SE_BASE[m];
            } else {
              beta = Math.floor((Math.sqrt(8 * m + 1) - 1) / 2);
              while ((beta * (beta + 1)) / 2 > m) beta--;
              while (((beta + 1) * (beta + 2)) / 2 <= m) beta++;
              base = (beta * (beta + 1)) / 2;
              if (beta > maxValue) throw malformed(`second-extension codeword ${m} is out of range`, block, wi * 32 + bp);
            }
            const second = m - base;
            if (((i - blockStart) & 1) === 0) out[i++] = beta - second;
            out[i++] = second;
          }
        } else if (id === idMax) {
          // No compression: n-bit samples.
          const shift = 32 - n;
          for (; i < blockEnd; i++) {
            out[i] = ((words[wi] << bp) | ((words[wi + 1] >>> 1) >>> (31 - bp))) >>> shift;
            bp += n;
            if (bp >= 32) {
              bp -= 32;
              wi++;
            }
          }
        } else {
          // Split sample with k = ID − 1: J fundamental-sequence codes of the high parts, then
          // J k-bit low parts.
          const k = id - 1;
          const fsMax = maxValue >>> k;
          const first = i;
          // A window of the next `valid` bits, left-aligned (the bits below are zeros): most
          // codes end inside it, so the words are read once per window, not once per code.
          // `pos` counts bits from the start of word `base`; (wi, bp) are brought up to date at
          // the end (a block spans far fewer than 2^31 bits, or the checks below stop it).
          const base = wi;
          let pos = bp;
          let win = (words[wi] << bp) | ((words[wi + 1] >>> 1) >>> (31 - bp));
          let valid = 32;
          for (; i < blockEnd; i++) {
            let fs = Math.clz32(win);
            if (fs < valid) {
              win = fs === 31 ? 0 : win << (fs + 1);
              valid -= fs + 1;
              pos += fs + 1;
            } else {
              // the code runs past the window: read it from the words
              wi = base + (pos >>> 5);
              bp = pos & 31;
              fs = 0;
              w = (words[wi] << bp) | ((words[wi + 1] >>> 1) >>> (31 - bp));
              while (w === 0) {
                fs += 32;
                wi++;
                if (wi * 32 + bp > lenBits) throw truncated(i, sampleCount, 'in a fundamental-sequence code', len);
                if (fs > fsMax) {
                  throw malformed(`split-sample high part ${fs} (k = ${k}) exceeds ${n} bits`, block, wi * 32 + bp);
                }
                w = (words[wi] << bp) | ((words[wi + 1] >>> 1) >>> (31 - bp));
              }
              const z = Math.clz32(w);
              fs += z;
              pos = (wi - base) * 32 + bp + z + 1;
              const q = base + (pos >>> 5);
              const r = pos & 31;
              win = (words[q] << r) | ((words[q + 1] >>> 1) >>> (31 - r));
              valid = 32;
            }
            if (fs > fsMax) {
              throw malformed(`split-sample high part ${fs} (k = ${k}) exceeds ${n} bits`, block, base * 32 + pos);
            }
            out[i] = fs;
          }
          if (k > 0) {
            const shift = 32 - k;
            valid = 0;
            for (let j = first; j < blockEnd; j++) {
              if (valid < k) {
                const q = base + (pos >>> 5);
                const r = pos & 31;
                win = (words[q] << r) | ((words[q + 1] >>> 1) >>> (31 - r));
                valid = 32;
              }
              // fs ≤ fsMax < 2^(32−k): the shift cannot lose bits (the int32 sign bit wraps back
              // to the unsigned value on store).
              out[j] = (out[j] << k) | (win >>> shift);
              win <<= k;
              valid -= k;
              pos += k;
            }
          }
          wi = base + (pos >>> 5);
          bp = pos & 31;
        }
        inInterval += 1;
        block += 1;
      }
      if (wi * 32 + bp > lenBits) {
        throw truncated(blockStart, sampleCount, `in block ${block - 1}`, len);
      }
    }
    // Undo the preprocessor while the interval is still in cache (one RSI per call).
    if (preprocess) {
      const part = result.subarray(intervalStart, block * J);
      if (layout.signed) unmapSigned(part, part.length, n, part.length);
      else unmapUnsigned(part, part.length, n, part.length);
    }
    if (padRsi) {
      const r = bp & 7;
      if (r !== 0) {
        bp += 8 - r;
        if (bp >= 32) {
          bp -= 32;
          wi++;
        }
      }
    }
  }

  if (!preprocess && layout.signed) {
    signExtend(result, result.length, n);
  }
  // the last block's padding samples stay in the buffer; the view ends at the count
  return result.length === sampleCount ? result : result.subarray(0, sampleCount);
}
