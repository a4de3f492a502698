/**
 * Octets 12–21 shared by the GRIB2 grid-point templates, and the simple-packing formula
 * Y = (R + X·2^E)·10^−D (WMO-No. 306, Vol. I.2, Part B, regulation 92.9.4).
 */
import { f32, s16, u8 } from '../bytes.js';
import type { ScaleParameters } from './types.js';

export function readScale(sec5: Uint8Array): ScaleParameters {
  return {
    referenceValue: f32(sec5, 11),
    binaryScale: s16(sec5, 15),
    decimalScale: s16(sec5, 17),
    bitsPerValue: u8(sec5, 19),
  };
}

/** 2^E and 10^−D as the decoder multiplies them. */
export function scaleFactors(p: ScaleParameters): { bscale: number; dscale: number; ref: number } {
  return { bscale: 2 ** p.binaryScale, dscale: 10 ** -p.decimalScale, ref: p.referenceValue };
}

/**
 * A field of constant value (bits per value 0, no data): every value is R itself. The reference
 * decoders (ecCodes, NCEP g2clib) do not apply 10^−D here, and ecCodes writes constant fields
 * with R equal to the value whatever D says; fixture ll-packings.grib2 has one with D = 2.
 */
export function constantField(p: ScaleParameters, count: number): Float64Array {
  const out = new Float64Array(count);
  out.fill(p.referenceValue);
  return out;
}

/** Applies the simple-packing formula in place to unsigned integers. */
export function scaleIntegers(ints: Uint32Array, count: number, p: ScaleParameters, out: Float64Array): Float64Array {
  const { bscale, dscale, ref } = scaleFactors(p);
  for (let i = 0; i < count; i++) out[i] = (ints[i] * bscale + ref) * dscale;
  return out;
}
