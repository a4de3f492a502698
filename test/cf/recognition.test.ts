/**
 * Quantity recognition (CF standard name table first, then common short names — common
 * practice, no source) and the inference of relative humidity's phase convention from file
 * attributes, on the committed fixtures (written by netCDF4-python, attributes as ncdump shows).
 */
import { describe, expect, it } from 'vitest';
import { recogniseQuantity } from '../../lib/cf/quantity.js';
import { inferRhConvention } from '../../lib/cf/rh-convention.js';
import { open } from '../../lib/open.js';
import { FIXTURES } from '../netcdf/reference.js';

describe('recogniseQuantity', () => {
  it.each([
    ['anything', { standard_name: 'air_temperature' }, 'air_temperature', 'standard_name'],
    ['x', { standard_name: 'geopotential_height' }, 'geopotential_height', 'standard_name'],
    ['t', {}, 'air_temperature', 'name'],
    ['ta', {}, 'air_temperature', 'name'],
    ['q', {}, 'specific_humidity', 'name'],
    ['hus', {}, 'specific_humidity', 'name'],
    ['r', {}, 'relative_humidity', 'name'],
    ['hur', {}, 'relative_humidity', 'name'],
    ['z', {}, 'geopotential', 'name'],
    ['zg', {}, 'geopotential_height', 'name'],
  ] as const)('%s %j → %s by %s', (name, attrs, q, by) => {
    expect(recogniseQuantity(name, attrs)).toEqual({ quantity: q, by });
  });
  it('a standard_name of another quantity wins over a matching short name', () => {
    expect(recogniseQuantity('t', { standard_name: 'time' })).toBeUndefined();
  });
  it('z and zg are different quantities', () => {
    expect(recogniseQuantity('z', {})!.quantity).not.toBe(recogniseQuantity('zg', {})!.quantity);
  });
});

describe('RH convention from attributes', () => {
  it('GRIB_centre = ecmf → ECMWF mixed phase', () => {
    expect(inferRhConvention('r', { GRIB_centre: 'ecmf' }, {})).toEqual({ convention: 'ecmwf-mixed', source: 'variable attribute GRIB_centre=ecmf' });
  });
  it('CMIP mip_era → cmip', () => {
    expect(inferRhConvention('hur', {}, { mip_era: 'CMIP6' })).toEqual({ convention: 'cmip', source: 'global attribute mip_era=CMIP6' });
  });
  it('nothing → undefined; the user choice wins', () => {
    expect(inferRhConvention('r', {}, { title: 'x' })).toBeUndefined();
    expect(inferRhConvention('r', { GRIB_centre: 'ecmf' }, {}, 'water')).toEqual({ convention: 'water', source: 'user' });
  });
  it.each([
    ['nc3_classic.nc', 'r', 'ecmwf-mixed', 'global attribute institution=European Centre for Medium-Range Weather Forecasts'],
    ['cf_other_names.nc', 'hur', 'cmip', 'global attribute mip_era=CMIP6'],
  ])('fixture %s: %s is %s', async (file, vname, conv, source) => {
    const ds = await open(FIXTURES + file);
    try {
      expect(ds.fields.find((f) => f.name === vname)!.rhConvention).toEqual({ convention: conv, source });
    } finally {
      await ds.close();
    }
  });
  it('fixture rh_only.nc: no convention recorded', async () => {
    const ds = await open(FIXTURES + 'rh_only.nc');
    try {
      expect(ds.fields.find((f) => f.name === 'r')!.rhConvention).toBeUndefined();
    } finally {
      await ds.close();
    }
  });
});

describe('fields of the fixtures are recognised with SI units', () => {
  it.each([
    ['nc3_classic.nc', { t: 'air_temperature:K', q: 'specific_humidity:kg kg-1', r: 'relative_humidity:1', z: 'geopotential:m2 s-2' }],
    ['cf_other_names.nc', { ta: 'air_temperature:K', hus: 'specific_humidity:kg kg-1', hur: 'relative_humidity:1' }],
    ['degc_gkg.nc', { air: 'air_temperature:K', shum: 'specific_humidity:kg kg-1' }],
  ])('%s', async (file, want) => {
    const ds = await open(FIXTURES + file);
    try {
      expect(Object.fromEntries(ds.fields.map((f) => [f.name, `${f.quantity}:${f.units}`]))).toEqual(want);
    } finally {
      await ds.close();
    }
  });
  it('degc_gkg.nc records the conversions (SI Brochure §2.3.1; gram = 1e-3 kg)', async () => {
    const ds = await open(FIXTURES + 'degc_gkg.nc');
    try {
      const air = ds.fields.find((f) => f.name === 'air')!;
      const shum = ds.fields.find((f) => f.name === 'shum')!;
      expect([air.encoding.sourceUnits, air.encoding.unitScale, air.encoding.unitOffset]).toEqual(['degC', 1, 273.15]);
      expect([shum.encoding.sourceUnits, shum.encoding.unitScale, shum.encoding.unitOffset]).toEqual(['g/kg', 1e-3, 0]);
    } finally {
      await ds.close();
    }
  });
  it('a user-named variable takes the quantity, and nothing else keeps it', async () => {
    const ds = await open(FIXTURES + 'nc3_classic.nc', { variables: { humidity_mixing_ratio: 'q' } });
    try {
      expect(ds.fields.find((f) => f.name === 'q')!.quantity).toBe('humidity_mixing_ratio');
      expect(ds.fields.filter((f) => f.quantity === 'specific_humidity')).toEqual([]);
    } finally {
      await ds.close();
    }
  });
  it('a user-named variable with units of another quantity is a UnitsError', async () => {
    await expect(open(FIXTURES + 'nc3_classic.nc', { variables: { air_temperature: 'z' } })).rejects.toThrow(
      /variable z: units "m\*\*2 s\*\*-2" are not a temperature/,
    );
  });
});
