/**
 * Helpers of the GRIB1 bad-input tests: damage one committed fixture, parse it as message 3 of a
 * file at byte 1000, and check the typed error names the file, the message, the byte offset and
 * what is wrong.
 */
import { expect } from 'vitest';
import type { DecodeError, FormatError, UnsupportedError } from '../../../lib/errors.js';
import { parseGrib1Message } from '../../../lib/formats/grib/edition1/index.js';
import { loadFixture } from './fixtures.js';

export const FILE = 'damaged.grib';
/** The damaged message is message 3 of its file and starts at byte 1000. */
export const MESSAGE = 3;
export const OFFSET = 1000;

export function damaged(name: string, edit: (b: Uint8Array) => Uint8Array | void): Uint8Array {
  const b = new Uint8Array(loadFixture(name).bytes);
  return edit(b) ?? b;
}

export function parse(bytes: Uint8Array) {
  return parseGrib1Message(FILE, bytes, { number: MESSAGE, offset: OFFSET, length: bytes.length, edition: 1 });
}

export function put16(b: Uint8Array, p: number, v: number): void {
  b[p] = (v >>> 8) & 0xff;
  b[p + 1] = v & 0xff;
}

export function put24(b: Uint8Array, p: number, v: number): void {
  b[p] = (v >>> 16) & 0xff;
  b[p + 1] = (v >>> 8) & 0xff;
  b[p + 2] = v & 0xff;
}

/** Section offsets within a fixture: PDS at 8, then GDS, BMS, BDS by their lengths. */
export function sections(b: Uint8Array): { gds: number; bms: number | undefined; bds: number } {
  const u24 = (p: number) => (b[p] << 16) | (b[p + 1] << 8) | b[p + 2];
  const gds = 8 + u24(8);
  const afterGds = gds + u24(gds);
  const hasBms = (b[8 + 7] & 0x40) !== 0;
  return { gds, bms: hasBms ? afterGds : undefined, bds: hasBms ? afterGds + u24(afterGds) : afterGds };
}

export function expectError(fn: () => unknown, type: typeof FormatError | typeof DecodeError | typeof UnsupportedError, offset: number, text: RegExp) {
  let caught: unknown;
  try {
    fn();
  } catch (e) {
    caught = e;
  }
  expect(caught).toBeInstanceOf(type);
  const e = caught as FormatError;
  expect(e.file).toBe(FILE);
  expect(e.messageNumber).toBe(MESSAGE);
  expect(e.offset).toBe(offset);
  expect(e.message).toMatch(new RegExp(`^${FILE}: GRIB1 message ${MESSAGE} at byte ${offset}: `));
  expect(e.message).toMatch(text);
  return e;
}
