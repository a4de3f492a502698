/**
 * Hot-loop reading of packed unsigned integers (MSB first) into a Float64Array, with an offset
 * added: out[o + k] = X_k + add. A 32-bit window is loaded at each value's byte, so widths up to
 * 25 bits take one load; wider values take the general path of lib/codecs/bits.ts.
 * The caller guarantees the bits lie within `bytes` (reads past the end of the array yield 0).
 */
import { unpackUnsigned } from '../../../../codecs/bits.js';

export function readBitsInto(bytes: Uint8Array, bitPos: number, width: number, count: number, out: Float64Array, o: number, add: number): void {
  if (width === 0) {
    out.fill(add, o, o + count);
    return;
  }
  if (width > 25) {
    const view = out.subarray(o, o + count);
    unpackUnsigned(bytes, bitPos, width, count, view);
    if (add !== 0) for (let k = 0; k < count; k++) view[k] += add;
    return;
  }
  const drop = 32 - width;
  let bp = bitPos;
  const end = o + count;
  for (let k = o; k < end; k++, bp += width) {
    const p = bp >>> 3;
    const w = ((bytes[p] << 24) | (bytes[p + 1] << 16) | (bytes[p + 2] << 8) | bytes[p + 3]) >>> 0;
    out[k] = ((w << (bp & 7)) >>> drop) + add;
  }
}
