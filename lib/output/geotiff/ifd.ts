/**
 * Serialising image file directories, classic TIFF (TIFF 6.0 §2: 2-byte entry count, 12-byte
 * entries, 4-byte next offset) and BigTIFF (8-byte count, 20-byte entries, 8-byte next offset).
 * Values that do not fit in the entry's value field follow the directory, each on a word
 * boundary. All integers are little-endian.
 */
import { FIELD_TYPE_SIZE, FieldType, type FieldTypeCode } from './tiff-tags.js';

export interface IfdEntry {
  readonly tag: number;
  readonly type: FieldTypeCode;
  /** The values; for ASCII, the bytes including the terminating NUL. */
  values: ArrayLike<number>;
}

const even = (n: number): number => n + (n & 1);

function valueBytes(e: IfdEntry): number {
  return FIELD_TYPE_SIZE[e.type] * e.values.length;
}

/** Bytes of the directory and its out-of-line values. */
export function ifdByteLength(entries: readonly IfdEntry[], big: boolean): number {
  const inline = big ? 8 : 4;
  let n = big ? 8 + entries.length * 20 + 8 : 2 + entries.length * 12 + 4;
  for (const e of entries) {
    const size = valueBytes(e);
    if (size > inline) n += even(size);
  }
  return even(n);
}

function putValues(dv: DataView, at: number, e: IfdEntry): void {
  const v = e.values;
  switch (e.type) {
    case FieldType.BYTE:
    case FieldType.ASCII:
      for (let i = 0; i < v.length; i++) dv.setUint8(at + i, v[i]);
      break;
    case FieldType.SHORT:
      for (let i = 0; i < v.length; i++) dv.setUint16(at + 2 * i, v[i], true);
      break;
    case FieldType.LONG:
      for (let i = 0; i < v.length; i++) dv.setUint32(at + 4 * i, v[i], true);
      break;
    case FieldType.DOUBLE:
      for (let i = 0; i < v.length; i++) dv.setFloat64(at + 8 * i, v[i], true);
      break;
    case FieldType.LONG8:
      for (let i = 0; i < v.length; i++) dv.setBigUint64(at + 8 * i, BigInt(v[i]), true);
      break;
  }
}

/** Writes a directory at byte `at` of `dv` (whose byte 0 is file offset `base`). */
export function writeIfd(dv: DataView, at: number, base: number, entries: readonly IfdEntry[], next: number, big: boolean): void {
  const sorted = [...entries].sort((a, b) => a.tag - b.tag);
  const inline = big ? 8 : 4;
  const entrySize = big ? 20 : 12;
  let p = at;
  if (big) {
    dv.setBigUint64(p, BigInt(sorted.length), true);
    p += 8;
  } else {
    dv.setUint16(p, sorted.length, true);
    p += 2;
  }
  let extra = p + sorted.length * entrySize + inline;
  for (const e of sorted) {
    dv.setUint16(p, e.tag, true);
    dv.setUint16(p + 2, e.type, true);
    if (big) dv.setBigUint64(p + 4, BigInt(e.values.length), true);
    else dv.setUint32(p + 4, e.values.length, true);
    const field = p + (big ? 12 : 8);
    const size = valueBytes(e);
    if (size <= inline) putValues(dv, field, e);
    else {
      if (big) dv.setBigUint64(field, BigInt(base + extra), true);
      else dv.setUint32(field, base + extra, true);
      putValues(dv, extra, e);
      extra += even(size);
    }
    p += entrySize;
  }
  if (big) dv.setBigUint64(p, BigInt(next), true);
  else dv.setUint32(p, next, true);
}

/** ASCII field bytes of a string (NUL-terminated). Characters above U+00FF are not allowed. */
export function asciiBytes(text: string): Uint8Array {
  const out = new Uint8Array(text.length + 1);
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    out[i] = c < 256 ? c : 0x3f;
  }
  return out;
}
