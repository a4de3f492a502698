/**
 * GRIB edition 1 second-order packing, general extended form (section 4 flags 0x40 with extended
 * flags at octet 14), as ECMWF's archives and ecCodes (packingType=grid_second_order and its
 * _SPD1, _SPD3, _no_SPD, _boustrophedonic variants) write it.
 *
 * Layout, octets of section 4 (ecCodes definitions grib1/section.4.def and
 * data.grid_second_order.def; FM 92 GRIB edition 1, section 4, second-order packing):
 *   11 width of first-order values, 12–13 N1 (octet of the first-order values), 14 extended flags,
 *   15–16 N2 (octet of the second-order values), 17–18 number of groups P1, 19–20 number of
 *   second-order values P2, 21 extra groups (groups = P1 + 65536·extra), 22 width of the group
 *   widths, 23 width of the group lengths, 24–25 NL (octet of the group lengths),
 *   26 width of the spatial-differencing values when SPD is used, then the SPD order initial
 *   values (unsigned) and the SPD bias (sign and magnitude), then, each starting on an octet,
 *   the group widths, group lengths and first-order values, then the second-order values of all
 *   groups as one bit stream. NL, N1 and N2 saturate at 65535.
 * Extended flags (ecCodes grib1/11-2.table; bit 1 = 0x80): 0x40 matrix of values,
 *   0x20 secondary bitmap, 0x10 second-order values of different widths, 0x08 general extended
 *   packing, 0x04 boustrophedonic ordering, 0x02 and 0x01 the order of spatial differencing
 *   (2·bit + bit, 0..3).
 *
 * Decoding: value k of group g is firstOrder[g] + (its second-order value, or 0 when the group's
 * width is 0). With SPD order m the first m integers are the SPD initial values and the series is
 * integrated m times, adding the bias to each m-th difference; then Y = (X·2^E + R)·10^−D.
 * Boustrophedonic ordering reverses every second row (rows 1, 3, … from 0) after any bitmap has
 * been applied.
 */
import { unpackUnsigned } from '../../../codecs/bits.js';
import type { MessageContext } from './context.js';
import { signedBits, u16, unsignedBits } from './octets.js';
import type { Section4 } from './section4.js';

export const EXT_MATRIX = 0x40;
export const EXT_SECONDARY_BITMAP = 0x20;
export const EXT_DIFFERENT_WIDTHS = 0x10;
export const EXT_GENERAL_EXTENDED = 0x08;
export const EXT_BOUSTROPHEDONIC = 0x04;

const FLAG_NAMES: readonly [number, string][] = [
  [EXT_MATRIX, 'matrix of values'],
  [EXT_SECONDARY_BITMAP, 'secondary bitmap'],
  [EXT_DIFFERENT_WIDTHS, 'second-order values of different widths'],
  [EXT_GENERAL_EXTENDED, 'general extended second-order packing'],
  [EXT_BOUSTROPHEDONIC, 'boustrophedonic ordering'],
];

function describeFlags(ext: number): string {
  const on = FLAG_NAMES.filter(([bit]) => ext & bit).map(([, name]) => name);
  on.push(`spatial differencing order ${ext & 3}`);
  return on.join(', ');
}

export interface SecondOrderHeader {
  readonly extendedFlags: number;
  readonly orderOfSpd: number;
  readonly boustrophedonic: boolean;
}

/** Checks the extended flags (octet 14) and returns what they select. */
export function readSecondOrderHeader(bds: Section4, ctx: MessageContext): SecondOrderHeader {
  if (bds.length < 25) throw ctx.format(bds.offset, `section 4 of second-order packing needs 25 bytes, has ${bds.length}`);
  const ext = bds.bytes[13];
  const required = EXT_DIFFERENT_WIDTHS | EXT_GENERAL_EXTENDED;
  if ((ext & (EXT_MATRIX | EXT_SECONDARY_BITMAP | required)) !== required || ext & 0x80) {
    throw ctx.unsupported(
      bds.offset + 13,
      'GRIB1 second-order packing with extended flags',
      `0x${ext.toString(16).padStart(2, '0')}`,
      `${describeFlags(ext)}; only general extended packing with different widths and no secondary bitmap is`,
    );
  }
  return { extendedFlags: ext, orderOfSpd: ext & 3, boustrophedonic: (ext & EXT_BOUSTROPHEDONIC) !== 0 };
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
 * Reads and checks the descriptors for `count` coded values (allocations are bounded by the
 * section length or by `count`, which the caller has bounded).
 */
export function readSecondOrderLayout(bds: Section4, header: SecondOrderHeader, count: number, ctx: MessageContext): SecondOrderLayout {
  const b = bds.bytes;
  const at = (octet: number) => bds.offset + octet - 1;
  const widthFirst = b[10];
  const n1 = u16(b, 11);
  const n2 = u16(b, 14);
  const groups = u16(b, 16) + 65536 * b[20];
  const widthOfWidths = b[21];
  const widthOfLengths = b[22];
  const nl = u16(b, 23);
  const order = header.orderOfSpd;
  for (const [w, octet, name] of [
    [widthFirst, 11, 'width of first-order values'],
    [widthOfWidths, 22, 'width of group widths'],
    [widthOfLengths, 23, 'width of group lengths'],
  ] as const) {
    if (w > 32) throw ctx.decode(at(octet), `${name} ${w} is more than 32 bits`);
  }
  if (groups === 0) throw ctx.decode(at(17), 'second-order packing with 0 groups');
  let pos = 25;
  const spd: number[] = [];
  if (order > 0) {
    const w = b[25];
    if (w === 0 || w > 32) throw ctx.decode(at(26), `width of spatial-differencing values ${w} is not 1..32`);
    pos = 26;
    const bytesSpd = Math.ceil(((order + 1) * w) / 8);
    if (pos + bytesSpd > bds.length) throw ctx.format(bds.offset, 'section 4 ends inside the spatial-differencing values');
    for (let i = 0; i < order; i++) spd.push(unsignedBits(b, pos * 8 + i * w, w));
    spd.push(signedBits(b, pos * 8 + order * w, w));
    pos += bytesSpd;
  }
  const descriptors = Math.ceil((groups * widthOfWidths) / 8) + Math.ceil((groups * widthOfLengths) / 8) + Math.ceil((groups * widthFirst) / 8);
  if (pos + descriptors > bds.length) {
    throw ctx.format(bds.offset, `section 4 of ${bds.length} bytes cannot hold the descriptors of ${groups} groups`);
  }
  if (groups > count) throw ctx.decode(at(17), `${groups} groups for ${count} values`);
  const widths = new Uint32Array(groups);
  const lengths = new Uint32Array(groups);
  const firsts = new Float64Array(groups);
  const expectOctet = (coded: number, actual: number, octet: number, name: string) => {
    if (coded !== 65535 && coded !== actual + 1) {
      throw ctx.decode(at(octet), `${name} is octet ${coded}, the descriptors put it at octet ${actual + 1}`);
    }
  };
  unpackUnsigned(b, pos * 8, widthOfWidths, groups, widths);
  pos += Math.ceil((groups * widthOfWidths) / 8);
  expectOctet(nl, pos, 24, 'NL (start of group lengths)');
  unpackUnsigned(b, pos * 8, widthOfLengths, groups, lengths);
  pos += Math.ceil((groups * widthOfLengths) / 8);
  expectOctet(n1, pos, 12, 'N1 (start of first-order values)');
  unpackUnsigned(b, pos * 8, widthFirst, groups, firsts);
  pos += Math.ceil((groups * widthFirst) / 8);
  expectOctet(n2, pos, 15, 'N2 (start of second-order values)');

  let total = order;
  let dataBits = 0;
  for (let g = 0; g < groups; g++) {
    if (widths[g] > 32) throw ctx.decode(at(pos), `group ${g} has width ${widths[g]}, more than 32 bits`);
    total += lengths[g];
    dataBits += lengths[g] * widths[g];
  }
  if (total !== count) {
    throw ctx.decode(bds.offset, `second-order groups hold ${total} values (with ${order} spatial-differencing values), ${count} are expected`);
  }
  const available = (bds.length - pos) * 8;
  if (dataBits > available) {
    throw ctx.format(bds.offset, `second-order values need ${Math.ceil(dataBits / 8)} bytes, section 4 has ${bds.length - pos} after the descriptors`);
  }
  return { order, spd, widths, lengths, firsts, dataBit: pos * 8 };
}

/** Decodes the `count` coded values of a general extended second-order section into `out`. */
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
