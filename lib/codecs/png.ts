/**
 * PNG decoding for GRIB2 data representation template 5.41: the data section is a PNG file of
 * grey samples whose depth is the packing's bits per value. Depths 1, 2, 4, 8 and 16 are grey
 * images; ecCodes writes 24 bits as 8-bit RGB and 32 bits as 8-bit RGBA, the sample being the
 * bytes read as one big-endian integer.
 */
import { decode } from 'fast-png';
import { DecodeError, UnsupportedError } from '../errors.js';
import type { DecodedSamples } from './jpeg2000.js';

const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

/**
 * Decodes a PNG into one unsigned integer per pixel, row by row.
 * @throws DecodeError when the bytes are not a PNG or are corrupt; UnsupportedError for a layout
 *   GRIB does not use (palette, grey+alpha, 16-bit colour).
 */
export function decodePngSamples(png: Uint8Array): DecodedSamples {
  if (png.length < 8 || PNG_SIGNATURE.some((b, i) => png[i] !== b)) {
    throw new DecodeError('PNG: data does not start with the PNG signature', { offset: 0 });
  }
  let image: ReturnType<typeof decode>;
  try {
    image = decode(png);
  } catch (cause) {
    throw new DecodeError(`PNG: ${cause instanceof Error ? cause.message : String(cause)}`, { cause });
  }
  const { width, height, depth, channels, data } = image;
  const count = width * height;
  if (image.palette !== undefined) {
    throw new UnsupportedError('PNG: palette images are not GRIB data', 'PNG colour type', 'palette');
  }
  const values = new Uint32Array(count);
  if (channels === 1) {
    if (depth === 8 || depth === 16) {
      if (data.length < count) throw new DecodeError(`PNG: ${data.length} samples for ${width} × ${height}`);
      for (let i = 0; i < count; i++) values[i] = data[i];
      return { width, height, bitsPerSample: depth, values };
    }
    if (depth === 1 || depth === 2 || depth === 4) {
      // fast-png returns these rows packed, MSB first, each row padded to a whole byte.
      const rowBytes = Math.ceil((width * depth) / 8);
      if (data.length < rowBytes * height) throw new DecodeError(`PNG: ${data.length} bytes for ${height} packed rows`);
      const perByte = 8 / depth;
      const mask = (1 << depth) - 1;
      for (let y = 0, o = 0; y < height; y++) {
        const row = y * rowBytes;
        for (let x = 0; x < width; x++, o++) {
          const shift = 8 - depth * ((x % perByte) + 1);
          values[o] = (data[row + Math.floor(x / perByte)] >>> shift) & mask;
        }
      }
      return { width, height, bitsPerSample: depth, values };
    }
  }
  if (depth === 8 && (channels === 3 || channels === 4)) {
    if (data.length < count * channels) throw new DecodeError(`PNG: ${data.length} bytes for ${count} pixels`);
    if (channels === 3) {
      for (let i = 0, p = 0; i < count; i++, p += 3) values[i] = (data[p] << 16) | (data[p + 1] << 8) | data[p + 2];
      return { width, height, bitsPerSample: 24, values };
    }
    for (let i = 0, p = 0; i < count; i++, p += 4) {
      values[i] = ((data[p] << 24) | (data[p + 1] << 16) | (data[p + 2] << 8) | data[p + 3]) >>> 0;
    }
    return { width, height, bitsPerSample: 32, values };
  }
  throw new UnsupportedError(
    `PNG: ${channels} channel(s) of ${depth} bits is not a GRIB sample layout`,
    'PNG sample layout',
    `${channels}x${depth}`,
  );
}
