/**
 * Zero-copy views of a slice (ndarray 1.1.1). Expected values: netCDF4-python's stored values of
 * nc3_classic.nc t (reference.json), indexed by hand; the re-ordered CMIP-style file is checked
 * in test/netcdf/contract.test.ts.
 */
import { describe, expect, it } from 'vitest';
import { regularLatLonGrid } from '../../lib/grid/horizontal.js';
import { contiguous, flipLatitude, isContiguous, rotateColumns, sliceView, subBox, toLongitudeConvention, viewGet } from '../../lib/grid/view.js';
import { REFERENCE } from '../netcdf/reference.js';

const ref = REFERENCE.files['nc3_classic.nc'].variables;
const lat = Float64Array.from(ref.latitude.decoded as number[]);
const lon = Float64Array.from(ref.longitude.decoded as number[]);
const { grid } = regularLatLonGrid(lat, lon);
/** t at time 1, level 2 as stored (raw int16 values as float32: exact). */
const slice = Float32Array.from((ref.t.raw as number[]).slice((1 * 3 + 2) * 80, (1 * 3 + 2) * 80 + 80));
const cell = (i: number, j: number) => slice[i * 16 + j];

describe('grid descriptor of nc3_classic.nc (coordinates from netCDF4-python)', () => {
  it('global 22.5° grid, north to south, 0..360', () => {
    expect(grid).toMatchObject({ nx: 16, ny: 5, npoints: 80, dLat: 45, dLon: 22.5, latitudeOrder: 'north_to_south', longitudeConvention: '0..360', globalLongitude: true });
  });
});

describe('views', () => {
  it('flipLatitude reverses rows without copying', () => {
    const base = slice.slice();
    const v = flipLatitude(sliceView(base, grid));
    expect(viewGet(v, 0, 3)).toBe(cell(4, 3));
    expect(Array.from(v.lat)).toEqual([-90, -45, 0, 45, 90]);
    base[4 * 16 + 3] = 12345;
    expect(viewGet(v, 0, 3)).toBe(12345);
    expect(isContiguous(v)).toBe(false);
  });
  it('rotateColumns by 8 puts 180° first, and contiguous() copies in that order', () => {
    const v = rotateColumns(sliceView(slice, grid), 8);
    expect(v.lon[0]).toBe(180);
    const c = contiguous(v);
    for (let i = 0; i < 5; i++) for (let j = 0; j < 16; j++) expect(c[i * 16 + j]).toBe(cell(i, (j + 8) % 16));
  });
  it('toLongitudeConvention −180..180 starts at −180 and relabels', () => {
    const v = toLongitudeConvention(sliceView(slice, grid), '-180..180');
    expect(Array.from(v.lon.slice(0, 3))).toEqual([-180, -157.5, -135]);
    expect(viewGet(v, 2, 0)).toBe(cell(2, 8));
  });
  it('subBox across the rotation seam', () => {
    const v = subBox(rotateColumns(sliceView(slice, grid), 12), 1, 3, 2, 6);
    const c = contiguous(v);
    expect(c.length).toBe(18);
    for (let i = 0; i < 3; i++) for (let j = 0; j < 6; j++) expect(c[i * 6 + j]).toBe(cell(1 + i, (12 + 2 + j) % 16));
  });
  it('contiguous() of an untouched view is the slice memory itself', () => {
    const v = sliceView(slice, grid);
    expect(contiguous(v)).toBe(slice);
  });
  it('a box outside the view is a RangeError', () => {
    expect(() => subBox(sliceView(slice, grid), 3, 3, 0, 1)).toThrow(RangeError);
  });
});
