/**
 * The one entry point: sniff the first bytes of a file and open it with the first driver that
 * accepts them.
 */
import { open as openFile } from 'node:fs/promises';
import { FormatError } from './errors.js';
import { netcdf3Driver, netcdf4Driver, isHdf5, openNetcdf3Raw, openNetcdf4Raw } from './formats/netcdf/index.js';
import { nc3Version } from './formats/netcdf/nc3-header.js';
import type { FormatDriver, OpenOptions } from './formats/registry.js';
import { gribDriver } from './formats/grib/index.js';
import type { GridDataset, RawDataset } from './grid/types.js';

/**
 * Format drivers, tried in order. ── DRIVER LIST ── (add new formats here)
 */
export const DRIVERS: readonly FormatDriver[] = [
  netcdf3Driver,
  netcdf4Driver,
  gribDriver,
];

/** How many leading bytes a sniff sees (HDF5 may put its signature at 512, 1024 or 2048). */
const SNIFF_BYTES = 4096;

async function head(path: string): Promise<Uint8Array> {
  let fh;
  try {
    fh = await openFile(path, 'r');
  } catch (e) {
    throw new FormatError(`${path}: cannot open: ${(e as Error).message}`, { file: path, cause: e });
  }
  try {
    const buf = new Uint8Array(SNIFF_BYTES);
    const { bytesRead } = await fh.read(buf, 0, SNIFF_BYTES, 0);
    return buf.subarray(0, bytesRead);
  } finally {
    await fh.close();
  }
}

function unknownFormat(path: string, drivers: readonly FormatDriver[]): FormatError {
  return new FormatError(
    `${path}: not a recognised format (known formats: ${drivers.map((d) => d.name).join(', ')}); the first bytes match none of them`,
    { file: path, offset: 0 },
  );
}

/** Opens a gridded weather file and decodes it into fields. */
export async function open(path: string, options: OpenOptions = {}): Promise<GridDataset> {
  const h = await head(path);
  const driver = DRIVERS.find((d) => d.sniff(h));
  if (driver === undefined) throw unknownFormat(path, DRIVERS);
  return driver.open(path, options);
}

/** Opens a NetCDF file as a raw dataset (variables as stored, no CF decoding). */
export async function openRaw(path: string): Promise<RawDataset> {
  const h = await head(path);
  if (nc3Version(h) !== undefined) return openNetcdf3Raw(path);
  if (isHdf5(h)) return openNetcdf4Raw(path);
  throw unknownFormat(path, [netcdf3Driver, netcdf4Driver]);
}
