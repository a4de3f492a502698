/**
 * Parameter descriptions of GRIB edition 1 from the tables held as data in tables/.
 *
 * Which table applies (as ecCodes decides, definitions grib1/section.1.def): table versions below
 * 128 are WMO versions of Code table 2, whose codes 1–127 are international (this module holds
 * version 3 and uses it for versions 1–3); versions 128 and above are local tables of the
 * originating centre — table 128 of centre 98 is ECMWF's. Anything else is undefined: an unknown
 * parameter stays identified by its numbers.
 */
import type { GribParameterDescription } from '../types.js';
import { ECMWF_GRIB1_TABLE128 } from './tables/ecmwf-local-table128.js';
import { ECMWF_TABLE128_QUANTITIES, WMO_TABLE2_QUANTITIES, type QuantityEntry } from './tables/quantities.js';
import { WMO_GRIB1_TABLE2_V3 } from './tables/wmo-table2-v3.js';

interface TableRow {
  readonly number: number;
  readonly shortName: string;
  readonly name: string;
  readonly units: string;
}

function index(rows: readonly TableRow[], quantities: readonly QuantityEntry[]): Map<number, GribParameterDescription> {
  const q = new Map(quantities.map((e) => [e.number, e]));
  const map = new Map<number, GribParameterDescription>();
  for (const r of rows) {
    const e = q.get(r.number);
    map.set(r.number, {
      shortName: r.shortName,
      name: r.name,
      units: r.units,
      ...(e === undefined ? {} : { quantity: e.quantity }),
      ...(e?.rhConvention === undefined ? {} : { rhConvention: e.rhConvention }),
    });
  }
  return map;
}

const WMO = index(WMO_GRIB1_TABLE2_V3, WMO_TABLE2_QUANTITIES);
const ECMWF128 = index(ECMWF_GRIB1_TABLE128, ECMWF_TABLE128_QUANTITIES);

export const ECMWF_CENTRE = 98;

/** Describes GRIB1 parameter `number` of table version `table` from centre `centre`. */
export function describeGrib1Parameter(id: { table: number; number: number; centre: number }): GribParameterDescription | undefined {
  if (id.table >= 1 && id.table <= 3 && id.number <= 127) return WMO.get(id.number);
  if (id.table === 128 && id.centre === ECMWF_CENTRE) return ECMWF128.get(id.number);
  return undefined;
}
