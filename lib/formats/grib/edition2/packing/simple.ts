/**
 * Template 5.0, grid point data – simple packing: `count` unsigned integers of `bitsPerValue`
 * bits, MSB first, then Y = (R + X·2^E)·10^−D.
 */
import { readBitsInto } from './bitread.js';
import { readScale, constantField, scaleFactors } from './scale.js';
import { PackingProblem, type DataTemplate } from './types.js';

export function unpackSimple(
  data: Uint8Array,
  count: number,
  p: { referenceValue: number; binaryScale: number; decimalScale: number; bitsPerValue: number },
): Float64Array {
  const bits = p.bitsPerValue;
  if (bits === 0) return constantField(p, count);
  if (bits > 32) throw new PackingProblem('section 5 octet 20', `${bits} bits per value is more than simple packing allows (32)`);
  const need = Math.ceil((bits * count) / 8);
  if (need > data.length) {
    throw new PackingProblem('section 7', `${count} values of ${bits} bits need ${need} bytes of data, the section holds ${data.length}`);
  }
  const out = new Float64Array(count);
  const { bscale, dscale, ref } = scaleFactors(p);
  if (bits === 16) {
    for (let i = 0, q = 0; i < count; i++, q += 2) out[i] = (((data[q] << 8) | data[q + 1]) * bscale + ref) * dscale;
    return out;
  }
  if (bits === 8) {
    for (let i = 0; i < count; i++) out[i] = (data[i] * bscale + ref) * dscale;
    return out;
  }
  readBitsInto(data, 0, bits, count, out, 0, 0);
  for (let i = 0; i < count; i++) out[i] = (out[i] * bscale + ref) * dscale;
  return out;
}

export const simplePacking: DataTemplate = {
  name: 'simple',
  length: 21,
  read: (sec5, template) => ({ ...readScale(sec5), template, extra: {} }),
  decode: (p, data, count) => unpackSimple(data, count, p),
};
