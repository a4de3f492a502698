/**
 * The GRIB driver's GridDataset: fields grouped by parameter and level type, levels in Pa, times
 * with reference and step, SI units, and slices equal to ecCodes' values (reference.json.gz) of the
 * message that holds that time and level.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { gribDriver } from '../../lib/formats/grib/index.js';
import { REFERENCE, ecDate, firstMismatch, fixture } from './reference.js';

const FILE = 'll-isobaric-tq.grib2';
const ref = REFERENCE[FILE].messages;

describe('gribDriver', () => {
  it('sniffs GRIB at the start and after leading junk, and rejects other bytes', () => {
    const msg = readFileSync(fixture(FILE)).subarray(0, 512);
    expect(gribDriver.sniff(msg)).toBe(true);
    const junk = new Uint8Array(600);
    junk.set(new TextEncoder().encode('HTTP transfer header\r\n'), 0);
    junk.set(msg.subarray(0, 300), 100);
    expect(gribDriver.sniff(junk)).toBe(true);
    expect(gribDriver.sniff(new TextEncoder().encode('CDF\x01 not a grib file at all, GRIB mentioned'))).toBe(false);
  });

  it('opens t and q on isobaric levels with times, units and encoding (WMO code table 4.2: 0/0/0, 0/1/0)', async () => {
    const ds = await gribDriver.open(fixture(FILE), {});
    try {
      expect(ds.format).toBe('grib2');
      const names = ds.fields.map((f) => f.name).sort();
      expect(names).toEqual(['q', 't']);
      const t = ds.fields.find((f) => f.name === 't')!;
      const q = ds.fields.find((f) => f.name === 'q')!;
      expect(t.quantity).toBe('air_temperature');
      expect(t.units).toBe('K');
      expect(q.quantity).toBe('specific_humidity');
      expect(q.units).toBe('kg kg-1');
      const levels = [...new Set(ref.map((m) => m.level * 100))].sort((a, b) => a - b);
      expect(Array.from(t.levelsPa)).toEqual(levels);
      const valid = [...new Set(ref.map((m) => ecDate(m.validityDate, m.validityTime)))].sort((a, b) => a - b);
      expect(t.times.map((x) => x.valid.epochMs)).toEqual(valid);
      expect(t.times.map((x) => x.stepHours)).toEqual(valid.map((v) => (v - ecDate(ref[0].dataDate, ref[0].dataTime)) / 3600000));
      expect(t.rhConvention).toBeUndefined();
      const m0 = ref.find((m) => m.shortName === 't')!;
      expect(t.encoding.quantizationStep).toBe(2 ** m0.binaryScaleFactor * 10 ** -m0.decimalScaleFactor);
      expect(t.encoding.storedType).toBe('grib2-5.0');
      expect(t.grid.kind).toBe('regular_ll');
    } finally {
      await ds.close();
    }
  });

  it.each(ref.map((m, k) => [k, m] as const))('slice of message %i equals ecCodes values', async (_k, m) => {
    const ds = await gribDriver.open(fixture(FILE), {});
    try {
      const f = ds.fields.find((x) => x.name === m.shortName)!;
      const ti = f.times.findIndex((x) => x.valid.epochMs === ecDate(m.validityDate, m.validityTime));
      const li = Array.from(f.levelsPa).indexOf(m.level * 100);
      expect(ti).toBeGreaterThanOrEqual(0);
      expect(li).toBeGreaterThanOrEqual(0);
      const slice = await f.readSlice(ti, li);
      // Scanning mode 0: frostgrid order is the message order; values are float32 (1e-6).
      const want = m.values;
      expect(firstMismatch(slice, want, 1e-6)).toBe(-1);
    } finally {
      await ds.close();
    }
  });
});

describe('GRIB datasets: parameters and conventions', () => {
  it('lists an unknown parameter by its numbers instead of dropping it', async () => {
    const { mkdtempSync, writeFileSync } = await import('node:fs');
    const { tmpdir } = await import('node:os');
    const { join } = await import('node:path');
    const bytes = Uint8Array.from(readFileSync(fixture(FILE)).subarray(0, ref[0].totalLength));
    // Section 4 starts after sections 0 (16), 1 and 3; octet 11 is the parameter number.
    let pos = 16;
    while (bytes[pos + 4] !== 4) pos += (bytes[pos] << 24) | (bytes[pos + 1] << 16) | (bytes[pos + 2] << 8) | bytes[pos + 3];
    bytes[pos + 10] = 250;
    const path = join(mkdtempSync(join(tmpdir(), 'frostgrid-grib-')), 'unknown-parameter.grib2');
    writeFileSync(path, bytes);
    const ds = await gribDriver.open(path, {});
    try {
      expect(ds.fields.map((f) => f.name)).toEqual(['p0.0.250']);
      expect(ds.fields[0].quantity).toBeUndefined();
      expect(ds.fields[0].longName).toContain('discipline 0 category 0 number 250');
      expect(ds.notes.some((n) => n.includes('unknown parameter') && n.includes('number 250'))).toBe(true);
    } finally {
      await ds.close();
    }
  });

  it('states the phase of relative humidity the parameter gives (0/1/94 ice; ECMWF GRIB1 r mixed)', async () => {
    const a = await gribDriver.open(fixture('ll-bitmap.grib2'), {});
    const b = await gribDriver.open(fixture('mixed.grib2'), {});
    try {
      expect(a.fields[0].rhConvention).toEqual({ convention: 'ice', source: 'GRIB2 parameter 0/1/94' });
      expect(a.fields[0].units).toBe('1');
      expect(a.fields[0].encoding.unitScale).toBe(0.01);
      const r = b.fields.find((f) => f.name === 'r')!;
      expect(r.rhConvention?.convention).toBe('ecmwf-mixed');
      expect(b.format).toBe('grib-mixed');
    } finally {
      await a.close();
      await b.close();
    }
  });
});
