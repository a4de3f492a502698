/**
 * NetCDF read benchmark: every level slice of one variable on a global 0.25° grid
 * (1440 × 721 × 37 levels), from NetCDF3 int16 (packed) and NetCDF4 zlib float32, through
 * `open()` and `Field.readSlice` (decoded to SI float32). Prints seconds, peak RSS and the ratio
 * to python netCDF4 reading the same slices (auto mask and scale on).
 *
 *   node --import tsx benchmarks/netcdf.ts
 *
 * The files are made under benchmarks/.data/ with Debian's python netCDF4 when absent. Each
 * measurement runs in its own process so that its peak RSS is its own.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const PYTHON = '/usr/bin/python3';
const DATA = fileURLToPath(new URL('./.data/', import.meta.url));
const FILES = { nc3: `${DATA}global_nc3_int16.nc`, nc4: `${DATA}global_nc4_zlib.nc` } as const;
type Kind = keyof typeof FILES;

const MAKE = `
import sys, numpy as np, netCDF4
kind, path = sys.argv[1], sys.argv[2]
ny, nx, nk = 721, 1440, 37
lat = np.linspace(90, -90, ny); lon = np.arange(nx) * 0.25
levels = np.array([1,2,3,5,7,10,20,30,50,70,100,125,150,175,200,225,250,300,350,400,450,500,550,600,650,700,750,775,800,825,850,875,900,925,950,975,1000], dtype='f8')
rng = np.random.default_rng(7)
fmt = 'NETCDF3_64BIT_OFFSET' if kind == 'nc3' else 'NETCDF4'
with netCDF4.Dataset(path, 'w', format=fmt) as ds:
    ds.createDimension('time', None); ds.createDimension('level', nk)
    ds.createDimension('latitude', ny); ds.createDimension('longitude', nx)
    t = ds.createVariable('time', 'i4', ('time',)); t.units = 'hours since 1900-01-01'; t[:] = [1000000]
    l = ds.createVariable('level', 'f8', ('level',)); l.units = 'hPa'; l[:] = levels
    la = ds.createVariable('latitude', 'f4', ('latitude',)); la.units = 'degrees_north'; la[:] = lat
    lo = ds.createVariable('longitude', 'f4', ('longitude',)); lo.units = 'degrees_east'; lo[:] = lon
    dims = ('time', 'level', 'latitude', 'longitude')
    if kind == 'nc3':
        v = ds.createVariable('t', 'i2', dims, fill_value=np.int16(-32767))
        v.scale_factor = 0.002; v.add_offset = 250.0
    else:
        v = ds.createVariable('t', 'f4', dims, zlib=True, shuffle=True, complevel=4, chunksizes=(1, 1, ny, nx))
    v.units = 'K'; v.standard_name = 'air_temperature'
    base = 30 * np.cos(np.radians(lat))[:, None] + 2 * np.sin(np.radians(lon))[None, :]
    for k in range(nk):
        v[0, k] = (200 + 0.08 * levels[k] + base + rng.normal(0, 0.5, (ny, nx))).astype('f4')
`;

const PY_READ = `
import sys, time, resource, netCDF4
path = sys.argv[1]
t0 = time.perf_counter()
with netCDF4.Dataset(path) as ds:
    v = ds['t']
    s = 0.0
    for k in range(v.shape[1]):
        a = v[0, k]
        s += float(a[0, 0])
dt = time.perf_counter() - t0
print(dt, resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024.0)
`;

function ensureFile(kind: Kind): void {
  if (existsSync(FILES[kind])) return;
  mkdirSync(DATA, { recursive: true });
  process.stdout.write(`making ${FILES[kind]} …\n`);
  execFileSync(PYTHON, ['-c', MAKE, kind, FILES[kind]], { stdio: 'inherit' });
}

/** Child mode: read every level of t from one file, print "seconds peakRssMiB". */
async function child(kind: Kind): Promise<void> {
  const { open } = await import('../lib/open.js');
  // Library loading is not timed (python's `import netCDF4` is not either); for NetCDF4 that is
  // h5wasm's start-up, printed separately.
  const l0 = performance.now();
  if (kind === 'nc4') {
    const { h5wasmReady } = await import('../lib/formats/netcdf/nc4-reader.js');
    await h5wasmReady();
  }
  const loadSeconds = (performance.now() - l0) / 1000;
  const t0 = performance.now();
  const ds = await open(FILES[kind]);
  const f = ds.fields.find((x) => x.name === 't')!;
  const out = new Float32Array(f.grid.npoints);
  let check = 0;
  for (let k = 0; k < f.levelsPa.length; k++) {
    await f.readSlice(0, k, out);
    check += out[0];
  }
  await ds.close();
  const seconds = (performance.now() - t0) / 1000;
  process.stdout.write(`${seconds} ${process.resourceUsage().maxRSS / 1024} ${loadSeconds} ${check}\n`);
}

function measureNode(kind: Kind): [number, number, number] {
  const r = spawnSync(process.execPath, ['--import', 'tsx', fileURLToPath(import.meta.url), '--child', kind], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`child ${kind} failed: ${r.stderr}`);
  const [s, rss, load] = r.stdout.trim().split(/\s+/).map(Number);
  return [s, rss, load];
}

function measurePython(kind: Kind): [number, number] {
  const out = execFileSync(PYTHON, ['-c', PY_READ, FILES[kind]], { encoding: 'utf8' });
  const [s, rss] = out.trim().split(/\s+/).map(Number);
  return [s, rss];
}

async function main(): Promise<void> {
  const i = process.argv.indexOf('--child');
  if (i >= 0) return child(process.argv[i + 1] as Kind);
  for (const kind of ['nc3', 'nc4'] as const) ensureFile(kind);
  const runs = 3;
  process.stdout.write('every level slice (37 × 1440 × 721) of t, best of 3\n');
  for (const kind of ['nc3', 'nc4'] as const) {
    let best: [number, number, number] = [Infinity, 0, 0];
    let py: [number, number] = [Infinity, 0];
    for (let r = 0; r < runs; r++) {
      const m = measureNode(kind);
      if (m[0] < best[0]) best = m;
      const p = measurePython(kind);
      if (p[0] < py[0]) py = p;
    }
    const label = kind === 'nc3' ? 'NetCDF3 int16 ' : 'NetCDF4 zlib  ';
    process.stdout.write(
      `${label} frostgrid ${best[0].toFixed(3)} s, peak RSS ${best[1].toFixed(0)} MiB${kind === 'nc4' ? ` (h5wasm start-up ${best[2].toFixed(2)} s, untimed)` : ''} | python netCDF4 ${py[0].toFixed(3)} s, peak RSS ${py[1].toFixed(0)} MiB | ratio ${(best[0] / py[0]).toFixed(2)}×\n`,
    );
  }
}

await main();
