/**
 * Earth shapes of WMO GRIB2 code table 3.2 that fix their own sizes (codes 1, 3 and 7 take the
 * sizes from the message; see edition2/earth.ts).
 *
 * Source: WMO Manual on Codes (WMO-No. 306), Vol. I.2, Part B, GRIB2 code table 3.2 (master
 * tables version 30). Minor axes are turned into inverse flattening a/(a−b) where the table gives
 * axes; where it gives f, f is used.
 */
export type FixedEarth =
  | { readonly kind: 'sphere'; readonly radiusM: number }
  | { readonly kind: 'ellipsoid'; readonly semiMajorM: number; readonly inverseFlattening: number };

export const GRIB2_FIXED_EARTHS: Readonly<Record<number, FixedEarth>> = {
  0: { kind: 'sphere', radiusM: 6367470 },
  2: { kind: 'ellipsoid', semiMajorM: 6378160, inverseFlattening: 297.0 },
  4: { kind: 'ellipsoid', semiMajorM: 6378137, inverseFlattening: 298.257222101 },
  5: { kind: 'ellipsoid', semiMajorM: 6378137, inverseFlattening: 298.257223563 },
  6: { kind: 'sphere', radiusM: 6371229 },
  8: { kind: 'sphere', radiusM: 6371200 },
  9: { kind: 'ellipsoid', semiMajorM: 6377563.396, inverseFlattening: 6377563.396 / (6377563.396 - 6356256.909) },
  10: { kind: 'ellipsoid', semiMajorM: 6378137, inverseFlattening: 298.257223563 },
} as const;

/** Code table 3.2 codes whose sizes are in the message: 1 sphere (m), 3 oblate (km), 7 oblate (m). */
export const GRIB2_EARTH_FROM_MESSAGE = { sphereM: 1, oblateKm: 3, oblateM: 7 } as const;
