/**
 * Contract suite: the same fields through every NetCDF format give the same numbers. The base
 * fixtures hold one synthetic atmosphere written by netCDF4-python as NetCDF3 classic, 64-bit
 * offset, CDF-5 and NetCDF-4 classic (int16 packed), NetCDF-4 zlib+shuffle (float32 of the
 * unpacked values), the reanalysis-style expver file (float32, split over two expver versions)
 * and the CMIP-style file (levels, rows and columns re-ordered). Every format must agree with
 * nc3_classic.nc exactly; nc3_classic.nc itself is checked against netCDF4-python in
 * reference-values.test.ts. Times: cftime (reference.json `dates`).
 */
import { describe, expect, it } from 'vitest';
import { findField } from '../../lib/grid/select.js';
import { contiguous, northToSouth, sliceView, toLongitudeConvention } from '../../lib/grid/view.js';
import type { GridDataset, Quantity, RegularLatLonGrid } from '../../lib/grid/types.js';
import { open } from '../../lib/open.js';
import { FIXTURES, REFERENCE } from './reference.js';

async function withDataset<T>(file: string, f: (ds: GridDataset) => Promise<T>): Promise<T> {
  const ds = await open(FIXTURES + file);
  try {
    return await f(ds);
  } finally {
    await ds.close();
  }
}

async function allSlices(ds: GridDataset, q: Quantity): Promise<Float32Array[]> {
  const f = findField(ds, q);
  const out: Float32Array[] = [];
  for (let t = 0; t < f.times.length; t++) for (let k = 0; k < f.levelsPa.length; k++) out.push(await f.readSlice(t, k));
  return out;
}

const SAME_LAYOUT = ['nc3_64bit.nc', 'cdf5.nc', 'nc4_classic.nc', 'nc4_zlib.nc', 'expver.nc'];

describe.each(['air_temperature', 'specific_humidity'] as const)('%s is the same in every format', (q) => {
  it.each(SAME_LAYOUT)('%s equals nc3_classic.nc', async (file) => {
    const base = await withDataset('nc3_classic.nc', (ds) => allSlices(ds, q));
    const other = await withDataset(file, (ds) => allSlices(ds, q));
    expect(other.length).toBe(base.length);
    for (let i = 0; i < base.length; i++) expect(Array.from(other[i])).toEqual(Array.from(base[i]));
  });

  it('cf_other_names.nc (Pa ascending, south to north, −180..180) equals nc3_classic.nc after re-ordering views', async () => {
    const base = await withDataset('nc3_classic.nc', async (ds) => ({ slices: await allSlices(ds, q), levels: findField(ds, q).levelsPa }));
    await withDataset('cf_other_names.nc', async (ds) => {
      const f = findField(ds, q);
      const grid = f.grid as RegularLatLonGrid;
      expect([grid.latitudeOrder, grid.longitudeConvention, grid.globalLongitude]).toEqual(['south_to_north', '-180..180', true]);
      for (let t = 0; t < f.times.length; t++) {
        for (let k = 0; k < f.levelsPa.length; k++) {
          const kb = Array.from(base.levels).indexOf(f.levelsPa[k]);
          expect(kb).toBeGreaterThanOrEqual(0);
          const v = toLongitudeConvention(northToSouth(sliceView(await f.readSlice(t, k), grid)), '0..360');
          expect(Array.from(v.lon)).toEqual(Array.from({ length: 16 }, (_, i) => i * 22.5));
          expect(Array.from(contiguous(v))).toEqual(Array.from(base.slices[t * 3 + kb]));
        }
      }
    });
  });
});

describe('coordinates', () => {
  it.each([...SAME_LAYOUT, 'nc3_classic.nc'])('%s: levels 300, 250, 200 hPa in Pa; global 0..360 grid north to south', async (file) => {
    await withDataset(file, async (ds) => {
      const f = findField(ds, 'air_temperature');
      expect(Array.from(f.levelsPa)).toEqual([30000, 25000, 20000]);
      const g = f.grid as RegularLatLonGrid;
      expect(g).toMatchObject({ kind: 'regular_ll', nx: 16, ny: 5, dLat: 45, dLon: 22.5, latitudeOrder: 'north_to_south', longitudeConvention: '0..360', globalLongitude: true });
      expect(g.crs).toMatchObject({ kind: 'geographic', epsg: 4326 });
    });
  });

  it.each([
    ['nc3_classic.nc', 'time'],
    ['cdf5.nc', 'time'],
    ['nc4_zlib.nc', 'time'],
    ['cf_other_names.nc', 'time'],
    ['expver.nc', 'valid_time'],
  ])('%s: times agree with cftime', async (file, tname) => {
    const want = REFERENCE.files[file].variables[tname].dates!;
    await withDataset(file, async (ds) => {
      const f = findField(ds, 'air_temperature');
      expect(f.times.map((t) => t.valid.iso.replace(/Z$/, ''))).toEqual(want);
    });
  });

  it('expver.nc notes the merge of the expver versions', async () => {
    await withDataset('expver.nc', async (ds) => {
      expect(ds.notes).toContain('variable t: merged the 2 expver versions, taking the non-missing value per cell');
    });
  });
});

describe('encoding records what was on disk', () => {
  it('nc3_classic.nc t: packed int16 (values as ncdump -h shows them)', async () => {
    await withDataset('nc3_classic.nc', async (ds) => {
      expect(findField(ds, 'air_temperature').encoding).toMatchObject({
        storedType: 'int16',
        scaleFactor: 0.000376915094915461,
        addOffset: 234.85,
        fillValue: -32767,
        missingValue: [-32766],
        sourceUnits: 'K',
        unitScale: 1,
        unitOffset: 0,
        quantizationStep: 0.000376915094915461,
      });
    });
  });
  it('nc4_zlib.nc t: float32 chunks (1, 1, 5, 16) through shuffle and deflate', async () => {
    await withDataset('nc4_zlib.nc', async (ds) => {
      expect(findField(ds, 'air_temperature').encoding).toMatchObject({
        storedType: 'float32',
        fillValue: -9999,
        chunking: [1, 1, 5, 16],
        filters: ['shuffle', 'deflate'],
        quantizationStep: 0,
      });
    });
  });
  it('nc4_zlib.nc q_szip: the szip filter decodes to the same numbers as q', async () => {
    await withDataset('nc4_zlib.nc', async (ds) => {
      const q = ds.fields.find((f) => f.name === 'q')!;
      const s = ds.fields.find((f) => f.name === 'q_szip')!;
      expect(s.encoding.filters).toEqual(['szip']);
      expect(Array.from(await s.readSlice(1, 2))).toEqual(Array.from(await q.readSlice(1, 2)));
    });
  });
});
