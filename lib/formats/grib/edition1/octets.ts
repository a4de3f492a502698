/**
 * Octet readers of GRIB edition 1 (FM 92 GRIB edition 1, Part A, "Representation of numbers"):
 * unsigned big-endian integers, signed integers in sign-and-magnitude form (the leftmost bit is
 * the sign, 1 = negative) and the IBM System/360 single-precision floating-point reference value.
 * Positions are 0-based byte indices; the caller checks bounds.
 */

export function u16(b: Uint8Array, p: number): number {
  return (b[p] << 8) | b[p + 1];
}

export function u24(b: Uint8Array, p: number): number {
  return (b[p] << 16) | (b[p + 1] << 8) | b[p + 2];
}

/** Two-octet sign-and-magnitude integer. */
export function s16(b: Uint8Array, p: number): number {
  const v = u16(b, p);
  return v & 0x8000 ? -(v & 0x7fff) : v;
}

/** Three-octet sign-and-magnitude integer. */
export function s24(b: Uint8Array, p: number): number {
  const v = u24(b, p);
  return v & 0x800000 ? -(v & 0x7fffff) : v;
}

/**
 * IBM single-precision float: sign bit, 7-bit excess-64 exponent of 16, 24-bit fraction;
 * value = (−1)^s · 16^(E−64) · F / 2^24.
 */
export function ibmFloat(b: Uint8Array, p: number): number {
  const sign = b[p] & 0x80 ? -1 : 1;
  const exponent = b[p] & 0x7f;
  const fraction = u24(b, p + 1);
  if (fraction === 0) return 0;
  return sign * fraction * 2 ** (4 * (exponent - 64) - 24);
}

/**
 * Reads a sign-and-magnitude integer of `bits` bits (1..32) at bit position `bitPos`, MSB first.
 */
export function signedBits(b: Uint8Array, bitPos: number, bits: number): number {
  const v = unsignedBits(b, bitPos, bits);
  const signBit = 2 ** (bits - 1);
  return v >= signBit ? -(v - signBit) : v;
}

/** Reads an unsigned integer of `bits` bits (0..32) at bit position `bitPos`, MSB first. */
export function unsignedBits(b: Uint8Array, bitPos: number, bits: number): number {
  let v = 0;
  for (let i = 0; i < bits; i++) {
    const q = bitPos + i;
    v = v * 2 + ((b[q >>> 3] >>> (7 - (q & 7))) & 1);
  }
  return v;
}
