/**
 * Parameter descriptions by the numbers a message carries: GRIB2 from WMO code table 4.2
 * (tables/grib2-parameters.generated.ts, tables/grib2-quantities.ts), GRIB1 from the edition 1
 * decoder's tables. A parameter no table knows gets undefined here; callers list it by its numbers.
 */
import { edition1 } from './edition1-bridge.js';
import { GRIB2_PARAMETERS } from './tables/grib2-parameters.generated.js';
import { GRIB2_CENTRE_RH, GRIB2_QUANTITIES } from './tables/grib2-quantities.js';
import type { GribParameterDescription, GribParameterId } from './types.js';

/** Describes a parameter, or undefined when no table knows it. */
export function describeParameter(id: GribParameterId): GribParameterDescription | undefined {
  if (id.edition === 1) return edition1()?.describeGrib1Parameter({ table: id.table, number: id.number, centre: id.centre });
  const key = `${id.discipline}/${id.category}/${id.number}`;
  const row = GRIB2_PARAMETERS[key];
  if (!row) return undefined;
  const q = GRIB2_QUANTITIES[key];
  const rh = q?.rh ?? (q?.quantity === 'relative_humidity' ? GRIB2_CENTRE_RH[id.centre] : undefined);
  return {
    shortName: row[0] !== '' ? row[0] : parameterKey(id),
    name: row[1],
    units: row[2],
    ...(q ? { quantity: q.quantity } : {}),
    ...(rh ? { rhConvention: rh } : {}),
  };
}

/** A name made of the parameter's numbers ("p0.1.250" for GRIB2, "p128.250" for GRIB1). */
export function parameterKey(id: GribParameterId): string {
  return id.edition === 2 ? `p${id.discipline}.${id.category}.${id.number}` : `p${id.table}.${id.number}`;
}

/** The numbers of a parameter in words, for messages and unknown-parameter names. */
export function parameterNumbers(id: GribParameterId): string {
  return id.edition === 2
    ? `GRIB2 discipline ${id.discipline} category ${id.category} number ${id.number} (centre ${id.centre})`
    : `GRIB1 table ${id.table} parameter ${id.number} (centre ${id.centre})`;
}
