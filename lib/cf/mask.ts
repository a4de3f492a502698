/**
 * CF coder 2 — masking, applied to the *packed* values (CF 1.11 §2.5.1): a value equal to
 * `_FillValue` (or, when there is none, the netCDF default fill value of the stored type, as
 * netCDF-C and netCDF4-python do), equal to one of `missing_value`, or outside
 * [`valid_min`, `valid_max`] (or `valid_range`), is missing. NaN is always missing.
 *
 * Not done: CF's suggestion that a fill value also bounds the valid range (netCDF4-python does
 * not do it either).
 */
import type { Attributes, Dtype } from '../grid/types.js';
import { numericAttr, scalarAttr, type AttrContext } from './attrs.js';
import { NETCDF_DEFAULT_FILL } from './default-fill.js';
import { reinterpretUnsigned, type UnsignedCoding } from './unsigned.js';

export interface MaskCoding {
  /** The fill value in the packed (reinterpreted) domain; undefined when nothing is a fill. */
  readonly fill?: number;
  /** True when `fill` is the type's default rather than an attribute. */
  readonly fillIsDefault: boolean;
  readonly missing: readonly number[];
  readonly validMin: number;
  readonly validMax: number;
}

export function maskCoding(attrs: Attributes, dtype: Dtype, unsigned: UnsignedCoding, ctx: AttrContext): MaskCoding {
  const round = dtype === 'float32' ? Math.fround : (x: number): number => x;
  const conv = (x: number): number => round(reinterpretUnsigned(x, unsigned));
  const fillAttr = scalarAttr(attrs, '_FillValue', ctx);
  let fill: number | undefined;
  let fillIsDefault = false;
  if (fillAttr !== undefined) fill = conv(fillAttr);
  else if (dtype !== 'char' && dtype !== 'string') {
    const d = NETCDF_DEFAULT_FILL[dtype];
    if (d !== undefined) {
      fill = conv(d);
      fillIsDefault = true;
    }
  }
  const missing = (numericAttr(attrs, 'missing_value', ctx) ?? []).map(conv);
  let validMin = -Infinity;
  let validMax = Infinity;
  const range = numericAttr(attrs, 'valid_range', ctx);
  if (range !== undefined && range.length === 2) {
    validMin = conv(range[0]);
    validMax = conv(range[1]);
  } else {
    const lo = scalarAttr(attrs, 'valid_min', ctx);
    const hi = scalarAttr(attrs, 'valid_max', ctx);
    if (lo !== undefined) validMin = conv(lo);
    if (hi !== undefined) validMax = conv(hi);
  }
  return { fill, fillIsDefault, missing, validMin, validMax };
}

/** Scalar form: true when a packed value is missing. */
export function isMasked(packed: number, m: MaskCoding): boolean {
  if (Number.isNaN(packed) || packed === m.fill || packed < m.validMin || packed > m.validMax) return true;
  for (const x of m.missing) if (packed === x) return true;
  return false;
}
