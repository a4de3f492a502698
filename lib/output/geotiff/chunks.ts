/**
 * Cutting one image (one resolution level, all bands) into tiles or strips, applying the
 * predictor and compressing each chunk. Chunks are ordered band by band, and row-major within a
 * band, as TIFF's band-separate layout stores them (TIFF 6.0 §15, PlanarConfiguration = 2).
 */
import { constants as zlibConstants, deflate as deflateCb, deflateSync, type ZlibOptions } from 'node:zlib';
import { promisify } from 'node:util';
import type { RasterArray, ResolvedProfile } from './profile.js';
import { applyPredictor } from './predictor.js';

const deflateAsync = promisify(deflateCb);

/** Geometry of the chunks of one image. Strips are chunks of full width and are not padded. */
export interface ChunkGrid {
  readonly width: number;
  readonly height: number;
  readonly chunkWidth: number;
  readonly chunkHeight: number;
  readonly across: number;
  readonly down: number;
  readonly tiled: boolean;
}

export function chunkGrid(width: number, height: number, p: ResolvedProfile): ChunkGrid {
  if (p.tiled) {
    const s = p.blockSize;
    return { width, height, chunkWidth: s, chunkHeight: s, across: Math.ceil(width / s), down: Math.ceil(height / s), tiled: true };
  }
  const rowBytes = width * p.info.bytes;
  const rows = Math.max(1, Math.min(height, Math.floor(65536 / rowBytes)));
  return { width, height, chunkWidth: width, chunkHeight: rows, across: 1, down: Math.ceil(height / rows), tiled: false };
}

/** Fill value of padded tile edges: the nodata value when there is one, else 0. */
function padValue(p: ResolvedProfile): number {
  return p.nodata !== undefined ? p.nodata : 0;
}

/** Copies chunk (cx, cy) of a band into a new typed array (tiles padded to full size). */
export function extractChunk(band: RasterArray, g: ChunkGrid, cx: number, cy: number, p: ResolvedProfile): RasterArray {
  const x0 = cx * g.chunkWidth;
  const y0 = cy * g.chunkHeight;
  const rows = g.tiled ? g.chunkHeight : Math.min(g.chunkHeight, g.height - y0);
  const tile = p.info.create(g.chunkWidth * rows);
  const copyWidth = Math.min(g.chunkWidth, g.width - x0);
  const validRows = Math.min(rows, g.height - y0);
  const fill = padValue(p);
  for (let r = 0; r < validRows; r++) {
    const s = (y0 + r) * g.width + x0;
    tile.set(band.subarray(s, s + copyWidth), r * g.chunkWidth);
    if (copyWidth < g.chunkWidth && fill !== 0) tile.fill(fill, r * g.chunkWidth + copyWidth, (r + 1) * g.chunkWidth);
  }
  if (validRows < rows && fill !== 0) tile.fill(fill, validRows * g.chunkWidth);
  return tile;
}

function zlibOptions(p: ResolvedProfile): ZlibOptions {
  return p.runLength ? { level: 6, strategy: zlibConstants.Z_RLE } : { level: p.deflateLevel, windowBits: p.windowBits };
}

function encodeRaw(band: RasterArray, g: ChunkGrid, cx: number, cy: number, p: ResolvedProfile): Uint8Array {
  const tile = extractChunk(band, g, cx, cy, p);
  return applyPredictor(tile, g.chunkWidth, p.predictor);
}

/** Encodes every chunk of every band, synchronously. */
export function encodeChunksSync(bands: readonly RasterArray[], g: ChunkGrid, p: ResolvedProfile): Uint8Array[] {
  const out: Uint8Array[] = [];
  const opts = zlibOptions(p);
  for (const band of bands) {
    for (let cy = 0; cy < g.down; cy++) {
      for (let cx = 0; cx < g.across; cx++) {
        const raw = encodeRaw(band, g, cx, cy, p);
        out.push(p.compress === 'deflate' ? deflateSync(raw, opts) : raw);
      }
    }
  }
  return out;
}

/**
 * Encodes every chunk of every band, compressing on the libuv thread pool; at most `inFlight`
 * chunks are pending at a time so memory stays bounded.
 */
export async function encodeChunks(bands: readonly RasterArray[], g: ChunkGrid, p: ResolvedProfile, inFlight = 16): Promise<Uint8Array[]> {
  // Uncompressed and run-length chunks are cheaper to encode than to hand to the thread pool.
  if (p.compress !== 'deflate' || p.runLength) return encodeChunksSync(bands, g, p);
  const perBand = g.across * g.down;
  const total = perBand * bands.length;
  const out = new Array<Uint8Array>(total);
  let next = 0;
  const opts = zlibOptions(p);
  const worker = async (): Promise<void> => {
    while (next < total) {
      const i = next++;
      const b = Math.floor(i / perBand);
      const k = i % perBand;
      const raw = encodeRaw(bands[b], g, k % g.across, Math.floor(k / g.across), p);
      out[i] = await deflateAsync(raw, opts);
    }
  };
  await Promise.all(Array.from({ length: Math.min(inFlight, total) }, worker));
  return out;
}
