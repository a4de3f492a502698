/**
 * The contract between the GRIB edition decoders (edition1/, edition2/) and the parts they share
 * (file scan, grid construction, dataset assembly). Each edition decoder turns the bytes of one
 * message (one field of it, for GRIB2 messages with repeated sections) into a GribFieldInfo
 * without unpacking data, and unpacks values on demand.
 */
import type { CalendarDate, EarthShape, Quantity, RhConvention } from '../../grid/types.js';

/** Where a message sits in its file, found by the scan. */
export interface GribMessageLocation {
  /** 1-based message number in the file. */
  readonly number: number;
  readonly offset: number;
  readonly length: number;
  readonly edition: 1 | 2;
}

/** Identification of a parameter, by the numbers the message carries. */
export type GribParameterId =
  | {
      readonly edition: 2;
      readonly discipline: number;
      readonly category: number;
      readonly number: number;
      readonly centre: number;
    }
  | { readonly edition: 1; readonly table: number; readonly number: number; readonly centre: number };

/** A grid as a message describes it; angles in degrees, lengths in metres. */
export type GribGridDefinition =
  | {
      readonly type: 'regular_ll';
      readonly template: string;
      readonly earth: EarthShape;
      readonly ni: number;
      readonly nj: number;
      readonly lat1: number;
      readonly lon1: number;
      readonly lat2: number;
      readonly lon2: number;
      readonly di: number;
      readonly dj: number;
      readonly scanningMode: number;
    }
  | {
      readonly type: 'rotated_ll';
      readonly template: string;
      readonly earth: EarthShape;
      readonly ni: number;
      readonly nj: number;
      readonly lat1: number;
      readonly lon1: number;
      readonly lat2: number;
      readonly lon2: number;
      readonly di: number;
      readonly dj: number;
      readonly scanningMode: number;
      readonly southPoleLat: number;
      readonly southPoleLon: number;
      readonly rotationAngle: number;
    }
  | {
      readonly type: 'gaussian';
      readonly template: string;
      readonly earth: EarthShape;
      /** Number of parallels between a pole and the equator. */
      readonly N: number;
      /** Points along a parallel for a regular grid; undefined for reduced grids. */
      readonly ni: number | undefined;
      readonly nj: number;
      readonly lat1: number;
      readonly lon1: number;
      readonly lat2: number;
      readonly lon2: number;
      readonly di: number | undefined;
      readonly scanningMode: number;
      /** Points per row for reduced grids (storage order). */
      readonly pl: Int32Array | undefined;
    }
  | {
      readonly type: 'lambert_conformal';
      readonly template: string;
      readonly earth: EarthShape;
      readonly nx: number;
      readonly ny: number;
      readonly lat1: number;
      readonly lon1: number;
      readonly lad: number;
      readonly lov: number;
      readonly dx: number;
      readonly dy: number;
      readonly latin1: number;
      readonly latin2: number;
      readonly projectionCentre: number;
      readonly scanningMode: number;
    }
  | {
      readonly type: 'polar_stereographic';
      readonly template: string;
      readonly earth: EarthShape;
      readonly nx: number;
      readonly ny: number;
      readonly lat1: number;
      readonly lon1: number;
      /** Latitude where dx/dy are true (60° for GRIB1). */
      readonly lad: number;
      readonly lov: number;
      readonly dx: number;
      readonly dy: number;
      /** 0 north pole, 1 south pole (bit 1 of the projection centre flag). */
      readonly southPole: boolean;
      readonly scanningMode: number;
    };

/** Vertical level of a field. */
export interface GribLevel {
  /** 'isobaric' for pressure levels; other types keep the code. */
  readonly type: 'isobaric' | 'other';
  /** Level type code (GRIB2 code table 4.5, GRIB1 table 3). */
  readonly code: number;
  /** Pressure in Pa for isobaric levels, otherwise the level value as coded. */
  readonly value: number;
}

/** Everything known about one field without unpacking its data. */
export interface GribFieldInfo {
  readonly location: GribMessageLocation;
  /** Index of the field within a GRIB2 message (0 for the first/only one). */
  readonly fieldIndex: number;
  readonly parameter: GribParameterId;
  readonly level: GribLevel;
  readonly referenceTime: CalendarDate;
  /** Forecast step in hours to the end of any statistical processing period. */
  readonly stepHours: number;
  readonly validTime: CalendarDate;
  readonly member: number | undefined;
  /** Product definition template (GRIB2 4.x) or 'grib1'. */
  readonly productTemplate: string;
  readonly grid: GribGridDefinition;
  /** Data representation template ('5.0', '5.42', 'grib1-simple', 'grib1-second-order'…). */
  readonly packing: string;
  readonly bitsPerValue: number;
  readonly binaryScale: number;
  readonly decimalScale: number;
  readonly referenceValue: number;
  readonly numberOfPoints: number;
  readonly hasBitmap: boolean;
  /** Unpacks the field: numberOfPoints values in the message's scanning order, NaN where missing. */
  decode(): Float64Array;
  /**
   * The same as decode(), for packings whose codec is asynchronous (GRIB2 5.40 JPEG 2000, 5.41
   * PNG); decode() throws for those. Optional: callers fall back to decode() when absent.
   */
  decodeAsync?(): Promise<Float64Array>;
}

/** What a parameter table says about a parameter (tables are data: see tables/). */
export interface GribParameterDescription {
  readonly shortName: string;
  readonly name: string;
  /** Units as the table gives them ("K", "kg kg**-1", "%", "m**2 s**-2", "gpm"). */
  readonly units: string;
  readonly quantity?: Quantity;
  /** For relative humidity: the phase convention the parameter implies, when it implies one. */
  readonly rhConvention?: RhConvention;
}
