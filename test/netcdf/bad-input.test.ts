/**
 * Bad input: each error is typed and names the file, the variable and what is wrong. The bad
 * fixtures are made by make_fixtures.py from netCDF4-python files (cut or patched bytes, odd
 * attributes); what is wrong with each is stated there.
 */
import { describe, expect, it } from 'vitest';
import { FormatError, MissingQuantityError, ParameterError, UnitsError, UnsupportedError } from '../../lib/errors.js';
import { findField, findHumidity } from '../../lib/grid/select.js';
import { DRIVERS, open, openRaw } from '../../lib/open.js';
import { FIXTURES } from './reference.js';

const BAD = FIXTURES + 'bad/';

async function failure(p: Promise<unknown>): Promise<Error> {
  try {
    await p;
  } catch (e) {
    return e as Error;
  }
  throw new Error('expected a failure');
}

describe('files that are not (whole) NetCDF', () => {
  it('not a NetCDF file: FormatError naming the file and the known formats', async () => {
    const e = await failure(open(BAD + 'not_netcdf.nc'));
    expect(e).toBeInstanceOf(FormatError);
    const known = DRIVERS.map((d) => d.name);
    expect(known).toEqual(expect.arrayContaining(['netcdf3', 'netcdf4']));
    expect(e.message).toBe(`${BAD}not_netcdf.nc: not a recognised format (known formats: ${known.join(', ')}); the first bytes match none of them`);
    expect((e as FormatError).file).toBe(BAD + 'not_netcdf.nc');
  });
  it('truncated in the data: FormatError naming the variable whose bytes are missing', async () => {
    const e = (await failure(open(BAD + 'truncated.nc'))) as FormatError;
    expect(e).toBeInstanceOf(FormatError);
    expect(e.message).toMatch(/truncated\.nc: truncated file: variable \w+ needs bytes up to \d+, the file has 4453 bytes/);
    expect(e.variable).toBeDefined();
  });
  it('truncated in the header: FormatError', async () => {
    const e = (await failure(open(BAD + 'truncated_header.nc'))) as FormatError;
    expect(e).toBeInstanceOf(FormatError);
    expect(e.message).toBe(`${BAD}truncated_header.nc: truncated file: the header continues past the end of the file (40 bytes)`);
  });
  it('a header pointing past the end: FormatError naming variable z and the offset', async () => {
    const e = (await failure(open(BAD + 'header_past_end.nc'))) as FormatError;
    expect(e).toBeInstanceOf(FormatError);
    expect(e.message).toBe(
      `${BAD}header_past_end.nc: header points past the end of the file: variable z begins at byte ${0x7fffff00}, the file has 6680 bytes`,
    );
    expect([e.variable, e.offset]).toEqual(['z', 0x7fffff00]);
  });
  it('a NetCDF-4 file cut in half: FormatError from the HDF5 superblock end-of-file address', async () => {
    const e = (await failure(open(BAD + 'truncated_nc4.nc'))) as FormatError;
    expect(e).toBeInstanceOf(FormatError);
    expect(e.message).toBe(`${BAD}truncated_nc4.nc: truncated file: the HDF5 superblock says the file ends at byte 43850, it has 21925 bytes`);
  });
  it('a missing file: FormatError naming it', async () => {
    const e = await failure(open(BAD + 'no_such_file.nc'));
    expect(e).toBeInstanceOf(FormatError);
    expect(e.message).toMatch(/no_such_file\.nc: cannot open: ENOENT/);
  });
});

describe('files that are NetCDF but lack what frostgrid needs', () => {
  it('units that cannot be understood: UnitsError naming the file and the variable', async () => {
    const e = (await failure(open(BAD + 'bad_units.nc'))) as UnitsError;
    expect(e).toBeInstanceOf(UnitsError);
    expect(e.message).toBe(`${BAD}bad_units.nc: variable t: units "furlongs per fortnight" cannot be understood (needed a temperature, K)`);
    expect([e.file, e.variable, e.needed, e.found]).toEqual([BAD + 'bad_units.nc', 't', 'K', 'furlongs per fortnight']);
  });
  it('no pressure levels: MissingQuantityError naming the variable and its vertical axis', async () => {
    const ds = await open(BAD + 'no_pressure.nc');
    try {
      const t = ds.fields.find((f) => f.name === 't')!;
      expect(t.levelsPa.length).toBe(0);
      let e: unknown;
      try {
        findField(ds, 'air_temperature');
      } catch (x) {
        e = x;
      }
      expect(e).toBeInstanceOf(MissingQuantityError);
      expect((e as Error).message).toBe(
        `${BAD}no_pressure.nc: variable t (air_temperature) has no pressure levels: its vertical axis lev is not pressure (atmosphere_hybrid_sigma_pressure_coordinate, units 1)`,
      );
      // Without the pressure requirement the model-level field is there.
      expect(findField(ds, 'air_temperature', { pressureLevels: false }).name).toBe('t');
    } finally {
      await ds.close();
    }
  });
  it('missing humidity: MissingQuantityError listing what was found', async () => {
    const ds = await open(BAD + 'missing_humidity.nc');
    try {
      let e: unknown;
      try {
        findHumidity(ds);
      } catch (x) {
        e = x;
      }
      expect(e).toBeInstanceOf(MissingQuantityError);
      expect((e as MissingQuantityError).found).toEqual(['t (air_temperature)', 'z (geopotential)']);
      expect((e as Error).message).toBe(
        `${BAD}missing_humidity.nc: no humidity variable found (looked for specific_humidity, humidity_mixing_ratio, relative_humidity, dew_point_temperature; recognised: t (air_temperature), z (geopotential))`,
      );
    } finally {
      await ds.close();
    }
  });
  it('missing temperature: MissingQuantityError listing what was found', async () => {
    const ds = await open(BAD + 'missing_humidity.nc');
    try {
      expect(() => findField(ds, 'specific_humidity')).toThrow(
        `${BAD}missing_humidity.nc: no specific_humidity variable found (recognised: t (air_temperature), z (geopotential)); name it explicitly if it is there`,
      );
    } finally {
      await ds.close();
    }
  });
  it('RH only and nothing says the convention: ParameterError asking for rhConvention', async () => {
    const ds = await open(FIXTURES + 'rh_only.nc');
    try {
      let e: unknown;
      try {
        findHumidity(ds);
      } catch (x) {
        e = x;
      }
      expect(e).toBeInstanceOf(ParameterError);
      expect((e as ParameterError).parameter).toBe('rhConvention');
      expect((e as Error).message).toBe(
        `${FIXTURES}rh_only.nc: variable r is relative humidity, and nothing in the file says over what phase (water, ice, ECMWF mixed or CMIP); name the convention with the rhConvention option`,
      );
      expect(findHumidity(ds, { rhConvention: 'water' })).toMatchObject({ quantity: 'relative_humidity', rhConvention: 'water' });
    } finally {
      await ds.close();
    }
  });
  it('a read outside the variable is a RangeError naming it', async () => {
    const raw = await openRaw(FIXTURES + 'nc4_zlib.nc');
    try {
      await expect(raw.variables.get('t')!.read([0, 0, 0, 0], [3, 3, 5, 16])).rejects.toThrow('variable t: index 0+3 outside dimension time of 2');
    } finally {
      await raw.close();
    }
  });
});

describe('HDF5 filters frostgrid cannot decode', () => {
  it('an unregistered filter id (32099, written by h5py) is an UnsupportedError naming the filter, not garbage', async () => {
    const raw = await openRaw(BAD + 'unknown_filter.h5');
    try {
      const e = (await failure(raw.variables.get('v')!.read([0], [8]))) as UnsupportedError;
      expect(e).toBeInstanceOf(UnsupportedError);
      expect([e.what, e.id, e.variable]).toEqual(['HDF5 filter', 32099, 'v']);
      expect(e.message).toMatch(/unknown_filter\.h5: variable v is compressed with HDF5 filter 32099 \(.*\), which frostgrid cannot decode/);
    } finally {
      await raw.close();
    }
  });
});
