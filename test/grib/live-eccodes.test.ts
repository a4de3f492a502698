/**
 * Live cross-check with the ecCodes command-line tools (libeccodes-tools; CI installs them): a
 * committed fixture is repacked by grib_set into other packings, and every point that grib_get_data
 * prints (latitude, longitude, value; missing as "MISSING") is compared with frostgrid's decoding.
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { buildGrid, gridLonLat, readGribIndex, scanGrib } from '../../lib/formats/grib/index.js';
import { PYTHON, run, toolAvailable } from '../support/tools.js';
import { firstMismatch, fixture } from './reference.js';

function gribGetData(path: string): { lat: number[]; lon: number[]; values: (number | null)[] }[] {
  const text = run('grib_get_data', ['-m', 'MISSING', '-F', '%.12g', path]);
  const out: { lat: number[]; lon: number[]; values: (number | null)[] }[] = [];
  for (const line of text.split('\n')) {
    const f = line.trim().split(/\s+/);
    if (f[0] === 'Latitude') {
      out.push({ lat: [], lon: [], values: [] });
      continue;
    }
    if (f.length < 3 || out.length === 0) continue;
    const m = out[out.length - 1];
    m.lat.push(Number(f[0]));
    m.lon.push(Number(f[1]));
    m.values.push(f[2] === 'MISSING' ? null : Number(f[2]));
  }
  return out;
}

const cases = [
  ['ll-bitmap.grib2', 'grid_simple'],
  ['products.grib2', 'grid_complex'],
  ['ll-bitmap.grib2', 'grid_ccsds'],
  ['ll-scanning.grib2', 'grid_ccsds'],
  ['gaussian.grib2', 'grid_complex'],
  ['lambert.grib2', 'grid_ccsds'],
] as const;

describe('live ecCodes cross-check (grib_set repack, grib_get_data values)', () => {
  it.each(cases)('%s repacked as %s', async (name, packing) => {
    if (!toolAvailable('command', 'grib_set') || !toolAvailable('command', 'grib_get_data')) return;
    const out = join(mkdtempSync(join(tmpdir(), 'frostgrid-live-')), `${packing}.grib2`);
    run('grib_set', ['-r', '-s', `packingType=${packing}`, fixture(name), out]);
    const want = gribGetData(out);
    const index = await readGribIndex(out);
    expect(index.problems).toEqual([]);
    expect(index.fields.length).toBe(want.length);
    for (let k = 0; k < want.length; k++) {
      const info = index.fields[k];
      expect(info.packing).toBe({ grid_simple: '5.0', grid_complex: '5.2', grid_ccsds: '5.42' }[packing]);
      const values = info.decodeAsync ? await info.decodeAsync() : info.decode();
      const bad = firstMismatch(values, want[k].values);
      expect(bad, bad >= 0 ? `field ${k} point ${bad}: ${values[bad]} vs ${want[k].values[bad]}` : '').toBe(-1);
      // Coordinates: grib_get_data prints them in message order, to 3 decimals (hence 5.1e-4).
      // Alternate-row scanning (0x10) is
      // left out: ecCodes 2.28's iterator ignores it (see make_fixtures.py).
      if (info.grid.scanningMode & 0x10) continue;
      const { grid, order } = buildGrid(info.grid);
      const { lon, lat } = gridLonLat(grid);
      for (let q = 0; q < grid.npoints; q++) {
        const src = order ? order[q] : q;
        expect(Math.abs(lat[q] - want[k].lat[src])).toBeLessThan(5.1e-4);
        if (Math.abs(lat[q]) < 89.99) expect(Math.abs(((((lon[q] - want[k].lon[src]) % 360) + 540) % 360) - 180)).toBeLessThan(5.1e-4);
      }
    }
  });
});

describe('live: GRIB1 messages above 8 MB (large-message length convention)', () => {
  it('scans two 12 MB GRIB1 messages written by python3-eccodes to the lengths ecCodes reports', async () => {
    if (!toolAvailable('python', 'eccodes')) return;
    const out = join(mkdtempSync(join(tmpdir(), 'frostgrid-live-')), 'large.grib1');
    const script = `
import sys, eccodes as ec, numpy as np
h = ec.codes_grib_new_from_samples('GRIB1')
for k, v in [('Ni', 2880), ('Nj', 1441), ('latitudeOfFirstGridPointInDegrees', 90.0), ('longitudeOfFirstGridPointInDegrees', 0.0),
             ('latitudeOfLastGridPointInDegrees', -90.0), ('longitudeOfLastGridPointInDegrees', 359.875),
             ('iDirectionIncrementInDegrees', 0.125), ('jDirectionIncrementInDegrees', 0.125), ('bitsPerValue', 24)]:
    ec.codes_set(h, k, v)
ec.codes_set_values(h, np.linspace(200, 300, 2880 * 1441))
m = ec.codes_get_message(h)
open(sys.argv[1], 'wb').write(b'junk' + m + m)
print(ec.codes_get(h, 'totalLength'), int.from_bytes(m[4:7], 'big') & 0x800000)
`;
    const [total, flag] = run(PYTHON, ['-c', script, out]).trim().split(' ').map(Number);
    expect(flag).toBe(0x800000); // the message does use the convention
    const scan = await scanGrib(out);
    expect(scan.problems).toEqual([]);
    expect(scan.messages).toEqual([
      { number: 1, offset: 4, length: total, edition: 1 },
      { number: 2, offset: 4 + total, length: total, edition: 1 },
    ]);
  });
});
