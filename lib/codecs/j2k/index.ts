/** JPEG 2000 (ISO/IEC 15444-1) codestream decoding, our own implementation. */
export { decodeJ2k, J2K_MAX_CODED_PLANES, J2K_MAX_PRECISION, J2K_MAX_SAMPLES, type J2kLimits, type J2kSamples } from './decode.js';
