/**
 * `frostgrid probe` against the reference readers: the value at the nearest grid node, in the
 * file's own units, as netCDF4-python (NetCDF, CF unpacking) and ecCodes' codes_grib_find_nearest
 * (GRIB: regular, rotated and Lambert grids) report it.
 */
import { describe, expect, it } from 'vitest';
import { PYTHON, run, toolAvailable } from '../support/tools.js';
import { cli } from './support.js';

const POINTS = ['50.2,40.4', '-44.6,-160.1', '0,0', '89.4,179.9', '-12.4,359.6'];

describe('frostgrid probe', () => {
  it('NetCDF int16-packed t and q: netCDF4-python values at the nearest node', async () => {
    if (!toolAvailable('python', 'netCDF4')) return;
    const file = 'data-samples/demo/frostgrid-demo.nc';
    for (const v of ['t', 'q']) {
      const r = await cli('probe', file, '--var', v === 't' ? 'air_temperature' : 'q', '--level', '250', '--time', '2029-10-17T12:00Z', '--json', ...POINTS.flatMap((p) => ['--at', p]));
      expect(r.code).toBe(0);
      const rows = JSON.parse(r.stdout) as { lat: number; lon: number; grid_lat: number; grid_lon: number; value: number }[];
      const py = `
import json, sys, numpy as np, netCDF4
ds = netCDF4.Dataset('${file}')
lat = ds['latitude'][:]; lon = ds['longitude'][:]; lev = list(ds['level'][:])
k = lev.index(250)
out = []
for p in sys.argv[1:]:
    la, lo = map(float, p.split(','))
    j = int(np.argmin(np.abs(lat - la))); i = int(np.argmin(np.abs(((lon - lo) + 180) % 360 - 180)))
    out.append([float(lat[j]), float(lon[i]), float(ds['${v}'][1, k, j, i])])
print(json.dumps(out))`;
      const ref = JSON.parse(run(PYTHON, ['-c', py, ...POINTS])) as [number, number, number][];
      rows.forEach((row, n) => {
        expect(row.grid_lat).toBe(ref[n][0]);
        expect(row.grid_lon).toBe(ref[n][1]);
        // netCDF4-python unpacks to float64; we hand out float32 (a few ulps, reference-tools.md).
        expect(Math.abs(row.value - ref[n][2])).toBeLessThanOrEqual(Math.abs(ref[n][2]) * 4 * 2 ** -23);
      });
    }
  });

  it.each([
    { file: 'data-samples/demo/frostgrid-demo.grib2', short: 't', level: 250, points: POINTS },
    { file: 'data-samples/fixtures/grib/rotated.grib2', short: 't', level: 300, points: [] as string[] },
    { file: 'data-samples/fixtures/grib/lambert.grib2', short: 't', level: 300, points: [] as string[] },
  ])('GRIB $file: ecCodes codes_grib_find_nearest', async ({ file, short, level, points }) => {
    if (!toolAvailable('python', 'eccodes')) return;
    // Points inside the grid: from `frostgrid info`, between the first and last nodes.
    let pts = points;
    if (pts.length === 0) {
      const info = JSON.parse((await cli('info', file, '--json')).stdout);
      const v = info.variables.find((x: { name: string }) => x.name === short);
      const ll = JSON.parse(run(PYTHON, ['-c', `
import eccodes, json
with open('${file}','rb') as f:
    h = eccodes.codes_grib_new_from_file(f)
    la = eccodes.codes_get_array(h,'latitudes'); lo = eccodes.codes_get_array(h,'longitudes')
n = len(la)
print(json.dumps([[float(la[k]), float(lo[k])] for k in (n//3, n//2, (2*n)//3)]))`]));
      pts = (ll as [number, number][]).map(([a, b]) => `${(a + 0.013).toFixed(4)},${(b - 0.017).toFixed(4)}`);
      expect(v).toBeDefined();
    }
    const r = await cli('probe', file, '--var', short, '--level', String(level), '--json', ...(file.includes('demo') ? ['--time', '2029-10-17T06:00Z'] : []), ...pts.flatMap((p) => ['--at', p]));
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const rows = JSON.parse(r.stdout) as { grid_lat: number; grid_lon: number; value: number }[];
    const ref = JSON.parse(run(PYTHON, ['test/e2e/nearest_eccodes.py', file, short, String(level), ...pts])) as { grid_lat: number; grid_lon: number; value: number }[];
    expect(rows).toHaveLength(ref.length);
    rows.forEach((row, n) => {
      expect(row.grid_lat).toBeCloseTo(ref[n].grid_lat, 4);
      expect((((row.grid_lon - ref[n].grid_lon) % 360) + 540) % 360 - 180).toBeCloseTo(0, 4);
      expect(Math.abs(row.value - ref[n].value)).toBeLessThanOrEqual(Math.abs(ref[n].value) * 1e-6);
    });
  });

  it('CSV output has the contract header', async () => {
    const r = await cli('probe', 'data-samples/demo/frostgrid-demo.nc', '--var', 't', '--level', '200', '--time', '2029-10-17T06:00Z', '--at', '10,20');
    expect(r.code).toBe(0);
    const [head, row] = r.stdout.trim().split('\n');
    expect(head).toBe('lat,lon,grid_lat,grid_lon,value');
    expect(row.split(',').slice(0, 4)).toEqual(['10', '20', '10', '20']);
  });
});
