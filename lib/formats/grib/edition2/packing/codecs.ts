/**
 * Templates 5.40 (JPEG 2000 code stream) and 5.41 (PNG): section 7 is an image whose samples are
 * simple-packing integers X, Y = (R + X·2^E)·10^−D. The image codecs live in lib/codecs; JPEG 2000
 * decoding is asynchronous (a WebAssembly module), PNG is not.
 */
import { decodeJpeg2000, decodePngSamples } from '../../../../codecs/index.js';
import { u8 } from '../bytes.js';
import { constantField, readScale, scaleIntegers } from './scale.js';
import { PackingProblem, type DataTemplate, type PackingParameters } from './types.js';

interface ImageSamples {
  width: number;
  height: number;
  values: Uint32Array;
}

function fromImage(img: ImageSamples, count: number, p: PackingParameters, what: string): Float64Array {
  if (img.values.length < count) {
    throw new PackingProblem('section 7', `the ${what} image holds ${img.values.length} samples (${img.width}×${img.height}), ${count} expected`);
  }
  return scaleIntegers(img.values, count, p, new Float64Array(count));
}

function wrap(what: string, e: unknown): PackingProblem {
  return e instanceof PackingProblem ? e : new PackingProblem('section 7', `${what} decoding failed: ${(e as Error).message}`);
}

export const jpeg2000Packing: DataTemplate = {
  name: 'jpeg2000',
  length: 23,
  read: (sec5, template) => ({ ...readScale(sec5), template, extra: { compressionType: u8(sec5, 21), targetRatio: u8(sec5, 22) } }),
  decode(p, data, count, points) {
    if (p.bitsPerValue === 0 || data.length === 0) return constantField(p, count);
    // ecCodes writes an image of the packed values (count × 1 with a bitmap, else the grid)
    return decodeJpeg2000(data, { maxSamples: Math.max(count, points) }).then(
      (img) => fromImage(img, count, p, 'JPEG 2000'),
      (e: unknown) => {
        throw wrap('JPEG 2000', e);
      },
    );
  },
};

export const pngPacking: DataTemplate = {
  name: 'png',
  length: 21,
  read: (sec5, template) => ({ ...readScale(sec5), template, extra: {} }),
  decode(p, data, count) {
    if (p.bitsPerValue === 0 || data.length === 0) return constantField(p, count);
    let img: ImageSamples;
    try {
      img = decodePngSamples(data);
    } catch (e) {
      throw wrap('PNG', e);
    }
    return fromImage(img, count, p, 'PNG');
  },
};
