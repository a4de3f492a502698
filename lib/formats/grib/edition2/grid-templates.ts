/**
 * GRIB2 grid definition templates (section 3), registered by template number. Each reads the
 * template into a GribGridDefinition; octet numbers below are those of WMO-No. 306, Vol. I.2,
 * Part B, GRIB2 templates 3.0, 3.1, 3.20, 3.30 and 3.40 (section-relative, 1-based).
 */
import type { EarthShape } from '../../../grid/types.js';
import type { GribGridDefinition } from '../types.js';
import { allOnes, s32, u16, u32, u8 } from './bytes.js';
import { readEarthShape } from './earth.js';

/** A problem in a template, located by its section-relative octet (1-based). */
export class TemplateProblem {
  constructor(
    readonly octet: number,
    readonly why: string,
  ) {}
}

export interface GridTemplate {
  /** Octets of the section up to the end of the template (for the optional list that follows). */
  readonly length: number;
  read(sec: Uint8Array, template: number): GribGridDefinition;
}

/** Section-relative octet n (1-based) → index. */
const o = (n: number) => n - 1;

function earth(sec: Uint8Array): EarthShape {
  const r = readEarthShape(sec, o(15));
  if (!r.ok) throw new TemplateProblem(15, r.why);
  return r.earth;
}

/** Angle unit of templates 3.0/3.1/3.40: basic angle / subdivisions, default 10^-6 degree. */
function angleUnit(sec: Uint8Array): number {
  const basic = u32(sec, o(39));
  const sub = u32(sec, o(43));
  if (basic === 0 || sub === 0 || basic === 0xffffffff || sub === 0xffffffff) return 1e-6;
  return basic / sub;
}

function count(sec: Uint8Array, octet: number, what: string): number {
  const n = u32(sec, o(octet));
  if (n === 0 || n === 0xffffffff) throw new TemplateProblem(octet, `${what} is ${n === 0 ? 0 : 'missing'}`);
  return n;
}

function optionalCount(sec: Uint8Array, octet: number): number | undefined {
  const n = u32(sec, o(octet));
  return n === 0xffffffff || n === 0 ? undefined : n;
}

/** Rounds a decoded angle to the precision of its unit (10^-6 degree → 6 decimals). */
function angle(raw: number, unit: number): number {
  const v = raw * unit;
  return unit === 1e-6 ? Math.round(v * 1e6) / 1e6 : v;
}

function latLonCommon(sec: Uint8Array) {
  const unit = angleUnit(sec);
  return {
    earth: earth(sec),
    ni: count(sec, 31, 'Ni (points along a parallel)'),
    nj: count(sec, 35, 'Nj (points along a meridian)'),
    lat1: angle(s32(sec, o(47)), unit),
    lon1: angle(s32(sec, o(51)), unit),
    lat2: angle(s32(sec, o(56)), unit),
    lon2: angle(s32(sec, o(60)), unit),
    di: allOnes(sec, o(64), 4) ? Number.NaN : angle(u32(sec, o(64)), unit),
    dj: allOnes(sec, o(68), 4) ? Number.NaN : angle(u32(sec, o(68)), unit),
    scanningMode: u8(sec, o(72)),
    unit,
  };
}

const regularLatLon: GridTemplate = {
  length: 72,
  read(sec, template) {
    const { unit: _u, ...g } = latLonCommon(sec);
    return { type: 'regular_ll', template: `3.${template}`, ...g };
  },
};

const rotatedLatLon: GridTemplate = {
  length: 84,
  read(sec, template) {
    const { unit, ...g } = latLonCommon(sec);
    const view = new DataView(sec.buffer, sec.byteOffset + o(81), 4);
    return {
      type: 'rotated_ll',
      template: `3.${template}`,
      ...g,
      southPoleLat: angle(s32(sec, o(73)), unit),
      southPoleLon: angle(u32(sec, o(77)), unit),
      rotationAngle: view.getFloat32(0, false),
    };
  },
};

const gaussian: GridTemplate = {
  length: 72,
  read(sec, template) {
    const unit = angleUnit(sec);
    const N = count(sec, 68, 'N (parallels between a pole and the equator)');
    return {
      type: 'gaussian',
      template: `3.${template}`,
      earth: earth(sec),
      N,
      ni: optionalCount(sec, 31),
      nj: count(sec, 35, 'Nj (number of parallels)'),
      lat1: angle(s32(sec, o(47)), unit),
      lon1: angle(s32(sec, o(51)), unit),
      lat2: angle(s32(sec, o(56)), unit),
      lon2: angle(s32(sec, o(60)), unit),
      di: allOnes(sec, o(64), 4) ? undefined : angle(u32(sec, o(64)), unit),
      scanningMode: u8(sec, o(72)),
      pl: undefined,
    };
  },
};

const polarStereographic: GridTemplate = {
  length: 65,
  read(sec, template) {
    const flag = u8(sec, o(64));
    return {
      type: 'polar_stereographic',
      template: `3.${template}`,
      earth: earth(sec),
      nx: count(sec, 31, 'Nx'),
      ny: count(sec, 35, 'Ny'),
      lat1: s32(sec, o(39)) * 1e-6,
      lon1: u32(sec, o(43)) * 1e-6,
      lad: s32(sec, o(48)) * 1e-6,
      lov: u32(sec, o(52)) * 1e-6,
      dx: u32(sec, o(56)) * 1e-3,
      dy: u32(sec, o(60)) * 1e-3,
      southPole: (flag & 0x80) !== 0,
      scanningMode: u8(sec, o(65)),
    };
  },
};

const lambert: GridTemplate = {
  length: 81,
  read(sec, template) {
    return {
      type: 'lambert_conformal',
      template: `3.${template}`,
      earth: earth(sec),
      nx: count(sec, 31, 'Nx'),
      ny: count(sec, 35, 'Ny'),
      lat1: s32(sec, o(39)) * 1e-6,
      lon1: u32(sec, o(43)) * 1e-6,
      lad: s32(sec, o(48)) * 1e-6,
      lov: u32(sec, o(52)) * 1e-6,
      dx: u32(sec, o(56)) * 1e-3,
      dy: u32(sec, o(60)) * 1e-3,
      projectionCentre: u8(sec, o(64)),
      scanningMode: u8(sec, o(65)),
      latin1: s32(sec, o(66)) * 1e-6,
      latin2: s32(sec, o(70)) * 1e-6,
    };
  },
};

/** Grid definition templates by number (code table 3.1). */
export const GRID_TEMPLATES: ReadonlyMap<number, GridTemplate> = new Map([
  [0, regularLatLon],
  [1, rotatedLatLon],
  [20, polarStereographic],
  [30, lambert],
  [40, gaussian],
]);

/** Reads the optional list of numbers (points per row) after the template (octets 11–12). */
export function readPointsList(sec: Uint8Array, templateLength: number): Int32Array | undefined {
  const width = u8(sec, o(11));
  if (width === 0) return undefined;
  if (width !== 1 && width !== 2 && width !== 4) throw new TemplateProblem(11, `${width} octets per number is not a valid list width`);
  const start = templateLength;
  const n = Math.floor((sec.length - start) / width);
  if (n <= 0) throw new TemplateProblem(11, `the list of points per row is declared with ${width} octets per number but the section has no room for it`);
  const pl = new Int32Array(n);
  for (let i = 0, p = start; i < n; i++, p += width) {
    pl[i] = width === 1 ? sec[p] : width === 2 ? u16(sec, p) : u32(sec, p);
  }
  return pl;
}
