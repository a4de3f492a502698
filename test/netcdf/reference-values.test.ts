/**
 * Decoded values against netCDF4-python: every field of every fixture, slice by slice, must
 * match netCDF4-python's auto-masked-and-scaled values (float64) to a few float32 ulps, missing
 * cells exactly; the format must be the one `ncdump -k` names. Source of every expected value:
 * data-samples/fixtures/netcdf/reference.json (netCDF4-python 1.6.2, ncdump from netcdf-bin).
 */
import { describe, expect, it } from 'vitest';
import { open, openRaw } from '../../lib/open.js';
import { decodeValues, valueCodec } from '../../lib/cf/decode.js';
import { FIXTURES, REFERENCE, compareToReference } from './reference.js';

/** ncdump -k names → our format names. */
const KIND: Record<string, string> = {
  classic: 'netcdf3-classic',
  '64-bit offset': 'netcdf3-64bit-offset',
  cdf5: 'netcdf3-cdf5',
  'netCDF-4': 'netcdf4',
  'netCDF-4 classic model': 'netcdf4-classic',
};

const files = Object.keys(REFERENCE.files);

describe('format names agree with ncdump -k', () => {
  it.each(files)('%s', async (name) => {
    const raw = await openRaw(FIXTURES + name);
    try {
      expect(raw.format).toBe(KIND[REFERENCE.files[name].kind]);
    } finally {
      await raw.close();
    }
  });
});

describe('raw stored values agree with netCDF4-python (auto mask and scale off)', () => {
  const cases = files.flatMap((f) =>
    Object.entries(REFERENCE.files[f].variables)
      .filter(([, v]) => v.text === undefined)
      .map(([vn]) => [f, vn] as const),
  );
  it.each(cases)('%s %s', async (file, vname) => {
    const ref = REFERENCE.files[file].variables[vname];
    const raw = await openRaw(FIXTURES + file);
    try {
      const v = raw.variables.get(vname)!;
      expect(v.dims).toEqual(ref.dims);
      expect(v.shape).toEqual(ref.shape);
      const data = await v.read(
        v.shape.map(() => 0),
        v.shape,
      );
      const want = ref.raw ?? ref.decoded!;
      const got = Array.from(data as ArrayLike<number | bigint>, Number);
      // Float fill cells are null in `decoded` (the only list when raw equals decoded); compare the rest.
      const cmp = want.map((w, i) => (w === null ? null : got[i] - w));
      expect(cmp.filter((d) => d !== null && d !== 0)).toEqual([]);
    } finally {
      await raw.close();
    }
  });
});

describe('CF decoding of stored values agrees with netCDF4-python (auto mask and scale on)', () => {
  const cases = files.flatMap((f) =>
    Object.entries(REFERENCE.files[f].variables)
      .filter(([, v]) => v.decoded !== undefined && !v.dtype.includes('int64'))
      .map(([vn]) => [f, vn] as const),
  );
  it.each(cases)('%s %s', async (file, vname) => {
    const ref = REFERENCE.files[file].variables[vname];
    const raw = await openRaw(FIXTURES + file);
    try {
      const v = raw.variables.get(vname)!;
      const data = await v.read(
        v.shape.map(() => 0),
        v.shape,
      );
      const { codec } = valueCodec(v, { file, variable: vname }, () => ({ units: '', unitScale: 1, unitOffset: 0 }));
      const out = new Float32Array(data.length);
      decodeValues(data, codec, out);
      expect(compareToReference(out, ref.decoded!)).toEqual([]);
    } finally {
      await raw.close();
    }
  });
});

describe('text variables agree with netCDF4-python chartostring', () => {
  it.each(['edge_classic.nc', 'edge_64bit.nc', 'edge_cdf5.nc'])('%s c5', async (file) => {
    const raw = await openRaw(FIXTURES + file);
    try {
      expect(await raw.variables.get('c5')!.readText!()).toEqual([REFERENCE.files[file].variables.c5.text]);
    } finally {
      await raw.close();
    }
  });
});

describe('fields read slice by slice agree with netCDF4-python, converted to SI with the recorded units', () => {
  const cases = files.filter((f) => !f.startsWith('edge')).flatMap((f) =>
    Object.entries(REFERENCE.files[f].variables)
      .filter(([, v]) => v.shape.length >= 3 && v.decoded !== undefined)
      .map(([vn]) => [f, vn] as const),
  );
  it.each(cases)('%s %s', async (file, vname) => {
    const ref = REFERENCE.files[file].variables[vname];
    const ds = await open(FIXTURES + file);
    try {
      const f = ds.fields.find((x) => x.name === vname)!;
      expect(f).toBeDefined();
      const npoints = f.grid.npoints;
      const nt = Math.max(1, f.times.length);
      const nk = Math.max(1, f.levelsPa.length);
      const nexp = ref.dims.includes('expver') ? ref.shape[ref.dims.indexOf('expver')] : 1;
      for (let t = 0; t < nt; t++) {
        for (let k = 0; k < nk; k++) {
          const got = await f.readSlice(t, k);
          // Expected: the reference slice (first non-missing expver per cell), in SI.
          const want: (number | null)[] = [];
          for (let i = 0; i < npoints; i++) {
            let w: number | null = null;
            for (let e = 0; e < nexp && w === null; e++) {
              w = ref.decoded![((t * nexp + e) * nk + k) * npoints + i];
            }
            want.push(w === null ? null : w * f.encoding.unitScale + f.encoding.unitOffset);
          }
          expect(compareToReference(got, want), `${vname} t=${t} k=${k}`).toEqual([]);
        }
      }
    } finally {
      await ds.close();
    }
  });
});
