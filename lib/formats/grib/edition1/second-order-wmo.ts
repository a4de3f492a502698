/**
 * GRIB edition 1 second-order packing in the forms FM 92 GRIB edition 1 defines without the ECMWF
 * general extended descriptors: row by row, constant width and general (different widths with a
 * secondary bitmap). ecCodes reads them as grid_second_order_row_by_row,
 * grid_second_order_constant_width and grid_second_order_general_grib1 (and cannot write them).
 *
 * Layout, octets of section 4 (FM 92 GRIB edition 1, section 4, "grid-point data — second-order
 * packing"; ecCodes definitions grib1/data.grid_second_order_row_by_row.def,
 * _constant_width.def, _general_grib1.def):
 *   11 width of the first-order values, 12–13 N1 (octet of the first-order values), 14 extended
 *   flags, 15–16 N2 (octet of the second-order values), 17–18 P1 (number of first-order values,
 *   one per group), 19–20 P2 (number of second-order values), 21 reserved (ecCodes: extra groups,
 *   groups = P1 + 65536·octet 21), 22… the widths of the second-order values, one octet each:
 *   P1 of them with different widths (0x10), a single one (W21) with constant width;
 *   then, with a secondary bitmap (0x20), P2 bits, padded with 0 to an octet: a 1 marks the first
 *   value of each group, and the first bit is always 1 (WMO note 3);
 *   then at N1 the P1 first-order values, padded to an octet; then at N2 the P2 second-order
 *   values, one stream, each group's values of its width (none for width 0: the group is
 *   constant).
 * Without a secondary bitmap the groups are the rows of the grid (row by row): as many groups as
 * rows (Nj, or Ni when points are consecutive in j), each holding the row's points — with a
 * primary bitmap only its present points, so a row without values is a group of length 0
 * (ecCodes data_g1second_order_row_by_row_packing counts the bitmap per row; the same rule is
 * written down for GRIB2 template 5.2, notes 1 and 2).
 *
 * Where the data start: ecCodes reads the parts one after the other as above and does not read N1
 * or N2; here they must agree with that layout, except when the octet number is above 65535 and
 * cannot be held in two octets (not checked then). P2 is the length of the secondary bitmap and
 * must equal the number of coded values (when that fits in two octets); row by row does not use
 * it (nor does ecCodes). The number of coded values comes from the grid and the primary bitmap.
 */
import { unpackUnsigned } from '../../../codecs/bits.js';
import type { MessageContext } from './context.js';
import { u16 } from './octets.js';
import type { SecondOrderLayout } from './second-order.js';
import type { Section3 } from './section3.js';
import type { Section4 } from './section4.js';

/** What the row-by-row form needs to know of the grid and the primary bitmap. */
export interface SecondOrderGrid {
  /** Coded values: grid points, or the present points when there is a bitmap. */
  readonly count: number;
  /** Rows in storage order and their point counts (`pl` for a reduced grid, else `columns`). */
  readonly rows: number;
  readonly columns: number;
  readonly pl: Int32Array | undefined;
  readonly bms: Section3 | undefined;
}

const MAX_OCTET_NUMBER = 65535;

function numberOfGroups(b: Uint8Array): number {
  return u16(b, 16) + 65536 * b[20];
}

/** N1 or N2 as coded against where the layout puts the part (`pos`: 0-based byte index). */
function expectOctet(bds: Section4, ctx: MessageContext, coded: number, pos: number, octet: number, name: string): void {
  const actual = pos + 1;
  if (actual <= MAX_OCTET_NUMBER && coded !== actual) {
    throw ctx.decode(bds.offset + octet - 1, `${name} is octet ${coded}, the layout puts it at octet ${actual}`);
  }
}

/** Checks a width of second-order values (one octet at 0-based `pos`) against 32 bits. */
function checkWidth(bds: Section4, ctx: MessageContext, w: number, pos: number, group: number | undefined): void {
  if (w > 32) {
    const what = group === undefined ? 'the width of the second-order values' : `group ${group} has width`;
    throw ctx.decode(bds.offset + pos, `${what} ${w}, more than 32 bits (octet ${pos + 1} of section 4)`);
  }
}

/** Reads the first-order values at `pos`, checking N1 and N2; returns them and the data start. */
function readFirstOrder(bds: Section4, ctx: MessageContext, groups: number, pos: number): { firsts: Float64Array; dataBit: number } {
  const b = bds.bytes;
  const widthFirst = b[10];
  if (widthFirst > 32) throw ctx.decode(bds.offset + 10, `width of first-order values ${widthFirst} is more than 32 bits`);
  expectOctet(bds, ctx, u16(b, 11), pos, 12, 'N1 (start of first-order values)');
  const bytes = Math.ceil((groups * widthFirst) / 8);
  if (pos + bytes > bds.length) {
    throw ctx.format(bds.offset, `section 4 of ${bds.length} bytes cannot hold ${groups} first-order values of ${widthFirst} bits from octet ${pos + 1}`);
  }
  const firsts = new Float64Array(groups);
  unpackUnsigned(b, pos * 8, widthFirst, groups, firsts);
  pos += bytes;
  expectOctet(bds, ctx, u16(b, 14), pos, 15, 'N2 (start of second-order values)');
  return { firsts, dataBit: pos * 8 };
}

/** Number of 1 bits of the primary bitmap among points [start, start + n). */
function presentIn(bms: Section3, start: number, n: number): number {
  const b = bms.bytes;
  let present = 0;
  for (let i = start; i < start + n; i++) present += (b[6 + (i >>> 3)] >>> (7 - (i & 7))) & 1;
  return present;
}

/** Row by row (extended flags 0x10): one group per row, widths at octets 22…, no secondary bitmap. */
export function readRowByRowLayout(bds: Section4, grid: SecondOrderGrid, ctx: MessageContext): SecondOrderLayout {
  const b = bds.bytes;
  const groups = numberOfGroups(b);
  if (groups !== grid.rows) {
    throw ctx.decode(bds.offset + 16, `row-by-row second-order packing has ${groups} groups (P1), the grid has ${grid.rows} rows`);
  }
  if (21 + groups > bds.length) {
    throw ctx.format(bds.offset, `section 4 of ${bds.length} bytes cannot hold the widths of ${groups} groups from octet 22`);
  }
  const widths = new Uint32Array(groups);
  const lengths = new Uint32Array(groups);
  let start = 0;
  let total = 0;
  for (let g = 0; g < groups; g++) {
    widths[g] = b[21 + g];
    checkWidth(bds, ctx, widths[g], 21 + g, g);
    const n = grid.pl ? grid.pl[g] : grid.columns;
    lengths[g] = grid.bms ? presentIn(grid.bms, start, n) : n;
    total += lengths[g];
    start += n;
  }
  if (total !== grid.count) {
    throw ctx.decode(bds.offset, `the rows of the grid hold ${total} values, ${grid.count} are expected`);
  }
  const { firsts, dataBit } = readFirstOrder(bds, ctx, groups, 21 + groups);
  return { order: 0, spd: [], widths, lengths, firsts, dataBit };
}

/**
 * Constant width (0x20) or general (0x30, `different`): groups marked by the secondary bitmap.
 * `count` is the number of coded values (grid points, or present points with a primary bitmap).
 */
export function readSecondaryBitmapLayout(bds: Section4, different: boolean, count: number, ctx: MessageContext): SecondOrderLayout {
  const b = bds.bytes;
  const groups = numberOfGroups(b);
  const p2 = u16(b, 18);
  if (groups === 0) throw ctx.decode(bds.offset + 16, 'second-order packing with 0 groups (P1)');
  if (groups > count) throw ctx.decode(bds.offset + 16, `${groups} groups (P1) for ${count} values`);
  if (count <= 65535 && p2 !== count) {
    throw ctx.decode(bds.offset + 18, `P2 says ${p2} second-order values (the length of the secondary bitmap), the grid and bitmap give ${count}`);
  }
  const widthOctets = different ? groups : 1;
  let pos = 21 + widthOctets;
  const bitmapBytes = Math.ceil(count / 8);
  if (pos + bitmapBytes > bds.length) {
    throw ctx.format(bds.offset, `section 4 of ${bds.length} bytes cannot hold ${widthOctets} widths and a secondary bitmap of ${count} bits from octet 22`);
  }
  const widths = new Uint32Array(groups);
  if (different) {
    for (let g = 0; g < groups; g++) {
      widths[g] = b[21 + g];
      checkWidth(bds, ctx, widths[g], 21 + g, g);
    }
  } else {
    checkWidth(bds, ctx, b[21], 21, undefined);
    widths.fill(b[21]);
  }
  // The secondary bitmap: a 1 at the first value of each group.
  const bit0 = pos * 8;
  if (count > 0 && !((b[pos] >>> 7) & 1)) {
    throw ctx.decode(bds.offset + pos, `the secondary bitmap (octet ${pos + 1} of section 4) does not start with 1: its first value belongs to no group`);
  }
  let starts = 0;
  for (let i = 0; i < count; i++) starts += (b[(bit0 + i) >>> 3] >>> (7 - ((bit0 + i) & 7))) & 1;
  if (starts !== groups) {
    throw ctx.decode(bds.offset + pos, `the secondary bitmap marks ${starts} group starts, P1 says ${groups} groups`);
  }
  const lengths = new Uint32Array(groups);
  let g = -1;
  for (let i = 0; i < count; i++) {
    if ((b[(bit0 + i) >>> 3] >>> (7 - ((bit0 + i) & 7))) & 1) g++;
    lengths[g]++;
  }
  pos += bitmapBytes;
  const { firsts, dataBit } = readFirstOrder(bds, ctx, groups, pos);
  return { order: 0, spd: [], widths, lengths, firsts, dataBit };
}
