/**
 * NetCDF classic layout: header parsing and hyperslab reads. Outside references: ncdump -h (the
 * netCDF library's own listing of dimensions and variables), netcdfjs 4.0.0 (an independent
 * header parser, for CDF-1/CDF-2), and netCDF4-python's stored values (reference.json).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { netcdfjsHeader, parseNc3Header } from '../../lib/formats/netcdf/nc3-header.js';
import { openRaw } from '../../lib/open.js';
import { run, toolAvailable } from '../support/tools.js';
import { FIXTURES, REFERENCE, numbers } from './reference.js';

const CLASSIC = Object.entries(REFERENCE.files)
  .filter(([, f]) => ['classic', '64-bit offset', 'cdf5'].includes(f.kind))
  .map(([n]) => n);

/** CDL type names (ncdump) of our dtypes. */
const CDL_TYPE: Record<string, string> = {
  int8: 'byte', char: 'char', int16: 'short', int32: 'int', float32: 'float', float64: 'double',
  uint8: 'ubyte', uint16: 'ushort', uint32: 'uint', int64: 'int64', uint64: 'uint64',
};

describe('headers agree with ncdump -h', () => {
  it.each(CLASSIC)('%s', async (file) => {
    if (!toolAvailable('command', 'ncdump')) return;
    const cdl = run('ncdump', ['-h', FIXTURES + file]);
    const dimsCdl = [...cdl.split('variables:')[0].matchAll(/^\t(\w+) = (UNLIMITED ; \/\/ \((\d+) currently\)|(\d+))/gm)].map((m) => [
      m[1],
      Number(m[3] ?? m[4]),
      m[3] !== undefined,
    ]);
    const varsCdl = [...cdl.matchAll(/^\t(\w+) (\w+)\(([^)]*)\) ;$/gm)].map((m) => [m[2], m[1], m[3].split(', ')]);
    const raw = await openRaw(FIXTURES + file);
    try {
      expect(raw.dims.map((d) => [d.name, d.size, d.unlimited])).toEqual(dimsCdl);
      expect([...raw.variables.values()].filter((v) => v.dims.length > 0).map((v) => [v.name, CDL_TYPE[v.dtype], v.dims])).toEqual(varsCdl);
    } finally {
      await raw.close();
    }
  });
});

describe('our header parser agrees with netcdfjs on CDF-1/CDF-2 files', () => {
  it.each(CLASSIC.filter((f) => REFERENCE.files[f].kind !== 'cdf5'))('%s', (file) => {
    const bytes = new Uint8Array(readFileSync(FIXTURES + file));
    const ours = parseNc3Header(bytes);
    const theirs = netcdfjsHeader(bytes);
    expect(ours.vars.map((v) => [v.name, v.begin, v.vsize, v.isRecord, v.dimIds])).toEqual(
      theirs.vars.map((v) => [v.name, v.begin, v.vsize, v.isRecord, v.dimIds]),
    );
    expect(ours.attrs).toEqual(theirs.attrs);
    expect(ours.vars.map((v) => v.attrs)).toEqual(theirs.vars.map((v) => v.attrs));
    expect(ours.numrecs).toEqual(theirs.numrecs);
  });
});

describe('regressions of netcdfjs 4.0.0 that our reader must not repeat (values: netCDF4-python)', () => {
  it.each(['edge_classic.nc', 'edge_64bit.nc', 'edge_cdf5.nc'])('%s: odd-length short s3 reads 1, 2, 3 without the padding element', async (file) => {
    const raw = await openRaw(FIXTURES + file);
    try {
      const s3 = raw.variables.get('s3')!;
      expect(numbers(await s3.read([0], [3]))).toEqual(REFERENCE.files[file].variables.s3.decoded);
    } finally {
      await raw.close();
    }
  });
  it.each(['edge_classic.nc', 'edge_64bit.nc', 'edge_cdf5.nc'])('%s: the only record variable r, 6-byte records, is stored unpadded', async (file) => {
    const raw = await openRaw(FIXTURES + file);
    try {
      const r = raw.variables.get('r')!;
      expect(r.storage.recordSize).toBe(6);
      expect(numbers(await r.read([1, 0], [2, 3]))).toEqual(REFERENCE.files[file].variables.r.decoded!.slice(3, 9));
    } finally {
      await raw.close();
    }
  });
  it('edge_classic.nc: bytes are signed (b4 = -1, 0, 1, -127)', async () => {
    const raw = await openRaw(FIXTURES + 'edge_classic.nc');
    try {
      expect(numbers(await raw.variables.get('b4')!.read([0], [4]))).toEqual(REFERENCE.files['edge_classic.nc'].variables.b4.raw);
    } finally {
      await raw.close();
    }
  });
});

describe('hyperslabs of record variables read only the boxes asked for', () => {
  /** Flat index in a row-major array. */
  const at = (shape: number[], idx: number[]) => idx.reduce((acc, x, i) => acc * shape[i] + x, 0);
  it.each(['nc3_classic.nc', 'nc3_64bit.nc', 'cdf5.nc', 'nc4_classic.nc'])('%s t[0:2, 1:3, 1:4, 3:9]', async (file) => {
    const ref = REFERENCE.files[file].variables.t;
    const want: number[] = [];
    for (let a = 0; a < 2; a++) for (let b = 1; b < 3; b++) for (let c = 1; c < 4; c++) for (let d = 3; d < 9; d++) want.push(ref.raw![at(ref.shape, [a, b, c, d])] as number);
    const raw = await openRaw(FIXTURES + file);
    try {
      expect(numbers(await raw.variables.get('t')!.read([0, 1, 1, 3], [2, 2, 3, 6]))).toEqual(want);
    } finally {
      await raw.close();
    }
  });
});

describe('numrecs = STREAMING (0xFFFFFFFF): records are counted from the file size', () => {
  // The NetCDF file format specification allows it; netCDF-C 4.9's ncdump does not count them
  // (it reports 4294967295 records), so the oracle is nc3_classic.nc itself, whose bytes are
  // these with numrecs = 2, and netCDF4-python's values for it.
  it('nc3_classic.nc with numrecs patched reads the same two records', async () => {
    const { mkdtempSync, writeFileSync, rmSync } = await import('node:fs');
    const { tmpdir } = await import('node:os');
    const dir = mkdtempSync(`${tmpdir()}/frostgrid-stream-`);
    try {
      const bytes = new Uint8Array(readFileSync(FIXTURES + 'nc3_classic.nc'));
      expect(Array.from(bytes.subarray(4, 8))).toEqual([0, 0, 0, 2]);
      bytes.set([0xff, 0xff, 0xff, 0xff], 4);
      writeFileSync(`${dir}/s.nc`, bytes);
      const raw = await openRaw(`${dir}/s.nc`);
      try {
        expect(raw.dims.find((d) => d.name === 'time')!.size).toBe(2);
        const t = raw.variables.get('t')!;
        expect(numbers(await t.read([0, 0, 0, 0], [2, 3, 5, 16]))).toEqual(REFERENCE.files['nc3_classic.nc'].variables.t.raw);
      } finally {
        await raw.close();
      }
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
