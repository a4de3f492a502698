/**
 * Every committed fixture, every field: decoded values against ecCodes' values (reference.json.gz,
 * made by python3-eccodes codes_get_values), to float32 rounding, with missing points exactly where
 * ecCodes' bitmap puts them; and the metadata ecCodes reports (parameter numbers, level, dates,
 * step, member, template numbers).
 */
import { describe, expect, it } from 'vitest';
import type { GribFieldInfo } from '../../lib/formats/grib/types.js';
import { REFERENCE, ecDate, firstMismatch, fixtureIndex } from './reference.js';

const files = Object.keys(REFERENCE).filter((f) => !f.startsWith('bad-'));

async function decoded(info: GribFieldInfo): Promise<Float64Array> {
  return info.decodeAsync ? info.decodeAsync() : info.decode();
}

describe.each(files)('%s against ecCodes', (file) => {
  const ref = REFERENCE[file];

  it('indexes as many fields as ecCodes reads, without problems', async () => {
    const index = await fixtureIndex(file);
    expect(index.problems.map((p) => p.message)).toEqual([]);
    expect(index.fields.length).toBe(ref.messages.length);
  });

  it.each(ref.messages.map((m, k) => [k, m] as const))('field %i: values and missing points', async (k, m) => {
    const index = await fixtureIndex(file);
    const info = index.fields[k];
    const values = await decoded(info);
    expect(values.length).toBe(m.values.length);
    const bad = firstMismatch(values, m.values);
    expect(bad, bad >= 0 ? `point ${bad}: got ${values[bad]}, ecCodes ${m.values[bad]}` : '').toBe(-1);
    expect(info.hasBitmap).toBe(m.bitmapPresent === 1);
  });

  it.each(ref.messages.map((m, k) => [k, m] as const))('field %i: metadata', async (k, m) => {
    const index = await fixtureIndex(file);
    const info = index.fields[k];
    expect(info.location.offset).toBe(m.offset);
    expect(info.location.edition).toBe(m.edition);
    expect(info.parameter.centre).toBe(m.centre);
    if (info.parameter.edition === 2) {
      expect([info.parameter.discipline, info.parameter.category, info.parameter.number]).toEqual([m.discipline, m.parameterCategory, m.parameterNumber]);
      expect(info.productTemplate).toBe(`4.${m.productDefinitionTemplateNumber}`);
      expect(info.packing).toBe(`5.${m.dataRepresentationTemplateNumber}`);
      expect(info.grid.template).toBe(`3.${m.gridDefinitionTemplateNumber}`);
    }
    if (m.typeOfLevel === 'isobaricInhPa') {
      expect(info.level).toEqual({ type: 'isobaric', code: 100, value: m.level * 100 });
    }
    expect(info.referenceTime.epochMs).toBe(ecDate(m.dataDate, m.dataTime));
    expect(info.validTime.epochMs).toBe(ecDate(m.validityDate, m.validityTime));
    expect(info.stepHours).toBe((ecDate(m.validityDate, m.validityTime) - ecDate(m.dataDate, m.dataTime)) / 3600000);
    // GRIB1 ECMWF local definitions carry perturbationNumber 0 for non-ensemble fields.
    if (m.edition === 2) expect(info.member).toBe(m.perturbationNumber ?? undefined);
    expect(info.numberOfPoints).toBe(m.numberOfDataPoints);
    expect(info.grid.scanningMode).toBe(m.scanningMode);
  });
});
