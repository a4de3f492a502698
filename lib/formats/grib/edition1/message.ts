/**
 * One GRIB edition 1 message: sections 0–5 read into a GribFieldInfo without unpacking data;
 * decode() unpacks on demand.
 *
 * Structure (FM 92 GRIB edition 1): section 0 "GRIB", 3-octet total length, edition 1; section 1
 * (PDS); section 2 (GDS) when flag bit 1 of PDS octet 8 is set; section 3 (BMS) when flag bit 2
 * is set; section 4 (BDS); section 5 "7777".
 */
import type { GribFieldInfo, GribMessageLocation } from '../types.js';
import { MessageContext } from './context.js';
import { grib1MessageLength, SECTION0_LENGTH } from './length.js';
import { u24 } from './octets.js';
import { decodeSecondOrder, readSecondOrderHeader, readSecondOrderLayout, unBoustrophedon, type SecondOrderHeader } from './second-order.js';
import { readSection1 } from './section1.js';
import { readSection2 } from './section2.js';
import { applyBitmap, countPresent, readSection3, type Section3 } from './section3.js';
import { readSection4 } from './section4.js';
import { checkSimple, decodeSimple } from './simple.js';

/**
 * Fewest points any message may declare without data to justify them (a constant field); above
 * it a message must hold at least one byte per POINTS_PER_BYTE_LIMIT points.
 */
export const POINTS_WITHOUT_DATA_LIMIT = 1 << 24;
export const POINTS_PER_BYTE_LIMIT = 64;

/**
 * Parses one GRIB1 message. `bytes` holds the whole message (it may extend past it);
 * `location` (from the file scan) gives the message number and file offset for error messages.
 */
export function parseGrib1Message(file: string, bytes: Uint8Array, location: GribMessageLocation): GribFieldInfo {
  const ctx = new MessageContext(file, location);
  if (bytes.length < SECTION0_LENGTH) throw ctx.format(0, `message is truncated: ${bytes.length} bytes, section 0 needs 8`);
  // Errors from the length rule already name the file, message and byte offset.
  const total = grib1MessageLength(bytes, { file, offset: location.offset, message: location.number });
  if (total < SECTION0_LENGTH + 28 + 11 + 4) throw ctx.format(4, `total length ${total} is too small for a GRIB1 message`);
  if (total > bytes.length) throw ctx.format(4, `message is truncated: total length ${total}, only ${bytes.length} bytes present`);
  const end = total;
  const msg = bytes.subarray(0, total);
  const large = (u24(msg, 4) & 0x800000) !== 0 && total !== u24(msg, 4);

  let p = SECTION0_LENGTH;
  const pds = readSection1(msg, p, end, ctx);
  p += pds.length;
  if (!pds.hasGds) throw ctx.unsupported(8 + 6, 'GRIB1 predefined grid (no section 2), grid definition number', pds.gridNumber);
  const gds = readSection2(msg, p, end, ctx);
  p += gds.length;
  const limit = Math.max(POINTS_WITHOUT_DATA_LIMIT, POINTS_PER_BYTE_LIMIT * total);
  if (gds.numberOfPoints > limit) {
    throw ctx.format(p - gds.length, `grid declares ${gds.numberOfPoints} points, more than a message of ${total} bytes can justify (limit ${limit})`);
  }
  let bms: Section3 | undefined;
  if (pds.hasBms) {
    bms = readSection3(msg, p, end, gds.numberOfPoints, ctx);
    p += bms.length;
  }
  const bdsLength = large ? total - p - 4 : undefined;
  const bds = readSection4(msg, p, end, bdsLength, ctx);
  p += bds.length;
  if (p + 4 > end) throw ctx.format(p, `section 4 ends at byte ${p} of the message, leaving no room for "7777" before ${end}`);
  if (msg[p] !== 0x37 || msg[p + 1] !== 0x37 || msg[p + 2] !== 0x37 || msg[p + 3] !== 0x37) {
    throw ctx.format(p, 'end marker "7777" not found after section 4');
  }
  const secondOrder: SecondOrderHeader | undefined = bds.secondOrder ? readSecondOrderHeader(bds, ctx) : undefined;
  // Simple packing: bits per value. Second-order packing (every form): octet 11 is the width of
  // the first-order values, reported as is; the quantization step is 2^E·10^−D in both cases.
  // (ecCodes' bitsPerValue for second-order packing is no octet: it is computed from the decoded
  // values, second_order_bits_per_value, as the bits of ceil((max − min)·2^−E·10^D).)
  const bitsPerValue = bds.octet11;
  const numberOfPoints = gds.numberOfPoints;

  const decode = (): Float64Array => {
    const present = bms ? countPresent(bms, numberOfPoints) : numberOfPoints;
    // Check the data against the point count before allocating anything of that size.
    const layout = secondOrder
      ? readSecondOrderLayout(bds, secondOrder, { count: present, rows: gds.rows, columns: gds.columns, pl: gds.pl, bms }, ctx)
      : undefined;
    if (!layout) checkSimple(bds, present, ctx);
    const out = new Float64Array(numberOfPoints);
    const packed = bms ? new Float64Array(present) : out;
    if (layout) decodeSecondOrder(bds, layout, pds.decimalScale, present, packed);
    else decodeSimple(bds, pds.decimalScale, present, packed, ctx);
    if (bms) applyBitmap(bms, packed, out);
    if (secondOrder?.boustrophedonic) unBoustrophedon(out, gds.rows, gds.columns, gds.pl);
    return out;
  };

  return {
    location,
    fieldIndex: 0,
    parameter: { edition: 1, table: pds.tableVersion, number: pds.parameter, centre: pds.centre },
    level: pds.level,
    referenceTime: pds.time.referenceTime,
    stepHours: pds.time.stepHours,
    validTime: pds.time.validTime,
    member: pds.member,
    productTemplate: 'grib1',
    grid: gds.grid,
    packing: secondOrder ? 'grib1-second-order' : 'grib1-simple',
    bitsPerValue,
    binaryScale: bds.binaryScale,
    decimalScale: pds.decimalScale,
    referenceValue: bds.referenceValue,
    numberOfPoints,
    hasBitmap: bms !== undefined,
    decode,
  };
}
