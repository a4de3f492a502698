/**
 * Writing a GeoTIFF file: encoded to a temporary file beside the target, renamed over the target
 * when complete. On any failure the temporary file is removed and no partial file is left.
 */
import { open, rename, rm } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';
import { randomBytes } from 'node:crypto';
import { OutputError } from '../../errors.js';
import { encodeGeoTiffParts, type EncodeOptions } from './encoder.js';
import type { RasterMetadata, RasterProfile } from './profile.js';

export interface WrittenRaster {
  readonly path: string;
  readonly bytes: number;
  readonly bigTiff: boolean;
}

/** Path of a temporary file beside `path`. */
export function temporaryPathBeside(path: string): string {
  return join(dirname(path), `.${basename(path)}.${process.pid}.${randomBytes(4).toString('hex')}.partial`);
}

/** Writes `parts` to `path` atomically (temporary file + rename). */
export async function writePartsAtomically(path: string, parts: readonly Uint8Array[]): Promise<void> {
  const tmp = temporaryPathBeside(path);
  let created = false;
  try {
    const fh = await open(tmp, 'wx');
    created = true;
    try {
      for (let i = 0; i < parts.length; i += 512) await fh.writev(parts.slice(i, i + 512));
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
