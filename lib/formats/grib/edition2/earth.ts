/**
 * The shape of the earth of a GRIB2 grid definition template (octets 15–30 of templates 3.0,
 * 3.1, 3.20, 3.30, 3.40), interpreted through code table 3.2 (tables/grib2-earth.ts).
 */
import type { EarthShape } from '../../../grid/types.js';
import { GRIB2_EARTH_FROM_MESSAGE, GRIB2_FIXED_EARTHS } from '../tables/grib2-earth.js';
import { allOnes, s8, u32, u8 } from './bytes.js';

export type EarthResult = { ok: true; earth: EarthShape } | { ok: false; code: number; why: string };

function scaled(b: Uint8Array, p: number): number | undefined {
  if (allOnes(b, p, 5)) return undefined;
  return u32(b, p + 1) / 10 ** s8(b, p);
}

/** Reads the earth shape from the 16 octets starting at `p` (octet 15 of the template section). */
export function readEarthShape(b: Uint8Array, p: number): EarthResult {
  const code = u8(b, p);
  const fixed = GRIB2_FIXED_EARTHS[code];
  if (fixed) return { ok: true, earth: fixed };
  if (code === GRIB2_EARTH_FROM_MESSAGE.sphereM) {
    const r = scaled(b, p + 1);
    if (r === undefined || !(r > 0)) return { ok: false, code, why: 'the earth radius is missing' };
    return { ok: true, earth: { kind: 'sphere', radiusM: r } };
  }
  if (code === GRIB2_EARTH_FROM_MESSAGE.oblateKm || code === GRIB2_EARTH_FROM_MESSAGE.oblateM) {
    const k = code === GRIB2_EARTH_FROM_MESSAGE.oblateKm ? 1000 : 1;
    const a = scaled(b, p + 6);
    const bb = scaled(b, p + 11);
    if (a === undefined || bb === undefined || !(a > 0) || !(bb > 0)) {
      return { ok: false, code, why: 'the earth axes are missing' };
    }
    if (a === bb) return { ok: true, earth: { kind: 'sphere', radiusM: a * k } };
    return { ok: true, earth: { kind: 'ellipsoid', semiMajorM: a * k, inverseFlattening: a / (a - bb) } };
  }
  return { ok: false, code, why: `code table 3.2 entry ${code} is not an earth shape frostgrid knows` };
}
