/**
 * Bad input: each case damages one ecCodes-made fixture in one place and expects a typed error
 * that names the file, the message number, the byte offset in the file and what is wrong.
 * Octet positions are those of FM 92 GRIB edition 1 (section 0: 8 octets; section 1 of these
 * fixtures: 52 octets with ECMWF local definition 1; section 2 of a lat-lon grid: 32 octets).
 */
import { describe, expect, it } from 'vitest';
import { DecodeError, FormatError, UnsupportedError } from '../../../lib/errors.js';
import { describeGrib1Parameter, grib1MessageLength, parseGrib1Message } from '../../../lib/formats/grib/edition1/index.js';
import { damaged, expectError, FILE, MESSAGE, OFFSET, parse, put24, sections } from './damage.js';
import { loadFixture } from './fixtures.js';

describe('GRIB1 bad input', () => {
  it('a truncated message is a FormatError stating both lengths', () => {
    const full = loadFixture('ll_t500_t128_16bit').bytes;
    const cut = full.slice(0, 400);
    expectError(() => parse(cut), FormatError, OFFSET + 4, new RegExp(`truncated: total length ${full.length}, only 400 bytes present`));
  });

  it('a message cut inside section 0 is a FormatError', () => {
    expectError(() => parse(new Uint8Array([0x47, 0x52, 0x49, 0x42, 0])), FormatError, OFFSET, /truncated: 5 bytes, section 0 needs 8/);
  });

  it('a section 2 length past the end of the message is a FormatError', () => {
    const b = damaged('ll_t500_t128_16bit', (b) => put24(b, sections(b).gds, 0x7fff00));
    expectError(() => parse(b), FormatError, OFFSET + 60, /section 2 length 8388352 runs past the end of the message/);
  });

  it('a section 4 length past the end of the message is a FormatError', () => {
    const b = damaged('ll_t500_t128_16bit', (b) => put24(b, sections(b).bds, 5000));
    expectError(() => parse(b), FormatError, OFFSET + 92, /section 4 length 5000 runs past the end/);
  });

  it('a section 4 that does not end at "7777" is a FormatError', () => {
    const b = damaged('ll_t500_t128_16bit', (b) => {
      b[b.length - 2] = 0x36;
    });
    expectError(() => parse(b), FormatError, OFFSET + b.length - 4, /end marker "7777" not found/);
  });

  it('an unknown grid type (Code table 6) is an UnsupportedError naming it', () => {
    const b = damaged('ll_t500_t128_16bit', (b) => {
      b[sections(b).gds + 5] = 1; // 1 = Mercator, not decoded
    });
    const e = expectError(() => parse(b), UnsupportedError, OFFSET + 60 + 5, /data representation type \(Code table 6\) 1 is not supported/) as unknown as UnsupportedError;
    expect(e.id).toBe(1);
  });

  it('a message without section 2 (predefined grid) is an UnsupportedError', () => {
    const b = damaged('ll_t500_t128_16bit', (b) => {
      b[8 + 7] &= ~0x80;
    });
    expectError(() => parse(b), UnsupportedError, OFFSET + 14, /predefined grid \(no section 2\), grid definition number 255/);
  });

  it('a bitmap shorter than the grid is a FormatError', () => {
    const b = damaged('ll_z250_t128_24bit_bitmap', (b) => {
      const { gds } = sections(b);
      b[gds + 7] = 20; // Ni 16 -> 20: 240 points, the bitmap has 192 bits
    });
    expectError(() => parse(b), FormatError, OFFSET + 92, /bitmap holds 192 bits, the grid has 240 points/);
  });

  it('a bitmap whose present points do not match the packed values is a DecodeError at decode()', () => {
    const b = damaged('ll_z250_t128_24bit_bitmap', (b) => {
      const bms = sections(b).bms!;
      b[bms + 6 + 5] = 0xff; // points 40..47 were missing (make_fixtures.py), now marked present
    });
    const info = parse(b);
    const present = loadFixture('ll_z250_t128_24bit_bitmap').ref.values.filter((v) => v !== null).length;
    expectError(() => info.decode(), DecodeError, OFFSET + sections(b).bds, new RegExp(`section 4 holds ${present} values of 24 bits, ${present + 8} are needed`));
  });

  it('a predefined bitmap is an UnsupportedError naming its number', () => {
    const b = damaged('ll_z250_t128_24bit_bitmap', (b) => {
      const bms = sections(b).bms!;
      b[bms + 5] = 7;
    });
    expectError(() => parse(b), UnsupportedError, OFFSET + 92 + 4, /predefined bitmap 7 is not supported/);
  });

  it('an absurd grid size with a constant field is refused before anything is allocated', () => {
    const b = damaged('ll_gh200_wmo3_constant', (b) => {
      const { gds } = sections(b);
      b[gds + 6] = 0xff;
      b[gds + 7] = 0xfe; // Ni 65534
      b[gds + 8] = 0xff;
      b[gds + 9] = 0xfe; // Nj 65534
    });
    expectError(() => parse(b), FormatError, OFFSET + sections(b).gds, /grid declares 4294705156 points, more than a message of 84 bytes can justify/);
  });

  it('a grid larger than its simple-packed data is a DecodeError before allocation', () => {
    const b = damaged('ll_t500_t128_16bit', (b) => {
      const { gds } = sections(b);
      b[gds + 6] = 0x0f; // Ni 24 -> 3840 + 24: 50 232 points, the data hold 312
    });
    const info = parse(b);
    expect(info.numberOfPoints).toBe((0x0f00 + 24) * 13);
    expectError(() => info.decode(), DecodeError, OFFSET + 92, /section 4 holds 312 values of 16 bits, 50232 are needed/);
  });

  it('a second-order group count that does not match the grid is a DecodeError', () => {
    const b = damaged('ll_t250_t128_second_order', (b) => {
      const { gds } = sections(b);
      b[gds + 9] = 20; // Nj 21 -> 20
    });
    expectError(() => parse(b).decode(), DecodeError, OFFSET + sections(b).bds, /second-order groups hold 840 values .*, 800 are expected/);
  });

  // Flag combinations outside the forms read (layout: FM 92 GRIB edition 1, Code table 11 and
  // ecCodes grib1/11-2.table; the forms: ecCodes grib1/section.4.def packingType concept).
  it.each([
    ['50', 'matrix of values, second-order values of different widths, spatial differencing order 0'],
    ['28', 'secondary bitmap, general extended second-order packing, second-order values of constant width, spatial differencing order 0'],
    ['08', 'general extended second-order packing, second-order values of constant width, spatial differencing order 0'],
    ['00', 'second-order values of constant width, spatial differencing order 0'],
    ['12', 'second-order values of different widths, spatial differencing order 2'],
    ['31', 'secondary bitmap, second-order values of different widths, spatial differencing order 1'],
    ['14', 'second-order values of different widths, boustrophedonic ordering, spatial differencing order 0'],
    ['9a', 'reserved bit 1, second-order values of different widths, general extended second-order packing, spatial differencing order 2'],
  ])('second-order extended flags 0x%s are an UnsupportedError naming the flags', (hex, named) => {
    const b = damaged('ll_t250_t128_second_order', (b) => {
      b[sections(b).bds + 13] = parseInt(hex, 16);
    });
    const e = expectError(() => parse(b), UnsupportedError, OFFSET + sections(b).bds + 13, new RegExp(`second-order packing with extended flags 0x${hex} is not supported \\(${named}; read are: general extended`));
    expect((e as unknown as UnsupportedError).id).toBe(`0x${hex}`);
  });

  it('spherical harmonic data are an UnsupportedError', () => {
    const b = damaged('ll_t500_t128_16bit', (b) => {
      b[sections(b).bds + 3] |= 0x80;
    });
    expectError(() => parse(b), UnsupportedError, OFFSET + 95, /spherical harmonic data/);
  });

  it('a reference date that is not a date is a DecodeError', () => {
    const b = damaged('ll_t500_t128_16bit', (b) => {
      b[8 + 13] = 2;
      b[8 + 14] = 30; // 30 February
    });
    expectError(() => parse(b), DecodeError, OFFSET + 8 + 12, /reference time 2026-02-30 00:00 is not a date/);
  });

  it('a time range indicator without a defined step is an UnsupportedError', () => {
    const b = damaged('ll_t500_t128_16bit', (b) => {
      b[8 + 20] = 51;
    });
    expectError(() => parse(b), UnsupportedError, OFFSET + 8 + 20, /time range indicator \(Code table 5\) 51 is not supported/);
  });

  it('a time unit without a fixed length (month) is an UnsupportedError', () => {
    const b = damaged('ll_t500_t128_16bit', (b) => {
      b[8 + 17] = 3;
    });
    expectError(() => parse(b), UnsupportedError, OFFSET + 8 + 17, /time unit \(Code table 4\) 3 is not supported/);
  });

  it('a damaged message among others: its error names it, the others stay readable', () => {
    // Three messages one after another, as in a file; the middle one has a predefined bitmap.
    const a = loadFixture('ll_t500_t128_16bit');
    const c = loadFixture('reduced_gg_n8_r700_t128_second_order');
    const bad = damaged('ll_z250_t128_24bit_bitmap', (b) => {
      b[sections(b).bms! + 5] = 3;
    });
    const file = new Uint8Array(a.bytes.length + bad.length + c.bytes.length);
    file.set(a.bytes, 0);
    file.set(bad, a.bytes.length);
    file.set(c.bytes, a.bytes.length + bad.length);
    const results: string[] = [];
    for (let offset = 0, n = 1; offset < file.length; n++) {
      const length = grib1MessageLength(file.subarray(offset), { file: FILE, offset, message: n });
      const bytes = file.subarray(offset, offset + length);
      try {
        const values = parseGrib1Message(FILE, bytes, { number: n, offset, length, edition: 1 }).decode();
        results.push(`ok ${values.length}`);
      } catch (e) {
        expect(e).toBeInstanceOf(UnsupportedError);
        expect((e as UnsupportedError).offset).toBe(offset + 92 + 4);
        results.push((e as Error).message);
      }
      offset += length;
    }
    expect(results).toEqual([
      `ok ${a.ref.values.length}`,
      `${FILE}: GRIB1 message 2 at byte ${a.bytes.length + 96}: GRIB1 predefined bitmap 3 is not supported`,
      `ok ${c.ref.values.length}`,
    ]);
  });

  it('an unknown parameter is kept by its numbers and has no description', () => {
    const b = damaged('ll_t500_t128_16bit', (b) => {
      b[8 + 8] = 61; // table 128 has no parameter 61 (ecCodes grib1/2.98.128.table)
    });
    const info = parse(b);
    expect(info.parameter).toEqual({ edition: 1, table: 128, number: 61, centre: 98 });
    expect(describeGrib1Parameter({ table: 128, number: 61, centre: 98 })).toBeUndefined();
    expect(info.decode().length).toBe(312);
  });

  it('random damage never hangs and only ever raises typed errors', () => {
    // Deterministic corruption of every fixture octet by octet; decode() must finish or throw one
    // of the typed errors (no RangeError from a typed array, no TypeError).
    const names = ['ll_t500_t128_16bit', 'll_z250_t128_24bit_bitmap', 'reduced_gg_n8_r700_t128_second_order', 'll_q400_t128_second_order_boustrophedonic_bitmap'];
    let typed = 0;
    for (const name of names) {
      const base = loadFixture(name).bytes;
      for (let p = 4; p < Math.min(base.length, 140); p++) {
        for (const v of [0x00, 0xff, base[p] ^ 0x55]) {
          const b = new Uint8Array(base);
          b[p] = v;
          try {
            const info = parse(b);
            info.decode();
          } catch (e) {
            expect(e instanceof FormatError || e instanceof DecodeError || e instanceof UnsupportedError, `${name} octet ${p + 1} = ${v}: ${String(e)}`).toBe(true);
            typed++;
          }
        }
      }
    }
    expect(typed).toBeGreaterThan(100);
  });
});
