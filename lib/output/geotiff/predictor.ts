/**
 * TIFF predictors, applied to one tile or strip of one band (band-separate layout, so one sample
 * per pixel).
 *
 * - Horizontal differencing (TIFF 6.0 §14, Predictor = 2): each sample of a row is replaced by
 *   its difference from the previous sample, modulo 2^bitsPerSample. Typed-array stores wrap
 *   modulo 2^bits, which is exactly that arithmetic for 8-, 16- and 32-bit samples.
 * - Floating-point predictor (Adobe Photoshop TIFF Technical Note 3, Predictor = 3): the bytes of
 *   each row are regrouped so that all most-significant bytes come first, then the next bytes,
 *   and so on; the regrouped row is then byte-differenced.
 */
import type { RasterArray } from './profile.js';

/** Horizontal differencing in place over rows of `rowLength` samples. */
export function horizontalDifference(samples: Uint8Array | Int16Array | Uint16Array | Int32Array, rowLength: number): void {
  for (let start = 0; start < samples.length; start += rowLength) {
    for (let i = start + rowLength - 1; i > start; i--) samples[i] = samples[i] - samples[i - 1];
  }
}

/**
 * Floating-point predictor: returns the transformed bytes of `samples` (a float array in host
 * byte order, which the encoder requires to be little-endian) for rows of `rowLength` samples.
 */
export function floatingPointPredict(samples: Float32Array | Float64Array, rowLength: number): Uint8Array {
  const out = new Uint8Array(samples.byteLength);
  if (samples instanceof Float32Array) {
    const words = new Uint32Array(samples.buffer, samples.byteOffset, samples.length);
    // Regroup (byte b of sample i goes to plane 3 − b, most significant plane first) and
    // difference in the same pass: each plane is read from the row's words, and `prev` carries
    // the last byte across plane boundaries, as the differencing runs over the whole row.
    for (let w = 0, o = 0; w < words.length; w += rowLength) {
      let prev = 0;
      for (let shift = 24; shift >= 0; shift -= 8) {
        for (let i = w, end = w + rowLength; i < end; i++) {
          const v = (words[i] >>> shift) & 0xff;
          out[o++] = v - prev;
          prev = v;
        }
      }
    }
    return out;
  }
  const src = new Uint8Array(samples.buffer, samples.byteOffset, samples.byteLength);
  const rowBytes = rowLength * 8;
  for (let row = 0; row < src.length; row += rowBytes) {
    for (let b = 0; b < 8; b++) {
      const plane = row + (7 - b) * rowLength;
      for (let i = 0, s = row + b; i < rowLength; i++, s += 8) out[plane + i] = src[s];
    }
    differenceBytes(out, row, rowBytes);
  }
  return out;
}

/** Byte differencing of out[start .. start+length), right to left. */
function differenceBytes(out: Uint8Array, start: number, length: number): void {
  let prev = out[start];
  for (let k = start + 1, end = start + length; k < end; k++) {
    const cur = out[k];
    out[k] = cur - prev;
    prev = cur;
  }
}

/** Bytes of a tile after the predictor; integer tiles are differenced in place. */
export function applyPredictor(tile: RasterArray, rowLength: number, predictor: 'none' | 'horizontal' | 'float'): Uint8Array {
  if (predictor === 'float') return floatingPointPredict(tile as Float32Array | Float64Array, rowLength);
  if (predictor === 'horizontal') horizontalDifference(tile as Uint8Array | Int16Array | Uint16Array | Int32Array, rowLength);
  return new Uint8Array(tile.buffer, tile.byteOffset, tile.byteLength);
}
