/**
 * CF coder 1 — `_Unsigned` (NetCDF User Guide, attribute conventions; CF 1.11 §2.5.1 note on
 * NUG): a signed integer variable with `_Unsigned = "true"` holds unsigned values. Reinterpret
 * the stored bits:  u = s < 0 ? s + 2^bits : s. The fill, missing and valid-range attributes of
 * such a variable are written in the signed type and are reinterpreted the same way.
 */
import type { Attributes, Dtype } from '../grid/types.js';
import { textAttr } from './attrs.js';

const BITS: Readonly<Partial<Record<Dtype, number>>> = { int8: 8, int16: 16, int32: 32, int64: 64 };

export interface UnsignedCoding {
  /** 2^bits when the stored values are to be read as unsigned, else 0. */
  readonly wrap: number;
}

export function unsignedCoding(attrs: Attributes, dtype: Dtype): UnsignedCoding {
  const flag = textAttr(attrs, '_Unsigned');
  const bits = BITS[dtype];
  return { wrap: flag !== undefined && flag.toLowerCase() === 'true' && bits !== undefined ? 2 ** bits : 0 };
}

/** Scalar form: the unsigned value of a stored signed value. */
export function reinterpretUnsigned(stored: number, coding: UnsignedCoding): number {
  return coding.wrap !== 0 && stored < 0 ? stored + coding.wrap : stored;
}
