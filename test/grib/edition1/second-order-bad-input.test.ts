/**
 * Bad input in the second-order forms without general extended descriptors (row by row, constant
 * width, general with a secondary bitmap): each case damages one hand-packed fixture (made by
 * make_fixtures.py and checked there against ecCodes 2.28 codes_get_values) in one place and
 * expects a typed error naming the file, the message, the byte offset and what is wrong.
 * Octets: FM 92 GRIB edition 1, section 4, grid-point data second-order packing (12–13 N1,
 * 14 extended flags, 15–16 N2, 17–18 P1, 19–20 P2, 22… widths, then the secondary bitmap);
 * section 2 of a lat-lon grid: octets 7–8 Ni, 9–10 Nj; section 3: the bitmap from octet 7.
 */
import { describe, expect, it } from 'vitest';
import { DecodeError, FormatError, UnsupportedError } from '../../../lib/errors.js';
import { damaged, expectError, OFFSET, parse, put16, sections } from './damage.js';
import { loadFixture } from './fixtures.js';

const ROW = 'll_t300_t128_second_order_row_by_row'; // 20 × 12, P1 12, N1 34, N2 49, 278 bytes, 0 unused bits
const ROW_BITMAP = 'll_z300_t128_second_order_row_by_row_bitmap'; // point 6 of row 0 missing, row width 5
const GENERAL = 'll_t200_t128_second_order_general'; // 240 values, P1 17, secondary bitmap at octet 39, 370 bytes
const CONSTANT = 'll_r500_t128_second_order_constant_width'; // 240 values, W21 = 9 at octet 22

/** Absolute byte of section 4 octet `octet` in the damaged file. */
const at = (b: Uint8Array, octet: number) => OFFSET + sections(b).bds + octet - 1;

describe('GRIB1 second-order bad input: row by row', () => {
  it('a group count (P1) that is not the number of rows is a DecodeError', () => {
    const b = damaged(ROW, (b) => put16(b, sections(b).bds + 16, 11));
    expectError(() => parse(b).decode(), DecodeError, at(b, 17), /row-by-row second-order packing has 11 groups \(P1\), the grid has 12 rows$/);
  });

  it('rows longer than the data hold (Ni 20 -> 21) are a FormatError before allocation', () => {
    const b = damaged(ROW, (b) => {
      b[sections(b).gds + 7] = 21;
    });
    // 12 rows of 21 points at widths 0,3,7,11,16,24,1,9,0,3,7,11 need 1932 bits; 230 bytes follow N2.
    expectError(() => parse(b).decode(), FormatError, at(b, 1), /second-order values need 242 bytes, section 4 has 230 after the descriptors$/);
  });

  it('a group width of more than 32 bits is a DecodeError naming the group and octet', () => {
    const b = damaged(ROW, (b) => {
      b[sections(b).bds + 21 + 2] = 40;
    });
    expectError(() => parse(b).decode(), DecodeError, at(b, 24), /group 2 has width 40, more than 32 bits \(octet 24 of section 4\)$/);
  });

  it('a width of first-order values of more than 32 bits is a DecodeError', () => {
    const b = damaged(ROW, (b) => {
      b[sections(b).bds + 10] = 40;
    });
    expectError(() => parse(b).decode(), DecodeError, at(b, 11), /width of first-order values 40 is more than 32 bits$/);
  });

  it('N1 that does not point at the first-order values is a DecodeError', () => {
    const b = damaged(ROW, (b) => put16(b, sections(b).bds + 11, 35));
    expectError(() => parse(b).decode(), DecodeError, at(b, 12), /N1 \(start of first-order values\) is octet 35, the layout puts it at octet 34$/);
  });

  it('N2 pointing outside the section is a DecodeError', () => {
    const b = damaged(ROW, (b) => put16(b, sections(b).bds + 14, 65520));
    expectError(() => parse(b).decode(), DecodeError, at(b, 15), /N2 \(start of second-order values\) is octet 65520, the layout puts it at octet 49$/);
  });

  it('an unused-bits count (octet 4) that overlaps the values is ignored, as ecCodes ignores it', () => {
    // oracle: ecCodes 2.28 codes_get_values of this fixture with octet 4's low bits set to 15 are
    // identical to those of the fixture itself (checked when this test was written).
    const b = damaged(ROW, (b) => {
      b[sections(b).bds + 3] = (b[sections(b).bds + 3] & 0xf0) | 15;
    });
    const expected = loadFixture(ROW).ref.values;
    const got = parse(b).decode();
    expect(got).toHaveLength(expected.length);
    for (let i = 0; i < got.length; i++) expect(Math.abs(got[i] - expected[i]!)).toBeLessThanOrEqual(1e-6 * Math.abs(expected[i]!));
  });

  it('a primary bitmap with more present points in a row than its group holds is a FormatError', () => {
    const b = damaged(ROW_BITMAP, (b) => {
      b[sections(b).bms! + 6] |= 0x02; // point 6 (row 0, width 5) marked present
    });
    const bds = sections(b).bds;
    const length = (b[bds] << 16) | (b[bds + 1] << 8) | b[bds + 2];
    const n2 = (b[bds + 14] << 8) | b[bds + 15];
    expectError(() => parse(b).decode(), FormatError, at(b, 1), new RegExp(`second-order values need \\d+ bytes, section 4 has ${length - n2 + 1} after the descriptors$`));
  });

  it('boustrophedonic ordering with row-by-row packing is an UnsupportedError (ecCodes ignores the flag there)', () => {
    const b = damaged(ROW, (b) => {
      b[sections(b).bds + 13] |= 0x04;
    });
    expectError(() => parse(b), UnsupportedError, at(b, 14), /extended flags 0x14 is not supported \(second-order values of different widths, boustrophedonic ordering/);
  });
});

describe('GRIB1 second-order bad input: secondary bitmap forms', () => {
  it('P2 that is not the number of coded values is a DecodeError', () => {
    const b = damaged(GENERAL, (b) => put16(b, sections(b).bds + 18, 239));
    expectError(() => parse(b).decode(), DecodeError, at(b, 19), /P2 says 239 second-order values \(the length of the secondary bitmap\), the grid and bitmap give 240$/);
  });

  it('a secondary bitmap whose first bit is 0 is a DecodeError', () => {
    const b = damaged(GENERAL, (b) => {
      b[sections(b).bds + 38] &= 0x7f;
    });
    expectError(() => parse(b).decode(), DecodeError, at(b, 39), /the secondary bitmap \(octet 39 of section 4\) does not start with 1/);
  });

  it('a secondary bitmap marking more groups than P1 is a DecodeError', () => {
    const b = damaged(GENERAL, (b) => {
      b[sections(b).bds + 38] |= 0x40;
    });
    expectError(() => parse(b).decode(), DecodeError, at(b, 39), /the secondary bitmap marks 18 group starts, P1 says 17 groups$/);
  });

  it.each([
    [0, /second-order packing with 0 groups \(P1\)$/],
    [241, /241 groups \(P1\) for 240 values$/],
  ])('P1 = %i is a DecodeError', (p1, text) => {
    const b = damaged(GENERAL, (b) => put16(b, sections(b).bds + 16, p1));
    expectError(() => parse(b).decode(), DecodeError, at(b, 17), text);
  });

  it('a secondary bitmap longer than the section (Ni 20 -> 400, P2 4800) is a FormatError before allocation', () => {
    const b = damaged(GENERAL, (b) => {
      put16(b, sections(b).gds + 6, 400);
      put16(b, sections(b).bds + 18, 4800);
    });
    expectError(
      () => parse(b).decode(),
      FormatError,
      at(b, 1),
      /section 4 of 370 bytes cannot hold 17 widths and a secondary bitmap of 4800 bits from octet 22$/,
    );
  });

  it('a constant width of more than 32 bits is a DecodeError', () => {
    const b = damaged(CONSTANT, (b) => {
      b[sections(b).bds + 21] = 33;
    });
    expectError(() => parse(b).decode(), DecodeError, at(b, 22), /the width of the second-order values 33, more than 32 bits \(octet 22 of section 4\)$/);
  });

  it('a constant width the section cannot hold (9 -> 10 bits) is a FormatError', () => {
    const b = damaged(CONSTANT, (b) => {
      b[sections(b).bds + 21] = 10;
    });
    // 240 values of 10 bits need 300 bytes; N2 is octet 70 of 340.
    expectError(() => parse(b).decode(), FormatError, at(b, 1), /second-order values need 300 bytes, section 4 has 271 after the descriptors$/);
  });
});

describe('GRIB1 second-order forms with random damage', () => {
  it('never hang and only ever raise typed errors', () => {
    // Deterministic corruption of every octet of sections 2-4 (common practice, no source): decode()
    // must finish or throw one of the typed errors (no RangeError from a typed array, no TypeError).
    const names = [ROW_BITMAP, 'reduced_gg_n8_q300_t128_second_order_general_bitmap', 'll_t400_t128_second_order_constant_width_boustrophedonic_bitmap', CONSTANT];
    let typed = 0;
    let decoded = 0;
    for (const name of names) {
      const base = loadFixture(name).bytes;
      for (let p = 60; p < Math.min(base.length - 4, 260); p++) {
        for (const v of [0x00, 0xff, base[p] ^ 0x55]) {
          const b = new Uint8Array(base);
          b[p] = v;
          try {
            const values = parse(b).decode();
            expect(values.length).toBeGreaterThan(0);
            decoded++;
          } catch (e) {
            expect(e instanceof FormatError || e instanceof DecodeError || e instanceof UnsupportedError, `${name} octet ${p + 1} = ${v}: ${String(e)}`).toBe(true);
            typed++;
          }
        }
      }
    }
    expect(typed).toBeGreaterThan(300);
    expect(decoded).toBeGreaterThan(0);
  });
});
