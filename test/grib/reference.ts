/**
 * The values ecCodes (python3-eccodes 2.28, codes_get_values / codes_get_array) reports for the
 * committed fixtures, recorded by data-samples/fixtures/grib/make_fixtures.py in reference.json.gz.
 */
import { readFileSync } from 'node:fs';
import { gunzipSync } from 'node:zlib';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

export const FIXTURES = join(dirname(fileURLToPath(import.meta.url)), '../../data-samples/fixtures/grib');

export interface ReferenceMessage {
  edition: number;
  centre: number;
  discipline: number | null;
  parameterCategory: number | null;
  parameterNumber: number | null;
  indicatorOfParameter: number | null;
  table2Version: number | null;
  dataDate: number;
  dataTime: number;
  validityDate: number;
  validityTime: number;
  scanningMode: number | null;
  productDefinitionTemplateNumber: number | null;
  dataRepresentationTemplateNumber: number | null;
  gridDefinitionTemplateNumber: number | null;
  bitsPerValue: number;
  perturbationNumber: number | null;
  numberOfDataPoints: number;
  numberOfValues: number;
  offset: number;
  totalLength: number;
  typeOfFirstFixedSurface: number | null;
  level: number;
  Ni: number | null;
  Nj: number | null;
  N: number | null;
  bitmapPresent: number;
  binaryScaleFactor: number;
  decimalScaleFactor: number;
  shortName: string;
  typeOfLevel: string;
  gridType: string;
  packingType: string;
  stepRange: string;
  units: string;
  name: string;
  referenceValue: number;
  missing: number[];
  values: (number | null)[];
  latitudes?: number[];
  longitudes?: number[];
  pl?: number[] | null;
  distinctLatitudes?: number[];
}

export interface ReferenceFile {
  doc: string;
  messages: ReferenceMessage[];
  bad?: BadFixture;
}

export const REFERENCE: Record<string, ReferenceFile> = JSON.parse(gunzipSync(readFileSync(join(FIXTURES, 'reference.json.gz'))).toString('utf8'));

export const fixture = (name: string) => join(FIXTURES, name);

/** yyyymmdd + hhmm → epoch ms. */
export function ecDate(date: number, time: number): number {
  const y = Math.floor(date / 10000);
  const m = Math.floor(date / 100) % 100;
  const d = date % 100;
  return Date.UTC(y, m - 1, d, Math.floor(time / 100), time % 100);
}

/**
 * Index of the first value that differs from the reference by more than float32 rounding
 * (1e-6 relative, with an absolute floor for values near zero), or where missing-ness differs;
 * -1 when all agree.
 */
export function firstMismatch(got: ArrayLike<number>, want: readonly (number | null)[], rel = 1e-6): number {
  if (got.length !== want.length) return -2;
  let scale = 0;
  for (const w of want) if (w !== null) scale = Math.max(scale, Math.abs(w));
  const floor = scale * 1e-12;
  for (let k = 0; k < want.length; k++) {
    const w = want[k];
    const g = got[k];
    if (w === null) {
      if (!Number.isNaN(g)) return k;
      continue;
    }
    if (!(Math.abs(g - w) <= rel * Math.abs(w) + floor)) return k;
  }
  return -1;
}

import { readGribIndex, type GribIndex } from '../../lib/formats/grib/index.js';

const indexes = new Map<string, Promise<GribIndex>>();
/** The index of a fixture, read once per test file. */
export function fixtureIndex(name: string): Promise<GribIndex> {
  let p = indexes.get(name);
  if (!p) indexes.set(name, (p = readGribIndex(fixture(name))));
  return p;
}

export interface BadFixture {
  fault: string;
  brokenMessage: number;
  brokenOffset: number;
  brokenLength: number;
  goodMessages: number[];
  goodValues: (number | null)[];
}
