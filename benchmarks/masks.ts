/**
 * `frostgrid masks` end to end on a global 0.25° grid (1440 × 721) × 37 pressure levels, one
 * time, t and q in NetCDF4 (zlib, int16 packed as reanalysis downloads are): wall time and peak
 * memory (/usr/bin/time -v), printed beside the same work scripted with xarray/numpy + GDAL
 * (benchmarks/masks_reference.py).
 *
 *   npm run build && node --import tsx benchmarks/masks.ts
 *
 * The input is made under benchmarks/.data/ with Debian's python netCDF4 when absent. frostgrid
 * also writes overviews (COG), the column summary and summary.json/csv; the reference does not.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, rmSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const PYTHON = '/usr/bin/python3';
const DATA = fileURLToPath(new URL('./.data/', import.meta.url));
const INPUT = `${DATA}masks_global_025.nc`;
const CLI = fileURLToPath(new URL('../dist/bin/frostgrid.js', import.meta.url));
const REFERENCE = fileURLToPath(new URL('./masks_reference.py', import.meta.url));

const MAKE = `
import sys, numpy as np, netCDF4
path = sys.argv[1]
ny, nx = 721, 1440
levels = np.array([1,2,3,5,7,10,20,30,50,70,100,125,150,175,200,225,250,300,350,400,450,500,550,600,650,700,750,775,800,825,850,875,900,925,950,975,1000], dtype='f8')
lat = np.linspace(90, -90, ny); lon = np.arange(nx) * 0.25
rng = np.random.default_rng(11)
la = np.radians(lat)[:, None]
with netCDF4.Dataset(path, 'w', format='NETCDF4') as ds:
    ds.createDimension('time', None); ds.createDimension('level', len(levels))
    ds.createDimension('latitude', ny); ds.createDimension('longitude', nx)
    v = ds.createVariable('time', 'i4', ('time',)); v.units = 'hours since 2029-01-01'; v[:] = [0]
    v = ds.createVariable('level', 'f8', ('level',)); v.units = 'hPa'; v[:] = levels
    v = ds.createVariable('latitude', 'f4', ('latitude',)); v.units = 'degrees_north'; v[:] = lat
    v = ds.createVariable('longitude', 'f4', ('longitude',)); v.units = 'degrees_east'; v[:] = lon
    dims = ('time', 'level', 'latitude', 'longitude')
    t = ds.createVariable('t', 'i2', dims, zlib=True, complevel=1, chunksizes=(1, 1, ny, nx), fill_value=np.int16(-32767))
    t.units = 'K'; t.standard_name = 'air_temperature'; t.scale_factor = 0.0025; t.add_offset = 240.0
    q = ds.createVariable('q', 'i2', dims, zlib=True, complevel=1, chunksizes=(1, 1, ny, nx), fill_value=np.int16(-32767))
    q.units = 'kg kg**-1'; q.standard_name = 'specific_humidity'; q.scale_factor = 3.1e-7; q.add_offset = 0.0101
    for k, p in enumerate(levels):
        ts = 250 + 50 * np.cos(la) ** 2
        tk = np.maximum(ts * (p / 1013.25) ** 0.19026, 200 + 15 * np.cos(la) ** 2)
        tk = tk + 2 * np.sin(np.radians(lon) * 3)[None, :] + rng.normal(0, 0.5, (ny, nx))
        ei = np.exp(9.550426 - 5723.265 / tk + 3.53068 * np.log(tk) - 0.00728332 * tk)
        rhi = np.clip(0.7 + 0.4 * np.sin(np.radians(lon) * 2)[None, :] * np.cos(3 * la) + rng.normal(0, 0.05, (ny, nx)), 0.01, 1.4)
        e = rhi * ei
        qq = 0.622 * e / (p * 100 - 0.378 * e)
        t[0, k] = tk
        q[0, k] = np.minimum(qq, 0.02)
`;

function timed(cmd: string, args: string[]): { seconds: number; rssMB: number } {
  const r = spawnSync('/usr/bin/time', ['-v', cmd, ...args], { encoding: 'utf8', maxBuffer: 1 << 26 });
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(' ')} failed:\n${r.stderr}`);
  const wall = /Elapsed \(wall clock\) time.*: (?:(\d+):)?(\d+):(\d+(?:\.\d+)?)/.exec(r.stderr);
  const rss = /Maximum resident set size \(kbytes\): (\d+)/.exec(r.stderr);
  if (!wall || !rss) throw new Error(`cannot read /usr/bin/time output:\n${r.stderr}`);
  const seconds = Number(wall[1] ?? 0) * 3600 + Number(wall[2]) * 60 + Number(wall[3]);
  return { seconds, rssMB: Number(rss[1]) / 1024 };
}

mkdirSync(DATA, { recursive: true });
if (!existsSync(INPUT)) {
  process.stdout.write(`making ${INPUT} …\n`);
  execFileSync(PYTHON, ['-c', MAKE, INPUT], { stdio: 'inherit' });
}
if (!existsSync(CLI)) throw new Error('dist/ is missing: run npm run build first');

const outOurs = `${DATA}out-frostgrid`;
const outRef = `${DATA}out-reference`;
rmSync(outOurs, { recursive: true, force: true });
rmSync(outRef, { recursive: true, force: true });

const ours = timed(process.execPath, [CLI, 'masks', INPUT, '--out', outOurs, '--quiet']);
rmSync(outOurs, { recursive: true, force: true });
const single = timed(process.execPath, [CLI, 'masks', INPUT, '--out', outOurs, '--quiet', '--workers', '0']);
rmSync(outOurs, { recursive: true, force: true });
// Memory must not grow with the number of levels: the same job on 6 of the 37 levels (150–300 hPa).
const few = timed(process.execPath, [CLI, 'masks', INPUT, '--out', outOurs, '--quiet', '--workers', '0', '--levels', '150-300']);
const ref = timed(PYTHON, [REFERENCE, INPUT, outRef]);
const sliceMB = (1440 * 721 * 4) / 2 ** 20;
process.stdout.write(
  [
    `frostgrid masks, 1440 × 721 × 37 levels, 1 time (t, q int16 NetCDF4):`,
    `  frostgrid (default: 2 level workers)  ${ours.seconds.toFixed(2)} s   peak RSS ${ours.rssMB.toFixed(0)} MB (${(ours.rssMB / sliceMB).toFixed(1)} float32 slices)`,
    `  frostgrid --workers 0 (main thread)   ${single.seconds.toFixed(2)} s   peak RSS ${single.rssMB.toFixed(0)} MB (${(single.rssMB / sliceMB).toFixed(1)} float32 slices)`,
    `  frostgrid --workers 0, 6 levels only  ${few.seconds.toFixed(2)} s   peak RSS ${few.rssMB.toFixed(0)} MB (memory flat in the level count)`,
    `  xarray/numpy + GDAL                   ${ref.seconds.toFixed(2)} s   peak RSS ${ref.rssMB.toFixed(0)} MB`,
    `  ratio (reference / frostgrid): ${(ref.seconds / ours.seconds).toFixed(2)}× time, ${(ref.rssMB / ours.rssMB).toFixed(2)}× memory`,
    '',
  ].join('\n'),
);
