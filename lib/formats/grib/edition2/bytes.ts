/**
 * Big-endian readers for GRIB2 octets. GRIB2 signed integers are sign-and-magnitude: the top bit
 * is the sign, the rest the magnitude (WMO-No. 306, Vol. I.2, Part B, GRIB2 regulation 92.1.5).
 */

export function u8(b: Uint8Array, p: number): number {
  return b[p];
}
export function u16(b: Uint8Array, p: number): number {
  return (b[p] << 8) | b[p + 1];
}
export function u32(b: Uint8Array, p: number): number {
  return ((b[p] << 24) | (b[p + 1] << 16) | (b[p + 2] << 8) | b[p + 3]) >>> 0;
}
/** 64-bit unsigned as a number (exact below 2^53, which any real file length is). */
export function u64(b: Uint8Array, p: number): number {
  return u32(b, p) * 4294967296 + u32(b, p + 4);
}
export function s8(b: Uint8Array, p: number): number {
  const v = b[p];
  return v & 0x80 ? -(v & 0x7f) : v;
}
export function s16(b: Uint8Array, p: number): number {
  const v = u16(b, p);
  return v & 0x8000 ? -(v & 0x7fff) : v;
}
export function s32(b: Uint8Array, p: number): number {
  const v = u32(b, p);
  return v >= 0x80000000 ? -(v - 0x80000000) : v;
}
/** IEEE 754 single precision, big-endian. */
export function f32(b: Uint8Array, p: number): number {
  return new DataView(b.buffer, b.byteOffset + p, 4).getFloat32(0, false);
}
/** True when all `n` octets from p are 0xff (the GRIB "missing" value). */
export function allOnes(b: Uint8Array, p: number, n: number): boolean {
  for (let i = 0; i < n; i++) if (b[p + i] !== 0xff) return false;
  return true;
}
