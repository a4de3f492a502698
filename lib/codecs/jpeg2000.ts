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
import { readImageHeader } from './j2k/markers.js';

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

/**
 * Decodes a raw J2K codestream of one unsigned component into its integer samples.
 * @throws DecodeError when the bytes are not a J2K codestream or a decoder rejects them;
 *   UnsupportedError for several components, signed samples or more than 32 bits per sample.
 */
export async function decodeJpeg2000(codestream: Uint8Array, limits: J2kLimits = {}): Promise<DecodedSamples> {
  const header = readImageHeader(codestream, limits.maxSamples ?? J2K_MAX_SAMPLES);
  const siz = { width: header.width, height: header.height, bits: header.size.precision };
  const n = codestream.length;
  if (codestream[n - 2] !== 0xff || codestream[n - 1] !== 0xd9) {
    // OpenJPEG decodes truncated codestreams leniently (missing data becomes zeros): refuse them.
    throw new DecodeError(`JPEG 2000: codestream of ${n} bytes does not end with the EOC marker (truncated?)`, {
      offset: n,
    });
  }
  if (header.size.signed) throw new UnsupportedError('JPEG 2000: signed samples', 'JPEG 2000 signed samples', 'signed');
  if (siz.bits > JPEG2000_MAX_BITS) {
    throw new UnsupportedError(
      `JPEG 2000: ${siz.bits} bits per sample; at most ${JPEG2000_MAX_BITS} are decoded`,
      'JPEG 2000 bits per sample',
      siz.bits,
    );
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
