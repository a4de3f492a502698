/**
 * NetCDF classic-model external types (nc_type codes), as data.
 * Source: NetCDF "File Format Specifications", classic / 64-bit offset / CDF-5 grammar
 * (NC_BYTE = 1 … NC_DOUBLE = 6 in all three; NC_UBYTE = 7 … NC_UINT64 = 11 in CDF-5 only).
 */
import type { Dtype } from '../../grid/types.js';

export interface Nc3Type {
  readonly code: number;
  readonly dtype: Dtype;
  /** Bytes per element on disk. */
  readonly size: number;
  /** Only valid in CDF-5 files. */
  readonly cdf5Only: boolean;
}

export const NC3_TYPES: Readonly<Record<number, Nc3Type>> = {
  1: { code: 1, dtype: 'int8', size: 1, cdf5Only: false },
  2: { code: 2, dtype: 'char', size: 1, cdf5Only: false },
  3: { code: 3, dtype: 'int16', size: 2, cdf5Only: false },
  4: { code: 4, dtype: 'int32', size: 4, cdf5Only: false },
  5: { code: 5, dtype: 'float32', size: 4, cdf5Only: false },
  6: { code: 6, dtype: 'float64', size: 8, cdf5Only: false },
  7: { code: 7, dtype: 'uint8', size: 1, cdf5Only: true },
  8: { code: 8, dtype: 'uint16', size: 2, cdf5Only: true },
  9: { code: 9, dtype: 'uint32', size: 4, cdf5Only: true },
  10: { code: 10, dtype: 'int64', size: 8, cdf5Only: true },
  11: { code: 11, dtype: 'uint64', size: 8, cdf5Only: true },
} as const;

/** Header tags of the classic grammar. */
export const NC_DIMENSION = 0x0a;
export const NC_VARIABLE = 0x0b;
export const NC_ATTRIBUTE = 0x0c;
/** numrecs value meaning "still being written; count the records from the file size". */
export const NC_STREAMING = 0xffffffff;
