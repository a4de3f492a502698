/**
 * Files past 4 GiB and CDF-5 counts: sparse files whose header we write by the NetCDF "File
 * Format Specifications" grammar, with data placed past 4 GiB (the file takes a few KB on disk).
 * The netCDF library itself (ncdump) must read them, and what it prints is what we must read.
 * netcdfjs refuses such offsets ("offsets larger than 4GB"), so this covers our own parser.
 */
import { closeSync, mkdtempSync, openSync, rmSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { openRaw } from '../../lib/open.js';
import { run, toolAvailable } from '../support/tools.js';
import { numbers } from './reference.js';

const dir = mkdtempSync(join(tmpdir(), 'frostgrid-nc3-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Writes a one-variable (short s(k)) file with `s` at byte `begin`, in CDF-2 or CDF-5 grammar. */
function sparseFile(name: string, version: 2 | 5, begin: number, values: number[]): string {
  const parts: Buffer[] = [];
  const u32 = (n: number) => {
    const b = Buffer.alloc(4);
    b.writeUInt32BE(n);
    parts.push(b);
  };
  const u64 = (n: number) => {
    const b = Buffer.alloc(8);
    b.writeBigUInt64BE(BigInt(n));
    parts.push(b);
  };
  const count = version === 5 ? u64 : u32;
  const text = (s: string) => {
    count(s.length);
    const b = Buffer.alloc(Math.ceil(s.length / 4) * 4);
    b.write(s, 'latin1');
    parts.push(b);
  };
  parts.push(Buffer.from([0x43, 0x44, 0x46, version]));
  count(0); // numrecs
  u32(0x0a); // NC_DIMENSION
  count(1);
  text('k');
  count(values.length);
  u32(0); // no global attributes (ABSENT)
  count(0);
  u32(0x0b); // NC_VARIABLE
  count(1);
  text('s');
  count(1); // one dimension
  count(0); // dimid 0
  u32(0); // no attributes
  count(0);
  u32(3); // NC_SHORT
  const vsize = Math.ceil((values.length * 2) / 4) * 4;
  count(vsize);
  u64(begin);
  const header = Buffer.concat(parts);
  const path = join(dir, name);
  const fd = openSync(path, 'w');
  writeSync(fd, header, 0, header.length, 0);
  const data = Buffer.alloc(vsize);
  values.forEach((v, i) => data.writeInt16BE(v, i * 2));
  writeSync(fd, data, 0, vsize, begin);
  closeSync(fd);
  return path;
}

/** The values of `s` as ncdump prints them. */
function ncdumpValues(path: string): number[] {
  const out = run('ncdump', ['-v', 's', path]);
  const m = /s = ([^;]*);/.exec(out)!;
  return m[1].split(',').map((x) => Number(x.trim()));
}

describe('variables beginning past 4 GiB', () => {
  const values = [-3000, -2000, -1000, 0, 1000, 2000, 3000];
  it.each([
    ['cdf2_past_4gib.nc', 2, 5 * 2 ** 30, 'netcdf3-64bit-offset'],
    ['cdf5_past_4gib.nc', 5, 6 * 2 ** 30 + 8, 'netcdf3-cdf5'],
  ] as const)('%s (CDF-%i, begin %i): ncdump and frostgrid read the same values', async (name, version, begin, format) => {
    if (!toolAvailable('command', 'ncdump')) return;
    const path = sparseFile(name, version, begin, values);
    expect(ncdumpValues(path)).toEqual(values);
    const raw = await openRaw(path);
    try {
      expect(raw.format).toBe(format);
      const s = raw.variables.get('s')!;
      expect(s.storage.begin).toBe(begin);
      expect(s.storage.headerParser).toBe('frostgrid');
      expect(numbers(await s.read([0], [7]))).toEqual(ncdumpValues(path));
      expect(numbers(await s.read([2], [3]))).toEqual(values.slice(2, 5));
    } finally {
      await raw.close();
    }
  });
});
