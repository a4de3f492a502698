/**
 * JPEG 2000 codestream syntax (ISO/IEC 15444-1 Annex A): the main header, tile-part headers and
 * where each tile's packet data lies. Only what a decoder of one component needs is kept; the
 * informational segments (TLM, PLM, PLT, CRG, COM, CAP, CPF) are skipped.
 */
import { DecodeError, UnsupportedError } from '../../errors.js';
import { concatBytes } from './bytes.js';

export const SOC = 0xff4f;
const CAP = 0xff50;
const SIZ = 0xff51;
const COD = 0xff52;
const COC = 0xff53;
const TLM = 0xff55;
const PLM = 0xff57;
const PLT = 0xff58;
const CPF = 0xff59;
const QCD = 0xff5c;
const QCC = 0xff5d;
const RGN = 0xff5e;
const POC = 0xff5f;
const PPM = 0xff60;
const PPT = 0xff61;
const CRG = 0xff63;
const COM = 0xff64;
const SOT = 0xff90;
const SOD = 0xff93;
export const EOC = 0xffd9;

/** Image and tile geometry (SIZ, A.5.1), for the single component. */
export interface ImageSize {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
  tileWidth: number;
  tileHeight: number;
  tileX0: number;
  tileY0: number;
  tilesX: number;
  tilesY: number;
  precision: number;
  signed: boolean;
  /** Component sub-sampling XRsiz, YRsiz. */
  dx: number;
  dy: number;
}

/** The component part of COD/COC (SPcod, SPcoc; A.6.1, A.6.2). */
export interface ComponentStyle {
  levels: number;
  /** Code-block width and height exponents (xcb, ycb of Table A.18 plus 2). */
  cbWidthExp: number;
  cbHeightExp: number;
  cbStyle: number;
  reversible: boolean;
  /** Precinct size exponents per resolution level 0…levels (15 when not given). */
  precinctWidthExp: number[];
  precinctHeightExp: number[];
}

/** Coding style of the component: COD with COC and the tile's overrides applied. */
export interface CodingStyle extends ComponentStyle {
  sop: boolean;
  eph: boolean;
  progression: number;
  layers: number;
}

/** Quantization (QCD A.6.4 / QCC A.6.5). */
export interface Quantization {
  /** 0 none, 1 scalar derived, 2 scalar expounded. */
  style: number;
  guardBits: number;
  exponents: number[];
  mantissas: number[];
}

/** One progression of a POC segment (A.6.6). */
export interface ProgressionChange {
  resolutionStart: number;
  componentStart: number;
  layerEnd: number;
  resolutionEnd: number;
  componentEnd: number;
  order: number;
}

interface HeaderParts {
  cod?: { sop: boolean; eph: boolean; progression: number; layers: number; style: ComponentStyle };
  coc?: ComponentStyle;
  qcd?: Quantization;
  qcc?: Quantization;
  roiShift?: number;
  poc: ProgressionChange[];
  /** PPM (main header) or PPT (tile-part header) segments: index Zppm/Zppt and contents. */
  packed?: { z: number; data: Uint8Array }[];
}

/** One tile: its index, its header overrides and its packet data (tile-parts in order). */
export interface TileData {
  index: number;
  coding: CodingStyle;
  quantization: Quantization;
  roiShift: number;
  progressions: ProgressionChange[];
  data: Uint8Array[];
  /** Packed packet headers (PPM or PPT, A.7.4–A.7.5), tile-part by tile-part, when the codestream has them. */
  headers?: Uint8Array[];
}

export interface Codestream {
  size: ImageSize;
  tiles: TileData[];
}

class Reader {
  constructor(
    readonly b: Uint8Array,
    public pos: number,
  ) {}
  u8(): number {
    return this.b[this.pos++];
  }
  u16(): number {
    const v = (this.b[this.pos] << 8) | this.b[this.pos + 1];
    this.pos += 2;
    return v;
  }
  u32(): number {
    const v = ((this.b[this.pos] << 24) | (this.b[this.pos + 1] << 16) | (this.b[this.pos + 2] << 8) | this.b[this.pos + 3]) >>> 0;
    this.pos += 4;
    return v;
  }
}

function fail(message: string, offset: number): never {
  throw new DecodeError(`JPEG 2000: ${message} (codestream byte ${offset})`, { offset });
}

function readSiz(r: Reader, end: number, at: number): ImageSize {
  if (end - r.pos < 36) fail('SIZ segment too short', at);
  r.u16(); // Rsiz: capabilities, informational here
  const x1 = r.u32();
  const y1 = r.u32();
  const x0 = r.u32();
  const y0 = r.u32();
  const tileWidth = r.u32();
  const tileHeight = r.u32();
  const tileX0 = r.u32();
  const tileY0 = r.u32();
  const components = r.u16();
  if (components !== 1) {
    throw new UnsupportedError(`JPEG 2000: ${components} components, GRIB needs 1`, 'JPEG 2000 component count', components);
  }
  if (end - r.pos < 3) fail('SIZ segment too short for its component', at);
  const ssiz = r.u8();
  const dx = r.u8();
  const dy = r.u8();
  const precision = (ssiz & 0x7f) + 1;
  if (x1 <= x0 || y1 <= y0) fail(`image area ${x0}…${x1} × ${y0}…${y1} is empty`, at);
  if (tileWidth === 0 || tileHeight === 0) fail('tile size is zero', at);
  if (tileX0 > x0 || tileY0 > y0 || tileX0 + tileWidth <= x0 || tileY0 + tileHeight <= y0) {
    fail('the first tile does not cover the image origin', at);
  }
  if (dx === 0 || dy === 0) fail('component sub-sampling is zero', at);
  if (precision > 38) fail(`component precision ${precision} bits is beyond 38`, at);
  return {
    x0,
    y0,
    x1,
    y1,
    tileWidth,
    tileHeight,
    tileX0,
    tileY0,
    tilesX: Math.ceil((x1 - tileX0) / tileWidth),
    tilesY: Math.ceil((y1 - tileY0) / tileHeight),
    precision,
    signed: (ssiz & 0x80) !== 0,
    dx,
    dy,
  };
}

function readComponentStyle(r: Reader, end: number, customPrecincts: boolean, at: number): ComponentStyle {
  if (end - r.pos < 5) fail('COD/COC segment too short', at);
  const levels = r.u8();
  const xcb = r.u8() + 2;
  const ycb = r.u8() + 2;
  const cbStyle = r.u8();
  const transform = r.u8();
  if (levels > 32) fail(`${levels} decomposition levels (at most 32)`, at);
  if (xcb > 10 || ycb > 10 || xcb + ycb > 12) fail(`code-block size 2^${xcb} × 2^${ycb} is not allowed`, at);
  if (transform > 1) {
    throw new UnsupportedError(`JPEG 2000: wavelet transform ${transform} (only 0 = 9/7 and 1 = 5/3 are in Part 1)`, 'JPEG 2000 transform', transform);
  }
  if ((cbStyle & 0xc0) !== 0) {
    throw new UnsupportedError(`JPEG 2000: code-block style 0x${cbStyle.toString(16)} (HT or reserved bits)`, 'JPEG 2000 code-block style', cbStyle);
  }
  const pw: number[] = [];
  const ph: number[] = [];
  for (let i = 0; i <= levels; i++) {
    if (customPrecincts) {
      if (r.pos >= end) fail('COD/COC segment ends inside its precinct sizes', at);
      const v = r.u8();
      pw.push(v & 15);
      ph.push(v >> 4);
      if (i > 0 && ((v & 15) === 0 || v >> 4 === 0)) fail('precinct size 2^0 above resolution level 0', at);
    } else {
      pw.push(15);
      ph.push(15);
    }
  }
  return { levels, cbWidthExp: xcb, cbHeightExp: ycb, cbStyle, reversible: transform === 1, precinctWidthExp: pw, precinctHeightExp: ph };
}

function readQuantization(r: Reader, end: number, at: number): Quantization {
  const sq = r.u8();
  const style = sq & 0x1f;
  const guardBits = sq >> 5;
  const exponents: number[] = [];
  const mantissas: number[] = [];
  if (style === 0) {
    while (r.pos < end) {
      exponents.push(r.u8() >> 3);
      mantissas.push(0);
    }
  } else if (style === 1 || style === 2) {
    while (r.pos + 1 < end) {
      const v = r.u16();
      exponents.push(v >> 11);
      mantissas.push(v & 0x7ff);
    }
  } else fail(`quantization style ${style} is reserved`, at);
  if (exponents.length === 0) fail('quantization segment has no step sizes', at);
  return { style, guardBits, exponents, mantissas };
}

function readPoc(r: Reader, end: number, out: ProgressionChange[]): void {
  // one component: Csiz < 257, so component numbers are one byte
  while (end - r.pos >= 7) {
    out.push({
      resolutionStart: r.u8(),
      componentStart: r.u8(),
      layerEnd: r.u16(),
      resolutionEnd: r.u8(),
      componentEnd: r.u8() || 256,
      order: r.u8(),
    });
  }
}

/** Reads one header's marker segments until SOT (main header) or SOD (tile-part header). */
function readSegments(r: Reader, parts: HeaderParts, main: boolean): number {
  const b = r.b;
  for (;;) {
    const at = r.pos;
    if (b.length - at < 4) fail(`header ends without ${main ? 'SOT' : 'SOD'}`, at);
    const marker = r.u16();
    if (main && marker === SOT) return at;
    if (!main && marker === SOD) return r.pos;
    if ((marker & 0xff00) !== 0xff00) fail(`0x${marker.toString(16)} where a marker was expected`, at);
    const length = r.u16();
    const end = at + 2 + length;
    if (length < 2 || end > b.length) fail(`marker segment 0x${marker.toString(16)} of length ${length} runs past the data`, at);
    switch (marker) {
      case SIZ:
        fail('SIZ segment repeated', at);
        break;
      case COD: {
        const scod = r.u8();
        const progression = r.u8();
        const layers = r.u16();
        r.u8(); // multiple component transform: nothing to do for one component
        if (layers === 0) fail('COD declares 0 quality layers', at);
        if (progression > 4) fail(`progression order ${progression} is reserved`, at);
        const style = readComponentStyle(r, end, (scod & 1) !== 0, at);
        parts.cod = { sop: (scod & 2) !== 0, eph: (scod & 4) !== 0, progression, layers, style };
        break;
      }
      case COC: {
        const c = r.u8();
        const scoc = r.u8();
        if (c === 0) parts.coc = readComponentStyle(r, end, (scoc & 1) !== 0, at);
        break;
      }
      case QCD:
        parts.qcd = readQuantization(r, end, at);
        break;
      case QCC: {
        if (r.u8() === 0) parts.qcc = readQuantization(r, end, at);
        break;
      }
      case RGN: {
        const c = r.u8();
        const style = r.u8();
        if (style !== 0) throw new UnsupportedError(`JPEG 2000: region-of-interest style ${style}`, 'JPEG 2000 RGN style', style);
        const shift = r.u8();
        if (c === 0) parts.roiShift = shift;
        break;
      }
      case POC:
        readPoc(r, end, parts.poc);
        break;
      case PPM:
      case PPT:
        if ((marker === PPM) !== main) fail(`${marker === PPM ? 'PPM' : 'PPT'} segment in the ${main ? 'main' : 'tile-part'} header`, at);
        if (length < 3) fail(`${marker === PPM ? 'PPM' : 'PPT'} segment of length ${length}`, at);
        (parts.packed ??= []).push({ z: r.u8(), data: b.subarray(at + 5, end) });
        break;
      case TLM:
      case PLM:
      case PLT:
      case CRG:
      case COM:
      case CAP:
      case CPF:
        break;
      default:
        if (marker >= 0xff30 && marker <= 0xff3f) break; // reserved markers without meaning here
        throw new UnsupportedError(`JPEG 2000: marker 0x${marker.toString(16)} at byte ${at}`, 'JPEG 2000 marker', marker, {
          offset: at,
        });
    }
    r.pos = end;
  }
}

function mergeCoding(main: HeaderParts, tile: HeaderParts | undefined): CodingStyle {
  // precedence (A.6): tile COC > tile COD > main COC > main COD
  const cod = tile?.cod ?? main.cod;
  if (cod === undefined) fail('no COD segment', 0);
  const style = tile?.coc ?? tile?.cod?.style ?? main.coc ?? main.cod!.style;
  return { sop: cod.sop, eph: cod.eph, progression: cod.progression, layers: cod.layers, ...style };
}

function mergeQuantization(main: HeaderParts, tile: HeaderParts | undefined): Quantization {
  const q = tile?.qcc ?? tile?.qcd ?? main.qcc ?? main.qcd;
  if (q === undefined) fail('no QCD segment', 0);
  return q;
}

/** PPM or PPT segment contents in the order of their index (Zppm, Zppt), one after another. */
function joinPacked(segments: { z: number; data: Uint8Array }[]): Uint8Array {
  return concatBytes([...segments].sort((a, b) => a.z - b.z).map((x) => x.data));
}

/** The image header: SIZ, and the component's sample grid. */
export interface ImageHeader {
  size: ImageSize;
  /** Samples across and down (after sub-sampling). */
  width: number;
  height: number;
  /** Byte after the SIZ segment. */
  end: number;
}

/**
 * Reads SOC and SIZ (A.4.1, A.5.1) at the start of a codestream.
 * @param maxSamples most samples the image may have; a larger SIZ is refused here.
 * @throws DecodeError when the bytes are not a codestream or SIZ is impossible;
 *   UnsupportedError for more than one component.
 */
export function readImageHeader(b: Uint8Array, maxSamples: number): ImageHeader {
  const r = new Reader(b, 0);
  if (b.length < 6 || r.u16() !== SOC || r.u16() !== SIZ) {
    throw new DecodeError('JPEG 2000: data does not start with a J2K codestream header (SOC, SIZ markers)', { offset: 0 });
  }
  const sizLength = r.u16();
  if (sizLength < 41 || 4 + sizLength > b.length) fail(`SIZ segment of length ${sizLength} does not fit`, 2);
  const size = readSiz(r, 4 + sizLength, 2);
  const width = Math.ceil(size.x1 / size.dx) - Math.ceil(size.x0 / size.dx);
  const height = Math.ceil(size.y1 / size.dy) - Math.ceil(size.y0 / size.dy);
  if (width * height > maxSamples) {
    throw new DecodeError(`JPEG 2000: image of ${width} × ${height} samples, more than the ${maxSamples} it may hold here`, {
      offset: 2,
    });
  }
  return { size, width, height, end: 4 + sizLength };
}

/**
 * Parses the codestream structure: main header, tile-part headers and their data ranges.
 * @param maxSamples most samples the image may have; a larger SIZ is refused before anything else.
 */
export function readCodestream(b: Uint8Array, maxSamples: number): Codestream {
  const { size, end } = readImageHeader(b, maxSamples);
  const r = new Reader(b, end);
  const main: HeaderParts = { poc: [] };
  let pos = readSegments(r, main, true);
  const tileCount = size.tilesX * size.tilesY;
  const parts = new Map<number, { header: HeaderParts; data: Uint8Array[]; headers: (Uint8Array | undefined)[]; next: number }>();
  // PPM: the packed headers of every tile-part in codestream order, each as Nppm then Nppm bytes
  const ppm = main.packed === undefined ? undefined : joinPacked(main.packed);
  let ppmPos = 0;
  for (;;) {
    if (pos + 2 <= b.length && ((b[pos] << 8) | b[pos + 1]) === EOC) break;
    if (pos + 12 > b.length) fail('codestream ends inside a tile-part header (truncated?)', pos);
    r.pos = pos;
    if (r.u16() !== SOT) fail('SOT marker expected', pos);
    if (r.u16() !== 10) fail('SOT segment length is not 10', pos);
    const tile = r.u16();
    const length = r.u32();
    const partIndex = r.u8();
    r.u8(); // TNsot
    if (tile >= tileCount) fail(`tile-part of tile ${tile}, the image has ${tileCount} tiles`, pos);
    const end = length === 0 ? b.length - 2 : pos + length;
    if (length !== 0 && length < 14) fail(`tile-part length ${length} is too short`, pos);
    if (end > b.length) fail(`tile-part of ${length} bytes runs past the end of the codestream (truncated?)`, pos);
    let entry = parts.get(tile);
    if (entry === undefined) {
      entry = { header: { poc: [] }, data: [], headers: [], next: 0 };
      parts.set(tile, entry);
    }
    if (partIndex !== entry.next) fail(`tile ${tile}: tile-part ${partIndex} out of order (expected ${entry.next})`, pos);
    entry.next++;
    const header: HeaderParts = partIndex === 0 ? entry.header : { poc: entry.header.poc };
    const dataStart = readSegments(r, header, false);
    if (dataStart > end) fail('tile-part header runs past the tile-part', pos);
    entry.data.push(b.subarray(dataStart, end));
    if (ppm !== undefined) {
      if (header.packed !== undefined) fail('PPT segment in a codestream with PPM', pos);
      if (ppmPos + 4 > ppm.length) fail(`PPM segments hold no packet headers for the tile-part at byte ${pos}`, pos);
      const n = ((ppm[ppmPos] << 24) | (ppm[ppmPos + 1] << 16) | (ppm[ppmPos + 2] << 8) | ppm[ppmPos + 3]) >>> 0;
      if (ppmPos + 4 + n > ppm.length) fail(`PPM record of ${n} bytes runs past the PPM segments`, pos);
      entry.headers.push(ppm.subarray(ppmPos + 4, ppmPos + 4 + n));
      ppmPos += 4 + n;
    } else {
      // PPT: a tile-part without one (it holds no packets) adds no headers
      entry.headers.push(header.packed === undefined ? undefined : joinPacked(header.packed));
    }
    pos = end;
    if (length === 0) break;
  }
  const tiles: TileData[] = [];
  for (let t = 0; t < tileCount; t++) {
    const entry = parts.get(t);
    if (entry === undefined) fail(`tile ${t} has no tile-part`, b.length);
    const header = entry.header;
    tiles.push({
      index: t,
      coding: mergeCoding(main, header),
      quantization: mergeQuantization(main, header),
      roiShift: header.roiShift ?? main.roiShift ?? 0,
      progressions: header.poc.length > 0 ? header.poc : main.poc,
      data: entry.data,
      ...(entry.headers.some((h) => h !== undefined) ? { headers: entry.headers.map((h) => h ?? new Uint8Array(0)) } : {}),
    });
  }
  return { size, tiles };
}
