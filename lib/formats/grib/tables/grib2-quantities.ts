/**
 * GRIB2 parameters (discipline/category/number of WMO code table 4.2) that are quantities
 * frostgrid uses, with the relative-humidity phase the parameter itself states.
 *
 * Source: WMO Manual on Codes (WMO-No. 306), Vol. I.2, Part B, GRIB2 code table 4.2, discipline 0
 * categories 0 (temperature), 1 (moisture) and 3 (mass), master tables version 30. ECMWF's
 * relative humidity (centre 98, 0/1/1) is the mixed-phase one (ECMWF IFS documentation, Part IV,
 * physical processes, saturation over water and ice blended between 250.16 K and 273.16 K).
 */
import type { Quantity, RhConvention } from '../../../grid/types.js';

export const GRIB2_QUANTITIES: Readonly<Record<string, { readonly quantity: Quantity; readonly rh?: RhConvention }>> = {
  '0/0/0': { quantity: 'air_temperature' },
  '0/0/6': { quantity: 'dew_point_temperature' },
  '0/1/0': { quantity: 'specific_humidity' },
  '0/1/1': { quantity: 'relative_humidity' },
  '0/1/2': { quantity: 'humidity_mixing_ratio' },
  '0/1/93': { quantity: 'relative_humidity', rh: 'water' },
  '0/1/94': { quantity: 'relative_humidity', rh: 'ice' },
  '0/3/4': { quantity: 'geopotential' },
  '0/3/5': { quantity: 'geopotential_height' },
} as const;

/** Centres whose GRIB2 relative humidity 0/1/1 has a known phase convention. */
export const GRIB2_CENTRE_RH: Readonly<Record<number, RhConvention>> = {
  98: 'ecmwf-mixed',
} as const;
