/**
 * The GRIB index: every field of every message of a file (parameter, level, times, member, grid,
 * packing, byte offset) without unpacking data. GRIB2 messages are parsed from their first bytes
 * (sections 1–5 and the bitmap indicator); a field's decode() reads its bitmap and data on demand.
 * A message that cannot be read is listed in `problems` and the others stay readable.
 */
import { open, type FileHandle } from 'node:fs/promises';
import { DecodeError, FrostgridError, UnsupportedError } from '../../errors.js';
import { loadEdition1 } from './edition1-bridge.js';
import { parseGrib2 } from './edition2/message.js';
import { scanGrib } from './scan.js';
import { fileSource, memorySource } from './source.js';
import type { GribFieldInfo, GribMessageLocation } from './types.js';

export interface GribIndex {
  readonly path: string;
  readonly size: number;
  readonly messages: readonly GribMessageLocation[];
  /** Every field, in file order (GRIB2 messages with repeated sections give several). */
  readonly fields: readonly GribFieldInfo[];
  /** Messages that could not be delimited or parsed (typed errors naming file, message, offset). */
  readonly problems: readonly FrostgridError[];
}

/** Bytes of a GRIB2 message read for its index entry; later sections are read on demand. */
const PREFIX = 1 << 16;

async function readRange(fh: FileHandle, offset: number, length: number): Promise<Uint8Array> {
  const buf = new Uint8Array(length);
  let got = 0;
  while (got < length) {
    const { bytesRead } = await fh.read(buf, got, length - got, offset + got);
    if (bytesRead === 0) break;
    got += bytesRead;
  }
  return got === length ? buf : buf.subarray(0, got);
}

/** Reads a whole message. */
export async function readMessage(fh: FileHandle, location: GribMessageLocation): Promise<Uint8Array> {
  return readRange(fh, location.offset, location.length);
}

/** Parses one message (in memory) into its fields. */
export async function parseMessage(file: string, location: GribMessageLocation, bytes: Uint8Array): Promise<GribFieldInfo[]> {
  if (location.edition === 2) return parseGrib2(memorySource(file, location, bytes));
  const e1 = await loadEdition1();
  if (!e1) {
    throw new UnsupportedError(
      `${file}: message ${location.number} at byte offset ${location.offset}: GRIB edition 1 is not supported by this build`,
      'GRIB edition',
      1,
      { file, offset: location.offset, message: location.number },
    );
  }
  return [e1.parseGrib1Message(file, bytes, location)];
}

/** Scans a file and indexes every field. */
export async function readGribIndex(path: string): Promise<GribIndex> {
  const scan = await scanGrib(path);
  const problems: FrostgridError[] = [...scan.problems];
  const fields: GribFieldInfo[] = [];
  const fh = await open(path, 'r');
  try {
    for (const loc of scan.messages) {
      try {
        if (loc.edition === 2) {
          const prefix = await readRange(fh, loc.offset, Math.min(loc.length, PREFIX));
          fields.push(...parseGrib2(fileSource(path, loc, prefix)));
        } else {
          fields.push(...(await parseMessage(path, loc, await readMessage(fh, loc))));
        }
      } catch (e) {
        if (e instanceof FrostgridError) problems.push(e);
        else {
          problems.push(
            new DecodeError(`${path}: message ${loc.number} at byte offset ${loc.offset}: ${(e as Error).message}`, {
              file: path,
              offset: loc.offset,
              message: loc.number,
              cause: e,
            }),
          );
        }
      }
    }
  } finally {
    await fh.close();
  }
  problems.sort((a, b) => (a.offset ?? 0) - (b.offset ?? 0));
  return { path, size: scan.size, messages: scan.messages, fields, problems };
}
