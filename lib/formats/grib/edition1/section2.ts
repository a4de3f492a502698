/**
 * Section 2 of GRIB edition 1, the grid description section (GDS).
 * Octets common to all grids (FM 92 GRIB edition 1, section 2): 1–3 length, 4 NV (number of
 * vertical coordinate parameters), 5 PV/PL location (octet of the list of vertical coordinates,
 * or of the list of points per row when NV = 0; 255 when neither is present), 6 data
 * representation type (Code table 6). Octets 7–32 depend on the type (grids.ts).
 * A quasi-regular (reduced) grid has Ni = all ones (65535) and a list of Nj two-octet row point
 * counts after the vertical coordinates (4·NV octets).
 */
import type { GribGridDefinition } from '../types.js';
import type { MessageContext } from './context.js';
import { u16, u24 } from './octets.js';
import { readGrid } from './grids.js';

export interface Section2 {
  readonly length: number;
  readonly grid: GribGridDefinition;
  readonly numberOfPoints: number;
  /** Rows and columns for row-wise reordering (boustrophedonic second-order packing). */
  readonly rows: number;
  readonly columns: number;
  /** Row point counts of a reduced grid, storage order. */
  readonly pl: Int32Array | undefined;
}

export function readSection2(msg: Uint8Array, p: number, end: number, ctx: MessageContext): Section2 {
  if (p + 6 > end) throw ctx.format(p, `section 2 needs at least 6 bytes, ${end - p} remain`);
  const length = u24(msg, p);
  if (length < 32) throw ctx.format(p, `section 2 length ${length} is less than 32`);
  if (p + length > end) throw ctx.format(p, `section 2 length ${length} runs past the end of the message (${end - p} bytes remain)`);
  const s = msg.subarray(p, p + length);
  const nv = s[3];
  const pvl = s[4];
  const readPl = (nj: number): Int32Array => {
    const start = pvl === 255 ? 32 : pvl - 1 + 4 * nv;
    if (pvl !== 255 && pvl < 7) throw ctx.format(p + 4, `PV/PL location ${pvl} points into the section header`);
    if (nj <= 0 || start + 2 * nj > length) {
      throw ctx.format(p, `section 2 of length ${length} cannot hold ${nj} row point counts from octet ${start + 1}`);
    }
    const pl = new Int32Array(nj);
    for (let j = 0; j < nj; j++) pl[j] = u16(s, start + 2 * j);
    return pl;
  };
  return { length, ...readGrid(s, p, readPl, ctx) };
}
