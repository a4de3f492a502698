/**
 * CF coder 3 — unpacking (CF 1.11 §8.1): unpacked = packed · scale_factor + add_offset, with
 * scale_factor 1 and add_offset 0 when absent. The unpacked type is that of scale_factor /
 * add_offset (float or double); frostgrid computes in double and stores float32 results.
 */
import { DecodeError } from '../errors.js';
import type { Attributes } from '../grid/types.js';
import { scalarAttr, type AttrContext } from './attrs.js';

export interface ScaleOffsetCoding {
  readonly packed: boolean;
  readonly scale: number;
  readonly offset: number;
}

export function scaleOffsetCoding(attrs: Attributes, ctx: AttrContext): ScaleOffsetCoding {
  const scale = scalarAttr(attrs, 'scale_factor', ctx);
  const offset = scalarAttr(attrs, 'add_offset', ctx);
  if (scale !== undefined && (!Number.isFinite(scale) || scale === 0)) {
    throw new DecodeError(`${ctx.file ? ctx.file + ': ' : ''}variable ${ctx.variable}: scale_factor ${scale} is not a usable factor`, {
      file: ctx.file,
      variable: ctx.variable,
      attribute: 'scale_factor',
    });
  }
  if (offset !== undefined && !Number.isFinite(offset)) {
    throw new DecodeError(`${ctx.file ? ctx.file + ': ' : ''}variable ${ctx.variable}: add_offset ${offset} is not finite`, {
      file: ctx.file,
      variable: ctx.variable,
      attribute: 'add_offset',
    });
  }
  return { packed: scale !== undefined || offset !== undefined, scale: scale ?? 1, offset: offset ?? 0 };
}

/** Scalar form. */
export function unpack(packed: number, c: ScaleOffsetCoding): number {
  return packed * c.scale + c.offset;
}
