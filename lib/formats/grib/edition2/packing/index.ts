/** GRIB2 data representation templates (code table 5.0) by template number. */
import { ccsdsPacking } from './ccsds.js';
import { jpeg2000Packing, pngPacking } from './codecs.js';
import { complexPacking, complexSpatialPacking } from './complex.js';
import { ieeePacking } from './ieee.js';
import { simplePacking } from './simple.js';
import type { DataTemplate } from './types.js';

export const DATA_TEMPLATES: ReadonlyMap<number, DataTemplate> = new Map<number, DataTemplate>([
  [0, simplePacking],
  [2, complexPacking],
  [3, complexSpatialPacking],
  [4, ieeePacking],
  [40, jpeg2000Packing],
  [41, pngPacking],
  [42, ccsdsPacking],
]);

export { PackingProblem, type DataTemplate, type PackingParameters } from './types.js';
