/**
 * Bad input (fixtures made by make_fixtures.py by damaging an ecCodes-written message at a known
 * place): each broken message gives a typed error naming the file, the message number and its byte
 * offset; the good messages around it stay readable and equal ecCodes' values for them.
 */
import { describe, expect, it } from 'vitest';
import { DecodeError, FormatError, FrostgridError, UnsupportedError } from '../../lib/errors.js';
import { gribDriver, readGribIndex, scanGrib } from '../../lib/formats/grib/index.js';
import { REFERENCE, firstMismatch, fixture } from './reference.js';

const bad = Object.entries(REFERENCE).filter(([name]) => name.startsWith('bad-'));

/** When the damage shows: while indexing, or only when the field is decoded. */
const AT_DECODE = new Set(['bad-bitmap-mismatch.grib2']);

const KIND: Record<string, abstract new (...args: never[]) => FrostgridError> = {
  'bad-truncated.grib2': FormatError,
  'bad-past-end.grib2': FormatError,
  'bad-unknown-template.grib2': UnsupportedError,
  'bad-unknown-grid.grib2': UnsupportedError,
  'bad-bitmap-mismatch.grib2': DecodeError,
  'bad-absurd-size.grib2': FormatError,
  'bad-section-length.grib2': FormatError,
};

describe.each(bad)('%s', (name, ref) => {
  const b = ref.bad!;
  const path = fixture(name);
  const where = `${path}: message ${b.brokenMessage} at byte offset ${b.brokenOffset}`;

  it('reports the broken message with file, number, offset and what is wrong', async () => {
    const index = await readGribIndex(path);
    let err: FrostgridError;
    if (AT_DECODE.has(name)) {
      expect(index.problems).toEqual([]);
      const f = index.fields.find((x) => x.location.number === b.brokenMessage)!;
      let caught: unknown;
      try {
        f.decode();
      } catch (e) {
        caught = e;
      }
      expect(caught).toBeInstanceOf(FrostgridError);
      err = caught as FrostgridError;
    } else {
      expect(index.problems.length).toBe(1);
      err = index.problems[0];
    }
    expect(err).toBeInstanceOf(KIND[name]);
    expect(err.file).toBe(path);
    expect(err.messageNumber).toBe(b.brokenMessage);
    expect(err.offset).toBeGreaterThanOrEqual(b.brokenOffset);
    expect(err.offset).toBeLessThan(b.brokenOffset + Math.max(b.brokenLength, 16));
    expect(err.message.startsWith(where)).toBe(true);
    expect(err.message).toContain(b.fault);
  });

  it('keeps the other messages readable, with ecCodes values', async () => {
    const index = await readGribIndex(path);
    const good = index.fields.filter((f) => b.goodMessages.includes(f.location.number));
    expect(good.map((f) => f.location.number)).toEqual(b.goodMessages);
    for (const f of good) expect(firstMismatch(f.decode(), b.goodValues)).toBe(-1);
  });

  it('opens as a dataset that notes the skipped message', async () => {
    const warnings: string[] = [];
    const ds = await gribDriver.open(path, { warn: (m) => warnings.push(m) });
    try {
      const t = ds.fields.find((f) => f.name === 't')!;
      if (AT_DECODE.has(name)) {
        // The broken message is t at 300 hPa; the good ones t at 500 hPa.
        await expect(t.readSlice(0, Array.from(t.levelsPa).indexOf(30000))).rejects.toThrow(/bitmap marks/);
        expect(firstMismatch(await t.readSlice(0, Array.from(t.levelsPa).indexOf(50000)), b.goodValues)).toBe(-1);
      } else {
        expect(warnings.filter((w) => w.startsWith(where)).length).toBe(1);
        expect(ds.notes.some((n) => n.includes(where))).toBe(true);
        expect(firstMismatch(await t.readSlice(0, 0), b.goodValues)).toBe(-1);
      }
    } finally {
      await ds.close();
    }
  });
});

describe('scan robustness', () => {
  it('finds the messages of a mixed file between junk that mentions GRIB (offsets as ecCodes reports)', async () => {
    const scan = await scanGrib(fixture('mixed.grib2'));
    expect(scan.problems).toEqual([]);
    expect(scan.messages.map((m) => m.offset)).toEqual(REFERENCE['mixed.grib2'].messages.map((m) => m.offset));
    expect(scan.messages.map((m) => m.edition)).toEqual(REFERENCE['mixed.grib2'].messages.map((m) => m.edition));
    expect(scan.messages.map((m) => m.length)).toEqual(REFERENCE['mixed.grib2'].messages.map((m) => m.totalLength));
  });
});
