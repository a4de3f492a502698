/**
 * The one place the order of the CF value coders is fixed (CF 1.11 §2.5.1 and §8.1):
 *   1. `_Unsigned` reinterpretation of the stored integers   (unsigned.ts)
 *   2. masking on the packed values → NaN                     (mask.ts)
 *   3. unpacking: packed · scale_factor + add_offset          (scale-offset.ts)
 *   4. units to SI: value · unitScale + unitOffset            (units.ts)
 * `valueCodec` builds the parameters from a raw variable and records them in an `Encoding`;
 * `decodeValues` applies the four steps in that order in one pass.
 */
import type { Dtype, Encoding, RawVariable, TypedArray } from '../grid/types.js';
import { textAttr, type AttrContext } from './attrs.js';
import { maskCoding, type MaskCoding } from './mask.js';
import { scaleOffsetCoding, type ScaleOffsetCoding } from './scale-offset.js';
import { unsignedCoding, type UnsignedCoding } from './unsigned.js';
import type { SiConversion } from './units.js';

export interface ValueCodec {
  readonly unsigned: UnsignedCoding;
  readonly mask: MaskCoding;
  readonly scaleOffset: ScaleOffsetCoding;
  readonly units: SiConversion;
}

const INTEGER_TYPES = new Set<Dtype>(['int8', 'uint8', 'int16', 'uint16', 'int32', 'uint32', 'int64', 'uint64']);

/** Builds the codec of a variable; `toSi` converts its source units (steps 1–3 need no units). */
export function valueCodec(
  raw: RawVariable,
  ctx: AttrContext,
  toSi: (sourceUnits: string | undefined) => SiConversion,
): { codec: ValueCodec; encoding: Encoding } {
  const unsigned = unsignedCoding(raw.attrs, raw.dtype);
  const mask = maskCoding(raw.attrs, raw.dtype, unsigned, ctx);
  const scaleOffset = scaleOffsetCoding(raw.attrs, ctx);
  const sourceUnits = textAttr(raw.attrs, 'units');
  const units = toSi(sourceUnits);
  const storage = raw.storage as { chunks?: readonly number[]; filters?: readonly string[] };
  const isInt = INTEGER_TYPES.has(raw.dtype);
  const encoding: Encoding = {
    storedType: unsigned.wrap !== 0 ? raw.dtype.replace('int', 'uint') : raw.dtype,
    scaleFactor: scaleOffset.packed ? scaleOffset.scale : undefined,
    addOffset: scaleOffset.packed ? scaleOffset.offset : undefined,
    fillValue: mask.fillIsDefault ? undefined : mask.fill,
    missingValue: mask.missing.length > 0 ? mask.missing : undefined,
    validRange: Number.isFinite(mask.validMin) || Number.isFinite(mask.validMax) ? [mask.validMin, mask.validMax] : undefined,
    unsigned: unsigned.wrap !== 0 ? true : undefined,
    chunking: storage.chunks,
    filters: storage.filters !== undefined && storage.filters.length > 0 ? storage.filters : undefined,
    sourceUnits: sourceUnits ?? '',
    unitScale: units.unitScale,
    unitOffset: units.unitOffset,
    quantizationStep: isInt ? scaleOffset.scale * units.unitScale : 0,
    extra: mask.fillIsDefault && mask.fill !== undefined ? { defaultFillValue: mask.fill } : undefined,
  };
  return { codec: { unsigned, mask, scaleOffset, units }, encoding };
}

/**
 * Decodes `count` stored values from `src[srcOffset…]` into `out[outOffset…]`, in the CF order.
 */
export function decodeValues(
  src: TypedArray,
  codec: ValueCodec,
  out: Float32Array,
  outOffset = 0,
  srcOffset = 0,
  count = src.length - srcOffset,
): void {
  if (src instanceof BigInt64Array || src instanceof BigUint64Array) {
    const nums = new Float64Array(count);
    for (let i = 0; i < count; i++) nums[i] = Number(src[srcOffset + i]);
    decodeNumbers(nums, 0, codec, out, outOffset, count);
    return;
  }
  decodeNumbers(src, srcOffset, codec, out, outOffset, count);
}

function decodeNumbers(
  src: Exclude<TypedArray, BigInt64Array | BigUint64Array>,
  srcOffset: number,
  codec: ValueCodec,
  out: Float32Array,
  outOffset: number,
  count: number,
): void {
  const wrap = codec.unsigned.wrap;
  const fill = codec.mask.fill ?? NaN;
  const lo = codec.mask.validMin;
  const hi = codec.mask.validMax;
  const missing = codec.mask.missing;
  const nm = missing.length;
  const m0 = nm > 0 ? missing[0] : NaN;
  // Steps 3 and 4 in one multiply-add when units are the identity (exact: ×1 + 0).
  const scale = codec.scaleOffset.scale;
  const offset = codec.scaleOffset.offset;
  const us = codec.units.unitScale;
  const uo = codec.units.unitOffset;
  const identityUnits = us === 1 && uo === 0;
  const end = srcOffset + count;
  let o = outOffset;
  if (src instanceof Float32Array && scale === 1 && offset === 0 && wrap === 0 && nm <= 1 && identityUnits) {
    // Unpacked float32 in SI already: copy, then mask (steps 3 and 4 are the identity).
    out.set(src.subarray(srcOffset, end), outOffset);
    const checkRange = lo !== -Infinity || hi !== Infinity;
    for (let i = outOffset, e = outOffset + count; i < e; i++) {
      const x = out[i];
      if (x === fill || x === m0 || (checkRange && (x < lo || x > hi))) out[i] = NaN;
    }
    return;
  }
  if (wrap === 0 && nm <= 1 && identityUnits) {
    // The common case, kept tight.
    for (let i = srcOffset; i < end; i++, o++) {
      const x = src[i];
      out[o] = x !== x || x === fill || x === m0 || x < lo || x > hi ? NaN : x * scale + offset;
    }
    return;
  }
  for (let i = srcOffset; i < end; i++, o++) {
    let x = src[i];
    if (wrap !== 0 && x < 0) x += wrap; // 1
    let masked = x !== x || x === fill || x === m0 || x < lo || x > hi; // 2
    for (let k = 1; k < nm && !masked; k++) if (x === missing[k]) masked = true;
    if (masked) {
      out[o] = NaN;
      continue;
    }
    const v = x * scale + offset; // 3
    out[o] = identityUnits ? v : v * us + uo; // 4
  }
}
