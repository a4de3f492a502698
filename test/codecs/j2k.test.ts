/**
 * Our JPEG 2000 decoder (lib/codecs/j2k, ISO/IEC 15444-1) against the committed fixtures of
 * data-samples/fixtures/codecs/j2k (made by make-fixtures.py there): 130 raw codestreams written
 * by opj_compress 2.5.0, gdal_translate (GDAL 3.6.2 JP2OpenJPEG) and ecCodes 2.28 grid_jpeg.
 *
 * Expected samples: GDAL 3.6.2's decode of the same bytes (JP2OpenJPEG driver, OpenJPEG 2.5.0),
 * cross-checked there with opj_decompress (and grk_decompress up to 16 bits). Every sample must
 * be equal, irreversible (9/7) streams included. Expected GRIB2 values: ecCodes' codes_get_values.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { gunzipSync } from 'node:zlib';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { decodeJ2k, decodeJpeg2000 } from '../../lib/codecs/index.js';
import { DecodeError, FrostgridError, UnsupportedError } from '../../lib/errors.js';
import { readGribIndex } from '../../lib/formats/grib/index.js';

const DIR = fileURLToPath(new URL('../../data-samples/fixtures/codecs/j2k/', import.meta.url));

interface Fixture {
  name: string;
  file: string;
  expected: string;
  width: number;
  height: number;
  bitsPerSample: number;
  features: string[];
  sha256: string;
  first5: number[];
  last3: number[];
  tool: string;
  grib2?: string;
  ecCodes?: { valuesSha256F64le: string; valuesFirst3: number[]; valuesLast3: number[]; numberOfValues: number };
}
const all = (JSON.parse(readFileSync(DIR + 'fixtures.json', 'utf8')) as { fixtures: Fixture[] }).fixtures;
/** Streams the fixture README sets apart: overlapping POC records (decoders disagree), no guard bits. */
const SET_APART = new Set(['poc-overlap', 'guard0']);
const fixtures = all.filter((f) => !SET_APART.has(f.name));

/** Packet headers moved into PPM / PPT segments by make-packed.ts; expected: opj_decompress 2.5.0. */
const packed = (JSON.parse(readFileSync(DIR + 'packed.json', 'utf8')) as { fixtures: (Fixture & { source: string; gdal: string })[] })
  .fixtures;

const bytes = (f: string): Uint8Array => new Uint8Array(readFileSync(DIR + f));
function expectedSamples(f: Fixture): Uint32Array {
  const b = gunzipSync(readFileSync(DIR + f.expected));
  return new Uint32Array(b.buffer, b.byteOffset, b.length / 4);
}

function firstDifference(got: { width: number; values: Uint32Array }, want: Uint32Array): string | undefined {
  const v = got.values;
  if (v.length !== want.length) return `${v.length} samples, ${want.length} expected`;
  for (let i = 0; i < want.length; i++) {
    if (v[i] !== want[i]) return `row ${Math.floor(i / got.width)}, column ${i % got.width}: ${v[i]}, GDAL ${want[i]}`;
  }
  return undefined;
}

describe('decodeJ2k against GDAL (OpenJPEG 2.5.0) on every sample', () => {
  it.each(fixtures.map((f) => [`${f.name} (${f.bitsPerSample} bits; ${f.features.join(', ')})`, f] as const))('%s', (_n, f) => {
    const got = decodeJ2k(bytes(f.file));
    expect([got.width, got.height, got.bitsPerSample]).toEqual([f.width, f.height, f.bitsPerSample]);
    expect(firstDifference(got, expectedSamples(f))).toBeUndefined();
    // the committed record itself: digest and end samples as the generator wrote them
    expect(createHash('sha256').update(new Uint8Array(got.values.buffer)).digest('hex')).toBe(f.sha256);
    expect([...got.values.subarray(0, 5), ...got.values.subarray(got.values.length - 3)]).toEqual([...f.first5, ...f.last3]);
  });

  it.each(packed.map((f) => [`${f.name} (from ${f.source}; ${f.gdal})`, f] as const))('packed packet headers: %s', (_n, f) => {
    const got = decodeJ2k(bytes(f.file));
    expect(firstDifference(got, expectedSamples(f))).toBeUndefined();
    // moving the headers changes nothing: the same samples as the source codestream
    const source = all.find((x) => x.name === f.source)!;
    expect(firstDifference(got, expectedSamples(source))).toBeUndefined();
  });

  it('the fixtures cover every precision 1–31 and every coding option the decoder reads', () => {
    const tags = new Set(fixtures.flatMap((f) => f.features));
    for (let b = 1; b <= 31; b++) expect(tags.has(`bits:${b}`), `bits:${b}`).toBe(true);
    for (const t of [
      'reversible', 'irreversible', 'tiles', 'tileoffset', 'tileparts', 'offset', 'layers', 'precincts', 'sop', 'eph',
      'bypass', 'reset', 'termall', 'vcausal', 'predictable', 'segsym', 'roi', 'poc', 'plt', 'tlm', 'constant',
      'resolutions:1', 'resolutions:2', 'resolutions:6', 'progression:LRCP', 'progression:RLCP', 'progression:RPCL',
      'progression:PCRL', 'progression:CPRL', 'codeblock:4x4', 'codeblock:32x8', 'guardbits:1', 'grib2',
    ]) {
      expect(tags.has(t), t).toBe(true);
    }
  });
});

describe('decodeJpeg2000 up to 16 bits (the OpenJPEG wasm build) on the same fixtures', () => {
  it.each(fixtures.filter((f) => f.bitsPerSample <= 16).map((f) => [f.name, f] as const))('%s', async (_n, f) => {
    const got = await decodeJpeg2000(bytes(f.file));
    expect(firstDifference(got, expectedSamples(f))).toBeUndefined();
  });
});

describe('decodeJpeg2000 hands more than 16 bits per sample to our decoder', () => {
  it.each(fixtures.filter((f) => f.bitsPerSample > 16 && f.features.includes('eccodes')).map((f) => [f.name, f] as const))(
    '%s',
    async (_n, f) => {
      const got = await decodeJpeg2000(bytes(f.file));
      expect(got.bitsPerSample).toBe(f.bitsPerSample);
      expect(firstDifference(got, expectedSamples(f))).toBeUndefined();
    },
  );

  it('and 33 bits or more are refused by name', async () => {
    const f = fixtures.find((x) => x.name === 'grib2-24')!;
    const b = bytes(f.file).slice();
    b[42] = 32; // Ssiz: precision − 1 (ISO/IEC 15444-1 A.5.1)
    const err = await decodeJpeg2000(b).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(UnsupportedError);
    expect((err as Error).message).toMatch(/33 bits per sample/);
  });
});

describe('GRIB2 template 5.40 messages of ecCodes grid_jpeg above 16 bits, through the GRIB reader', () => {
  const gribs = fixtures.filter((f) => f.grib2 !== undefined && f.ecCodes !== undefined);
  it.each(gribs.map((f) => [f.name, f] as const))('%s: values equal codes_get_values', async (_n, f) => {
    const index = await readGribIndex(DIR + f.grib2!);
    expect(index.problems).toEqual([]);
    const info = index.fields[0];
    expect(info.packing).toBe('5.40');
    const values = await (info.decodeAsync ? info.decodeAsync() : info.decode());
    const e = f.ecCodes!;
    expect(values.length).toBe(e.numberOfValues);
    expect([...values.subarray(0, 3), ...values.subarray(values.length - 3)]).toEqual([...e.valuesFirst3, ...e.valuesLast3]);
    const le = new Uint8Array(Float64Array.from(values).buffer);
    expect(createHash('sha256').update(le).digest('hex')).toBe(e.valuesSha256F64le);
  });
});

describe('bad or unsupported codestreams: typed errors that say what is wrong', () => {
  const base = (): Uint8Array => bytes(fixtures.find((x) => x.name === 'grib2-24')!.file).slice();

  it('not a codestream', () => {
    expect(() => decodeJ2k(new Uint8Array([0xff, 0x4f, 0, 0]))).toThrow(DecodeError);
    expect(() => decodeJ2k(new Uint8Array([0xff, 0x4f, 0, 0]))).toThrow(/SOC, SIZ/);
  });

  it('cut inside the packet data', () => {
    const b = base();
    const cut = b.subarray(0, Math.floor(b.length * 0.6));
    // a tile-part whose declared length runs past the end
    expect(() => decodeJ2k(cut)).toThrow(DecodeError);
    expect(() => decodeJ2k(cut)).toThrow(/runs past the end of the codestream/);
  });

  it('packet data that runs out before the last packet', () => {
    const b = base();
    // Psot 0 means "to the end of the codestream": drop the tail but keep an EOC
    const sot = findMarker(b, 0xff90);
    b.set([0, 0, 0, 0], sot + 6);
    const short = new Uint8Array([...b.subarray(0, Math.floor(b.length * 0.5)), 0xff, 0xd9]);
    expect(() => decodeJ2k(short)).toThrow(DecodeError);
    expect(() => decodeJ2k(short)).toThrow(/tile 0: .*runs past the end of the (packet|tile) data/);
  });

  it('more than one component, signed samples', () => {
    const b = base();
    const three = new Uint8Array([...b.subarray(0, 40), 0, 3, ...b.subarray(42)]);
    expect(() => decodeJ2k(three)).toThrow(UnsupportedError);
    expect(() => decodeJ2k(three)).toThrow(/3 components, GRIB needs 1/);
    const signed = base();
    signed[42] |= 0x80;
    expect(() => decodeJ2k(signed)).toThrow(/signed samples/);
  });

  it('a reserved wavelet transform and too many decomposition levels', () => {
    const b = base();
    const cod = findMarker(b, 0xff52);
    const t = b.slice();
    t[cod + 13] = 2; // SPcod transformation (A.6.1: after Scod, SGcod 4 bytes, levels, xcb, ycb, style)
    expect(() => decodeJ2k(t)).toThrow(UnsupportedError);
    expect(() => decodeJ2k(t)).toThrow(/wavelet transform 2/);
    const l = b.slice();
    l[cod + 9] = 40;
    expect(() => decodeJ2k(l)).toThrow(/40 decomposition levels/);
  });

  it('an absurd declared size is refused before anything is allocated', async () => {
    const b = base();
    // Xsiz, Ysiz (A.5.1) to 60000 × 60000
    b.set([0, 0, 0xea, 0x60, 0, 0, 0xea, 0x60], 8);
    expect(() => decodeJ2k(b)).toThrow(/image of 60000 × 60000 samples, more than the 268435456 it may hold here/);
    // a GRIB message passes its point count as the bound, for either decoder
    const f = fixtures.find((x) => x.name === 'grib2-24')!;
    await expect(decodeJpeg2000(bytes(f.file), { maxSamples: f.width * f.height - 1 })).rejects.toThrow(/more than the \d+ it may hold/);
    const small = fixtures.find((x) => x.name === 'grib2-12')!;
    await expect(decodeJpeg2000(bytes(small.file), { maxSamples: 10 })).rejects.toThrow(DecodeError);
  });

  it('more packets declared than the packet data can hold', () => {
    const b = base();
    const cod = findMarker(b, 0xff52);
    b.set([0xff, 0xff], cod + 6); // SGcod number of layers: 65535
    expect(() => decodeJ2k(b)).toThrow(/declares \d+ packets \(layers × precincts\), more than its \d+ bytes/);
  });

  it('random damage to codestreams of every kind gives typed errors or samples, never a crash or a hang', () => {
    // deterministic byte damage (common practice, no source): flipped bytes and cuts
    let seed = 12345;
    const rand = (n: number): number => {
      seed = (Math.imul(seed, 1103515245) + 12345) >>> 0;
      return seed % n;
    };
    const kinds = ['grib2-24', 'prog-PCRL', 'mode63-all', 'irr16-layers', 'roi', 'poc', 'tiles-edge', 'sop-eph', 'grib2-24-ppm', 'prog-PCRL-ppt'];
    let decoded = 0;
    let typed = 0;
    for (const name of kinds) {
      const f = [...all, ...packed].find((x) => x.name === name)!;
      const good = bytes(f.file);
      for (let k = 0; k < 60; k++) {
        const b = good.slice();
        if (k % 4 === 3) {
          const cut = new Uint8Array([...b.subarray(0, 2 + rand(b.length - 2)), 0xff, 0xd9]);
          b.set(cut.subarray(0, Math.min(cut.length, b.length)));
        }
        for (let n = 1 + rand(4); n > 0; n--) b[rand(b.length)] = rand(256);
        try {
          decodeJ2k(b, { maxSamples: 1 << 20 });
          decoded++;
        } catch (e) {
          if (!(e instanceof FrostgridError)) throw new Error(`${name}, damage ${k}: ${(e as Error).stack}`);
          typed++;
        }
      }
    }
    expect(decoded + typed).toBe(kinds.length * 60);
    expect(typed).toBeGreaterThan(0);
  });

  it('packed packet headers that do not add up', () => {
    const ppm = bytes(packed.find((x) => x.name === 'tileparts-R-ppm')!.file);
    // the first PPM segment starts where the main header's last segment ends; its first Nppm
    // record (4 bytes after Lppm and Zppm) claims more bytes than the PPM segments hold
    const at = findMarker(ppm, 0xff60);
    const big = ppm.slice();
    big.set([0, 0x10, 0, 0], at + 5);
    expect(() => decodeJ2k(big)).toThrow(DecodeError);
    expect(() => decodeJ2k(big)).toThrow(/PPM record of 1048576 bytes runs past the PPM segments/);
    // a PPT segment moved into the main header
    const ppt = bytes(packed.find((x) => x.name === 'sop-eph-ppt')!.file);
    const moved = ppt.slice();
    moved[at + 1] = 0x61;
    expect(() => decodeJ2k(moved)).toThrow(/PPT segment in the main header/);
    // headers cut short: drop the last 4 bytes of the only PPT segment (Lppt and Psot follow)
    const p = findMarker(ppt, 0xff61);
    const lppt = (ppt[p + 2] << 8) | ppt[p + 3];
    const sot = findMarker(ppt, 0xff90);
    const psot = ((ppt[sot + 6] << 24) | (ppt[sot + 7] << 16) | (ppt[sot + 8] << 8) | ppt[sot + 9]) >>> 0;
    const short = new Uint8Array([...ppt.subarray(0, p + 2 + lppt - 4), ...ppt.subarray(p + 2 + lppt)]);
    short.set([(lppt - 4) >> 8, (lppt - 4) & 255], p + 2);
    short.set([(psot - 4) >>> 24, ((psot - 4) >>> 16) & 255, ((psot - 4) >>> 8) & 255, (psot - 4) & 255], sot + 6);
    expect(() => decodeJ2k(short)).toThrow(/packet header runs past the end of the packed packet headers/);
  });

  it('streams set apart by the fixture README: a typed error, never a crash', () => {
    // no guard bits: the encoder's passes outrun the bit-planes Mb allows (E.1.1, B.10.5)
    const g = all.find((x) => x.name === 'guard0')!;
    expect(() => decodeJ2k(bytes(g.file))).toThrow(/more coding passes than its \d+ bit-planes allow/);
    // overlapping POC records: the packets the progressions name outrun the data
    const p = all.find((x) => x.name === 'poc-overlap')!;
    expect(() => decodeJ2k(bytes(p.file))).toThrow(DecodeError);
  });
});

function findMarker(b: Uint8Array, code: number): number {
  for (let i = 0; i + 1 < b.length; i++) if (b[i] === code >> 8 && b[i + 1] === (code & 0xff)) return i;
  throw new Error(`marker ${code.toString(16)} not in fixture`);
}
