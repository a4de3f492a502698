/**
 * HDF5 filters frostgrid can decode, keyed by their registered filter identifier (the HDF5
 * filter registry numbers). h5wasm silently returns garbage when a filter is missing, so every
 * read checks its dataset's pipeline against this table first.
 *
 * Built-in ids 1–6: HDF5 H5Zpublic.h (H5Z_FILTER_DEFLATE … H5Z_FILTER_SCALEOFFSET); szip works in
 * h5wasm 0.10.3 (checked, see shared notes). Plugin ids: the HDF Group's registered-filter list,
 * from memory; they are the plugins h5wasm-plugins 0.2.1 bundles.
 */
export const HDF5_FILTERS: Readonly<Record<number, { readonly name: string; readonly via: 'builtin' | 'plugin' }>> = {
  1: { name: 'deflate', via: 'builtin' },
  2: { name: 'shuffle', via: 'builtin' },
  3: { name: 'fletcher32', via: 'builtin' },
  4: { name: 'szip', via: 'builtin' },
  5: { name: 'nbit', via: 'builtin' },
  6: { name: 'scaleoffset', via: 'builtin' },
  307: { name: 'bzip2', via: 'plugin' },
  32000: { name: 'lzf', via: 'plugin' },
  32001: { name: 'blosc', via: 'plugin' },
  32004: { name: 'lz4', via: 'plugin' },
  32008: { name: 'bitshuffle', via: 'plugin' },
  32013: { name: 'zfp', via: 'plugin' },
  32015: { name: 'zstd', via: 'plugin' },
  32019: { name: 'jpeg', via: 'plugin' },
  32026: { name: 'blosc2', via: 'plugin' },
} as const;
