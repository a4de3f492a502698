/**
 * Total length of a GRIB edition 1 message, with the large-message rule.
 *
 * Octets 5–7 of section 0 hold the total length (FM 92 GRIB edition 1, section 0). A 24-bit length
 * cannot state more than 16 MB; ECMWF's encoders write messages longer than 8 MB (0x800000 octets)
 * this way (ecCodes accessor g1_message_length, definitions grib1/boot.def "totalLength"):
 *   - bit 0x800000 of the coded total length is set, and the rest counts units of 120 octets:
 *     L120 = coded & 0x7fffff;
 *   - the 3-octet length of section 4 (BDS) holds, instead of the section length, the padding
 *     P < 120 that fills the message up to L120·120 octets;
 *   - true total length = L120·120 − P + 4, and the true section 4 length = total − (offset of
 *     section 4) − 4 (the "7777" end marker).
 * A coded length with bit 0x800000 set whose section 4 length is 120 or more is an ordinary length.
 */
import { FormatError, withFile } from '../../../errors.js';
import { u24 } from './octets.js';

/** Where the head came from, for error messages. */
export interface LengthContext {
  readonly file?: string;
  /** Byte offset of the message in its file. */
  readonly offset?: number;
  /** 1-based message number. */
  readonly message?: number;
}

/** Octets of section 0. */
export const SECTION0_LENGTH = 8;
const LARGE_FLAG = 0x800000;

function fail(where: LengthContext, what: string, rel = 0): FormatError {
  const offset = where.offset === undefined ? undefined : where.offset + rel;
  const at = [
    where.message === undefined ? '' : `message ${where.message}`,
    offset === undefined ? '' : `at byte ${offset}`,
  ]
    .filter((s) => s !== '')
    .join(' ');
  return new FormatError(withFile(where.file, `GRIB1 ${at === '' ? '' : `${at}: `}${what}`), {
    file: where.file,
    offset,
    message: where.message,
  });
}

/**
 * Offsets of the sections of a GRIB1 message, found by walking the section lengths from the
 * start. Returns the offset of section 4 (BDS), or throws when `head` is too short to reach the
 * 3-octet length of section 4.
 */
export function grib1Section4Offset(head: Uint8Array, where: LengthContext = {}): number {
  let p = SECTION0_LENGTH;
  if (head.length < p + 8) throw fail(where, `needs at least ${p + 8} bytes to find section 4, has ${head.length}`);
  const pdsLength = u24(head, p);
  const flags = head[p + 7];
  if (pdsLength < 28) throw fail(where, `section 1 length ${pdsLength} is less than 28`, p);
  p += pdsLength;
  for (const present of [(flags & 0x80) !== 0, (flags & 0x40) !== 0]) {
    if (!present) continue;
    if (head.length < p + 3) throw fail(where, `needs at least ${p + 3} bytes to find section 4, has ${head.length}`);
    const len = u24(head, p);
    if (len < 6) throw fail(where, `section length ${len} at byte ${p} of the message is too small`, p);
    p += len;
  }
  if (head.length < p + 3) throw fail(where, `needs at least ${p + 3} bytes to read the section 4 length, has ${head.length}`);
  return p;
}

/**
 * Total length in octets of the GRIB1 message that starts at `head[0]` ("GRIB"). `head` needs the
 * first 8 octets; for a large message (bit 0x800000 of the coded length) it must also reach the
 * 3-octet length of section 4 (the sections before it are walked), otherwise a FormatError says
 * how many bytes are needed.
 */
export function grib1MessageLength(head: Uint8Array, where: LengthContext = {}): number {
  if (head.length < SECTION0_LENGTH) throw fail(where, `needs 8 bytes for section 0, has ${head.length}`);
  if (head[0] !== 0x47 || head[1] !== 0x52 || head[2] !== 0x49 || head[3] !== 0x42) {
    throw fail(where, 'does not start with "GRIB"');
  }
  if (head[7] !== 1) throw fail(where, `edition number is ${head[7]}, not 1`, 7);
  const coded = u24(head, 4);
  if ((coded & LARGE_FLAG) === 0) return coded;
  const s4 = grib1Section4Offset(head, where);
  const padding = u24(head, s4);
  if (padding >= 120) return coded;
  return (coded & 0x7fffff) * 120 - padding + 4;
}
