/**
 * Section 6 bitmaps (WMO-No. 306, Vol. I.2, Part B, section 6): one bit per grid point in
 * scanning order, MSB first, 1 where a value is present in section 7.
 */

/** Number of set bits among the first `npoints` bits. */
export function countBitmap(bits: Uint8Array, npoints: number): number {
  let n = 0;
  const whole = npoints >>> 3;
  for (let i = 0; i < whole; i++) {
    let b = bits[i];
    b = b - ((b >>> 1) & 0x55);
    b = (b & 0x33) + ((b >>> 2) & 0x33);
    n += (b + (b >>> 4)) & 0x0f;
  }
  for (let k = whole * 8; k < npoints; k++) if (bits[k >>> 3] & (0x80 >>> (k & 7))) n++;
  return n;
}

/** Spreads packed values over the grid points; NaN where the bitmap has 0. */
export function applyBitmap(bits: Uint8Array, npoints: number, packed: Float64Array): Float64Array {
  const out = new Float64Array(npoints);
  let j = 0;
  for (let k = 0; k < npoints; k++) {
    out[k] = bits[k >>> 3] & (0x80 >>> (k & 7)) ? packed[j++] : Number.NaN;
  }
  return out;
}
