/**
 * Loads the GRIB1 fixtures of data-samples/fixtures/grib1 with what ecCodes reported for them
 * (make_fixtures.py wrote `<name>.json` beside each `<name>.grib1`).
 */
import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { GribMessageLocation } from '../../../lib/formats/grib/types.js';

export const FIXTURE_DIR = join(dirname(fileURLToPath(import.meta.url)), '../../../data-samples/fixtures/grib1');

export interface EccodesReference {
  readonly name: string;
  readonly eccodes: string;
  readonly keys: Readonly<Record<string, number | string | number[]>>;
  /** codes_get_values, null where the bitmap marks a point missing. */
  readonly values: readonly (number | null)[];
}

export interface Fixture {
  readonly name: string;
  readonly path: string;
  readonly bytes: Uint8Array;
  readonly ref: EccodesReference;
}

export function fixtureNames(): string[] {
  return readdirSync(FIXTURE_DIR)
    .filter((f) => f.endsWith('.grib1'))
    .map((f) => f.slice(0, -'.grib1'.length))
    .sort();
}

export function loadFixture(name: string): Fixture {
  const path = join(FIXTURE_DIR, `${name}.grib1`);
  const bytes = new Uint8Array(readFileSync(path));
  const ref = JSON.parse(readFileSync(join(FIXTURE_DIR, `${name}.json`), 'utf8')) as EccodesReference;
  return { name, path, bytes, ref };
}

export function locationOf(bytes: Uint8Array, number = 1, offset = 0): GribMessageLocation {
  return { number, offset, length: bytes.length, edition: 1 };
}

/** ecCodes dataDate (yyyymmdd) and dataTime (hhmm) as an ISO UTC string. */
export function isoOf(date: number, time: number): string {
  const d = String(date).padStart(8, '0');
  const t = String(time).padStart(4, '0');
  return `${d.slice(0, 4)}-${d.slice(4, 6)}-${d.slice(6, 8)}T${t.slice(0, 2)}:${t.slice(2, 4)}:00Z`;
}
