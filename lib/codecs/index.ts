/**
 * Data codecs for packed gridded data: packed-integer unpacking, CCSDS 121.0-B adaptive entropy
 * decoding (GRIB2 template 5.42), JPEG 2000 (5.40) and PNG (5.41) sample decoding.
 */
export { unpackUnsigned } from './bits.js';
export {
  aecDecode,
  emptyAecOptionCounts,
  AEC_DATA_SIGNED,
  AEC_DATA_3BYTE,
  AEC_DATA_MSB,
  AEC_DATA_PREPROCESS,
  AEC_RESTRICTED,
  AEC_PAD_RSI,
  AEC_GRIB_DEFAULT_FLAGS,
  AEC_BLOCK_SIZES,
  AEC_MAX_RSI,
  type AecParameters,
  type AecOptionCounts,
} from './aec/index.js';
export { decodeJpeg2000, JPEG2000_MAX_BITS, JPEG2000_WASM_MAX_BITS, type DecodedSamples } from './jpeg2000.js';
export { decodeJ2k, J2K_MAX_CODED_PLANES, type J2kSamples } from './j2k/index.js';
export { decodePngSamples } from './png.js';
