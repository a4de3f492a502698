/**
 * GRIB1 number representations (FM 92 GRIB edition 1, Part A, "Representation of numbers"):
 * sign-and-magnitude integers and IBM single-precision floats.
 */
import { describe, expect, it } from 'vitest';
import { ibmFloat, s16, s24, signedBits } from '../../../lib/formats/grib/edition1/octets.js';

describe('IBM single-precision float', () => {
  it.each([
    // value = (−1)^s · 16^(E−64) · F/2^24 (IBM System/360 hexadecimal floating point, as the
    // WMO GRIB1 manual defines the reference value).
    { bytes: [0x41, 0x10, 0x00, 0x00], value: 1, source: '16^1 · 1/16 (definition)' },
    { bytes: [0xc2, 0x76, 0xa0, 0x00], value: -118.625, source: 'IBM hexadecimal floating point, the commonly cited example −118.625 = C276A000' },
    { bytes: [0x40, 0x80, 0x00, 0x00], value: 0.5, source: '16^0 · 8/16 (definition)' },
    { bytes: [0x00, 0x00, 0x00, 0x00], value: 0, source: 'zero fraction (definition)' },
    { bytes: [0x3f, 0x10, 0x00, 0x00], value: 1 / 256, source: '16^−1 · 1/16 (definition)' },
  ])('$bytes is $value — $source', ({ bytes, value }) => {
    expect(ibmFloat(new Uint8Array(bytes), 0)).toBe(value);
  });
});

describe('sign-and-magnitude integers', () => {
  it.each([
    { bytes: [0x80, 0x05], value: -5 },
    { bytes: [0x00, 0x05], value: 5 },
    { bytes: [0xff, 0xff], value: -32767 },
  ])('2 octets $bytes are $value (leftmost bit is the sign, WMO GRIB1 Part A)', ({ bytes, value }) => {
    expect(s16(new Uint8Array(bytes), 0)).toBe(value);
  });

  it.each([
    { bytes: [0x81, 0x5f, 0x90], value: -90000 },
    { bytes: [0x01, 0x5f, 0x90], value: 90000 },
  ])('3 octets $bytes are $value millidegrees (WMO GRIB1 section 2 latitudes)', ({ bytes, value }) => {
    expect(s24(new Uint8Array(bytes), 0)).toBe(value);
  });

  it('reads a sign-and-magnitude field of any width at any bit (second-order SPD bias)', () => {
    // Bits 3..7 of 0b000_10011 are 1 0011: sign 1, magnitude 3.
    expect(signedBits(new Uint8Array([0b00010011, 0]), 3, 5)).toBe(-3);
    expect(signedBits(new Uint8Array([0b00000011, 0]), 3, 5)).toBe(3);
  });
});
