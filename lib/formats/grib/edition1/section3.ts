/**
 * Section 3 of GRIB edition 1, the bit-map section (BMS).
 * Octets (FM 92 GRIB edition 1, section 3): 1–3 length, 4 number of unused bits at the end,
 * 5–6 table reference (0: the bitmap follows; otherwise the number of a predefined bitmap held by
 * the centre), 7… the bitmap, one bit per grid point in scanning order, 1 = value present.
 */
import type { MessageContext } from './context.js';
import { u16, u24 } from './octets.js';

export interface Section3 {
  readonly length: number;
  /** The whole bitmap section; bits start at byte 6. */
  readonly bytes: Uint8Array;
}

const POPCOUNT = new Uint8Array(256);
for (let i = 1; i < 256; i++) POPCOUNT[i] = (i & 1) + POPCOUNT[i >>> 1];

export function readSection3(msg: Uint8Array, p: number, end: number, numberOfPoints: number, ctx: MessageContext): Section3 {
  if (p + 6 > end) throw ctx.format(p, `section 3 needs at least 6 bytes, ${end - p} remain`);
  const length = u24(msg, p);
  if (length < 6) throw ctx.format(p, `section 3 length ${length} is less than 6`);
  if (p + length > end) throw ctx.format(p, `section 3 length ${length} runs past the end of the message (${end - p} bytes remain)`);
  const bytes = msg.subarray(p, p + length);
  const tableReference = u16(bytes, 4);
  if (tableReference !== 0) throw ctx.unsupported(p + 4, 'GRIB1 predefined bitmap', tableReference);
  const bits = (length - 6) * 8 - (bytes[3] & 0x0f);
  if (bits < numberOfPoints) {
    throw ctx.format(p, `bitmap holds ${bits} bits, the grid has ${numberOfPoints} points`);
  }
  return { length, bytes };
}

/** Number of points with a value: 1 bits among the first `numberOfPoints` bits of the bitmap. */
export function countPresent(bms: Section3, numberOfPoints: number): number {
  const bytes = bms.bytes;
  const full = numberOfPoints >>> 3;
  let present = 0;
  for (let i = 0; i < full; i++) present += POPCOUNT[bytes[6 + i]];
  const rest = numberOfPoints & 7;
  if (rest !== 0) present += POPCOUNT[bytes[6 + full] & (0xff << (8 - rest)) & 0xff];
  return present;
}

/** Spreads `packed` (one value per 1 bit) over `out` in grid order, NaN where the bit is 0. */
export function applyBitmap(bms: Section3, packed: Float64Array, out: Float64Array): void {
  const b = bms.bytes;
  let k = 0;
  for (let i = 0; i < out.length; i++) {
    out[i] = (b[6 + (i >>> 3)] >>> (7 - (i & 7))) & 1 ? packed[k++] : NaN;
  }
}
