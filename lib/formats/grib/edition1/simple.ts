/**
 * GRIB edition 1 simple packing (grid point data, section 4 flags 0x00):
 *   Y = (R + X·2^E) / 10^D
 * with X the unsigned integers of `bitsPerValue` bits from octet 12, R the reference value, E the
 * binary scale factor (section 4) and D the decimal scale factor (section 1)
 * (FM 92 GRIB edition 1, section 4, note on the representation of data). 0 bits per value is a
 * constant field Y = R / 10^D. Evaluated as (X·2^E + R)·10^−D, the order ecCodes uses.
 */
import { unpackUnsigned } from '../../../codecs/bits.js';
import type { MessageContext } from './context.js';
import type { Section4 } from './section4.js';

/**
 * Checks that section 4 holds `count` values of its width, give or take the padding encoders
 * leave: fewer bits than needed, or at least max(bits, 16) bits more, is an error (the bitmap or
 * grid does not match the data).
 */
export function checkSimple(bds: Section4, count: number, ctx: MessageContext): void {
  const bits = bds.octet11;
  if (bits === 0) return;
  if (bits > 32) throw ctx.decode(bds.offset + 10, `${bits} bits per value is more than 32`, 'bitsPerValue');
  const available = (bds.length - 11) * 8 - bds.unusedBits;
  const needed = count * bits;
  if (needed > available) {
    throw ctx.decode(bds.offset, `section 4 holds ${Math.max(0, Math.floor(available / bits))} values of ${bits} bits, ${count} are needed`);
  }
  if (available - needed >= Math.max(bits, 16)) {
    throw ctx.decode(bds.offset, `section 4 holds ${Math.floor(available / bits)} values of ${bits} bits, but ${count} are expected`);
  }
}

/** Decodes `count` packed values into `out[0..count)`. */
export function decodeSimple(bds: Section4, decimalScale: number, count: number, out: Float64Array, ctx: MessageContext): void {
  const bits = bds.octet11;
  const s = 2 ** bds.binaryScale;
  const d = 10 ** -decimalScale;
  const r = bds.referenceValue;
  if (bits === 0) {
    out.fill(r * d, 0, count);
    return;
  }
  checkSimple(bds, count, ctx);
  const b = bds.bytes;
  // Octet 12 starts on a byte: the common widths are unpacked and scaled in one pass, each in
  // a small loop of its own (one shape per loop keeps the compiled code tight).
  if (bits === 16) unpack16(b, count, s, r, d, out);
  else if (bits === 8) unpack8(b, count, s, r, d, out);
  else if (bits === 24) unpack24(b, count, s, r, d, out);
  else {
    unpackUnsigned(b, 11 * 8, bits, count, out);
    for (let i = 0; i < count; i++) out[i] = (out[i] * s + r) * d;
  }
}

// With D = 0 the factor 10^−D is exactly 1 and the multiplication is skipped (same result).
function unpack16(b: Uint8Array, count: number, s: number, r: number, d: number, out: Float64Array): void {
  if (d === 1) for (let i = 0, q = 11; i < count; i++, q += 2) out[i] = ((b[q] << 8) | b[q + 1]) * s + r;
  else for (let i = 0, q = 11; i < count; i++, q += 2) out[i] = (((b[q] << 8) | b[q + 1]) * s + r) * d;
}

function unpack8(b: Uint8Array, count: number, s: number, r: number, d: number, out: Float64Array): void {
  for (let i = 0; i < count; i++) out[i] = (b[11 + i] * s + r) * d;
}

function unpack24(b: Uint8Array, count: number, s: number, r: number, d: number, out: Float64Array): void {
  for (let i = 0, q = 11; i < count; i++, q += 3) out[i] = (((b[q] << 16) | (b[q + 1] << 8) | b[q + 2]) * s + r) * d;
}
