/**
 * Assembling a GeoTIFF: the main image and (for the cloud-optimized layout) its overviews,
 * each as a list of encoded chunks, are laid out as
 *
 *   header | [structural metadata] | IFD main | IFD overview 1 | … | data of the smallest
 *   overview | … | data of overview 1 | data of the main image
 *
 * which is the layout GDAL's COG definition asks for (all IFDs before the data, the smallest
 * overview's data first). In the cloud-optimized layout each chunk is preceded by its byte count
 * (uint32) and followed by a copy of its last 4 bytes, as the structural metadata declares.
 * Classic TIFF unless the file would pass the classic 4 GiB limit, then BigTIFF.
 */
import { UnsupportedError } from '../../errors.js';
import type { ChunkGrid } from './chunks.js';
import { chunkGrid, encodeChunks, encodeChunksSync } from './chunks.js';
import { geoKeysFor, modelTags } from './georef.js';
import { gdalMetadataXml, gdalNodataText } from './gdal-metadata.js';
import { asciiBytes, ifdByteLength, writeIfd, type IfdEntry } from './ifd.js';
import { overviewBands, overviewLevels, type OverviewLevel } from './overviews.js';
import type { RasterArray, RasterMetadata, RasterProfile, ResolvedProfile } from './profile.js';
import { prepareBands, resolveProfile } from './profile.js';
import {
  BIGTIFF_MAGIC,
  CLASSIC_MAGIC,
  CLASSIC_MAX_BYTES,
  Compression,
  ExtraSampleUnspecified,
  FieldType,
  LITTLE_ENDIAN_MARK,
  PhotometricMinIsBlack,
  PlanarContig,
  PlanarSeparate,
  PredictorCode,
  ReducedResolution,
  SampleFormat,
  Tag,
} from './tiff-tags.js';

/** Encoder knobs that are not part of the raster's description. */
export interface EncodeOptions {
  /**
   * Size in bytes above which the file is written as BigTIFF (default: the classic TIFF limit,
   * 4 GiB − 1). Tests lower it to exercise BigTIFF on small files.
   */
  bigTiffThresholdBytes?: number;
}

/**
 * A compressed chunk kept in a spool file rather than in memory (band-by-band writer): where it
 * lies there, and its last (up to) 4 bytes, which the cloud-optimized trailer repeats.
 */
export interface SpooledChunk {
  readonly offset: number;
  readonly length: number;
  readonly tail: Uint8Array;
}

/** An encoded chunk, or a part of the file: bytes in memory or a range of a spool file. */
export type Chunk = Uint8Array | SpooledChunk;

export interface EncodedTiff {
  /** The file's bytes, in order, as a list of parts (spooled ranges only from a spooling writer). */
  readonly parts: Chunk[];
  readonly bytes: number;
  readonly bigTiff: boolean;
}

const HOST_LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

/** GDAL's structural metadata block of a cloud-optimized file. */
const STRUCTURAL_METADATA =
  'LAYOUT=IFDS_BEFORE_DATA\nBLOCK_ORDER=ROW_MAJOR\nBLOCK_LEADER=SIZE_AS_UINT4\nBLOCK_TRAILER=LAST_4_BYTES_REPEATED\nKNOWN_INCOMPATIBLE_EDITION=NO\n';

function structuralMetadata(): Uint8Array {
  const body = STRUCTURAL_METADATA;
  const head = `GDAL_STRUCTURAL_METADATA_SIZE=${String(body.length).padStart(6, '0')} bytes\n`;
  return asciiBytes(head + body).subarray(0, head.length + body.length);
}

/** One image of the file (the main image or an overview): its chunk geometry and encoded chunks, band-major. */
export interface Image {
  readonly grid: ChunkGrid;
  readonly chunks: readonly Chunk[];
  readonly overview: boolean;
}

/** Everything the file needs besides its pixels: the checked profile and the tags of the IFDs. */
export interface TiffHead {
  readonly p: ResolvedProfile;
  /** Chunk geometry of each image: the main image, then (cloud-optimized) each overview level. */
  readonly grids: { readonly grid: ChunkGrid; readonly overview: boolean }[];
  /** The overview levels of the cloud-optimized layout (empty otherwise). */
  readonly overviewLevels: readonly OverviewLevel[];
  readonly mainExtra: IfdEntry[];
  readonly nodataEntry?: IfdEntry;
}

/** Checks the profile and builds the tags that do not depend on the pixels. */
export function prepareHead(profile: RasterProfile, metadata: RasterMetadata | undefined): TiffHead {
  if (!HOST_LITTLE_ENDIAN) throw new UnsupportedError('the GeoTIFF encoder needs a little-endian host', 'host byte order', 'big-endian');
  const p = resolveProfile(profile);
  const geo = geoKeysFor(p.crs);
  const model = modelTags(p.transform);
  const mainExtra: IfdEntry[] = [];
  if (model.pixelScale) mainExtra.push({ tag: Tag.ModelPixelScaleTag, type: FieldType.DOUBLE, values: model.pixelScale });
  if (model.tiepoint) mainExtra.push({ tag: Tag.ModelTiepointTag, type: FieldType.DOUBLE, values: model.tiepoint });
  if (model.transformation) mainExtra.push({ tag: Tag.ModelTransformationTag, type: FieldType.DOUBLE, values: model.transformation });
  mainExtra.push({ tag: Tag.GeoKeyDirectoryTag, type: FieldType.SHORT, values: geo.directory });
  if (geo.doubles.length > 0) mainExtra.push({ tag: Tag.GeoDoubleParamsTag, type: FieldType.DOUBLE, values: geo.doubles });
  if (geo.ascii.length > 0) mainExtra.push({ tag: Tag.GeoAsciiParamsTag, type: FieldType.ASCII, values: asciiBytes(geo.ascii) });
  const xml = gdalMetadataXml(metadata, p.count);
  if (xml !== undefined) mainExtra.push({ tag: Tag.GDAL_METADATA, type: FieldType.ASCII, values: asciiBytes(xml) });
  const nodataEntry: IfdEntry | undefined =
    p.nodata === undefined ? undefined : { tag: Tag.GDAL_NODATA, type: FieldType.ASCII, values: asciiBytes(gdalNodataText(p.nodata)) };
  const ovLevels = p.cog ? overviewLevels(p.width, p.height, p.blockSize) : [];
  const grids = [
    { grid: chunkGrid(p.width, p.height, p), overview: false },
    ...ovLevels.map((lv) => ({ grid: chunkGrid(lv.width, lv.height, p), overview: true })),
  ];
  return { p, grids, overviewLevels: ovLevels, mainExtra, nodataEntry };
}

/** One band at every resolution of the file: the band itself, then each overview level. */
export function bandLevels(head: TiffHead, band: RasterArray): RasterArray[] {
  const { p } = head;
  return head.overviewLevels.length === 0 ? [band] : [band, ...overviewBands(band, p.width, p.height, head.overviewLevels, p)];
}

interface Prepared {
  readonly head: TiffHead;
  /** levels[image][band]: the pixels of each image, band by band. */
  readonly levels: RasterArray[][];
}

function prepare(profile: RasterProfile, bands: readonly ArrayLike<number>[], metadata: RasterMetadata | undefined): Prepared {
  const head = prepareHead(profile, metadata);
  const perBand = prepareBands(head.p, bands).map((b) => bandLevels(head, b));
  return { head, levels: head.grids.map((_, k) => perBand.map((lv) => lv[k])) };
}

function imageEntries(img: Image, p: ResolvedProfile, extra: IfdEntry[], big: boolean): { entries: IfdEntry[]; offsets: IfdEntry } {
  const n = p.count;
  const g = img.grid;
  const rep = (v: number): number[] => new Array<number>(n).fill(v);
  const offsets: IfdEntry = {
    tag: g.tiled ? Tag.TileOffsets : Tag.StripOffsets,
    type: big ? FieldType.LONG8 : FieldType.LONG,
    values: new Array<number>(img.chunks.length).fill(0),
  };
  const counts: IfdEntry = {
    tag: g.tiled ? Tag.TileByteCounts : Tag.StripByteCounts,
    type: FieldType.LONG,
    values: img.chunks.map((c) => c.length),
  };
  const entries: IfdEntry[] = [
    { tag: Tag.ImageWidth, type: FieldType.LONG, values: [g.width] },
    { tag: Tag.ImageLength, type: FieldType.LONG, values: [g.height] },
    { tag: Tag.BitsPerSample, type: FieldType.SHORT, values: rep(p.info.bytes * 8) },
    { tag: Tag.Compression, type: FieldType.SHORT, values: [p.compress === 'deflate' ? Compression.deflate : Compression.none] },
    { tag: Tag.PhotometricInterpretation, type: FieldType.SHORT, values: [PhotometricMinIsBlack] },
    { tag: Tag.SamplesPerPixel, type: FieldType.SHORT, values: [n] },
    { tag: Tag.PlanarConfiguration, type: FieldType.SHORT, values: [n > 1 ? PlanarSeparate : PlanarContig] },
    {
      tag: Tag.SampleFormat,
      type: FieldType.SHORT,
      values: rep(p.info.kind === 'float' ? SampleFormat.ieeeFloat : p.info.kind === 'int' ? SampleFormat.int : SampleFormat.uint),
    },
    offsets,
    counts,
    ...extra,
  ];
  if (img.overview) entries.push({ tag: Tag.NewSubfileType, type: FieldType.LONG, values: [ReducedResolution] });
  if (g.tiled) {
    entries.push({ tag: Tag.TileWidth, type: FieldType.LONG, values: [g.chunkWidth] });
    entries.push({ tag: Tag.TileLength, type: FieldType.LONG, values: [g.chunkHeight] });
  } else {
    entries.push({ tag: Tag.RowsPerStrip, type: FieldType.LONG, values: [g.chunkHeight] });
  }
  if (p.predictor !== 'none') entries.push({ tag: Tag.Predictor, type: FieldType.SHORT, values: [PredictorCode[p.predictor]] });
  if (n > 1) entries.push({ tag: Tag.ExtraSamples, type: FieldType.SHORT, values: new Array<number>(n - 1).fill(ExtraSampleUnspecified) });
  return { entries, offsets };
}

function layout(prep: TiffHead, images: Image[], big: boolean): EncodedTiff {
  const { p } = prep;
  const header = big ? 16 : 8;
  const ghost = p.cog ? structuralMetadata() : new Uint8Array(0);
  const dirs = images.map((img, i) => {
    const extra = i === 0 ? [...prep.mainExtra] : [];
    if (prep.nodataEntry) extra.push(prep.nodataEntry);
    return imageEntries(img, p, extra, big);
  });
  const firstIfd = header + ghost.length + ((header + ghost.length) & 1);
  const starts: number[] = [];
  let pos = firstIfd;
  for (const d of dirs) {
    starts.push(pos);
    pos += ifdByteLength(d.entries, big);
  }
  const wrap = p.cog ? 8 : 0;
  const headBytes = pos;
  // Data: smallest overview first, main image last.
  for (let i = images.length - 1; i >= 0; i--) {
    const offs = dirs[i].offsets.values as number[];
    images[i].chunks.forEach((c, k) => {
      offs[k] = pos + (p.cog ? 4 : 0);
      pos += c.length + wrap;
    });
  }
  const head = new Uint8Array(headBytes);
  const dv = new DataView(head.buffer);
  dv.setUint16(0, LITTLE_ENDIAN_MARK, true);
  if (big) {
    dv.setUint16(2, BIGTIFF_MAGIC, true);
    dv.setUint16(4, 8, true);
    dv.setUint16(6, 0, true);
    dv.setBigUint64(8, BigInt(firstIfd), true);
  } else {
    dv.setUint16(2, CLASSIC_MAGIC, true);
    dv.setUint32(4, firstIfd, true);
  }
  head.set(ghost, header);
  dirs.forEach((d, i) => writeIfd(dv, starts[i], 0, d.entries, i + 1 < dirs.length ? starts[i + 1] : 0, big));
  const parts: Chunk[] = [head];
  for (let i = images.length - 1; i >= 0; i--) {
    for (const c of images[i].chunks) {
      if (p.cog) {
        const lead = new Uint8Array(4);
        new DataView(lead.buffer).setUint32(0, c.length, true);
        parts.push(lead, c);
        const trail = new Uint8Array(4);
        if (c.length >= 4) trail.set(c instanceof Uint8Array ? c.subarray(c.length - 4) : c.tail);
        parts.push(trail);
      } else parts.push(c);
    }
  }
  return { parts, bytes: pos, bigTiff: big };
}

/** Lays the images out as one file (see the file comment): classic TIFF when it fits, else BigTIFF. */
export function finish(prep: TiffHead, images: Image[], options: EncodeOptions): EncodedTiff {
  const threshold = options.bigTiffThresholdBytes ?? CLASSIC_MAX_BYTES;
  const classic = layout(prep, images, false);
  if (classic.bytes <= threshold && classic.bytes <= CLASSIC_MAX_BYTES) return classic;
  return layout(prep, images, true);
}

/** Encodes a GeoTIFF as parts, compressing on the thread pool. */
export async function encodeGeoTiffParts(
  profile: RasterProfile,
  bands: readonly ArrayLike<number>[],
  metadata?: RasterMetadata,
  options: EncodeOptions = {},
): Promise<EncodedTiff> {
  const { head, levels } = prepare(profile, bands, metadata);
  const images: Image[] = [];
  for (const [k, { grid, overview }] of head.grids.entries()) {
    images.push({ grid, chunks: await encodeChunks(levels[k], grid, head.p), overview });
  }
  return finish(head, images, options);
}

/** Encodes a GeoTIFF in memory, synchronously (bands in raster order, one typed array each). */
export function encodeGeoTiff(
  profile: RasterProfile,
  bands: readonly ArrayLike<number>[],
  metadata?: RasterMetadata,
  options: EncodeOptions = {},
): Uint8Array {
  const { head, levels } = prepare(profile, bands, metadata);
  const images = head.grids.map(({ grid, overview }, k) => ({ grid, chunks: encodeChunksSync(levels[k], grid, head.p), overview }));
  const enc = finish(head, images, options);
  const out = new Uint8Array(enc.bytes);
  let at = 0;
  for (const part of enc.parts) {
    if (!(part instanceof Uint8Array)) throw new Error('in-memory encoding met a spooled chunk');
    out.set(part, at);
    at += part.length;
  }
  return out;
}
