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
  const wrap = codec.unsigned.wrap;
  const fill = codec.mask.fill ?? NaN;
  const lo = codec.mask.validMin;
  const hi = codec.mask.validMax;
  const missing = codec.mask.missing;
  const nm = missing.length;
  const m0 = nm > 0 ? missing[0] : NaN;
  const scale = codec.scaleOffset.scale;
  const offset = codec.scaleOffset.offset;
  const us = codec.units.unitScale;
  const uo = codec.units.unitOffset;
  const identityUnits = us === 1 && uo === 0;
  const big = src instanceof BigInt64Array || src instanceof BigUint64Array;
  for (let i = 0; i < count; i++) {
    let x = big ? Number((src as BigInt64Array)[srcOffset + i]) : (src as Float64Array)[srcOffset + i];
    if (wrap !== 0 && x < 0) x += wrap; // 1
    if (x !== x || x === fill || x < lo || x > hi || x === m0) {
      out[outOffset + i] = NaN; // 2
      continue;
    }
    if (nm > 1) {
      let hit = false;
      for (let k = 1; k < nm; k++) if (x === missing[k]) hit = true;
      if (hit) {
        out[outOffset + i] = NaN;
        continue;
      }
    }
    const v = x * scale + offset; // 3
    out[outOffset + i] = identityUnits ? v : v * us + uo; // 4
  }
}
