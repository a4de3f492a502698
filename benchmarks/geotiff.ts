/**
 * GeoTIFF writer benchmark: 37 bands of 1440 × 721 (a 0.25° global grid on 37 pressure levels)
 * written as cloud-optimized GeoTIFFs with overviews, uint8 masks and float32 fields, beside
 * gdal_translate's COG driver doing the same from an uncompressed copy.
 *
 *   node --import tsx benchmarks/geotiff.ts
 *
 * Targets: uint8 < 0.5 s, float32 < 3 s. Timings are the best and the median of five runs.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { availableParallelism, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { writeGeoTiff, type RasterProfile } from '../lib/output/index.js';

const W = 1440;
const H = 721;
const LEVELS = 37;
const RUNS = 5;
const TRANSFORM = [-180.125, 0.25, 0, 90.125, 0, -0.25] as const;

/** Invented masks: smooth blobs that move with the level. */
function masks(): Uint8Array[] {
  return Array.from({ length: LEVELS }, (_, b) => {
    const a = new Uint8Array(W * H);
    for (let y = 0; y < H; y++) for (let x = 0; x < W; x++) a[y * W + x] = Math.sin(x / 40 + b / 3) * Math.cos(y / 30) > 0.3 ? 1 : 0;
    return a;
  });
}

/** Invented continuous fields with full-precision float32 noise, like computed humidities. */
function fields(): Float32Array[] {
  let seed = 12345;
  const rnd = (): number => ((seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 4294967296);
  return Array.from({ length: LEVELS }, (_, b) => {
    const a = new Float32Array(W * H);
    for (let y = 0; y < H; y++) for (let x = 0; x < W; x++) a[y * W + x] = 80 + 40 * Math.sin(x / 40 + b / 3) * Math.cos(y / 30) + rnd() * 0.5;
    return a;
  });
}

function stats(ms: number[]): { best: number; median: number } {
  const s = [...ms].sort((a, b) => a - b);
  return { best: s[0], median: s[Math.floor(s.length / 2)] };
}

/** Wall-clock and process CPU milliseconds (all threads, so thread-pool compression counts). */
async function timeOurs(path: string, profile: RasterProfile, bands: ArrayLike<number>[]): Promise<{ wall: number[]; cpu: number[] }> {
  const wall: number[] = [];
  const cpu: number[] = [];
  for (let i = 0; i < RUNS; i++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    await writeGeoTiff(path, profile, bands);
    wall.push(performance.now() - t0);
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1000);
  }
  return { wall, cpu };
}

function timeGdal(src: string, dst: string, options: string[]): number[] {
  const out: number[] = [];
  for (let i = 0; i < RUNS; i++) {
    rmSync(dst, { force: true });
    const t0 = performance.now();
    execFileSync('gdal_translate', ['-q', '-of', 'COG', '-co', 'BLOCKSIZE=256', '-co', 'COMPRESS=DEFLATE', ...options, src, dst]);
    out.push(performance.now() - t0);
  }
  return out;
}

function haveGdal(): boolean {
  try {
    execFileSync('gdal_translate', ['--version'], { stdio: 'ignore' });
    return true;
  } catch {
    return false;
  }
}

export async function runGeotiffBenchmark(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'frostgrid-bench-'));
  const gdal = haveGdal();
  try {
    const cases = [
      { name: 'uint8 masks', target: 500, bands: masks() as ArrayLike<number>[], dtype: 'uint8' as const, nodata: 255, gdalOptions: ['-co', 'RESAMPLING=NEAREST'] },
      {
        name: 'float32 fields',
        target: 3000,
        bands: fields() as ArrayLike<number>[],
        dtype: 'float32' as const,
        nodata: NaN,
        gdalOptions: ['-co', 'RESAMPLING=AVERAGE', '-co', 'PREDICTOR=YES', '-co', 'LEVEL=3'],
      },
    ];
    process.stdout.write(`load average ${loadavg().map((l) => l.toFixed(2)).join(' ')} on ${availableParallelism()} CPUs\n`);
    process.stdout.write(`GeoTIFF writer: ${LEVELS} bands of ${W} × ${H}, COG with overviews, DEFLATE, 256 × 256 tiles; best / median of ${RUNS}\n`);
    for (const c of cases) {
      const base: RasterProfile = { width: W, height: H, count: LEVELS, dtype: c.dtype, crs: { epsg: 4326 }, transform: TRANSFORM, nodata: c.nodata };
      const ours = join(dir, `ours-${c.dtype}.tif`);
      const timing = await timeOurs(ours, { ...base, cog: true }, c.bands);
      const t = stats(timing.wall);
      const cpu = stats(timing.cpu);
      const size = statSync(ours).size;
      let line = `${c.name.padEnd(15)} frostgrid ${t.best.toFixed(0).padStart(5)} / ${t.median.toFixed(0).padStart(5)} ms (CPU ${cpu.median.toFixed(0)} ms)  ${(size / 1e6).toFixed(2)} MB  target < ${c.target} ms: ${t.median < c.target ? 'met' : 'MISSED'}`;
      if (gdal) {
        const plain = join(dir, `plain-${c.dtype}.tif`);
        await writeGeoTiff(plain, { ...base, compress: 'none' }, c.bands);
        const dst = join(dir, `gdal-${c.dtype}.tif`);
        const g = stats(timeGdal(plain, dst, c.gdalOptions));
        line += `\n${''.padEnd(15)} gdal_translate -of COG ${g.best.toFixed(0).padStart(5)} / ${g.median.toFixed(0).padStart(5)} ms  ${(statSync(dst).size / 1e6).toFixed(2)} MB  ratio gdal/frostgrid (median) ${(g.median / t.median).toFixed(2)}`;
      } else line += '  (gdal_translate not installed: no comparison)';
      process.stdout.write(line + '\n');
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) await runGeotiffBenchmark();
