/**
 * Typed errors of frostgrid. Every error names what it is about (file, message or variable) and
 * what is wrong; layers wrap lower errors with `cause` to add context
 * ("while reading variable t at 250 hPa").
 *
 * The physics layer imports nothing and throws the built-in RangeError; everything else throws
 * one of these classes.
 */

export interface ErrorContext {
  /** Path of the file concerned, when there is one. */
  file?: string;
  /** Byte offset in the file where the problem was found. */
  offset?: number;
  /** 1-based message number (GRIB) or record number. */
  message?: number;
  /** Variable (NetCDF) or parameter short name (GRIB). */
  variable?: string;
  /** Attribute or key concerned. */
  attribute?: string;
  cause?: unknown;
}

/** Root of all frostgrid errors. */
export class FrostgridError extends Error {
  readonly file?: string;
  readonly offset?: number;
  readonly messageNumber?: number;
  readonly variable?: string;
  readonly attribute?: string;

  constructor(message: string, context: ErrorContext = {}) {
    super(message, context.cause === undefined ? undefined : { cause: context.cause });
    this.name = new.target.name;
    this.file = context.file;
    this.offset = context.offset;
    this.messageNumber = context.message;
    this.variable = context.variable;
    this.attribute = context.attribute;
  }
}

/** The bytes of a file are not what its format requires (bad magic, truncation, bad lengths). */
export class FormatError extends FrostgridError {}

/** A variable or message could not be decoded (bad attribute, bad packing parameters). */
export class DecodeError extends FrostgridError {}

/** Units that cannot be understood or do not match the quantity. */
export class UnitsError extends FrostgridError {
  readonly needed: string;
  readonly found: string;
  constructor(message: string, needed: string, found: string, context: ErrorContext = {}) {
    super(message, context);
    this.needed = needed;
    this.found = found;
  }
}

/** A feature of a format the decoder does not implement; `id` is the specification's number. */
export class UnsupportedError extends FrostgridError {
  readonly what: string;
  readonly id: string | number;
  constructor(message: string, what: string, id: string | number, context: ErrorContext = {}) {
    super(message, context);
    this.what = what;
    this.id = id;
  }
}

/** A required physical quantity is not in the dataset; `found` lists what was recognised. */
export class MissingQuantityError extends FrostgridError {
  readonly quantity: string;
  readonly found: readonly string[];
  constructor(message: string, quantity: string, found: readonly string[], context: ErrorContext = {}) {
    super(message, context);
    this.quantity = quantity;
    this.found = found;
  }
}

/** Two or more variables could be the requested quantity; `candidates` lists them. */
export class AmbiguityError extends FrostgridError {
  readonly candidates: readonly string[];
  constructor(message: string, candidates: readonly string[], context: ErrorContext = {}) {
    super(message, context);
    this.candidates = candidates;
  }
}

/** A user-supplied parameter or option is invalid; `parameter` names it. */
export class ParameterError extends FrostgridError {
  readonly parameter: string;
  constructor(message: string, parameter: string, context: ErrorContext = {}) {
    super(message, context);
    this.parameter = parameter;
  }
}

/** Writing an output failed (unwritable target, mismatched data). No partial file is left. */
export class OutputError extends FrostgridError {}

/** Prefix "file: " to a message when the file is known. */
export function withFile(file: string | undefined, message: string): string {
  return file ? `${file}: ${message}` : message;
}
