/**
 * GRIB edition 1 parameters frostgrid recognises as physical quantities, by parameter table.
 * Sources (see /work/shared/notes/check-values.md §6):
 *   WMO FM 92 GRIB edition 1 Code table 2 (ecCodes grib1/2.0.3.table and the grib1 concept
 *     files): 6 z Geopotential, 7 gh Geopotential height, 11 t Temperature, 17 dpt Dew point
 *     temperature, 51 q Specific humidity, 52 r Relative humidity, 53 mixr Humidity mixing ratio
 *     (kg kg**-1).
 *   ECMWF local table 128 (ecCodes grib1/2.98.128.table): 129 z, 130 t, 133 q, 156 gh, 157 r.
 *     ECMWF's relative humidity (paramId 157) is with respect to water above 0 °C, ice below
 *     −23 °C and a quadratic blend between: rhConvention 'ecmwf-mixed'.
 */
import type { Quantity, RhConvention } from '../../../../grid/types.js';

export interface QuantityEntry {
  readonly number: number;
  readonly quantity: Quantity;
  readonly rhConvention?: RhConvention;
}

export const WMO_TABLE2_QUANTITIES: readonly QuantityEntry[] = [
  { number: 6, quantity: 'geopotential' },
  { number: 7, quantity: 'geopotential_height' },
  { number: 11, quantity: 'air_temperature' },
  { number: 17, quantity: 'dew_point_temperature' },
  { number: 51, quantity: 'specific_humidity' },
  { number: 52, quantity: 'relative_humidity' },
  { number: 53, quantity: 'humidity_mixing_ratio' },
] as const;

export const ECMWF_TABLE128_QUANTITIES: readonly QuantityEntry[] = [
  { number: 129, quantity: 'geopotential' },
  { number: 130, quantity: 'air_temperature' },
  { number: 133, quantity: 'specific_humidity' },
  { number: 156, quantity: 'geopotential_height' },
  { number: 157, quantity: 'relative_humidity', rhConvention: 'ecmwf-mixed' },
] as const;
