/**
 * Unpacking of big-endian, MSB-first packed unsigned integers of any width from 1 to 32 bits
 * (GRIB simple packing, GRIB1 second-order groups). Fast paths for 8, 12, 16, 24 and 32 bits.
 */

/**
 * Reads `count` unsigned integers of `bitsPerValue` bits, packed MSB first starting at bit
 * `bitOffset` of `bytes`, into `out[0..count)`. `bitsPerValue` 0 writes zeros.
 * The caller guarantees the packed data lies within `bytes` (checked: RangeError otherwise).
 */
export function unpackUnsigned(
  bytes: Uint8Array,
  bitOffset: number,
  bitsPerValue: number,
  count: number,
  out: Uint32Array | Float64Array | Float32Array,
): void {
  if (!(bitsPerValue >= 0 && bitsPerValue <= 32) || !Number.isInteger(bitsPerValue)) {
    throw new RangeError(`bits per value ${bitsPerValue} is outside 0..32`);
  }
  if (count > out.length) throw new RangeError(`output holds ${out.length} values, ${count} requested`);
  if (bitsPerValue === 0) {
    out.fill(0, 0, count);
    return;
  }
  const endBit = bitOffset + bitsPerValue * count;
  if (endBit > bytes.length * 8) {
    throw new RangeError(`packed data needs ${Math.ceil(endBit / 8)} bytes, ${bytes.length} available`);
  }
  if ((bitOffset & 7) === 0) {
    let p = bitOffset >>> 3;
    switch (bitsPerValue) {
      case 8:
        for (let i = 0; i < count; i++) out[i] = bytes[p + i];
        return;
      case 12: {
        // two values in every three bytes
        const pairs = count >>> 1;
        for (let i = 0; i < 2 * pairs; i += 2, p += 3) {
          const b1 = bytes[p + 1];
          out[i] = (bytes[p] << 4) | (b1 >>> 4);
          out[i + 1] = ((b1 & 0x0f) << 8) | bytes[p + 2];
        }
        if ((count & 1) !== 0) out[count - 1] = (bytes[p] << 4) | (bytes[p + 1] >>> 4);
        return;
      }
      case 16:
        for (let i = 0; i < count; i++, p += 2) out[i] = (bytes[p] << 8) | bytes[p + 1];
        return;
      case 24:
        for (let i = 0; i < count; i++, p += 3) out[i] = (bytes[p] << 16) | (bytes[p + 1] << 8) | bytes[p + 2];
        return;
      case 32:
        for (let i = 0; i < count; i++, p += 4) {
          out[i] = ((bytes[p] << 24) | (bytes[p + 1] << 16) | (bytes[p + 2] << 8) | bytes[p + 3]) >>> 0;
        }
        return;
    }
  }
  // General path: a 32-bit-wide window refilled byte by byte.
  let pos = bitOffset >>> 3;
  let acc = 0; // bits held in `acc`, right-aligned
  let held = 0;
  const skip = bitOffset & 7;
  if (skip !== 0) {
    acc = bytes[pos++] & (0xff >>> skip);
    held = 8 - skip;
  }
  if (bitsPerValue <= 24) {
    const mask = (1 << bitsPerValue) - 1;
    for (let i = 0; i < count; i++) {
      while (held < bitsPerValue) {
        acc = ((acc << 8) | bytes[pos++]) & 0x7fffffff;
        held += 8;
      }
      held -= bitsPerValue;
      out[i] = (acc >>> held) & mask;
    }
    return;
  }
  // 25..32 bits: a high part of (bitsPerValue − 16) bits and a low 16-bit part, each read from the
  // 31-bit window, joined with floating arithmetic to stay exact beyond 31 bits.
  const hiBits = bitsPerValue - 16;
  const hiMask = (1 << hiBits) - 1;
  for (let i = 0; i < count; i++) {
    while (held < hiBits) {
      acc = ((acc << 8) | bytes[pos++]) & 0x7fffffff;
      held += 8;
    }
    held -= hiBits;
    const hi = (acc >>> held) & hiMask;
    while (held < 16) {
      acc = ((acc << 8) | bytes[pos++]) & 0x7fffffff;
      held += 8;
    }
    held -= 16;
    out[i] = hi * 65536 + ((acc >>> held) & 0xffff);
  }
}
