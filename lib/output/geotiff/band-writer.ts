/**
 * Writing a GeoTIFF band by band. Each band is checked, its overviews computed (cloud-optimized
 * layout) and all its chunks compressed as soon as it is added; only the compressed chunks are
 * kept, so a many-band file never holds more than one raw band (and its overviews) in memory.
 * With a spool directory the compressed chunks go to a temporary file there instead of memory
 * (noise-like float data barely compresses, so a 37-band global file is hundreds of megabytes).
 * `finish` lays the chunks out exactly as the all-at-once writer does (encoder.ts) and writes the
 * file atomically (write.ts); the two produce byte-identical files for the same bands.
 */
import { open, rm, type FileHandle } from 'node:fs/promises';
import { OutputError } from '../../errors.js';
import { encodeChunks } from './chunks.js';
import { bandLevels, finish, prepareHead, type Chunk, type EncodeOptions, type TiffHead } from './encoder.js';
import { prepareBand, type RasterMetadata, type RasterProfile } from './profile.js';
import { temporaryPathBeside, writePartsAtomically, type WrittenRaster } from './write.js';

type WriterState = 'open' | 'adding' | 'finishing' | 'closed';

/** Options of the band-by-band writer. */
export interface BandWriterOptions extends EncodeOptions {
  /**
   * Directory for a temporary spool file that holds the compressed chunks until `finish` (created
   * at the first band, removed by finish and abort). Default: chunks stay in memory.
   */
  spoolDirectory?: string;
}

/** The spool file: its handle and how many bytes it holds. */
interface Spool {
  readonly path: string;
  readonly fh: FileHandle;
  size: number;
}

/**
 * A zlib output buffer can be much larger than the chunk it holds (a few hundred bytes of a
 * run-length mask tile in a 16 KiB buffer); such chunks are copied so only their bytes are kept.
 */
function compact(chunk: Uint8Array): Uint8Array {
  return chunk.buffer.byteLength > 2 * chunk.byteLength + 1024 ? new Uint8Array(chunk) : chunk;
}

/**
 * A GeoTIFF being written band by band (see `openGeoTiffWriter`).
 *
 * Bands are added in order, band 1 first, and one at a time: await each `addBand` before the
 * next (a second call while one is pending is an OutputError). A band that fails its checks is
 * not added and the writer stays usable. After `finish` succeeds or fails while writing, or after
 * `abort`, the writer is closed and keeps nothing.
 */
export class GeoTiffBandWriter {
  readonly path: string;
  readonly #profile: RasterProfile;
  #head: TiffHead;
  readonly #options: BandWriterOptions;
  /** chunks[image]: the compressed chunks of each image (main image, then overviews), band-major. */
  #chunks: Chunk[][];
  #spool: Promise<Spool> | undefined;
  #added = 0;
  #state: WriterState = 'open';

  /** Checks the profile (ParameterError / UnsupportedError as writeGeoTiff throws them); touches no file. */
  constructor(path: string, profile: RasterProfile, metadata?: RasterMetadata, options: BandWriterOptions = {}) {
    this.path = path;
    this.#profile = profile;
    this.#head = prepareHead(profile, metadata);
    this.#options = { ...options };
    this.#chunks = this.#head.grids.map(() => []);
  }

  /** Number of bands added so far. */
  get bandsAdded(): number {
    return this.#added;
  }

  /** Number of bands the profile declares. */
  get count(): number {
    return this.#head.p.count;
  }

  #usable(action: string): void {
    if (this.#state === 'closed') throw new OutputError(`cannot ${action}: the writer of ${this.path} is closed`, { file: this.path });
    if (this.#state === 'adding') {
      throw new OutputError(`cannot ${action} while band ${this.#added + 1} of ${this.path} is being encoded; await each addBand before the next call`, {
        file: this.path,
      });
    }
    if (this.#state === 'finishing') throw new OutputError(`cannot ${action}: ${this.path} is being written`, { file: this.path });
  }

  /**
   * Adds the next band (raster order, width × height values, of any numeric array type): checks
   * it as writeGeoTiff does, computes its overviews, compresses its chunks and keeps only those.
   * The caller's array is not kept and may be reused once the promise settles.
   */
  async addBand(band: ArrayLike<number>): Promise<void> {
    this.#usable('add a band');
    const { p } = this.#head;
    if (this.#added >= p.count) {
      throw new OutputError(`the profile has ${p.count} band(s) but band ${this.#added + 1} was added`, { file: this.path });
    }
    const typed = prepareBand(p, band, this.#added);
    this.#state = 'adding';
    const number = this.#added + 1;
    let encoded: Chunk[][];
    try {
      const levels = bandLevels(this.#head, typed);
      const compressed = await Promise.all(this.#head.grids.map(({ grid }, k) => encodeChunks([levels[k]], grid, p)));
      encoded = this.#options.spoolDirectory === undefined ? compressed.map((cs) => cs.map(compact)) : await this.#toSpool(compressed);
    } catch (err) {
      if (this.#state !== 'adding') throw new OutputError(`band ${number} of ${this.path} was dropped: the writer was aborted`, { file: this.path });
      await this.#close();
      throw new OutputError(`cannot encode band ${number} of ${this.path}: ${(err as Error).message}`, { file: this.path, cause: err });
    }
    if (this.#state !== 'adding') throw new OutputError(`band ${number} of ${this.path} was dropped: the writer was aborted`, { file: this.path });
    encoded.forEach((chunks, k) => {
      const into = this.#chunks[k];
      for (const c of chunks) into.push(c);
    });
    this.#added = number;
    this.#state = 'open';
  }

  /**
   * Lays out and writes the file (temporary file beside the target, then rename; nothing is left
   * on failure). Throws an OutputError, and writes nothing, unless exactly `count` bands were added.
   * `metadata`, when given, replaces the metadata passed at opening (for items known only once
   * every band is in, such as a flag set by any band); it is checked as at opening, and on a
   * ParameterError the writer stays open.
   */
  async finish(metadata?: RasterMetadata): Promise<WrittenRaster> {
    this.#usable('finish');
    const { p } = this.#head;
    if (metadata !== undefined) this.#head = { ...prepareHead(this.#profile, metadata), grids: this.#head.grids };
    if (this.#added !== p.count) {
      throw new OutputError(`the profile has ${p.count} band(s) but ${this.#added} band(s) were added`, { file: this.path });
    }
    this.#state = 'finishing';
    try {
      const images = this.#head.grids.map(({ grid, overview }, k) => ({ grid, overview, chunks: this.#chunks[k] }));
      const encoded = finish(this.#head, images, this.#options);
      const spool = this.#spool === undefined ? undefined : await this.#spool;
      await writePartsAtomically(this.path, encoded.parts, spool?.fh);
      return { path: this.path, bytes: encoded.bytes, bigTiff: encoded.bigTiff };
    } finally {
      await this.#close();
    }
  }

  /** Drops every encoded chunk (and the spool file); nothing is written. Safe to call more than once. */
  async abort(): Promise<void> {
    await this.#close();
  }

  /** Appends a band's chunks to the spool file (created on first use); returns where they lie. */
  async #toSpool(compressed: Uint8Array[][]): Promise<Chunk[][]> {
    const dir = this.#options.spoolDirectory as string;
    this.#spool ??= (async () => {
      const path = temporaryPathBeside(this.path, 'spool', dir);
      return { path, fh: await open(path, 'wx+'), size: 0 };
    })();
    const spool = await this.#spool;
    const flat = compressed.flat();
    const bytes = flat.reduce((n, c) => n + c.length, 0);
    const { bytesWritten } = await spool.fh.writev(flat, spool.size);
    if (bytesWritten !== bytes) throw new Error(`short write to the spool file ${spool.path} (${bytesWritten} of ${bytes} bytes)`);
    let at = spool.size;
    spool.size += bytes;
    return compressed.map((cs) =>
      cs.map((c) => {
        // A copy: zlib hands back Buffers, whose slice() is a view that would keep the whole chunk alive.
        const chunk = { offset: at, length: c.length, tail: new Uint8Array(c.subarray(Math.max(0, c.length - 4))) };
        at += c.length;
        return chunk;
      }),
    );
  }

  async #close(): Promise<void> {
    this.#state = 'closed';
    this.#chunks = [];
    const pending = this.#spool;
    this.#spool = undefined;
    if (pending === undefined) return;
    const spool = await pending.catch(() => undefined);
    if (spool === undefined) return;
    await spool.fh.close().catch(() => undefined);
    await rm(spool.path, { force: true });
  }
}

/** Opens a band-by-band GeoTIFF writer for `path` (nothing touches the disk before `finish`). */
export function openGeoTiffWriter(path: string, profile: RasterProfile, metadata?: RasterMetadata, options?: BandWriterOptions): GeoTiffBandWriter {
  return new GeoTiffBandWriter(path, profile, metadata, options);
}
