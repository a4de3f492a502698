/**
 * Writing a GeoTIFF file: encoded to a temporary file beside the target, renamed over the target
 * when complete. On any failure the temporary file is removed and no partial file is left.
 */
import { open, rename, rm, type FileHandle } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';
import { randomBytes } from 'node:crypto';
import { OutputError } from '../../errors.js';
import { encodeGeoTiffParts, type Chunk, type EncodeOptions } from './encoder.js';
import type { RasterMetadata, RasterProfile } from './profile.js';

export interface WrittenRaster {
  readonly path: string;
  readonly bytes: number;
  readonly bigTiff: boolean;
}

/** Path of a temporary file for `path`: hidden, unique, in `dir` (default: beside `path`). */
export function temporaryPathBeside(path: string, suffix = 'partial', dir = dirname(path)): string {
  return join(dir, `.${basename(path)}.${process.pid}.${randomBytes(4).toString('hex')}.${suffix}`);
}

async function writeAll(fh: FileHandle, batch: Uint8Array[], bytes: number): Promise<void> {
  const { bytesWritten } = await fh.writev(batch);
  if (bytesWritten !== bytes) throw new Error(`short write (${bytesWritten} of ${bytes} bytes)`);
}

/** Bytes gathered before each vectored write. */
const BATCH_BYTES = 8 << 20;

/**
 * Writes `parts` to `path` atomically (temporary file + rename). Spooled parts are copied from
 * `spool`, a few megabytes at a time.
 */
export async function writePartsAtomically(path: string, parts: readonly Chunk[], spool?: FileHandle): Promise<void> {
  const tmp = temporaryPathBeside(path);
  let created = false;
  try {
    const fh = await open(tmp, 'wx');
    created = true;
    try {
      let batch: Uint8Array[] = [];
      let batchBytes = 0;
      for (const part of parts) {
        let bytes: Uint8Array;
        if (part instanceof Uint8Array) bytes = part;
        else {
          if (spool === undefined) throw new Error('a spooled chunk without its spool file');
          bytes = new Uint8Array(part.length);
          const { bytesRead } = await spool.read(bytes, 0, part.length, part.offset);
          if (bytesRead !== part.length) throw new Error(`spool file ended early (${bytesRead} of ${part.length} bytes at ${part.offset})`);
        }
        batch.push(bytes);
        batchBytes += bytes.length;
        if (batch.length >= 512 || batchBytes >= BATCH_BYTES) {
          await writeAll(fh, batch, batchBytes);
          batch = [];
          batchBytes = 0;
        }
      }
      if (batch.length > 0) await writeAll(fh, batch, batchBytes);
      await fh.sync();
    } finally {
      await fh.close();
    }
    await rename(tmp, path);
    created = false;
  } catch (err) {
    if (created) await rm(tmp, { force: true });
    const code = (err as NodeJS.ErrnoException).code;
    throw new OutputError(`cannot write ${path}${code ? ` (${code})` : ''}: ${(err as Error).message}`, { file: path, cause: err });
  }
}

/**
 * Writes bands (typed arrays in raster order, one per band) as a GeoTIFF described by `profile`.
 * Invalid profiles and data throw before anything touches the disk.
 */
export async function writeGeoTiff(
  path: string,
  profile: RasterProfile,
  bands: ArrayLike<number>[],
  metadata?: RasterMetadata,
  options?: EncodeOptions,
): Promise<{ path: string; bytes: number; bigTiff: boolean }> {
  const encoded = await encodeGeoTiffParts(profile, bands, metadata, options);
  await writePartsAtomically(path, encoded.parts);
  return { path, bytes: encoded.bytes, bigTiff: encoded.bigTiff };
}
