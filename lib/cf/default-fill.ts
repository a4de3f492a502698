/**
 * The netCDF library's default fill values, used for masking when a variable has no _FillValue
 * (as netCDF-C and netCDF4-python do). Source: netcdf.h (NC_FILL_BYTE … NC_FILL_UINT64),
 * netCDF-C 4.9; the float values are 9.9692099683868690e+36 rounded to the type.
 */
import type { Dtype } from '../grid/types.js';

export const NETCDF_DEFAULT_FILL: Readonly<Partial<Record<Dtype, number>>> = {
  int8: -127,
  uint8: 255,
  int16: -32767,
  uint16: 65535,
  int32: -2147483647,
  uint32: 4294967295,
  int64: -9223372036854775806,
  uint64: 18446744073709551614,
  float32: Math.fround(9.969209968386869e36),
  float64: 9.969209968386869e36,
} as const;
