/**
 * The reference values committed beside the fixtures: what netCDF4-python (auto mask and scale:
 * float64, masked → null) and ncdump -k report for each file, made by
 * data-samples/fixtures/netcdf/make_fixtures.py.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

export const FIXTURES = fileURLToPath(new URL('../../data-samples/fixtures/netcdf/', import.meta.url));

export interface RefVariable {
  readonly dims: string[];
  readonly shape: number[];
  readonly dtype: string;
  readonly decoded?: (number | null)[];
  readonly raw?: (number | null)[];
  readonly text?: string | string[];
  readonly dates?: string[];
}

export interface RefFile {
  readonly kind: string;
  readonly variables: Record<string, RefVariable>;
}

export const REFERENCE = JSON.parse(readFileSync(`${FIXTURES}reference.json`, 'utf8')) as {
  _about: string;
  files: Record<string, RefFile>;
};

/** One unit in the last place of a float32 near x. */
export function ulp32(x: number): number {
  const a = Math.abs(x);
  if (a === 0) return 2 ** -149;
  return 2 ** (Math.floor(Math.log2(a)) - 23);
}

/**
 * Compares decoded float32 values with float64 reference values (null = missing): missing cells
 * must match exactly, others within `ulps` float32 ulps. Returns a description of the first
 * mismatches (empty when all agree).
 */
export function compareToReference(got: ArrayLike<number>, want: readonly (number | null)[], ulps = 4): string[] {
  const bad: string[] = [];
  if (got.length !== want.length) return [`length ${got.length} ≠ ${want.length}`];
  for (let i = 0; i < want.length && bad.length < 5; i++) {
    const w = want[i];
    const g = got[i];
    if (w === null) {
      if (!Number.isNaN(g)) bad.push(`[${i}] ${g} should be missing`);
    } else if (Number.isNaN(g) || Math.abs(g - w) > ulps * ulp32(w)) {
      bad.push(`[${i}] ${g} ≠ ${w}`);
    }
  }
  return bad;
}

/** Any typed array (bigint ones too) as plain numbers. */
export function numbers(a: ArrayLike<number> | ArrayLike<bigint>): number[] {
  return Array.from(a as ArrayLike<number | bigint>, Number);
}
