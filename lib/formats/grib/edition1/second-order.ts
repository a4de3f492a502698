/**
 * GRIB edition 1 second-order packing (section 4 flags 0x40, grid-point data): which form the
 * extended flags of octet 14 select, and the decoding all forms share.
 *
 * Forms read (FM 92 GRIB edition 1, section 4, "grid-point data — second-order packing", and
 * Code table 11; ecCodes definitions grib1/section.4.def, the packingType concept):
 *   - general extended (0x08 | 0x10, no secondary bitmap; optional boustrophedonic ordering 0x04
 *     and spatial differencing order in the low 2 bits): ecCodes grid_second_order and its
 *     _SPD1, _SPD3, _no_SPD, _boustrophedonic variants — second-order-extended.ts;
 *   - row by row (0x10, no secondary bitmap): each row of the grid is one group —
 *     ecCodes grid_second_order_row_by_row — second-order-wmo.ts;
 *   - constant width (0x20, secondary bitmap, one width W21; optional 0x04) —
 *     ecCodes grid_second_order_constant_width — second-order-wmo.ts;
 *   - general (0x30, secondary bitmap, one width per group; optional 0x04) —
 *     ecCodes grid_second_order_general_grib1 — second-order-wmo.ts.
 * Every other combination (matrix of values 0x40, the reserved bit 0x80, a general extended
 * section with a secondary bitmap or constant width, constant width without a secondary bitmap,
 * spatial differencing or boustrophedonic ordering outside the forms that define them) is an
 * UnsupportedError naming the flags.
 * Extended flags (ecCodes grib1/11-2.table; bit 1 = 0x80): 0x40 matrix of values,
 *   0x20 secondary bitmap, 0x10 second-order values of different widths, 0x08 general extended
 *   packing, 0x04 boustrophedonic ordering, 0x02 and 0x01 the order of spatial differencing
 *   (2·bit + bit, 0..3). Octet 14 is read as flags whether or not section 4 flag 0x10
 *   ("additional flags at octet 14") is set: ecCodes writes general extended sections without it.
 *
 * Decoding: every form comes down to groups (first-order value, width, length) over one stream
 * of second-order values; value k of group g is firstOrder[g] + (its second-order value, or 0
 * when the group's width is 0). With SPD order m the first m integers are the SPD initial values
 * and the series is integrated m times, adding the bias to each m-th difference; then
 * Y = (X·2^E + R)·10^−D. Boustrophedonic ordering reverses every second row (rows 1, 3, … from 0)
 * after any bitmap has been applied (ecCodes data_apply_bitmap then data_apply_boustrophedonic,
 * its default when ECCODES_GRIBEX_BOUSTROPHEDONIC is unset).
 */
import { unpackUnsigned } from '../../../codecs/bits.js';
import type { MessageContext } from './context.js';
import { readExtendedLayout } from './second-order-extended.js';
import { readRowByRowLayout, readSecondaryBitmapLayout, type SecondOrderGrid } from './second-order-wmo.js';
import type { Section4 } from './section4.js';

export type { SecondOrderGrid } from './second-order-wmo.js';

export const EXT_RESERVED = 0x80;
export const EXT_MATRIX = 0x40;
export const EXT_SECONDARY_BITMAP = 0x20;
export const EXT_DIFFERENT_WIDTHS = 0x10;
export const EXT_GENERAL_EXTENDED = 0x08;
export const EXT_BOUSTROPHEDONIC = 0x04;

const FLAG_NAMES: readonly [number, string][] = [
  [EXT_RESERVED, 'reserved bit 1'],
  [EXT_MATRIX, 'matrix of values'],
  [EXT_SECONDARY_BITMAP, 'secondary bitmap'],
  [EXT_DIFFERENT_WIDTHS, 'second-order values of different widths'],
  [EXT_GENERAL_EXTENDED, 'general extended second-order packing'],
  [EXT_BOUSTROPHEDONIC, 'boustrophedonic ordering'],
];

function describeFlags(ext: number): string {
  const on = FLAG_NAMES.filter(([bit]) => ext & bit).map(([, name]) => name);
  if (!(ext & EXT_DIFFERENT_WIDTHS)) on.push('second-order values of constant width');
  on.push(`spatial differencing order ${ext & 3}`);
  return on.join(', ');
}

/** The forms of second-order packing this decoder reads, named as ecCodes' packingType is. */
export type SecondOrderForm = 'general-extended' | 'row-by-row' | 'constant-width' | 'general';

const SUPPORTED =
  'read are: general extended packing with different widths and no secondary bitmap; ' +
  'row by row (different widths, no secondary bitmap, no boustrophedonic ordering); ' +
  'constant or different widths with a secondary bitmap; spatial differencing only with general extended packing';

export interface SecondOrderHeader {
  readonly extendedFlags: number;
  readonly form: SecondOrderForm;
  readonly orderOfSpd: number;
  readonly boustrophedonic: boolean;
}

/** Checks the extended flags (octet 14) and returns the form they select. */
export function readSecondOrderHeader(bds: Section4, ctx: MessageContext): SecondOrderHeader {
  if (bds.length < 22) throw ctx.format(bds.offset, `section 4 of second-order packing needs at least 22 bytes, has ${bds.length}`);
  const ext = bds.bytes[13];
  const unsupported = () =>
    ctx.unsupported(bds.offset + 13, 'GRIB1 second-order packing with extended flags', `0x${ext.toString(16).padStart(2, '0')}`, `${describeFlags(ext)}; ${SUPPORTED}`);
  if (ext & (EXT_RESERVED | EXT_MATRIX)) throw unsupported();
  const secondary = (ext & EXT_SECONDARY_BITMAP) !== 0;
  const different = (ext & EXT_DIFFERENT_WIDTHS) !== 0;
  const boustrophedonic = (ext & EXT_BOUSTROPHEDONIC) !== 0;
  const orderOfSpd = ext & 3;
  let form: SecondOrderForm;
  if (ext & EXT_GENERAL_EXTENDED) {
    if (secondary || !different) throw unsupported();
    if (bds.length < 25) throw ctx.format(bds.offset, `section 4 of general extended second-order packing needs 25 bytes, has ${bds.length}`);
    form = 'general-extended';
  } else {
    // Spatial differencing belongs to general extended packing only; ecCodes ignores these bits
    // (and boustrophedonic ordering for row by row) in the other forms, so they are refused here.
    if (orderOfSpd !== 0) throw unsupported();
    if (secondary) form = different ? 'general' : 'constant-width';
    else if (different && !boustrophedonic) form = 'row-by-row';
    else throw unsupported();
  }
  return { extendedFlags: ext, form, orderOfSpd, boustrophedonic };
}

/** The group descriptors of a second-order section, checked against the section and the count. */
export interface SecondOrderLayout {
  readonly order: number;
  /** SPD initial values followed by the bias. */
  readonly spd: readonly number[];
  readonly widths: Uint32Array;
  readonly lengths: Uint32Array;
  readonly firsts: Float64Array;
  /** Bit position in section 4 of the second-order values. */
  readonly dataBit: number;
}

/**
 * Reads and checks the descriptors for the `grid.count` coded values (allocations are bounded by
 * the section length or by the count, which the caller has bounded).
 */
export function readSecondOrderLayout(bds: Section4, header: SecondOrderHeader, grid: SecondOrderGrid, ctx: MessageContext): SecondOrderLayout {
  let layout: SecondOrderLayout;
  switch (header.form) {
    case 'general-extended':
      layout = readExtendedLayout(bds, header.orderOfSpd, grid.count, ctx);
      break;
    case 'row-by-row':
      layout = readRowByRowLayout(bds, grid, ctx);
      break;
    case 'constant-width':
    case 'general':
      layout = readSecondaryBitmapLayout(bds, header.form === 'general', grid.count, ctx);
      break;
  }
  checkDataLength(bds, layout, ctx);
  return layout;
}

/**
 * The second-order values must lie inside the section. The unused-bits count of octet 4 is not
 * held against them: ecCodes 2.28 ignores it for second-order packing (a fixture whose count is
 * set to 15 decodes unchanged there), and archives written by other encoders may not keep it.
 */
function checkDataLength(bds: Section4, layout: SecondOrderLayout, ctx: MessageContext): void {
  const { widths, lengths } = layout;
  let bits = 0;
  for (let g = 0; g < widths.length; g++) bits += lengths[g] * widths[g];
  const after = bds.length - layout.dataBit / 8;
  if (bits > after * 8) {
    throw ctx.format(bds.offset, `second-order values need ${Math.ceil(bits / 8)} bytes, section 4 has ${after} after the descriptors`);
  }
}

/** Decodes the `count` coded values of a second-order section into `out`. */
export function decodeSecondOrder(bds: Section4, layout: SecondOrderLayout, decimalScale: number, count: number, out: Float64Array): void {
  const b = bds.bytes;
  const { order, spd, widths, lengths, firsts } = layout;
  const groups = widths.length;
  // X: the integers before spatial differencing is undone.
  const x = out;
  let k = order;
  let bit = layout.dataBit;
  for (let g = 0; g < groups; g++) {
    const len = lengths[g];
    const w = widths[g];
    const f = firsts[g];
    if (w === 0) {
      x.fill(f, k, k + len);
    } else {
      const group = x.subarray(k, k + len);
      unpackUnsigned(b, bit, w, len, group);
      for (let j = 0; j < len; j++) group[j] += f;
      bit += w * len;
    }
    k += len;
  }
  for (let i = 0; i < order; i++) x[i] = spd[i];
  const bias = order > 0 ? spd[order] : 0;
  if (order === 1) {
    let y = x[0];
    for (let i = 1; i < count; i++) {
      y += x[i] + bias;
      x[i] = y;
    }
  } else if (order === 2) {
    let y = x[1] - x[0];
    let z = x[1];
    for (let i = 2; i < count; i++) {
      y += x[i] + bias;
      z += y;
      x[i] = z;
    }
  } else if (order === 3) {
    let y = x[2] - x[1];
    let z = y - (x[1] - x[0]);
    let w = x[2];
    for (let i = 3; i < count; i++) {
      z += x[i] + bias;
      y += z;
      w += y;
      x[i] = w;
    }
  }
  const s = 2 ** bds.binaryScale;
  const d = 10 ** -decimalScale;
  const r = bds.referenceValue;
  for (let i = 0; i < count; i++) x[i] = (x[i] * s + r) * d;
}

/**
 * Undoes boustrophedonic ordering in place: rows 1, 3, 5, … (from 0) were stored right to left.
 * `pl` gives the row lengths of a reduced grid; otherwise `rows` rows of `columns` points.
 */
export function unBoustrophedon(values: Float64Array, rows: number, columns: number, pl: Int32Array | undefined): void {
  let start = 0;
  for (let j = 0; j < rows; j++) {
    const n = pl ? pl[j] : columns;
    if (j % 2 === 1) values.subarray(start, start + n).reverse();
    start += n;
  }
}
