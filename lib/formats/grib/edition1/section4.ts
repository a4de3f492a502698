/**
 * Section 4 of GRIB edition 1, the binary data section (BDS): the header shared by all packings.
 * Octets (FM 92 GRIB edition 1, section 4): 1–3 length, 4 flags (Code table 11) in the high four
 * bits and the number of unused bits at the end of the section in the low four, 5–6 binary scale
 * factor E (sign and magnitude), 7–10 reference value R (IBM float), 11 bits per value (simple
 * packing) or width of the first-order values (second-order packing), 12… packed data.
 *
 * Flags (Code table 11): 0x80 spherical harmonics, 0x40 complex / second-order packing,
 * 0x20 integer values, 0x10 additional flags at octet 14.
 */
import type { MessageContext } from './context.js';
import { ibmFloat, s16, u24 } from './octets.js';

export const BDS_SPHERICAL = 0x80;
export const BDS_SECOND_ORDER = 0x40;
export const BDS_ADDITIONAL_FLAGS = 0x10;
/** Binary scale factor ecCodes uses to mark a field without data values (data_dummy_field). */
const DUMMY_FIELD_SCALE = -32767;

export interface Section4 {
  /** Offset of the section in the message. */
  readonly offset: number;
  readonly length: number;
  readonly bytes: Uint8Array;
  readonly flags: number;
  readonly unusedBits: number;
  readonly binaryScale: number;
  readonly referenceValue: number;
  /** Octet 11. */
  readonly octet11: number;
  readonly secondOrder: boolean;
}

/**
 * Reads the section 4 header at message offset `p`. `trueLength` replaces the coded length for
 * large messages (see length.ts).
 */
export function readSection4(msg: Uint8Array, p: number, end: number, trueLength: number | undefined, ctx: MessageContext): Section4 {
  if (p + 11 > end) throw ctx.format(p, `section 4 needs at least 11 bytes, ${end - p} remain`);
  const length = trueLength ?? u24(msg, p);
  if (length < 11) throw ctx.format(p, `section 4 length ${length} is less than 11`);
  if (p + length > end) throw ctx.format(p, `section 4 length ${length} runs past the end of the message (${end - p} bytes remain)`);
  const bytes = msg.subarray(p, p + length);
  const flags = bytes[3] & 0xf0;
  if (flags & BDS_SPHERICAL) throw ctx.unsupported(p + 3, 'GRIB1 spherical harmonic data (section 4 flags)', `0x${flags.toString(16)}`);
  const secondOrder = (flags & BDS_SECOND_ORDER) !== 0;
  if (!secondOrder && flags & BDS_ADDITIONAL_FLAGS) {
    throw ctx.unsupported(p + 3, 'GRIB1 simple packing with additional flags (matrix of values, section 4 flags)', `0x${flags.toString(16)}`);
  }
  const binaryScale = s16(bytes, 4);
  if (binaryScale === DUMMY_FIELD_SCALE) throw ctx.unsupported(p + 4, 'GRIB1 field without data (binary scale factor)', binaryScale);
  return {
    offset: p,
    length,
    bytes,
    flags,
    unusedBits: bytes[3] & 0x0f,
    binaryScale,
    referenceValue: ibmFloat(bytes, 6),
    octet11: bytes[10],
    secondOrder,
  };
}
