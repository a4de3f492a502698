/**
 * The CF coders one by one and in their fixed order. The expected values are what
 * netCDF4-python reports for the same attributes (reference.json for edge_*.nc: `_Unsigned`
 * bytes and the default byte fill -127), and CF 1.11 §2.5.1 / §8.1 for the order: masking
 * compares the *packed* values, before unpacking.
 */
import { describe, expect, it } from 'vitest';
import { DecodeError } from '../../lib/errors.js';
import { decodeValues, valueCodec } from '../../lib/cf/decode.js';
import { NETCDF_DEFAULT_FILL } from '../../lib/cf/default-fill.js';
import type { Attributes, Dtype, RawVariable, TypedArray } from '../../lib/grid/types.js';
import { REFERENCE } from '../netcdf/reference.js';

function variable(dtype: Dtype, attrs: Attributes): RawVariable {
  return {
    name: 'v',
    dims: ['n'],
    shape: [0],
    dtype,
    attrs,
    storage: {},
    read: async () => new Int16Array(0),
  };
}

function decode(dtype: Dtype, attrs: Attributes, stored: TypedArray, units = { units: '', unitScale: 1, unitOffset: 0 }): number[] {
  const { codec } = valueCodec(variable(dtype, attrs), { variable: 'v' }, () => units);
  const out = new Float32Array(stored.length);
  decodeValues(stored, codec, out);
  return Array.from(out);
}

describe('_Unsigned, then masking on packed values (netCDF4-python, reference.json edge_classic.nc)', () => {
  const edge = REFERENCE.files['edge_classic.nc'].variables;
  it('u4: bytes -1, 0, 1, -128 with _Unsigned = "true" are 255, 0, 1, 128', () => {
    expect(decode('int8', { _Unsigned: 'true' }, Int8Array.from(edge.u4.raw as number[]))).toEqual(edge.u4.decoded);
  });
  it('b4: without _FillValue the default byte fill -127 is masked, as netCDF4-python does', () => {
    const got = decode('int8', {}, Int8Array.from(edge.b4.raw as number[]));
    expect(got.map((x) => (Number.isNaN(x) ? null : x))).toEqual(edge.b4.decoded);
  });
});

describe('order of the coders (CF 1.11 §2.5.1: mask the packed values, then unpack)', () => {
  const attrs = { scale_factor: 0.5, add_offset: 100, _FillValue: -32767, missing_value: [-1, -2], valid_range: [-10, 10] };
  it('fill, missing and out-of-range packed values are NaN; the others unpack', () => {
    const got = decode('int16', attrs, Int16Array.from([-32767, -1, -2, -11, 11, 0, 10, -10, 3]));
    expect(got).toEqual([NaN, NaN, NaN, NaN, NaN, 100, 105, 95, 101.5]);
  });
  it('valid_range compares packed values: packed 10 is valid although unpacked 105 > 10', () => {
    expect(decode('int16', { scale_factor: 0.5, add_offset: 100, valid_max: 10 }, Int16Array.from([10, 11]))).toEqual([105, NaN]);
  });
  it('units come last: packed 0 → 20 (°C) → 293.15 K', () => {
    const got = decode('int16', { scale_factor: 0.1, add_offset: 20 }, Int16Array.from([0]), { units: 'K', unitScale: 1, unitOffset: 273.15 });
    expect(got[0]).toBeCloseTo(293.15, 4);
  });
  it('float data without _FillValue masks the netCDF default fill (netcdf.h NC_FILL_FLOAT)', () => {
    const got = decode('float32', {}, Float32Array.from([1.5, NETCDF_DEFAULT_FILL.float32!, NaN]));
    expect(got).toEqual([1.5, NaN, NaN]);
  });
});

describe('encoding records what was on disk', () => {
  it('packed int16 temperature in degC', () => {
    const { encoding } = valueCodec(
      variable('int16', { scale_factor: 0.01, add_offset: -40, _FillValue: -32767, units: 'degC' }),
      { variable: 'v' },
      () => ({ units: 'K', unitScale: 1, unitOffset: 273.15 }),
    );
    expect(encoding).toMatchObject({
      storedType: 'int16',
      scaleFactor: 0.01,
      addOffset: -40,
      fillValue: -32767,
      sourceUnits: 'degC',
      unitScale: 1,
      unitOffset: 273.15,
      quantizationStep: 0.01,
    });
  });
  it('float storage has quantization step 0', () => {
    const { encoding } = valueCodec(variable('float32', { units: 'K' }), { variable: 'v' }, () => ({ units: 'K', unitScale: 1, unitOffset: 0 }));
    expect(encoding.quantizationStep).toBe(0);
    expect(encoding.scaleFactor).toBeUndefined();
  });
  it('a non-numeric scale_factor is a DecodeError naming the attribute', () => {
    expect(() => valueCodec(variable('int16', { scale_factor: 'big' }), { file: 'f.nc', variable: 'v' }, () => ({ units: '', unitScale: 1, unitOffset: 0 }))).toThrow(
      'f.nc: variable v: attribute scale_factor must be numeric, found "big"',
    );
    try {
      valueCodec(variable('int16', { scale_factor: 'big' }), { variable: 'v' }, () => ({ units: '', unitScale: 1, unitOffset: 0 }));
    } catch (e) {
      expect(e).toBeInstanceOf(DecodeError);
      expect((e as DecodeError).attribute).toBe('scale_factor');
    }
  });
});
