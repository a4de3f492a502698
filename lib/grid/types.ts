/**
 * The one grid model every format decodes into and every product reads from.
 *
 * Two tiers, as in xarray:
 *  - RawDataset / RawVariable: what a format reader hands back — named dims, shape, stored dtype,
 *    attributes and a lazy hyperslab read of the *stored* values (no CF decoding).
 *  - GridDataset / Field: decoded physical fields on pressure levels — SI units, NaN for missing,
 *    a horizontal grid descriptor, pressure levels, times, and an `encoding` record of what was on
 *    disk. Fields are read one (time, level) slice at a time.
 *
 * Nothing downstream of this model looks at a GRIB section or a NetCDF header.
 */

export type TypedArray =
  | Int8Array
  | Uint8Array
  | Int16Array
  | Uint16Array
  | Int32Array
  | Uint32Array
  | Float32Array
  | Float64Array
  | BigInt64Array
  | BigUint64Array;

/** Stored element types (NetCDF names where they exist). */
export type Dtype =
  | 'int8'
  | 'uint8'
  | 'int16'
  | 'uint16'
  | 'int32'
  | 'uint32'
  | 'int64'
  | 'uint64'
  | 'float32'
  | 'float64'
  | 'char'
  | 'string';

export type AttrValue = string | number | bigint | readonly number[] | readonly bigint[] | readonly string[];
export type Attributes = Readonly<Record<string, AttrValue>>;

export interface Dimension {
  readonly name: string;
  readonly size: number;
  readonly unlimited: boolean;
}

/** A variable as stored: the format reader's product, before CF decoding. */
export interface RawVariable {
  readonly name: string;
  readonly dims: readonly string[];
  readonly shape: readonly number[];
  readonly dtype: Dtype;
  readonly attrs: Attributes;
  /** Storage facts a format knows (chunk shape, filter names, byte order, offset). */
  readonly storage: Readonly<Record<string, unknown>>;
  /**
   * Reads the hyperslab start[i] .. start[i]+count[i]-1 of the stored values, row-major, in the
   * stored dtype (char/string variables are read with `readText`).
   */
  read(start: readonly number[], count: readonly number[]): Promise<TypedArray>;
  /** Whole text of a char/string variable (coordinate labels, etc.). */
  readText?(): Promise<string[]>;
}

export type FormatName =
  | 'netcdf3-classic'
  | 'netcdf3-64bit-offset'
  | 'netcdf3-cdf5'
  | 'netcdf4'
  | 'netcdf4-classic'
  | 'grib1'
  | 'grib2'
  | 'grib-mixed';

export interface RawDataset {
  readonly path: string;
  readonly format: FormatName;
  readonly dims: readonly Dimension[];
  readonly variables: ReadonlyMap<string, RawVariable>;
  readonly attrs: Attributes;
  close(): Promise<void>;
}

// ---------------------------------------------------------------------------------------------
// Time
// ---------------------------------------------------------------------------------------------

/** CF calendars (CF 1.11 §4.4.1) after alias resolution. */
export type Calendar = 'standard' | 'proleptic_gregorian' | 'julian' | 'noleap' | 'all_leap' | '360_day';

/**
 * A date in a given calendar. `iso` keeps the calendar's own date ("2001-02-30T00:00:00" in
 * 360_day); real-world calendars add "Z" and `epochMs` (milliseconds since 1970-01-01T00:00Z,
 * proleptic Gregorian), which is undefined for model calendars.
 */
export interface CalendarDate {
  readonly calendar: Calendar;
  readonly year: number;
  readonly month: number;
  readonly day: number;
  readonly hour: number;
  readonly minute: number;
  readonly second: number;
  readonly iso: string;
  readonly epochMs?: number;
}

/** One entry of a field's time axis. Forecast files add reference time, step and member. */
export interface TimeCoordinate {
  readonly valid: CalendarDate;
  readonly reference?: CalendarDate;
  /** Forecast step in hours (valid − reference). */
  readonly stepHours?: number;
  /** Ensemble member number. */
  readonly member?: number;
}

// ---------------------------------------------------------------------------------------------
// Horizontal grids and coordinate reference systems
// ---------------------------------------------------------------------------------------------

export type EarthShape =
  | { readonly kind: 'sphere'; readonly radiusM: number }
  | { readonly kind: 'ellipsoid'; readonly semiMajorM: number; readonly inverseFlattening: number };

export const WGS84: EarthShape = { kind: 'ellipsoid', semiMajorM: 6378137, inverseFlattening: 298.257223563 };

export type Crs =
  | { readonly kind: 'geographic'; readonly earth: EarthShape; readonly epsg?: number }
  | {
      readonly kind: 'projected';
      readonly projection: 'lambert_conformal_conic' | 'polar_stereographic';
      /** proj4 definition built from the source's parameters. */
      readonly proj4: string;
      readonly earth: EarthShape;
      /** Projection parameters in degrees (standard parallels, central meridian, origin latitude). */
      readonly params: Readonly<Record<string, number>>;
    };

interface GridBase {
  readonly crs: Crs;
  /** Number of points of a slice (nx·ny for rectangular grids, the sum of row counts for reduced grids). */
  readonly npoints: number;
}

/** Regular latitude–longitude grid: point coordinates are cell centres. */
export interface RegularLatLonGrid extends GridBase {
  readonly kind: 'regular_ll';
  readonly nx: number;
  readonly ny: number;
  /** Latitude of each row, degrees north, in storage order. */
  readonly lat: Float64Array;
  /** Longitude of each column, degrees east, in storage order. */
  readonly lon: Float64Array;
  /** Spacing, positive, degrees. */
  readonly dLat: number;
  readonly dLon: number;
  readonly latitudeOrder: 'north_to_south' | 'south_to_north';
  readonly longitudeConvention: '0..360' | '-180..180';
  /** True when the columns span the whole circle (nx·dLon ≈ 360). */
  readonly globalLongitude: boolean;
}

/** Rotated-pole latitude–longitude grid (GRIB2 3.1). Coordinates are in the rotated frame. */
export interface RotatedLatLonGrid extends GridBase {
  readonly kind: 'rotated_ll';
  readonly nx: number;
  readonly ny: number;
  readonly rlat: Float64Array;
  readonly rlon: Float64Array;
  readonly dLat: number;
  readonly dLon: number;
  readonly southPoleLat: number;
  readonly southPoleLon: number;
  readonly rotationAngle: number;
}

/** Regular or reduced (incl. octahedral) Gaussian grid (GRIB2 3.40). Rows run in storage order. */
export interface GaussianGrid extends GridBase {
  readonly kind: 'gaussian';
  /** Number of latitude lines between a pole and the equator. */
  readonly N: number;
  readonly ny: number;
  /** Row latitudes (Legendre roots), degrees north, storage order. */
  readonly lat: Float64Array;
  /** Points in each row (all equal for a regular Gaussian grid). */
  readonly pointsPerRow: Int32Array;
  /** Longitude of the first point of each row and the row's spacing, degrees. */
  readonly lonFirst: Float64Array;
  readonly dLonPerRow: Float64Array;
  readonly reduced: boolean;
  readonly octahedral: boolean;
}

/** A projected grid with an affine transform in metres (Lambert conformal, polar stereographic). */
export interface ProjectedGrid extends GridBase {
  readonly kind: 'projected';
  readonly nx: number;
  readonly ny: number;
  /** Projected coordinates of columns / rows, metres, storage order. */
  readonly x: Float64Array;
  readonly y: Float64Array;
  readonly dx: number;
  readonly dy: number;
}

export type HorizontalGrid = RegularLatLonGrid | RotatedLatLonGrid | GaussianGrid | ProjectedGrid;

// ---------------------------------------------------------------------------------------------
// Decoded fields
// ---------------------------------------------------------------------------------------------

/** Physical quantities, named by CF standard name. */
export type Quantity =
  | 'air_temperature'
  | 'specific_humidity'
  | 'relative_humidity'
  | 'dew_point_temperature'
  | 'humidity_mixing_ratio'
  | 'geopotential'
  | 'geopotential_height';

/**
 * Phase convention of a relative humidity: over water; over ice; ECMWF's mixed phase (water at
 * T ≥ 273.16 K, ice at T ≤ 250.16 K, quadratic blend between); CMIP `hur` (water above 0 °C,
 * ice below).
 */
export type RhConvention = 'water' | 'ice' | 'ecmwf-mixed' | 'cmip';

export interface RhConventionRecord {
  readonly convention: RhConvention;
  /** Where the convention came from ("GRIB2 parameter 0/1/94", "attribute institution=…", "user"). */
  readonly source: string;
}

/** What was on disk, kept so outputs can state it and products can reason about precision. */
export interface Encoding {
  /** Stored type, e.g. 'int16', or 'grib2-5.0' style for GRIB packings. */
  readonly storedType: string;
  readonly scaleFactor?: number;
  readonly addOffset?: number;
  readonly fillValue?: number;
  readonly missingValue?: readonly number[];
  readonly validRange?: readonly [number, number];
  readonly unsigned?: boolean;
  readonly chunking?: readonly number[];
  readonly filters?: readonly string[];
  /** Units as written in the file. */
  readonly sourceUnits: string;
  /** SI = source·unitScale + unitOffset. */
  readonly unitScale: number;
  readonly unitOffset: number;
  /**
   * Smallest representable step of the stored values, in SI units (scale_factor·unitScale for
   * packed integers; 2^E·10^−D for GRIB packings); 0 for floating-point storage.
   */
  readonly quantizationStep: number;
  /** Anything else worth keeping (GRIB template numbers, bits per value, …). */
  readonly extra?: Readonly<Record<string, unknown>>;
}

/** A decoded quantity on pressure levels. */
export interface Field {
  /** The file's own variable name (NetCDF) or short name (GRIB). */
  readonly name: string;
  /** Recognised quantity, or undefined for a variable that is not one frostgrid uses. */
  readonly quantity: Quantity | undefined;
  /** SI units of decoded values: 'K', 'kg kg-1', '1' (fraction), 'm2 s-2', 'm'. */
  readonly units: string;
  readonly longName?: string;
  readonly grid: HorizontalGrid;
  /** Pressure of each level, Pa, in storage order. Empty for fields not on pressure levels. */
  readonly levelsPa: Float64Array;
  readonly times: readonly TimeCoordinate[];
  readonly rhConvention?: RhConventionRecord;
  readonly encoding: Encoding;
  readonly attrs: Attributes;
  /**
   * Reads one (time, level) slice: decoded, SI units, NaN where missing, `grid.npoints` values in
   * the grid's storage order. Allocates a new array unless `out` (length npoints) is given.
   */
  readSlice(timeIndex: number, levelIndex: number, out?: Float32Array): Promise<Float32Array>;
}

export interface GridDataset {
  readonly path: string;
  readonly format: FormatName;
  readonly attrs: Attributes;
  readonly fields: readonly Field[];
  /** Notes about decoding choices the user should know (merged expver, assumed conventions). */
  readonly notes: readonly string[];
  close(): Promise<void>;
}

/** Injectable warning sink; the library never calls console. */
export type WarningSink = (message: string) => void;
