/**
 * JPEG 2000 codestream decoding for GRIB2 data representation template 5.40: the data section is
 * a raw J2K codestream (ISO/IEC 15444-1) of one unsigned component, precision = bits per value.
 *
 * Up to 16 bits per sample, decoding uses OpenJPEG compiled to WebAssembly
 * (@cornerstonejs/codec-openjpeg; instantiated once and cached), which is exact there and fast.
 * Its build hands back at most 16 bits per sample, so deeper codestreams (GRIB allows 31 bits)
 * go to our own decoder in ./j2k/, written from ISO/IEC 15444-1.
 */
import factory, { type OpenJpegModule } from '@cornerstonejs/codec-openjpeg/decodewasmjs';
import { DecodeError, UnsupportedError } from '../errors.js';
import { decodeJ2k, J2K_MAX_SAMPLES, type J2kLimits, type J2kSamples } from './j2k/index.js';

/** Decoded samples, row by row, `width × height` of them (either decoder). */
export type DecodedSamples = J2kSamples;

/** Largest precision the WebAssembly OpenJPEG build returns exactly; deeper ones use ./j2k/. */
export const JPEG2000_WASM_MAX_BITS = 16;

/** Largest precision decoded: the 31 bits GRIB2 allows, and one more. */
export const JPEG2000_MAX_BITS = 32;

let openjpeg: Promise<OpenJpegModule> | undefined;

function openjpegModule(): Promise<OpenJpegModule> {
  // print/printErr: keep emscripten's [INFO] lines off stdout.
  openjpeg ??= factory({ print() {}, printErr() {} }).catch((cause: unknown) => {
    openjpeg = undefined; // let a later call try again
    throw new DecodeError(`JPEG 2000: the OpenJPEG WebAssembly module failed to load (${String(cause)})`, { cause });
  });
  return openjpeg;
}

/** Reads SIZ (ISO/IEC 15444-1 A.5.1) for the component precision, before decoding. */
function readSiz(
  cs: Uint8Array,
): { width: number; height: number; components: number; bits: number; signed: boolean } | undefined {
  // SOC (FF4F) then SIZ (FF51): Lsiz(2) Rsiz(2) Xsiz Ysiz XOsiz YOsiz XTsiz YTsiz XTOsiz YTOsiz (4 each) Csiz(2) Ssiz...
  if (cs.length < 43 || cs[0] !== 0xff || cs[1] !== 0x4f || cs[2] !== 0xff || cs[3] !== 0x51) return undefined;
  const u32 = (p: number) => ((cs[p] << 24) | (cs[p + 1] << 16) | (cs[p + 2] << 8) | cs[p + 3]) >>> 0;
  const components = (cs[40] << 8) | cs[41];
  const ssiz = cs[42];
  return {
    width: u32(8) - u32(16),
    height: u32(12) - u32(20),
    components,
    bits: (ssiz & 0x7f) + 1,
    signed: (ssiz & 0x80) !== 0,
  };
}

/**
 * Decodes a raw J2K codestream of one unsigned component into its integer samples.
 * @throws DecodeError when the bytes are not a J2K codestream or a decoder rejects them;
 *   UnsupportedError for several components, signed samples or more than 32 bits per sample.
 */
export async function decodeJpeg2000(codestream: Uint8Array, limits: J2kLimits = {}): Promise<DecodedSamples> {
  const siz = readSiz(codestream);
  if (siz === undefined) {
    throw new DecodeError(`JPEG 2000: data does not start with a J2K codestream header (SOC, SIZ markers)`, { offset: 0 });
  }
  const n = codestream.length;
  if (codestream[n - 2] !== 0xff || codestream[n - 1] !== 0xd9) {
    // OpenJPEG decodes truncated codestreams leniently (missing data becomes zeros): refuse them.
    throw new DecodeError(`JPEG 2000: codestream of ${n} bytes does not end with the EOC marker (truncated?)`, {
      offset: n,
    });
  }
  if (siz.components !== 1) {
    throw new UnsupportedError(`JPEG 2000: ${siz.components} components, GRIB needs 1`, 'JPEG 2000 component count', siz.components);
  }
  if (siz.signed) throw new UnsupportedError('JPEG 2000: signed samples', 'JPEG 2000 signed samples', 'signed');
  if (siz.bits > JPEG2000_MAX_BITS) {
    throw new UnsupportedError(
      `JPEG 2000: ${siz.bits} bits per sample; at most ${JPEG2000_MAX_BITS} are decoded`,
      'JPEG 2000 bits per sample',
      siz.bits,
    );
  }
  const most = limits.maxSamples ?? J2K_MAX_SAMPLES;
  if (siz.width * siz.height > most) {
    throw new DecodeError(`JPEG 2000: image of ${siz.width} × ${siz.height} samples, more than the ${most} it may hold here`);
  }
  if (siz.bits > JPEG2000_WASM_MAX_BITS) return decodeJ2k(codestream, limits);
  const oj = await openjpegModule();
  const decoder = new oj.J2KDecoder();
  try {
    decoder.getEncodedBuffer(codestream.length).set(codestream);
    try {
      decoder.decode();
    } catch (cause) {
      throw new DecodeError(`JPEG 2000: OpenJPEG could not decode the codestream (${String(cause)})`, { cause });
    }
    const info = decoder.getFrameInfo();
    if (info.width !== siz.width || info.height !== siz.height || info.bitsPerSample !== siz.bits) {
      throw new DecodeError(
        `JPEG 2000: decoded ${info.width} × ${info.height} × ${info.bitsPerSample} bits, header says ${siz.width} × ${siz.height} × ${siz.bits}`,
      );
    }
    const count = info.width * info.height;
    const heap = decoder.getDecodedBuffer();
    const bytesPerSample = info.bitsPerSample <= 8 ? 1 : 2;
    if (heap.length < count * bytesPerSample) {
      throw new DecodeError(`JPEG 2000: decoder returned ${heap.length} bytes for ${count} samples`);
    }
    const values = new Uint32Array(count);
    if (bytesPerSample === 1) {
      for (let i = 0; i < count; i++) values[i] = heap[i];
    } else {
      // little-endian 16-bit samples (the wasm heap's order)
      for (let i = 0, p = 0; i < count; i++, p += 2) values[i] = heap[p] | (heap[p + 1] << 8);
    }
    return { width: info.width, height: info.height, bitsPerSample: info.bitsPerSample, values };
  } finally {
    decoder.delete();
  }
}
