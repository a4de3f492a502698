/**
 * NetCDF format drivers: classic (CDF-1/2/5) and NetCDF-4/HDF5. Each sniffs the first bytes and
 * opens into the grid model through the CF decoding of lib/cf.
 */
import { decodeDataset } from '../../cf/dataset.js';
import type { RawDataset } from '../../grid/types.js';
import type { FormatDriver, OpenOptions } from '../registry.js';
import { nc3Version } from './nc3-header.js';
import { openNetcdf3Raw } from './nc3-reader.js';
import { openNetcdf4Raw } from './nc4-reader.js';

/** HDF5 superblock signature (HDF5 File Format Specification, "Format Signature"). */
const HDF5_SIGNATURE = [0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a];

/** True when an HDF5 signature is at offset 0 (or 512, 1024, 2048 … within the bytes given). */
export function isHdf5(head: Uint8Array): boolean {
  for (let at = 0; at + 8 <= head.length; at = at === 0 ? 512 : at * 2) {
    if (HDF5_SIGNATURE.every((b, i) => head[at + i] === b)) return true;
  }
  return false;
}

async function decodeOrClose(raw: RawDataset, options: OpenOptions) {
  try {
    return await decodeDataset(raw, options);
  } catch (e) {
    await raw.close();
    throw e;
  }
}

export const netcdf3Driver: FormatDriver = {
  name: 'netcdf3',
  sniff: (head) => nc3Version(head) !== undefined,
  async open(path, options) {
    return decodeOrClose(await openNetcdf3Raw(path), options);
  },
};

export const netcdf4Driver: FormatDriver = {
  name: 'netcdf4',
  sniff: isHdf5,
  async open(path, options) {
    return decodeOrClose(await openNetcdf4Raw(path), options);
  },
};

/** Both NetCDF drivers, classic first. */
export const netcdfDrivers: readonly FormatDriver[] = [netcdf3Driver, netcdf4Driver];

export { openNetcdf3Raw, openNetcdf4Raw };
