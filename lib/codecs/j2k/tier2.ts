/**
 * Tier-2 decoding (ISO/IEC 15444-1 B.9–B.12): the order of packets in a tile and each packet's
 * header (inclusion, zero bit-planes, coding passes, lengths), which hands every code-block its
 * share of the packet body, split into codeword segments.
 */
import { DecodeError } from '../../errors.js';
import { concatBytes } from './bytes.js';
import type { CodingStyle, ProgressionChange } from './markers.js';
import type { BitSource } from './tagtree.js';
import type { CodeBlock, Precinct, TileLayout } from './tile.js';
import { CB_BYPASS, CB_TERMALL, PASS_CLEANUP, passType, type Segment } from './tier1.js';

export const LRCP = 0;
export const RLCP = 1;
export const RPCL = 2;
export const PCRL = 3;
export const CPRL = 4;

/** The tile's packet data as one byte range, read across tile-part boundaries. */
export class PacketStream implements BitSource {
  readonly bytes: Uint8Array;
  pos = 0;
  private byte = 0;
  private bits = 0;

  /**
   * @param parts the byte ranges, tile-part by tile-part
   * @param name what the bytes are, for error messages ("packet data", "packed packet headers")
   */
  constructor(
    parts: readonly Uint8Array[],
    private readonly tile: number,
    private readonly name = 'packet data',
  ) {
    this.bytes = concatBytes(parts);
  }

  fail(what: string): never {
    throw new DecodeError(`JPEG 2000: tile ${this.tile}: ${what} (${this.name} byte ${this.pos})`);
  }

  /** B.10.1: header bits MSB first; a byte after 0xFF holds 7 bits. */
  bit(): number {
    if (this.bits === 0) {
      if (this.pos >= this.bytes.length) this.fail(`packet header runs past the end of the ${this.name}`);
      const previous = this.byte;
      this.byte = this.bytes[this.pos++];
      this.bits = previous === 0xff ? 7 : 8;
    }
    this.bits--;
    return (this.byte >> this.bits) & 1;
  }

  bitsValue(n: number): number {
    let v = 0;
    for (let k = 0; k < n; k++) v = v * 2 + this.bit();
    return v;
  }

  /** Ends the header at a byte boundary (a final 0xFF is followed by a stuffed byte). */
  align(): void {
    if (this.byte === 0xff) {
      if (this.pos >= this.bytes.length) this.fail(`packet header runs past the end of the ${this.name}`);
      this.pos++;
    }
    this.bits = 0;
    this.byte = 0;
  }

  /** Skips a marker of `length` bytes (after its code) at the current byte when present. */
  skipMarker(code: number, length: number): void {
    const b = this.bytes;
    if (this.pos + 1 < b.length && b[this.pos] === 0xff && b[this.pos + 1] === (code & 0xff)) this.pos += 2 + length;
  }
}

/** How many passes the codeword segment starting at pass `first` may hold (D.4.1, Table D.8). */
function newSegment(style: number, first: number): Segment {
  let maxPasses = Infinity;
  let raw = false;
  if ((style & CB_TERMALL) !== 0) {
    maxPasses = 1;
    raw = (style & CB_BYPASS) !== 0 && first >= 10 && passType(first) !== PASS_CLEANUP;
  } else if ((style & CB_BYPASS) !== 0) {
    if (first < 10) maxPasses = 10 - first;
    else if (passType(first) === PASS_CLEANUP) maxPasses = 1;
    else {
      maxPasses = 2;
      raw = true;
    }
  }
  return { maxPasses, passes: 0, raw, chunks: [], length: 0 };
}

/** B.10.6: the number of new coding passes. */
function readPassCount(s: PacketStream): number {
  if (s.bit() === 0) return 1;
  if (s.bit() === 0) return 2;
  const two = s.bitsValue(2);
  if (two < 3) return 3 + two;
  const five = s.bitsValue(5);
  if (five < 31) return 6 + five;
  return 37 + s.bitsValue(7);
}

interface Contribution {
  block: CodeBlock;
  /** Segment, byte count pairs in this packet's body. */
  pieces: { segment: Segment; bytes: number }[];
}

/**
 * Reads one packet of `precinct` for `layer`: its header from `s` (the packet data itself, or the
 * packed headers of PPM/PPT), then its body from `body`.
 */
export function readPacket(s: PacketStream, body: PacketStream, precinct: Precinct, layer: number, cod: CodingStyle): void {
  if (cod.sop) body.skipMarker(0xff91, 4);
  const contributions: Contribution[] = [];
  if (s.bit() === 1) {
    for (const pb of precinct.bands) {
      for (let k = 0; k < pb.blocks.length; k++) {
        const block = pb.blocks[k];
        let included: boolean;
        const first = !block.included;
        if (first) included = pb.inclusion.decode(s, k, layer + 1);
        else included = s.bit() === 1;
        if (!included) continue;
        if (first) {
          block.zeroPlanes = pb.zeroPlanes.decodeValue(s, k);
          block.included = true;
        }
        const passes = readPassCount(s);
        while (s.bit() === 1) block.lblock++;
        // split the new passes into codeword segments; one length per segment touched
        const pieces: Contribution['pieces'] = [];
        let left = passes;
        let pass = block.passes;
        while (left > 0) {
          let seg = block.segments[block.segments.length - 1];
          if (seg === undefined || seg.passes >= seg.maxPasses) {
            seg = newSegment(cod.cbStyle, pass);
            block.segments.push(seg);
          }
          const n = Math.min(left, seg.maxPasses - seg.passes);
          const bits = block.lblock + Math.floor(Math.log2(n));
          if (bits > 32) s.fail(`code-block length field of ${bits} bits`);
          pieces.push({ segment: seg, bytes: s.bitsValue(bits) });
          seg.passes += n;
          left -= n;
          pass += n;
        }
        block.passes = pass;
        contributions.push({ block, pieces });
      }
    }
  }
  s.align();
  if (cod.eph) s.skipMarker(0xff92, 0);
  for (const c of contributions) {
    for (const piece of c.pieces) {
      if (body.pos + piece.bytes > body.bytes.length) {
        body.fail(`code-block data of ${piece.bytes} bytes runs past the end of the tile data`);
      }
      if (piece.bytes > 0) {
        piece.segment.chunks.push(body.bytes.subarray(body.pos, body.pos + piece.bytes));
        piece.segment.length += piece.bytes;
      }
      body.pos += piece.bytes;
    }
  }
}

/** One packet's place: quality layer, resolution level, precinct index. */
export interface PacketId {
  layer: number;
  resolution: number;
  precinct: number;
}

/**
 * The tile's packets in codestream order (B.12): the COD progression, or the POC progressions in
 * turn, each packet taken the first time a progression reaches it.
 */
export function packetOrder(layout: TileLayout, cod: CodingStyle, changes: readonly ProgressionChange[]): PacketId[] {
  const res = layout.resolutions;
  const offsets: number[] = [];
  let total = 0;
  for (const r of res) {
    offsets.push(total);
    total += r.precincts.length;
  }
  const seen = new Uint8Array(total * cod.layers);
  const order: PacketId[] = [];
  const emit = (layer: number, resolution: number, precinct: number): void => {
    const key = layer * total + offsets[resolution] + precinct;
    if (seen[key] === 1) return;
    seen[key] = 1;
    order.push({ layer, resolution, precinct });
  };
  const progressions =
    changes.length > 0
      ? changes
      : [{ resolutionStart: 0, componentStart: 0, layerEnd: cod.layers, resolutionEnd: res.length, componentEnd: 1, order: cod.progression }];
  for (const p of progressions) {
    if (p.componentStart > 0 || p.componentEnd <= 0) continue; // not our component
    const r0 = p.resolutionStart;
    const r1 = Math.min(p.resolutionEnd, res.length);
    const l1 = Math.min(p.layerEnd, cod.layers);
    switch (p.order) {
      case LRCP:
        for (let l = 0; l < l1; l++) for (let r = r0; r < r1; r++) for (let k = 0; k < res[r].precincts.length; k++) emit(l, r, k);
        break;
      case RLCP:
        for (let r = r0; r < r1; r++) for (let l = 0; l < l1; l++) for (let k = 0; k < res[r].precincts.length; k++) emit(l, r, k);
        break;
      case RPCL:
        // one component: the positions of a resolution visit its precincts in raster order
        for (let r = r0; r < r1; r++) for (let k = 0; k < res[r].precincts.length; k++) for (let l = 0; l < l1; l++) emit(l, r, k);
        break;
      case PCRL:
      case CPRL: {
        const all: { r: number; k: number; x: number; y: number }[] = [];
        for (let r = r0; r < r1; r++) {
          res[r].precincts.forEach((pr, k) => all.push({ r, k, x: pr.refX, y: pr.refY }));
        }
        all.sort((a, b) => a.y - b.y || a.x - b.x || a.r - b.r);
        for (const e of all) for (let l = 0; l < l1; l++) emit(l, e.r, e.k);
        break;
      }
      default:
        throw new DecodeError(`JPEG 2000: progression order ${p.order} is reserved`);
    }
  }
  return order;
}
