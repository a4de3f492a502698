/**
 * Geometry of one tile-component (ISO/IEC 15444-1 B.5–B.7): resolution levels, subbands,
 * precincts and code-blocks, with the quantization of each subband (E.1).
 */
import { DecodeError } from '../../errors.js';
import type { ImageSize, TileData } from './markers.js';
import type { Segment } from './tier1.js';
import { TagTree } from './tagtree.js';

export interface CodeBlock {
  /** Bounds in subband coordinates. */
  x0: number;
  y0: number;
  x1: number;
  y1: number;
  included: boolean;
  lblock: number;
  zeroPlanes: number;
  passes: number;
  segments: Segment[];
}

export interface PrecinctBand {
  band: Band;
  /** Code-blocks across and down in this precinct. */
  blocksX: number;
  blocksY: number;
  blocks: CodeBlock[];
  inclusion: TagTree;
  zeroPlanes: TagTree;
}

export interface Precinct {
  bands: PrecinctBand[];
  /** Where the precinct starts on the reference grid (B.12.1.3 position order). */
  refX: number;
  refY: number;
}

export interface Band {
  /** 0 LL, 1 HL, 2 LH, 3 HH. */
  type: number;
  x0: number;
  y0: number;
  x1: number;
  y1: number;
  /** Mb of E.1 (guard bits + exponent − 1). */
  magnitudePlanes: number;
  /** Quantization step Δb (1 for the reversible path). */
  step: number;
  /** Where the band's (x0, y0) lands in the tile buffer. */
  bufferX: number;
  bufferY: number;
}

export interface Resolution {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
  bands: Band[];
  precinctsX: number;
  precinctsY: number;
  precincts: Precinct[];
}

export interface TileLayout {
  /** Tile-component bounds. */
  x0: number;
  y0: number;
  x1: number;
  y1: number;
  resolutions: Resolution[];
}

const ceilDiv = (a: number, b: number): number => Math.ceil(a / b);
const floorDiv = (a: number, b: number): number => Math.floor(a / b);

/** The tile-component bounds of tile `t` (B.3, B.5). */
export function tileBounds(size: ImageSize, t: number): { tx0: number; ty0: number; tx1: number; ty1: number } {
  const p = t % size.tilesX;
  const q = Math.floor(t / size.tilesX);
  return {
    tx0: Math.max(size.tileX0 + p * size.tileWidth, size.x0),
    ty0: Math.max(size.tileY0 + q * size.tileHeight, size.y0),
    tx1: Math.min(size.tileX0 + (p + 1) * size.tileWidth, size.x1),
    ty1: Math.min(size.tileY0 + (q + 1) * size.tileHeight, size.y1),
  };
}

/**
 * The number of packets of a tile (layers × precincts of all resolutions), from its geometry
 * alone, so a codestream can be checked before its structures are built.
 */
export function packetCount(size: ImageSize, tile: TileData): number {
  const { tx0, ty0, tx1, ty1 } = tileBounds(size, tile.index);
  const cod = tile.coding;
  let precincts = 0;
  for (let r = 0; r <= cod.levels; r++) {
    const scale = 2 ** (cod.levels - r);
    const rx0 = ceilDiv(ceilDiv(tx0, size.dx), scale);
    const ry0 = ceilDiv(ceilDiv(ty0, size.dy), scale);
    const rx1 = ceilDiv(ceilDiv(tx1, size.dx), scale);
    const ry1 = ceilDiv(ceilDiv(ty1, size.dy), scale);
    const px = 2 ** cod.precinctWidthExp[r];
    const py = 2 ** cod.precinctHeightExp[r];
    if (rx1 > rx0 && ry1 > ry0) precincts += (ceilDiv(rx1, px) - floorDiv(rx0, px)) * (ceilDiv(ry1, py) - floorDiv(ry0, py));
  }
  return precincts * cod.layers;
}

/** Builds the resolution / band / precinct / code-block structure of a tile. */
export function layoutTile(size: ImageSize, tile: TileData): TileLayout {
  const { tx0, ty0, tx1, ty1 } = tileBounds(size, tile.index);
  const x0 = ceilDiv(tx0, size.dx);
  const y0 = ceilDiv(ty0, size.dy);
  const x1 = ceilDiv(tx1, size.dx);
  const y1 = ceilDiv(ty1, size.dy);
  const cod = tile.coding;
  const q = tile.quantization;
  const levels = cod.levels;
  const bandCount = 3 * levels + 1;
  if (q.style !== 1 && q.exponents.length < bandCount) {
    throw new DecodeError(`JPEG 2000: tile ${tile.index}: quantization gives ${q.exponents.length} step sizes for ${bandCount} subbands`);
  }
  if (cod.reversible !== (q.style === 0)) {
    // Part 1 pairs the 5/3 transform with no quantization and the 9/7 with scalar quantization
    throw new DecodeError(
      `JPEG 2000: tile ${tile.index}: ${cod.reversible ? '5/3' : '9/7'} transform with quantization style ${q.style}`,
    );
  }
  const resolutions: Resolution[] = [];
  for (let r = 0; r <= levels; r++) {
    const scale = 2 ** (levels - r);
    const rx0 = ceilDiv(x0, scale);
    const ry0 = ceilDiv(y0, scale);
    const rx1 = ceilDiv(x1, scale);
    const ry1 = ceilDiv(y1, scale);
    const below = r > 0 ? resolutions[r - 1] : undefined;
    const types = r === 0 ? [0] : [1, 2, 3];
    const bands: Band[] = types.map((type, k) => {
      const nb = r === 0 ? levels : levels - r + 1;
      const xo = type === 1 || type === 3 ? 1 : 0;
      const yo = type === 2 || type === 3 ? 1 : 0;
      const s = 2 ** nb;
      const half = r === 0 ? 0 : 2 ** (nb - 1);
      const index = r === 0 ? 0 : 3 * (r - 1) + 1 + k;
      const gain = type === 0 ? 0 : type === 3 ? 2 : 1;
      let exponent: number;
      let mantissa: number;
      if (q.style === 1) {
        exponent = q.exponents[0] - (r === 0 ? 0 : r - 1);
        mantissa = q.mantissas[0];
        if (exponent < 0) throw new DecodeError(`JPEG 2000: derived quantization exponent of subband ${index} is negative`);
      } else {
        exponent = q.exponents[index];
        mantissa = q.mantissas[index];
      }
      return {
        type,
        x0: ceilDiv(x0 - half * xo, s),
        y0: ceilDiv(y0 - half * yo, s),
        x1: ceilDiv(x1 - half * xo, s),
        y1: ceilDiv(y1 - half * yo, s),
        magnitudePlanes: q.guardBits + exponent - 1,
        step: cod.reversible ? 1 : 2 ** (size.precision + gain - exponent) * (1 + mantissa / 2048),
        bufferX: xo === 1 && below !== undefined ? below.x1 - below.x0 : 0,
        bufferY: yo === 1 && below !== undefined ? below.y1 - below.y0 : 0,
      };
    });
    const ppx = cod.precinctWidthExp[r];
    const ppy = cod.precinctHeightExp[r];
    const precinctsX = rx1 > rx0 ? ceilDiv(rx1, 2 ** ppx) - floorDiv(rx0, 2 ** ppx) : 0;
    const precinctsY = ry1 > ry0 ? ceilDiv(ry1, 2 ** ppy) - floorDiv(ry0, 2 ** ppy) : 0;
    // code-block size within this resolution's precincts (B.7)
    const xcb = Math.min(cod.cbWidthExp, r === 0 ? ppx : ppx - 1);
    const ycb = Math.min(cod.cbHeightExp, r === 0 ? ppy : ppy - 1);
    const bandPpx = r === 0 ? ppx : ppx - 1;
    const bandPpy = r === 0 ? ppy : ppy - 1;
    const px0 = floorDiv(rx0, 2 ** ppx);
    const py0 = floorDiv(ry0, 2 ** ppy);
    const precincts: Precinct[] = [];
    for (let j = 0; j < precinctsY; j++) {
      for (let i = 0; i < precinctsX; i++) {
        const pbs: PrecinctBand[] = bands.map((band) => {
          const bx0 = Math.max(band.x0, (px0 + i) * 2 ** bandPpx);
          const by0 = Math.max(band.y0, (py0 + j) * 2 ** bandPpy);
          const bx1 = Math.min(band.x1, (px0 + i + 1) * 2 ** bandPpx);
          const by1 = Math.min(band.y1, (py0 + j + 1) * 2 ** bandPpy);
          let blocksX = 0;
          let blocksY = 0;
          const blocks: CodeBlock[] = [];
          if (bx1 > bx0 && by1 > by0) {
            const cx0 = floorDiv(bx0, 2 ** xcb);
            const cy0 = floorDiv(by0, 2 ** ycb);
            blocksX = ceilDiv(bx1, 2 ** xcb) - cx0;
            blocksY = ceilDiv(by1, 2 ** ycb) - cy0;
            for (let v = 0; v < blocksY; v++) {
              for (let u = 0; u < blocksX; u++) {
                blocks.push({
                  x0: Math.max(bx0, (cx0 + u) * 2 ** xcb),
                  y0: Math.max(by0, (cy0 + v) * 2 ** ycb),
                  x1: Math.min(bx1, (cx0 + u + 1) * 2 ** xcb),
                  y1: Math.min(by1, (cy0 + v + 1) * 2 ** ycb),
                  included: false,
                  lblock: 3,
                  zeroPlanes: 0,
                  passes: 0,
                  segments: [],
                });
              }
            }
          }
          return {
            band,
            blocksX,
            blocksY,
            blocks,
            inclusion: new TagTree(blocksX, blocksY),
            zeroPlanes: new TagTree(blocksX, blocksY),
          };
        });
        // reference-grid start of the precinct (B.12.1.3): the tile origin for a first precinct
        // that the tile cuts, else its own corner
        const scaleX = size.dx * scale;
        const scaleY = size.dy * scale;
        const cornerX = (px0 + i) * 2 ** ppx;
        const cornerY = (py0 + j) * 2 ** ppy;
        precincts.push({
          bands: pbs,
          refX: cornerX < rx0 ? tx0 : cornerX * scaleX,
          refY: cornerY < ry0 ? ty0 : cornerY * scaleY,
        });
      }
    }
    resolutions.push({ x0: rx0, y0: ry0, x1: rx1, y1: ry1, bands, precinctsX, precinctsY, precincts });
  }
  return { x0, y0, x1, y1, resolutions };
}
