/**
 * GRIB edition 1 second-order packing, general extended form (extended flags 0x08 | 0x10, no
 * secondary bitmap), as ECMWF's archives and ecCodes (packingType=grid_second_order and its
 * _SPD1, _SPD3, _no_SPD, _boustrophedonic variants) write it: the group descriptors.
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
 */
import { unpackUnsigned } from '../../../codecs/bits.js';
import type { MessageContext } from './context.js';
import { signedBits, u16, unsignedBits } from './octets.js';
import type { SecondOrderLayout } from './second-order.js';
import type { Section4 } from './section4.js';

/** Reads and checks the descriptors of a general extended section for `count` coded values. */
export function readExtendedLayout(bds: Section4, order: number, count: number, ctx: MessageContext): SecondOrderLayout {
  const b = bds.bytes;
  const at = (octet: number) => bds.offset + octet - 1;
  const widthFirst = b[10];
  const n1 = u16(b, 11);
  const n2 = u16(b, 14);
  const groups = u16(b, 16) + 65536 * b[20];
  const widthOfWidths = b[21];
  const widthOfLengths = b[22];
  const nl = u16(b, 23);
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
  for (let g = 0; g < groups; g++) {
    if (widths[g] > 32) throw ctx.decode(at(pos), `group ${g} has width ${widths[g]}, more than 32 bits`);
    total += lengths[g];
  }
  if (total !== count) {
    throw ctx.decode(bds.offset, `second-order groups hold ${total} values (with ${order} spatial-differencing values), ${count} are expected`);
  }
  return { order, spd, widths, lengths, firsts, dataBit: pos * 8 };
}
