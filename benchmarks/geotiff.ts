/**
 * GeoTIFF writer benchmark: 37 bands of 1440 × 721 (a 0.25° global grid on 37 pressure levels)
 * written as cloud-optimized GeoTIFFs with overviews, uint8 masks and float32 fields, beside
 * gdal_translate's COG driver doing the same from an uncompressed copy; then the band-by-band
 * writer (GeoTiffBandWriter) against the all-at-once writer: time on the same bands, and peak
 * memory of a child process that makes the 37 bands and writes them either way (all bands made
 * first for writeGeoTiff; each band made, added and dropped in turn for the band writer).
 *
 *   node --import tsx benchmarks/geotiff.ts
 *
 * Targets: uint8 < 0.5 s, float32 < 3 s. Timings are the best and the median of five runs.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { availableParallelism, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { openGeoTiffWriter, writeGeoTiff, type RasterProfile } from '../lib/output/index.js';

const W = 1440;
const H = 721;
const LEVELS = 37;
const RUNS = 5;
const TRANSFORM = [-180.125, 0.25, 0, 90.125, 0, -0.25] as const;

/** Invented mask of level b: smooth blobs that move with the level. */
function maskBand(b: number): Uint8Array {
  const a = new Uint8Array(W * H);
  for (let y = 0; y < H; y++) for (let x = 0; x < W; x++) a[y * W + x] = Math.sin(x / 40 + b / 3) * Math.cos(y / 30) > 0.3 ? 1 : 0;
  return a;
}

function masks(): Uint8Array[] {
  return Array.from({ length: LEVELS }, (_, b) => maskBand(b));
}

/**
 * Invented continuous fields with full-precision float32 noise, like computed humidities; the
 * returned function makes level 0, 1, 2, … in turn (one noise sequence runs through all levels).
 */
function fieldSource(): (b: number) => Float32Array {
  let seed = 12345;
  const rnd = (): number => ((seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 4294967296);
  return (b) => {
    const a = new Float32Array(W * H);
    for (let y = 0; y < H; y++) for (let x = 0; x < W; x++) a[y * W + x] = 80 + 40 * Math.sin(x / 40 + b / 3) * Math.cos(y / 30) + rnd() * 0.5;
    return a;
  };
}

function fields(): Float32Array[] {
  const next = fieldSource();
  return Array.from({ length: LEVELS }, (_, b) => next(b));
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

/** Like timeOurs, through the band writer: the same bands added one at a time. */
async function timeStreamed(path: string, profile: RasterProfile, bands: ArrayLike<number>[]): Promise<{ wall: number[]; cpu: number[] }> {
  const wall: number[] = [];
  const cpu: number[] = [];
  for (let i = 0; i < RUNS; i++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    const writer = openGeoTiffWriter(path, profile);
    for (const band of bands) await writer.addBand(band);
    await writer.finish();
    wall.push(performance.now() - t0);
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1000);
  }
  return { wall, cpu };
}

type MemoryMode = 'whole' | 'stream';

interface MemoryReport {
  mode: MemoryMode;
  dtype: 'uint8' | 'float32';
  /** Milliseconds to make the bands and write the file. */
  ms: number;
  /** Resident set size before any band was made, and the process's peak (bytes). */
  rssStart: number;
  rssPeak: number;
  /** Bytes of the file written. */
  bytes: number;
}

/**
 * Peak resident set size of this process (bytes): VmHWM from /proc/self/status on Linux, which
 * starts afresh with the process image; getrusage's maxRSS elsewhere (on Linux that one carries
 * the parent's peak across fork and exec, so it would report the benchmark's own peak).
 */
function peakRss(): number {
  try {
    const m = /^VmHWM:\s+(\d+)\s+kB/m.exec(readFileSync('/proc/self/status', 'utf8'));
    if (m) return Number(m[1]) * 1024;
  } catch {
    // not Linux
  }
  return process.resourceUsage().maxRSS * 1024;
}

/** The child process's part: make the bands and write them one way, then report as JSON on stdout. */
async function memoryChild(mode: MemoryMode, dtype: 'uint8' | 'float32', path: string): Promise<void> {
  const rssStart = process.memoryUsage.rss();
  const profile: RasterProfile = { width: W, height: H, count: LEVELS, dtype, crs: { epsg: 4326 }, transform: TRANSFORM, nodata: dtype === 'uint8' ? 255 : NaN, cog: true };
  const t0 = performance.now();
  let bytes: number;
  if (mode === 'whole') {
    bytes = (await writeGeoTiff(path, profile, dtype === 'uint8' ? masks() : fields())).bytes;
  } else {
    const next = dtype === 'uint8' ? maskBand : fieldSource();
    const writer = openGeoTiffWriter(path, profile);
    for (let b = 0; b < LEVELS; b++) await writer.addBand(next(b));
    bytes = (await writer.finish()).bytes;
  }
  const ms = performance.now() - t0;
  const report: MemoryReport = { mode, dtype, ms, rssStart, rssPeak: peakRss(), bytes };
  process.stdout.write(JSON.stringify(report) + '\n');
}

/** Runs memoryChild in a fresh node process (peak RSS is per process and never goes down). */
function measureMemory(mode: MemoryMode, dtype: 'uint8' | 'float32', path: string): MemoryReport {
  const out = execFileSync(process.execPath, [...process.execArgv, fileURLToPath(import.meta.url), '--memory-child', mode, dtype, path], { encoding: 'utf8' });
  return JSON.parse(out.trim().split('\n').pop() ?? '') as MemoryReport;
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
      const streamedPath = join(dir, `streamed-${c.dtype}.tif`);
      const st = await timeStreamed(streamedPath, { ...base, cog: true }, c.bands);
      const s = stats(st.wall);
      const sCpu = stats(st.cpu);
      const same = readFileSync(ours).equals(readFileSync(streamedPath));
      line += `\n${''.padEnd(15)} band writer ${s.best.toFixed(0).padStart(5)} / ${s.median.toFixed(0).padStart(5)} ms (CPU ${sCpu.median.toFixed(0)} ms)  ratio band writer/all-at-once (median) ${(s.median / t.median).toFixed(2)}  file ${same ? 'byte-identical' : 'DIFFERENT'}`;
      process.stdout.write(line + '\n');
    }
    process.stdout.write(`Peak memory, one fresh process each: make ${LEVELS} bands of ${W} × ${H} and write them as a COG (raw bands: uint8 ${((LEVELS * W * H) / 1e6).toFixed(1)} MB, float32 ${((LEVELS * W * H * 4) / 1e6).toFixed(1)} MB)\n`);
    for (const dtype of ['uint8', 'float32'] as const) {
      for (const mode of ['whole', 'stream'] as const) {
        const r = measureMemory(mode, dtype, join(dir, `memory-${mode}-${dtype}.tif`));
        const label = mode === 'whole' ? 'writeGeoTiff (all bands made first)' : 'band writer (one band at a time)';
        process.stdout.write(
          `${dtype.padEnd(8)} ${label.padEnd(36)} ${r.ms.toFixed(0).padStart(6)} ms  peak RSS ${(r.rssPeak / 1e6).toFixed(0).padStart(5)} MB (+${((r.rssPeak - r.rssStart) / 1e6).toFixed(0)} MB over the ${(r.rssStart / 1e6).toFixed(0)} MB at start)  file ${(r.bytes / 1e6).toFixed(2)} MB\n`,
        );
      }
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const at = process.argv.indexOf('--memory-child');
  if (at >= 0) await memoryChild(process.argv[at + 1] as MemoryMode, process.argv[at + 2] as 'uint8' | 'float32', process.argv[at + 3]);
  else await runGeotiffBenchmark();
}
