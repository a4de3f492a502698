/**
 * Fast scan of a GRIB file: finds every message (GRIB1 and GRIB2) with positioned reads — the
 * indicator section and the end marker of each message, never the data — and skips junk or
 * padding between messages. A message whose length runs past the end of the file, or that does
 * not end with "7777", is reported as a problem (numbered like the others) and the scan goes on
 * looking for the next "GRIB" after its start.
 *
 * Lengths: GRIB2 section 0 octets 9–16 (64 bits); GRIB1 section 0 octets 5–7 (24 bits). GRIB1
 * messages above 8 MB use ECMWF's large-message convention: when bit 0x800000 of the length is
 * set and the section 4 length L4 is below 120, the length is (length & 0x7fffff)·120 − L4 + 4.
 */
import { open, type FileHandle } from 'node:fs/promises';
import { FormatError } from '../../errors.js';
import type { GribMessageLocation } from './types.js';

export interface GribScan {
  readonly path: string;
  readonly size: number;
  /** Messages that are whole (start with GRIB, end with 7777 where their length says). */
  readonly messages: readonly GribMessageLocation[];
  /** Messages that could not be delimited, in file order. */
  readonly problems: readonly FormatError[];
}

const WINDOW = 1 << 16;
const MAGIC = Buffer.from('GRIB', 'latin1');
const END = 0x37373737; // "7777"

async function readAt(fh: FileHandle, buf: Buffer, length: number, position: number): Promise<number> {
  let got = 0;
  while (got < length) {
    const { bytesRead } = await fh.read(buf, got, length - got, position + got);
    if (bytesRead === 0) break;
    got += bytesRead;
  }
  return got;
}

const u24 = (b: Uint8Array, p: number) => (b[p] << 16) | (b[p + 1] << 8) | b[p + 2];

/** Length of a GRIB1 message from its first bytes (handles the large-message convention). */
async function grib1Length(fh: FileHandle, offset: number, head: Buffer, size: number): Promise<number | string> {
  let length = u24(head, 4);
  if ((length & 0x800000) === 0) return length;
  // Large message: walk sections 1–3 to section 4.
  const b = Buffer.alloc(8);
  let p = offset + 8;
  if ((await readAt(fh, b, 8, p)) < 8) return 'section 1 runs past the end of the file';
  const len1 = u24(b, 0);
  const flags = b[7];
  p += len1;
  for (const present of [(flags & 0x80) !== 0, (flags & 0x40) !== 0]) {
    if (!present) continue;
    if (p + 3 > size || (await readAt(fh, b, 3, p)) < 3) return 'section 2 or 3 runs past the end of the file';
    p += u24(b, 0);
  }
  if (p + 3 > size || (await readAt(fh, b, 3, p)) < 3) return 'section 4 runs past the end of the file';
  const len4 = u24(b, 0);
  if (len4 < 120) {
    length = (length & 0x7fffff) * 120 - len4 + 4;
  }
  return length;
}

/** Indexes every message of a GRIB file. */
export async function scanGrib(path: string): Promise<GribScan> {
  const fh = await open(path, 'r');
  try {
    const size = (await fh.stat()).size;
    const messages: GribMessageLocation[] = [];
    const problems: FormatError[] = [];
    const win = Buffer.allocUnsafe(WINDOW);
    const head = Buffer.allocUnsafe(16);
    let number = 0;
    let pos = 0;
    while (pos + 8 <= size) {
      // Find the next "GRIB" at or after pos.
      const n = await readAt(fh, win, Math.min(WINDOW, size - pos), pos);
      const at = win.subarray(0, n).indexOf(MAGIC);
      if (at < 0) {
        if (pos + n >= size) break;
        pos += n - 3;
        continue;
      }
      const offset = pos + at;
      const got = await readAt(fh, head, 16, offset);
      const edition = got >= 8 ? head[7] : 0;
      if (edition !== 1 && edition !== 2) {
        pos = offset + 1; // "GRIB" inside junk
        continue;
      }
      number++;
      let length: number | string;
      if (edition === 2) {
        length = got < 16 ? 'section 0 runs past the end of the file' : head.readUInt32BE(8) * 4294967296 + head.readUInt32BE(12);
      } else {
        length = await grib1Length(fh, offset, head, size);
      }
      const fail = (what: string) => {
        problems.push(
          new FormatError(`${path}: message ${number} at byte offset ${offset}: ${what}`, { file: path, offset, message: number }),
        );
        pos = offset + 4;
      };
      if (typeof length === 'string') {
        fail(length);
        continue;
      }
      if (length < (edition === 2 ? 20 : 12)) {
        fail(`a length of ${length} bytes is too short for a GRIB${edition} message`);
        continue;
      }
      if (offset + length > size) {
        fail(`its length (${length} bytes) runs past the end of the file (${size - offset} bytes left)`);
        continue;
      }
      if ((await readAt(fh, head, 4, offset + length - 4)) < 4 || head.readUInt32BE(0) !== END) {
        fail(`it does not end with "7777" where its length (${length} bytes) says (truncated, or a wrong length)`);
        continue;
      }
      messages.push({ number, offset, length, edition });
      pos = offset + length;
    }
    return { path, size, messages, problems };
  } finally {
    await fh.close();
  }
}
