/**
 * Grid definitions of GRIB edition 1 section 2, octets 7 onwards, by data representation type
 * (Code table 6). Octet numbers below are those of the section (FM 92 GRIB edition 1, section 2;
 * layouts as in ecCodes definitions grib1/grid_definition_{0,3,4,5,10}.def).
 *
 *  type 0 / 10 (lat-lon / rotated):  7–8 Ni, 9–10 Nj, 11–13 La1, 14–16 Lo1, 17 resolution and
 *    component flags, 18–20 La2, 21–23 Lo2, 24–25 Di, 26–27 Dj, 28 scanning mode, 29–32 reserved;
 *    type 10 adds 33–35 latitude and 36–38 longitude of the southern pole, 39–42 angle of
 *    rotation (IBM float).
 *  type 4 (Gaussian): as lat-lon but 26–27 N (parallels between a pole and the equator).
 *  type 3 (Lambert conformal): 7–8 Nx, 9–10 Ny, 11–13 La1, 14–16 Lo1, 17 flags, 18–20 LoV,
 *    21–23 Dx (m), 24–26 Dy (m), 27 projection centre flag, 28 scanning mode, 29–31 Latin1,
 *    32–34 Latin2, 35–37 / 38–40 southern pole. LaD is Latin1.
 *  type 5 (polar stereographic): as Lambert to octet 28; Dx, Dy true at 60° (north or south by
 *    bit 1 of the projection centre flag).
 *
 * Angles are signed (sign and magnitude) millidegrees. Resolution and component flags
 * (Code table 7): bit 1 (0x80) increments given, bit 2 (0x40) earth oblate spheroid
 * (IAU 1965: a = 6 378 160 m, b = 6 356 775 m) rather than a sphere of radius 6 367 470 m.
 */
import type { EarthShape } from '../../../grid/types.js';
import type { GribGridDefinition } from '../types.js';
import type { MessageContext } from './context.js';
import { ibmFloat, s24, u16, u24 } from './octets.js';

/** Earth of GRIB1 (FM 92 GRIB edition 1, Code table 7 and section 2 notes). */
export const GRIB1_SPHERE_RADIUS_M = 6_367_470;
export const IAU1965_SEMI_MAJOR_M = 6_378_160;
export const IAU1965_SEMI_MINOR_M = 6_356_775;

const SPHERE: EarthShape = { kind: 'sphere', radiusM: GRIB1_SPHERE_RADIUS_M };
const IAU1965: EarthShape = {
  kind: 'ellipsoid',
  semiMajorM: IAU1965_SEMI_MAJOR_M,
  inverseFlattening: IAU1965_SEMI_MAJOR_M / (IAU1965_SEMI_MAJOR_M - IAU1965_SEMI_MINOR_M),
};

const MISSING16 = 0xffff;
const deg = (millidegrees: number) => millidegrees / 1000;

export interface GridParts {
  readonly grid: GribGridDefinition;
  readonly numberOfPoints: number;
  readonly rows: number;
  readonly columns: number;
  readonly pl: Int32Array | undefined;
}

function earthOf(flags: number): EarthShape {
  return flags & 0x40 ? IAU1965 : SPHERE;
}

function rowsColumns(ni: number, nj: number, scanningMode: number): { rows: number; columns: number } {
  // Scanning mode bit 3 (0x20): adjacent points are consecutive in j (columns are stored rows).
  return scanningMode & 0x20 ? { rows: ni, columns: nj } : { rows: nj, columns: ni };
}

/**
 * Reads the grid of section `s` (starting at message offset `p`). `readPl(nj)` reads the row
 * point counts of a reduced grid.
 */
export function readGrid(
  s: Uint8Array,
  p: number,
  readPl: (nj: number) => Int32Array,
  ctx: MessageContext,
): GridParts {
  const type = s[5];
  const template = `grib1-${type}`;
  const at = (octet: number) => p + octet - 1;
  switch (type) {
    case 0:
    case 10:
    case 4: {
      const niCoded = u16(s, 6);
      const nj = u16(s, 8);
      const lat1 = deg(s24(s, 10));
      const lon1 = deg(s24(s, 13));
      const flags = s[16];
      const lat2 = deg(s24(s, 17));
      const lon2 = deg(s24(s, 20));
      const diCoded = u16(s, 23);
      const word26 = u16(s, 25);
      const scanningMode = s[27];
      const earth = earthOf(flags);
      const incrementsGiven = (flags & 0x80) !== 0;
      const reduced = niCoded === MISSING16;
      if (nj === MISSING16) {
        throw ctx.unsupported(at(9), 'GRIB1 grid quasi-regular along meridians (Nj all ones), data representation type', type);
      }
      if (nj === 0) throw ctx.format(at(9), 'Nj is 0');
      if (!reduced && niCoded === 0) throw ctx.format(at(7), 'Ni is 0');
      let pl: Int32Array | undefined;
      let numberOfPoints: number;
      if (reduced) {
        if (type !== 4) throw ctx.unsupported(at(6), 'GRIB1 quasi-regular grid of data representation type', type, 'only reduced Gaussian grids are');
        if (scanningMode & 0x20) throw ctx.unsupported(at(28), 'GRIB1 scanning mode', scanningMode, 'a reduced grid must run along rows');
        pl = readPl(nj);
        numberOfPoints = 0;
        for (let j = 0; j < nj; j++) numberOfPoints += pl[j];
        if (numberOfPoints === 0) throw ctx.format(at(33), 'the row point counts of the reduced grid are all 0');
      } else {
        numberOfPoints = niCoded * nj;
      }
      const ni = reduced ? undefined : niCoded;
      const di = incrementsGiven && diCoded !== MISSING16 ? deg(diCoded) : undefined;
      const { rows, columns } = reduced ? { rows: nj, columns: 0 } : rowsColumns(niCoded, nj, scanningMode);
      if (type === 4) {
        if (word26 === 0) throw ctx.format(at(26), 'Gaussian N is 0');
        return {
          grid: { type: 'gaussian', template, earth, N: word26, ni, nj, lat1, lon1, lat2, lon2, di, scanningMode, pl },
          numberOfPoints,
          rows,
          columns,
          pl,
        };
      }
      // Increments not given: derived from the corner points, as ecCodes does (accessor
      // latlon_increment): |La2 − La1| / (Nj − 1), and the longitude span in the scanning
      // direction, taken modulo 360, / (Ni − 1).
      const dj = incrementsGiven && word26 !== MISSING16 ? deg(word26) : nj > 1 ? Math.abs(lat2 - lat1) / (nj - 1) : 0;
      let diLatLon = di;
      if (diLatLon === undefined) {
        let span = scanningMode & 0x80 ? lon1 - lon2 : lon2 - lon1;
        span = ((span % 360) + 360) % 360;
        diLatLon = niCoded > 1 ? span / (niCoded - 1) : 0;
      }
      const common = {
        template,
        earth,
        ni: niCoded,
        nj,
        lat1,
        lon1,
        lat2,
        lon2,
        di: diLatLon,
        dj,
        scanningMode,
      };
      if (type === 0) return { grid: { type: 'regular_ll', ...common }, numberOfPoints, rows, columns, pl };
      if (s.length < 42) throw ctx.format(p, `section 2 of a rotated grid needs 42 bytes, has ${s.length}`);
      return {
        grid: {
          type: 'rotated_ll',
          ...common,
          southPoleLat: deg(s24(s, 32)),
          southPoleLon: deg(s24(s, 35)),
          rotationAngle: ibmFloat(s, 38),
        },
        numberOfPoints,
        rows,
        columns,
        pl,
      };
    }
    case 3:
    case 5: {
      const nx = u16(s, 6);
      const ny = u16(s, 8);
      if (nx === 0 || ny === 0 || nx === MISSING16 || ny === MISSING16) {
        throw ctx.format(at(7), `Nx ${nx} by Ny ${ny} is not a grid`);
      }
      const lat1 = deg(s24(s, 10));
      const lon1 = deg(s24(s, 13));
      const earth = earthOf(s[16]);
      const lov = deg(s24(s, 17));
      const dx = u24(s, 20);
      const dy = u24(s, 23);
      const projectionCentre = s[26];
      const scanningMode = s[27];
      const { rows, columns } = rowsColumns(nx, ny, scanningMode);
      const numberOfPoints = nx * ny;
      if (type === 5) {
        return {
          grid: {
            type: 'polar_stereographic',
            template,
            earth,
            nx,
            ny,
            lat1,
            lon1,
            lad: 60,
            lov,
            dx,
            dy,
            southPole: (projectionCentre & 0x80) !== 0,
            scanningMode,
          },
          numberOfPoints,
          rows,
          columns,
          pl: undefined,
        };
      }
      if (s.length < 40) throw ctx.format(p, `section 2 of a Lambert grid needs 40 bytes, has ${s.length}`);
      const latin1 = deg(s24(s, 28));
      const latin2 = deg(s24(s, 31));
      return {
        grid: {
          type: 'lambert_conformal',
          template,
          earth,
          nx,
          ny,
          lat1,
          lon1,
          lad: latin1,
          lov,
          dx,
          dy,
          latin1,
          latin2,
          projectionCentre,
          scanningMode,
        },
        numberOfPoints,
        rows,
        columns,
        pl: undefined,
      };
    }
    default:
      throw ctx.unsupported(at(6), 'GRIB1 data representation type (Code table 6)', type);
  }
}
