/**
 * Templates 5.40 (JPEG 2000 code stream) and 5.41 (PNG): section 7 is an image whose samples are
 * simple-packing integers X, Y = (R + X·2^E)·10^−D. The image codecs live in lib/codecs.
 */
import { u8 } from '../bytes.js';
import { constantField, readScale, scaleIntegers } from './scale.js';
import { PackingProblem, type DataTemplate } from './types.js';

interface ImageSamples {
  width: number;
  height: number;
  bitsPerSample: number;
  values: Uint32Array;
}
interface ImageCodecs {
  decodeJpeg2000(codestream: Uint8Array): Promise<ImageSamples>;
  decodePngSamples(png: Uint8Array): ImageSamples;
}

let codecs: Promise<ImageCodecs> | undefined;
function loadCodecs(): Promise<ImageCodecs> {
  // Loaded on first use: the JPEG 2000 decoder is a WebAssembly module.
  const spec = '../../../../codecs/index.js';
  codecs ??= import(spec) as Promise<ImageCodecs>;
  return codecs;
}

function fromImage(img: ImageSamples, count: number, p: Parameters<DataTemplate['decode']>[0], what: string): Float64Array {
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
  async decode(p, data, count) {
    if (p.bitsPerValue === 0 || data.length === 0) return constantField(p, count);
    try {
      const c = await loadCodecs();
      return fromImage(await c.decodeJpeg2000(data), count, p, 'JPEG 2000');
    } catch (e) {
      throw wrap('JPEG 2000', e);
    }
  },
};

export const pngPacking: DataTemplate = {
  name: 'png',
  length: 21,
  read: (sec5, template) => ({ ...readScale(sec5), template, extra: {} }),
  async decode(p, data, count) {
    if (p.bitsPerValue === 0 || data.length === 0) return constantField(p, count);
    try {
      const c = await loadCodecs();
      return fromImage(c.decodePngSamples(data), count, p, 'PNG');
    } catch (e) {
      throw wrap('PNG', e);
    }
  },
};
