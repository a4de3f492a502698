/**
 * GRIB (editions 1 and 2) reader: the format driver, and the low-level scan / index API.
 */
import type { FormatDriver } from '../registry.js';
import { openGribDataset } from './dataset.js';

/** How far into a file the sniff looks for "GRIB" (leading junk such as a transfer header). */
export const GRIB_SNIFF_WINDOW = 512;

export const gribDriver: FormatDriver = {
  name: 'grib',
  sniff(head: Uint8Array): boolean {
    const n = Math.min(head.length, GRIB_SNIFF_WINDOW) - 7;
    for (let i = 0; i < n; i++) {
      if (head[i] === 0x47 && head[i + 1] === 0x52 && head[i + 2] === 0x49 && head[i + 3] === 0x42 && (head[i + 7] === 1 || head[i + 7] === 2)) {
        return true;
      }
    }
    return false;
  },
  open: (path, options) => openGribDataset(path, options),
};

export { openGribDataset, datasetFromIndex } from './dataset.js';
export { scanGrib, type GribScan } from './scan.js';
export { readGribIndex, type GribIndex } from './read-index.js';
export { parseGrib2Message, type Grib2FieldInfo } from './edition2/message.js';
export { describeParameter, parameterKey, parameterNumbers } from './parameters.js';
export { buildGrid, gridLonLat, reorder, type GribGrid } from './grids.js';
export { gaussianLatitudes } from './gaussian.js';
export type * from './types.js';
