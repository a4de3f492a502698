/**
 * PNG quicklook of one band: a title line, the map (frostgrid's colour ramp for continuous
 * fields, a two-colour style for 0/1 masks, grey for nodata) with coastlines, and a legend.
 */
import { encode } from 'fast-png';
import type { Crs } from '../../grid/types.js';
import { OutputError, ParameterError } from '../../errors.js';
import { writePartsAtomically } from '../geotiff/write.js';
import { Canvas, textWidth } from './canvas.js';
import { coastlinesOnRaster } from './coastlines.js';
import { GLYPH_HEIGHT } from './font.js';
import { BACKGROUND, COAST_COLOUR, MASK_COLOURS, NODATA_COLOUR, TEXT_COLOUR, rampColour, type Rgb } from './ramp.js';

export interface QuicklookImage {
  /** Values in raster order (rows north to south). */
  values: Float32Array | Uint8Array;
  width: number;
  height: number;
  transform: readonly [number, number, number, number, number, number];
  crs: Crs | { epsg: number };
  kind: 'mask' | 'continuous';
  /** Title line: quantity, level, valid time. */
  title: string;
  units?: string;
  /** Value range of the colour ramp (default: the finite values' minimum and maximum). */
  range?: [number, number];
  nodata?: number;
}

/** Geometry of a quicklook: where the map sits and how big the text is. */
export interface QuicklookGeometry {
  readonly width: number;
  readonly height: number;
  readonly map: { readonly x: number; readonly y: number; readonly w: number; readonly h: number };
  readonly textScale: number;
}

const PAD = 6;
const MAX_MAP_WIDTH = 2000;
const MIN_MAP_WIDTH = 720;

/** Layout of the picture for a raster of the given size. */
export function quicklookGeometry(width: number, height: number): QuicklookGeometry {
  let w = width;
  let h = height;
  if (width < MIN_MAP_WIDTH) {
    const k = Math.ceil(MIN_MAP_WIDTH / width);
    w = width * k;
    h = height * k;
  } else if (width > MAX_MAP_WIDTH) {
    w = MAX_MAP_WIDTH;
    h = Math.max(1, Math.round((height * MAX_MAP_WIDTH) / width));
  }
  const textScale = 2;
  const titleH = GLYPH_HEIGHT * textScale + 2 * PAD;
  const legendH = 14 + GLYPH_HEIGHT * textScale + 3 * PAD;
  return { width: w + 2 * PAD, height: titleH + h + legendH, map: { x: PAD, y: titleH, w, h }, textScale };
}

function isMissing(v: number, nodata: number | undefined): boolean {
  return v !== v || (nodata !== undefined && v === nodata);
}

/** Short label of a number (3 significant digits, no trailing zeros). */
export function formatValue(v: number): string {
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e5 || a < 1e-3) return v.toExponential(2).replace(/\.?0+e/, 'e');
  return String(Number(v.toPrecision(3)));
}

function valueRange(image: QuicklookImage): [number, number] {
  if (image.range) return image.range;
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of image.values) {
    if (isMissing(v, image.nodata) || !Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  return lo <= hi ? [lo, hi] : [0, 1];
}

function validate(path: string, image: QuicklookImage): void {
  const { width, height } = image;
  if (!Number.isInteger(width) || width < 1 || !Number.isInteger(height) || height < 1) {
    throw new ParameterError(`quicklook size must be positive integers, got ${width} × ${height}`, 'width', { file: path });
  }
  if (image.values.length !== width * height) {
    throw new OutputError(`quicklook has ${image.values.length} values but a ${width} × ${height} raster needs ${width * height}`, { file: path });
  }
  if (image.kind !== 'mask' && image.kind !== 'continuous') {
    throw new ParameterError(`quicklook kind must be 'mask' or 'continuous', got ${String(image.kind)}`, 'kind', { file: path });
  }
  if (image.range && !(image.range[0] < image.range[1])) {
    throw new ParameterError(`quicklook range must be increasing, got ${image.range.join(', ')}`, 'range', { file: path });
  }
}

/** Renders the quicklook to RGBA pixels. */
export function renderQuicklook(image: QuicklookImage): { geometry: QuicklookGeometry; rgba: Uint8Array } {
  const g = quicklookGeometry(image.width, image.height);
  const cv = new Canvas(g.width, g.height, BACKGROUND);
  const { map } = g;
  const [lo, hi] = valueRange(image);
  const colourOf = (v: number): Rgb => {
    if (isMissing(v, image.nodata)) return NODATA_COLOUR;
    if (image.kind === 'mask') return v > 0 ? MASK_COLOURS.on : MASK_COLOURS.off;
    return rampColour((v - lo) / (hi - lo));
  };
  for (let py = 0; py < map.h; py++) {
    const r = Math.min(image.height - 1, Math.floor((py * image.height) / map.h));
    for (let px = 0; px < map.w; px++) {
      const c = Math.min(image.width - 1, Math.floor((px * image.width) / map.w));
      cv.set(map.x + px, map.y + py, colourOf(image.values[r * image.width + c]));
    }
  }
  const sx = map.w / image.width;
  const sy = map.h / image.height;
  const resolution = map.w >= 1200 ? '50m' : '110m';
  for (const line of coastlinesOnRaster(image.crs, image.transform, image.width, image.height, resolution)) {
    for (let k = 1; k < line.length; k++) {
      const [c0, r0] = line[k - 1];
      const [c1, r1] = line[k];
      cv.line(map.x + c0 * sx, map.y + r0 * sy, map.x + c1 * sx, map.y + r1 * sy, COAST_COLOUR, map);
    }
  }
  // Frame.
  cv.rect(map.x - 1, map.y - 1, map.w + 2, 1, TEXT_COLOUR);
  cv.rect(map.x - 1, map.y + map.h, map.w + 2, 1, TEXT_COLOUR);
  cv.rect(map.x - 1, map.y - 1, 1, map.h + 2, TEXT_COLOUR);
  cv.rect(map.x + map.w, map.y - 1, 1, map.h + 2, TEXT_COLOUR);

  const s = g.textScale;
  const maxChars = Math.floor((g.width - 2 * PAD) / (6 * s));
  const title = [...image.title].length > maxChars ? [...image.title].slice(0, maxChars - 1).join('') + '…' : image.title;
  cv.text(PAD, PAD, title, TEXT_COLOUR, s);

  const ly = map.y + map.h + 2 * PAD;
  const textY = ly + 14 + PAD;
  if (image.kind === 'mask') {
    let x = PAD;
    for (const [label, colour] of [
      ['0', MASK_COLOURS.off],
      ['1', MASK_COLOURS.on],
      ['NO DATA', NODATA_COLOUR],
    ] as const) {
      cv.rect(x, ly, 28, 14, TEXT_COLOUR);
      cv.rect(x + 1, ly + 1, 26, 12, colour);
      x = cv.text(x + 34, ly + (14 - GLYPH_HEIGHT * s) / 2, label, TEXT_COLOUR, s) + 18;
    }
    if (image.units) cv.text(x, ly + (14 - GLYPH_HEIGHT * s) / 2, image.units, TEXT_COLOUR, s);
  } else {
    const barW = Math.min(360, map.w - 2 * PAD);
    for (let i = 0; i < barW; i++) cv.rect(PAD + i, ly, 1, 14, rampColour(i / (barW - 1)));
    const loText = formatValue(lo);
    const hiText = formatValue(hi);
    const midText = formatValue((lo + hi) / 2);
    cv.text(PAD, textY, loText, TEXT_COLOUR, s);
    cv.text(PAD + Math.round((barW - textWidth(midText, s)) / 2), textY, midText, TEXT_COLOUR, s);
    cv.text(PAD + barW - textWidth(hiText, s), textY, hiText, TEXT_COLOUR, s);
    if (image.units) cv.text(PAD + barW + 14, ly + (14 - GLYPH_HEIGHT * s) / 2, image.units, TEXT_COLOUR, s);
  }
  return { geometry: g, rgba: cv.data };
}

/** Writes a PNG quicklook of one band (temporary file beside the target, then renamed). */
export async function writeQuicklook(path: string, image: QuicklookImage): Promise<void> {
  validate(path, image);
  const { geometry, rgba } = renderQuicklook(image);
  const png = encode({ width: geometry.width, height: geometry.height, data: rgba, channels: 4, depth: 8 });
  await writePartsAtomically(path, [png]);
}
