/**
 * Recognising physical quantities: by CF standard_name first (CF standard name table), then by
 * common short variable names (common practice, no source: ECMWF-style t/q/r/z, CMIP-style
 * ta/hus/hur/zg, NCEP-reanalysis-style air/shum/rhum/hgt).
 * Geopotential (z, m2 s-2) and geopotential height (zg, m) are different quantities.
 */
import type { Attributes, Quantity } from '../grid/types.js';
import { textAttr } from './attrs.js';

export const QUANTITIES: readonly Quantity[] = [
  'air_temperature',
  'specific_humidity',
  'relative_humidity',
  'dew_point_temperature',
  'humidity_mixing_ratio',
  'geopotential',
  'geopotential_height',
];

const SHORT_NAMES: Readonly<Record<string, Quantity>> = {
  t: 'air_temperature',
  ta: 'air_temperature',
  air: 'air_temperature',
  temp: 'air_temperature',
  temperature: 'air_temperature',
  q: 'specific_humidity',
  hus: 'specific_humidity',
  shum: 'specific_humidity',
  spfh: 'specific_humidity',
  r: 'relative_humidity',
  hur: 'relative_humidity',
  rh: 'relative_humidity',
  rhum: 'relative_humidity',
  d: 'dew_point_temperature',
  td: 'dew_point_temperature',
  dpt: 'dew_point_temperature',
  mr: 'humidity_mixing_ratio',
  mixr: 'humidity_mixing_ratio',
  z: 'geopotential',
  zg: 'geopotential_height',
  gh: 'geopotential_height',
  hgt: 'geopotential_height',
};

export interface QuantityMatch {
  readonly quantity: Quantity;
  /** How it was recognised. */
  readonly by: 'standard_name' | 'name';
}

/** The quantity a variable holds, or undefined. */
export function recogniseQuantity(name: string, attrs: Attributes): QuantityMatch | undefined {
  const sn = textAttr(attrs, 'standard_name');
  if (sn !== undefined) {
    const q = QUANTITIES.find((x) => x === sn);
    if (q !== undefined) return { quantity: q, by: 'standard_name' };
    // A standard name that is something else is authoritative: do not guess from the name.
    return undefined;
  }
  const q = SHORT_NAMES[name.toLowerCase()];
  return q === undefined ? undefined : { quantity: q, by: 'name' };
}
