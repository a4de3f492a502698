/**
 * Decoding a JPEG 2000 codestream (ISO/IEC 15444-1) of one unsigned component into its integer
 * samples: codestream syntax (markers.ts), packets (tier2.ts), code-blocks (tier1.ts),
 * dequantization (E.1), inverse wavelet transform (dwt.ts) and the DC level shift (G.1.2).
 *
 * Written for GRIB2 template 5.40, where a component may carry up to 31 bits; it reads any
 * Part 1 codestream of one component: several tiles and tile-parts, all five progression orders
 * and POC changes, precincts, layers, SOP/EPH, every code-block style, both transforms and
 * region-of-interest max-shift, and packet headers packed into PPM or PPT segments.
 */
import { DecodeError, UnsupportedError } from '../../errors.js';
import { readCodestream, type TileData, type ImageSize } from './markers.js';
import { layoutTile, packetCount, type TileLayout } from './tile.js';
import { CodeBlockDecoder, FLAG_NEGATIVE } from './tier1.js';
import { PacketStream, packetOrder, readPacket } from './tier2.js';
import { inverseTransform } from './dwt.js';

/** Bounds on what a codestream may make the decoder allocate. */
export interface J2kLimits {
  /** Most samples the image may have (GRIB: the points of the message). */
  maxSamples?: number;
}

/** Samples decoded at most when no limit is given (2^28: a 1 GiB result). */
export const J2K_MAX_SAMPLES = 2 ** 28;

/** Decoded samples of the component, row by row. */
export interface J2kSamples {
  width: number;
  height: number;
  bitsPerSample: number;
  values: Uint32Array;
}

/**
 * Code-block magnitudes are held with one fractional bit in 32-bit integers, so at most 30
 * bit-planes (ROI shift included) fit; OpenJPEG has the same bound.
 */
export const J2K_MAX_CODED_PLANES = 30;

/** Largest component precision decoded (the output is 32-bit unsigned). */
export const J2K_MAX_PRECISION = 32;

/** Round half to even, as C's lrintf in the default rounding mode. */
function roundHalfEven(v: number): number {
  const f = Math.floor(v);
  const d = v - f;
  if (d < 0.5) return f;
  if (d > 0.5) return f + 1;
  return f % 2 === 0 ? f : f + 1;
}

/** Tier-1 for every code-block of the tile, dequantized into the subband layout of `buf`. */
function decodeBlocks(tile: TileData, layout: TileLayout, buf: Int32Array | Float32Array, stride: number): void {
  const ws = new CodeBlockDecoder();
  const reversible = tile.coding.reversible;
  const roi = tile.roiShift;
  const roiThreshold = 2 ** (roi + 1); // a magnitude of 2^roi or more, in units of ½
  for (const res of layout.resolutions) {
    for (const precinct of res.precincts) {
      for (const pb of precinct.bands) {
        const band = pb.band;
        const halfStep = Math.fround(band.step / 2);
        for (const block of pb.blocks) {
          if (block.passes === 0) continue;
          const planes = band.magnitudePlanes - block.zeroPlanes + roi;
          if (planes <= 0) {
            // More zero bit-planes than the subband has (B.10.5 forbids it). OpenJPEG, the
            // JPEG 2000 coder inside ecCodes and GDAL, writes such code-blocks for 30- and 31-bit
            // samples: their detail-subband exponents exceed the 5 bits of QCD and are stored
            // modulo 32. Its decoder leaves these code-blocks at zero; so do we, to read those
            // messages as ecCodes does (the values in them are then not the values packed).
            continue;
          }
          if (planes > J2K_MAX_CODED_PLANES) {
            throw new UnsupportedError(
              `JPEG 2000: tile ${tile.index}: a code-block codes ${planes} bit-planes; at most ${J2K_MAX_CODED_PLANES} are supported`,
              'JPEG 2000 bit-planes',
              planes,
            );
          }
          const w = block.x1 - block.x0;
          const h = block.y1 - block.y0;
          const cstride = ws.decode({ width: w, height: h, band: band.type, style: tile.coding.cbStyle, planes, segments: block.segments });
          const mag = ws.mag;
          const flags = ws.flags;
          let out = (band.bufferY + block.y0 - band.y0) * stride + band.bufferX + block.x0 - band.x0;
          for (let v = 0; v < h; v++, out += stride) {
            for (let u = 0, i = (v + 1) * cstride + 1; u < w; u++, i++) {
              let m = mag[i];
              if (m === 0) continue;
              if (roi > 0 && m >= roiThreshold) m = Math.floor(m / 2 ** roi);
              const negative = (flags[i] & FLAG_NEGATIVE) !== 0;
              if (reversible) buf[out + u] = negative ? -(m >> 1) : m >> 1;
              else buf[out + u] = Math.fround(negative ? -m : m) * halfStep; // as float × float, like OpenJPEG
            }
          }
        }
      }
    }
  }
}

function decodeTile(size: ImageSize, tile: TileData, out: Uint32Array, width: number, imageX0: number, imageY0: number): void {
  const stream = new PacketStream(tile.data, tile.index);
  const headers = tile.headers === undefined ? stream : new PacketStream(tile.headers, tile.index, 'packed packet headers');
  // every packet header takes at least one byte (B.9, B.10.3), which bounds the work
  const packets = packetCount(size, tile);
  if (packets > headers.bytes.length) {
    throw new DecodeError(
      `JPEG 2000: tile ${tile.index} declares ${packets} packets (layers × precincts), more than its ${headers.bytes.length} bytes of ${tile.headers === undefined ? 'packet data' : 'packed packet headers'} can hold`,
    );
  }
  const layout = layoutTile(size, tile);
  for (const p of packetOrder(layout, tile.coding, tile.progressions)) {
    readPacket(headers, stream, layout.resolutions[p.resolution].precincts[p.precinct], p.layer, tile.coding);
  }
  const tw = layout.x1 - layout.x0;
  const th = layout.y1 - layout.y0;
  if (tw === 0 || th === 0) return;
  const buf = tile.coding.reversible ? new Int32Array(tw * th) : new Float32Array(tw * th);
  decodeBlocks(tile, layout, buf, tw);
  inverseTransform(buf, tw, layout);
  const shift = 2 ** (size.precision - 1);
  const max = 2 ** size.precision - 1;
  for (let y = 0; y < th; y++) {
    const o = (layout.y0 - imageY0 + y) * width + layout.x0 - imageX0;
    for (let x = 0, i = y * tw; x < tw; x++, i++) {
      const v = (tile.coding.reversible ? buf[i] : roundHalfEven(buf[i])) + shift;
      out[o + x] = v < 0 ? 0 : v > max ? max : v;
    }
  }
}

/**
 * Decodes a raw J2K codestream of one unsigned component.
 * @throws DecodeError when the bytes break the codestream syntax (naming what and the byte);
 *   UnsupportedError for what Part 1 allows but this decoder does not read (several components,
 *   signed samples, more than 30 coded bit-planes).
 */
export function decodeJ2k(codestream: Uint8Array, limits: J2kLimits = {}): J2kSamples {
  const cs = readCodestream(codestream, limits.maxSamples ?? J2K_MAX_SAMPLES);
  const size = cs.size;
  if (size.signed) throw new UnsupportedError('JPEG 2000: signed samples', 'JPEG 2000 signed samples', 'signed');
  if (size.precision > J2K_MAX_PRECISION) {
    throw new UnsupportedError(`JPEG 2000: ${size.precision} bits per sample`, 'JPEG 2000 bits per sample', size.precision);
  }
  const x0 = Math.ceil(size.x0 / size.dx);
  const y0 = Math.ceil(size.y0 / size.dy);
  const width = Math.ceil(size.x1 / size.dx) - x0;
  const height = Math.ceil(size.y1 / size.dy) - y0;
  const values = new Uint32Array(width * height);
  for (const tile of cs.tiles) decodeTile(size, tile, values, width, x0, y0);
  return { width, height, bitsPerSample: size.precision, values };
}
