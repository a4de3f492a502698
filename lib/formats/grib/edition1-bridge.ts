/**
 * The GRIB edition 1 decoder (lib/formats/grib/edition1, written separately) as the shared parts
 * use it: its message parser and its parameter tables.
 */
import { describeGrib1Parameter, parseGrib1Message } from './edition1/index.js';
import type { GribFieldInfo, GribMessageLocation, GribParameterDescription } from './types.js';

export interface Edition1Module {
  parseGrib1Message(file: string, bytes: Uint8Array, location: GribMessageLocation): GribFieldInfo;
  describeGrib1Parameter(id: { table: number; number: number; centre: number }): GribParameterDescription | undefined;
}

const module1: Edition1Module = { parseGrib1Message, describeGrib1Parameter };

/** The edition 1 decoder (kept async for callers written when it loaded lazily). */
export function loadEdition1(): Promise<Edition1Module | undefined> {
  return Promise.resolve(module1);
}

/** The edition 1 decoder. */
export function edition1(): Edition1Module | undefined {
  return module1;
}
