/**
 * The GRIB edition 1 decoder (lib/formats/grib/edition1, written separately) is loaded on first
 * use, so the GRIB2 parts work on their own: its parser and parameter tables are reached through
 * this module once `loadEdition1()` has resolved.
 */
import type { GribFieldInfo, GribMessageLocation, GribParameterDescription } from './types.js';

export interface Edition1Module {
  parseGrib1Message(file: string, bytes: Uint8Array, location: GribMessageLocation): GribFieldInfo;
  describeGrib1Parameter(id: { table: number; number: number; centre: number }): GribParameterDescription | undefined;
}

let loaded: Edition1Module | undefined;
let loading: Promise<Edition1Module | undefined> | undefined;

/** Loads the edition 1 decoder; resolves to undefined when it is not there. */
export function loadEdition1(): Promise<Edition1Module | undefined> {
  const spec = './edition1/index.js';
  loading ??= (import(spec) as Promise<Partial<Edition1Module>>).then(
    (m) => {
      if (typeof m.parseGrib1Message === 'function' && typeof m.describeGrib1Parameter === 'function') loaded = m as Edition1Module;
      return loaded;
    },
    () => undefined,
  );
  return loading;
}

/** The edition 1 decoder if loadEdition1() has found it. */
export function edition1(): Edition1Module | undefined {
  return loaded;
}
