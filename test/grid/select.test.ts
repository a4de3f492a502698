/**
 * Choosing a field by quantity. Fixture ambiguous.nc (netCDF4-python): t and ta are both
 * temperatures by common short name only (common practice, no source); q is specific humidity
 * by short name and spec_hum by CF standard_name, which ranks first.
 */
import { describe, expect, it } from 'vitest';
import { AmbiguityError, MissingQuantityError } from '../../lib/errors.js';
import { findField, findHumidity } from '../../lib/grid/select.js';
import { open } from '../../lib/open.js';
import { FIXTURES } from '../netcdf/reference.js';

describe('findField', () => {
  it('two short-name candidates are an AmbiguityError listing them', async () => {
    const ds = await open(FIXTURES + 'ambiguous.nc');
    try {
      let e: unknown;
      try {
        findField(ds, 'air_temperature');
      } catch (x) {
        e = x;
      }
      expect(e).toBeInstanceOf(AmbiguityError);
      expect((e as AmbiguityError).candidates).toEqual(['t', 'ta']);
      expect((e as Error).message).toBe(`${FIXTURES}ambiguous.nc: 2 variables could be air_temperature: t, ta; name one explicitly`);
    } finally {
      await ds.close();
    }
  });
  it('naming the variable resolves the ambiguity', async () => {
    const ds = await open(FIXTURES + 'ambiguous.nc');
    try {
      expect(findField(ds, 'air_temperature', { variable: 'ta' }).name).toBe('ta');
      expect(() => findField(ds, 'air_temperature', { variable: 'nope' })).toThrow(MissingQuantityError);
    } finally {
      await ds.close();
    }
  });
  it('a standard_name match outranks a short-name match (CF standard names are authoritative)', async () => {
    const ds = await open(FIXTURES + 'ambiguous.nc');
    try {
      expect(findField(ds, 'specific_humidity').name).toBe('spec_hum');
      expect(findHumidity(ds).field.name).toBe('spec_hum');
    } finally {
      await ds.close();
    }
  });
  it('open(…, { variables }) names the variable for the whole dataset', async () => {
    const ds = await open(FIXTURES + 'ambiguous.nc', { variables: { air_temperature: 't' } });
    try {
      expect(findField(ds, 'air_temperature').name).toBe('t');
      expect(ds.notes).toContain('variable ta looks like air_temperature, but t was named for it');
    } finally {
      await ds.close();
    }
  });
});
