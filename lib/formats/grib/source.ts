/**
 * Byte sources for one message: either the message's bytes in memory, or a file region read on
 * demand with positioned reads (a prefix of the message is held, the rest is read when asked).
 */
import { closeSync, openSync, readSync } from 'node:fs';
import { FormatError } from '../../errors.js';
import type { GribMessageLocation } from './types.js';

export interface ByteSource {
  readonly file: string;
  readonly location: GribMessageLocation;
  /** Bytes [start, start+length) of the message (offsets relative to the message start). */
  read(start: number, length: number): Uint8Array;
}

function outside(file: string, location: GribMessageLocation, start: number, length: number): FormatError {
  return new FormatError(
    `${file}: message ${location.number} at byte offset ${location.offset}: read of ${length} bytes at message offset ${start} runs past the message end (${location.length} bytes)`,
    { file, offset: location.offset + start, message: location.number },
  );
}

/** A message held in memory. */
export function memorySource(file: string, location: GribMessageLocation, bytes: Uint8Array): ByteSource {
  return {
    file,
    location,
    read(start, length) {
      if (start < 0 || length < 0 || start + length > bytes.length) throw outside(file, location, start, length);
      return bytes.subarray(start, start + length);
    },
  };
}

/**
 * A message in a file of which `prefix` (the first bytes of the message) is already read; reads
 * beyond the prefix open the file, read that region and close it again.
 */
export function fileSource(file: string, location: GribMessageLocation, prefix: Uint8Array): ByteSource {
  return {
    file,
    location,
    read(start, length) {
      if (start < 0 || length < 0 || start + length > location.length) throw outside(file, location, start, length);
      if (start + length <= prefix.length) return prefix.subarray(start, start + length);
      const out = new Uint8Array(length);
      const fd = openSync(file, 'r');
      try {
        let got = 0;
        while (got < length) {
          const n = readSync(fd, out, got, length - got, location.offset + start + got);
          if (n === 0) break;
          got += n;
        }
        if (got < length) throw outside(file, location, start, length);
      } finally {
        closeSync(fd);
      }
      return out;
    },
  };
}
