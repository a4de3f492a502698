/** CCSDS 121.0-B adaptive entropy decoding (GRIB2 data representation template 5.42). */
export { aecDecode, emptyAecOptionCounts, type AecOptionCounts } from './decode.js';
export {
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
} from './params.js';
