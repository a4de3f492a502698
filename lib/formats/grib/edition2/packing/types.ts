/**
 * The data representation template registry's contract (GRIB2 section 5 → section 7).
 */

/** A problem in packed data or its parameters; the message layer adds file, message and offset. */
export class PackingProblem {
  constructor(
    /** Where it is: 'section 5' (octet) or 'section 7' (byte within the data). */
    readonly where: string,
    readonly why: string,
  ) {}
}

/** Octets 12–21 of templates 5.0, 5.2, 5.3, 5.40, 5.41, 5.42. */
export interface ScaleParameters {
  readonly referenceValue: number;
  /** E, binary scale factor. */
  readonly binaryScale: number;
  /** D, decimal scale factor. */
  readonly decimalScale: number;
  readonly bitsPerValue: number;
}

export interface PackingParameters extends ScaleParameters {
  /** Template number (code table 5.0). */
  readonly template: number;
  /** Template-specific parameters. */
  readonly extra: Readonly<Record<string, number>>;
}

export interface DataTemplate {
  /** Short description for the encoding record ("simple", "complex", …). */
  readonly name: string;
  /** Minimum section 5 length the template needs. */
  readonly length: number;
  read(sec5: Uint8Array, template: number): PackingParameters;
  /**
   * Decodes `count` values from the section 7 payload (octets 6 onward). Values are physical
   * (Y = (R + X·2^E)·10^−D); NaN marks values the packing itself declares missing. `points` is
   * the number of grid points, the most any packing may hold.
   */
  decode(params: PackingParameters, data: Uint8Array, count: number, points: number): Float64Array | Promise<Float64Array>;
}
