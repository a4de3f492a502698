/**
 * Template 5.42, grid point data – CCSDS recommended lossless compression (CCSDS 121.0-B adaptive
 * entropy coding): octets 22 (flags), 23 (block size) and 24–25 (reference sample interval)
 * parameterise the decoder; the decoded samples are simple-packing integers.
 */
import { aecDecode } from '../../../../codecs/index.js';
import { u16, u8 } from '../bytes.js';
import { constantField, readScale, scaleIntegers } from './scale.js';
import { PackingProblem, type DataTemplate } from './types.js';

export const ccsdsPacking: DataTemplate = {
  name: 'ccsds',
  length: 25,
  read: (sec5, template) => ({
    ...readScale(sec5),
    template,
    extra: { flags: u8(sec5, 21), blockSize: u8(sec5, 22), rsi: u16(sec5, 23) },
  }),
  decode(p, data, count) {
    if (p.bitsPerValue === 0) return constantField(p, count);
    let ints: Uint32Array;
    try {
      ints = aecDecode(data, { bitsPerSample: p.bitsPerValue, blockSize: p.extra.blockSize, rsi: p.extra.rsi, flags: p.extra.flags }, count);
    } catch (e) {
      throw new PackingProblem('section 7', `CCSDS decoding failed: ${(e as Error).message}`);
    }
    if (ints.length < count) throw new PackingProblem('section 7', `CCSDS data hold ${ints.length} samples, ${count} expected`);
    return scaleIntegers(ints, count, p, new Float64Array(count));
  },
};
