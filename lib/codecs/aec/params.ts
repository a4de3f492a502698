/**
 * Parameters of a CCSDS 121.0-B adaptive entropy coded stream, as GRIB2 data representation
 * template 5.42 carries them (ccsdsFlags, ccsdsBlockSize, ccsdsRsi) and as libaec names them.
 *
 * Flag bits (GRIB2 template 5.42 octet 18 "ccsdsFlags"; libaec.h AEC_* constants):
 *   bit 0 (1)  AEC_DATA_SIGNED      samples are two's-complement signed
 *   bit 1 (2)  AEC_DATA_3BYTE       17–24-bit samples are stored in 3 bytes (output layout only)
 *   bit 2 (4)  AEC_DATA_MSB         samples are stored most significant byte first (output layout only)
 *   bit 3 (8)  AEC_DATA_PREPROCESS  unit-delay predictor + mapper were applied before coding
 *   bit 4 (16) AEC_RESTRICTED       restricted set of code options (1–4 bits per sample)
 *   bit 5 (32) AEC_PAD_RSI          each reference sample interval ends on a byte boundary
 */

export interface AecParameters {
  /** Resolution n in bits per sample, 1..32. */
  bitsPerSample: number;
  /** Block size J in samples: 8, 16, 32 or 64. */
  blockSize: number;
  /** Reference sample interval: blocks per interval, 1..4096. */
  rsi: number;
  /** Bit set of the AEC_* flags below (GRIB2 ccsdsFlags). */
  flags: number;
}

export const AEC_DATA_SIGNED = 1;
export const AEC_DATA_3BYTE = 2;
export const AEC_DATA_MSB = 4;
export const AEC_DATA_PREPROCESS = 8;
export const AEC_RESTRICTED = 16;
export const AEC_PAD_RSI = 32;

/** Flags GRIB2 encoders write by default (MSB | PREPROCESS | 3BYTE). */
export const AEC_GRIB_DEFAULT_FLAGS = AEC_DATA_3BYTE | AEC_DATA_MSB | AEC_DATA_PREPROCESS;

const KNOWN_FLAGS = AEC_DATA_SIGNED | AEC_DATA_3BYTE | AEC_DATA_MSB | AEC_DATA_PREPROCESS | AEC_RESTRICTED | AEC_PAD_RSI;

/** Block sizes CCSDS 121.0-B-3 §5.1.2 allows (libaec enforces the same set). */
export const AEC_BLOCK_SIZES: readonly number[] = [8, 16, 32, 64];

/** Largest reference sample interval libaec accepts. */
export const AEC_MAX_RSI = 4096;

/** Validated, derived form of the parameters used by the decoder. */
export interface AecLayout {
  bitsPerSample: number;
  blockSize: number;
  rsi: number;
  signed: boolean;
  preprocess: boolean;
  padRsi: boolean;
  /** Length in bits of the option identifier. */
  idLength: number;
  /** Largest split-sample k option (ID k+1); ID all-ones is "no compression". */
  kMax: number;
}

/**
 * Checks the parameters and derives the option-identifier length.
 * CCSDS 121.0-B-3 Table 5-1: ID length 3 bits for n ≤ 8, 4 bits for n ≤ 16, 5 bits for n ≤ 32;
 * restricted set (§5.1.4, n ≤ 4): 1 bit for n ≤ 2, 2 bits for n = 3, 4.
 */
export function aecLayout(params: AecParameters): AecLayout {
  const { bitsPerSample: n, blockSize, rsi, flags } = params;
  if (!Number.isInteger(n) || n < 1 || n > 32) {
    throw new RangeError(`CCSDS bits per sample ${n} is outside 1..32`);
  }
  if (!AEC_BLOCK_SIZES.includes(blockSize)) {
    throw new RangeError(`CCSDS block size ${blockSize} is not one of ${AEC_BLOCK_SIZES.join(', ')}`);
  }
  if (!Number.isInteger(rsi) || rsi < 1 || rsi > AEC_MAX_RSI) {
    throw new RangeError(`CCSDS reference sample interval ${rsi} is outside 1..${AEC_MAX_RSI}`);
  }
  if (!Number.isInteger(flags) || flags < 0 || (flags & ~KNOWN_FLAGS) !== 0) {
    throw new RangeError(`CCSDS flags ${flags} set bits other than 0..5`);
  }
  let idLength: number;
  if ((flags & AEC_RESTRICTED) !== 0) {
    if (n > 4) throw new RangeError(`CCSDS restricted code options need 1..4 bits per sample, not ${n}`);
    idLength = n <= 2 ? 1 : 2;
  } else {
    idLength = n > 16 ? 5 : n > 8 ? 4 : 3;
  }
  return {
    bitsPerSample: n,
    blockSize,
    rsi,
    signed: (flags & AEC_DATA_SIGNED) !== 0,
    preprocess: (flags & AEC_DATA_PREPROCESS) !== 0,
    padRsi: (flags & AEC_PAD_RSI) !== 0,
    idLength,
    kMax: (1 << idLength) - 3,
  };
}
