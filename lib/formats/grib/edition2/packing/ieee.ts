/**
 * Template 5.4, grid point data – IEEE floating point: big-endian IEEE 754 values, precision by
 * code table 5.7 (1: 32-bit, 2: 64-bit; 3: 128-bit is not supported).
 */
import { u8 } from '../bytes.js';
import { PackingProblem, type DataTemplate } from './types.js';

export const ieeePacking: DataTemplate = {
  name: 'ieee',
  length: 12,
  read: (sec5, template) => ({
    template,
    referenceValue: 0,
    binaryScale: 0,
    decimalScale: 0,
    bitsPerValue: u8(sec5, 11) === 1 ? 32 : u8(sec5, 11) === 2 ? 64 : 0,
    extra: { precision: u8(sec5, 11) },
  }),
  decode(p, data, count) {
    const precision = p.extra.precision;
    const size = precision === 1 ? 4 : precision === 2 ? 8 : 0;
    if (size === 0) throw new PackingProblem('section 5 octet 12', `IEEE precision ${precision} (code table 5.7) is not supported`);
    if (count * size > data.length) {
      throw new PackingProblem('section 7', `${count} values of ${size} bytes need ${count * size} bytes, the section holds ${data.length}`);
    }
    const view = new DataView(data.buffer, data.byteOffset, count * size);
    const out = new Float64Array(count);
    if (size === 4) for (let i = 0; i < count; i++) out[i] = view.getFloat32(i * 4, false);
    else for (let i = 0; i < count; i++) out[i] = view.getFloat64(i * 8, false);
    return out;
  },
};
