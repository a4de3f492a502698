/**
 * GRIB benchmark: indexing a ≈1.2 GB file of 1,000 GRIB2 messages (1440 × 721 points: 200 simple
 * 16-bit, 650 CCSDS 16-bit, 150 complex-packed), and decode rates of simple 16-bit, CCSDS and
 * complex packing, beside python3-eccodes doing the same work on the same file, as ratios.
 *
 * Run:  node --import tsx benchmarks/grib.ts
 * Needs: /usr/bin/python3 with eccodes and numpy (makes benchmarks/.data/grib-bench.grib2 once).
 * Targets: index well under 1 s; simple 16-bit ≥ 200 M values/s; CCSDS, complex ≥ 50 M values/s.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync } from 'node:fs';
import { open } from 'node:fs/promises';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { readGribIndex } from '../lib/formats/grib/index.js';
import { parseGrib2Message } from '../lib/formats/grib/edition2/message.js';
import type { GribFieldInfo } from '../lib/formats/grib/types.js';

const PYTHON = '/usr/bin/python3';
const DATA = join(dirname(fileURLToPath(import.meta.url)), '.data');
const FILE = join(DATA, 'grib-bench.grib2');
const COUNTS = { grid_simple: 200, grid_ccsds: 650, grid_complex: 150 } as const;

/** Writes the file: one ecCodes-packed message per packing, repeated with patched levels/steps. */
const MAKE = `
import sys, numpy as np, eccodes as ec
out, counts = sys.argv[1], [int(x) for x in sys.argv[2:5]]
h = ec.codes_grib_new_from_samples('GRIB2')
for k, v in [('Ni', 1440), ('Nj', 721), ('numberOfDataPoints', 1440 * 721),
             ('latitudeOfFirstGridPointInDegrees', 90.0), ('longitudeOfFirstGridPointInDegrees', 0.0),
             ('latitudeOfLastGridPointInDegrees', -90.0), ('longitudeOfLastGridPointInDegrees', 359.75),
             ('iDirectionIncrementInDegrees', 0.25), ('jDirectionIncrementInDegrees', 0.25),
             ('typeOfFirstFixedSurface', 100), ('scaleFactorOfFirstFixedSurface', 0), ('scaledValueOfFirstFixedSurface', 50000),
             ('bitsPerValue', 16)]:
    ec.codes_set(h, k, v)
lat = np.repeat(np.linspace(90, -90, 721), 1440); lon = np.tile(np.arange(1440) * 0.25, 721)
vals = 250 + 30 * np.cos(np.radians(lat)) + 5 * np.sin(np.radians(3 * lon)) * np.cos(np.radians(2 * lat))
ec.codes_set_values(h, vals)
msgs = []
for p in ('grid_simple', 'grid_ccsds', 'grid_complex'):
    c = ec.codes_clone(h)
    if p != 'grid_simple':
        ec.codes_set(c, 'packingType', p)
    msgs.append(bytearray(ec.codes_get_message(c)))
    off = ec.codes_get(c, 'offsetSection4')
    msgs[-1] = (msgs[-1], off)
with open(out, 'wb') as f:
    for (m, off4), n in zip(msgs, counts):
        for k in range(n):
            b = bytearray(m)
            lev = 1000 + 100 * (k % 900)          # levels 10..9 hPa apart: distinct fields
            b[off4 + 24:off4 + 28] = lev.to_bytes(4, 'big')
            b[off4 + 18:off4 + 22] = (k // 900).to_bytes(4, 'big')
            f.write(b)
`;

function best<T>(runs: number, f: () => T): { ms: number; result: T } {
  let ms = Infinity;
  let result!: T;
  for (let r = 0; r < runs; r++) {
    const t0 = performance.now();
    result = f();
    ms = Math.min(ms, performance.now() - t0);
  }
  return { ms, result };
}

async function bestAsync<T>(runs: number, f: () => Promise<T>): Promise<{ ms: number; result: T }> {
  let ms = Infinity;
  let result!: T;
  for (let r = 0; r < runs; r++) {
    const t0 = performance.now();
    result = await f();
    ms = Math.min(ms, performance.now() - t0);
  }
  return { ms, result };
}

/** python3-eccodes: header-only pass over the file, and codes_get_values of the first n messages of each packing. */
const ECCODES = `
import sys, time, eccodes as ec
path, n = sys.argv[1], int(sys.argv[2])
t0 = time.perf_counter(); count = 0
with open(path, 'rb') as f:
    while True:
        h = ec.codes_grib_new_from_file(f, headers_only=True)
        if h is None: break
        ec.codes_get(h, 'shortName'); ec.codes_get(h, 'level'); ec.codes_get(h, 'dataRepresentationTemplateNumber')
        ec.codes_release(h); count += 1
print('index', time.perf_counter() - t0, count)
seen = {}
with open(path, 'rb') as f:
    while True:
        h = ec.codes_grib_new_from_file(f)
        if h is None: break
        p = ec.codes_get(h, 'packingType')
        if seen.get(p, 0) < n:
            t = time.perf_counter(); v = ec.codes_get_values(h); dt = time.perf_counter() - t
            seen[p] = seen.get(p, 0) + 1
            print('decode', p, dt, len(v))
        ec.codes_release(h)
`;

async function main(): Promise<void> {
  if (!existsSync(FILE)) {
    mkdirSync(DATA, { recursive: true });
    process.stdout.write(`making ${FILE} with ecCodes …\n`);
    execFileSync(PYTHON, ['-c', MAKE, FILE, String(COUNTS.grid_simple), String(COUNTS.grid_ccsds), String(COUNTS.grid_complex)], { stdio: 'inherit' });
  }
  const idx = await bestAsync(3, () => readGribIndex(FILE));
  const index = idx.result;
  const size = index.size;
  const lines: string[] = [];
  lines.push(`file: ${(size / 1e9).toFixed(2)} GB, ${index.messages.length} messages, ${index.problems.length} problems`);

  const N = 20;
  const byPacking = new Map<string, GribFieldInfo[]>();
  for (const f of index.fields) {
    const l = byPacking.get(f.packing) ?? [];
    if (l.length < N) l.push(f);
    byPacking.set(f.packing, l);
  }
  const fh = await open(FILE, 'r');
  const ours: Record<string, number> = {};
  for (const [packing, infos] of byPacking) {
    // Messages read into memory first: the rate is unpacking only.
    const parsed: GribFieldInfo[] = [];
    for (const info of infos) {
      const bytes = new Uint8Array(info.location.length);
      await fh.read(bytes, 0, bytes.length, info.location.offset);
      parsed.push(parseGrib2Message(FILE, bytes, info.location)[0]);
    }
    parsed[0].decode(); // warm up
    let values = 0;
    const t = best(5, () => {
      values = 0;
      for (const p of parsed) values += p.decode().length;
      return values;
    });
    ours[packing] = values / (t.ms / 1000);
  }
  await fh.close();

  const py = execFileSync(PYTHON, ['-c', ECCODES, FILE, String(N)], { encoding: 'utf8', maxBuffer: 1 << 24 });
  let ecIndex = NaN;
  const ecTime: Record<string, number> = {};
  const ecValues: Record<string, number> = {};
  for (const line of py.trim().split('\n')) {
    const f = line.split(' ');
    if (f[0] === 'index') ecIndex = Number(f[1]) * 1000;
    else {
      const key = { grid_simple: '5.0', grid_ccsds: '5.42', grid_complex: '5.2' }[f[1]] ?? f[1];
      ecTime[key] = (ecTime[key] ?? 0) + Number(f[2]);
      ecValues[key] = (ecValues[key] ?? 0) + Number(f[3]);
    }
  }
  const fmt = (x: number) => x.toFixed(1).padStart(8);
  lines.push('');
  lines.push('task                          frostgrid        python3-eccodes   ratio (frostgrid/ecCodes speed)');
  lines.push(`index (all messages)       ${fmt(idx.ms)} ms   ${fmt(ecIndex)} ms        ${(ecIndex / idx.ms).toFixed(2)}×   (target < 1000 ms)`);
  const target: Record<string, number> = { '5.0': 200, '5.42': 50, '5.2': 50 };
  for (const p of ['5.0', '5.42', '5.2']) {
    const mine = ours[p] / 1e6;
    const theirs = ecValues[p] / ecTime[p] / 1e6;
    lines.push(`decode ${p.padEnd(5)} (M values/s) ${fmt(mine)}        ${fmt(theirs)}           ${(mine / theirs).toFixed(2)}×   (target ≥ ${target[p]})`);
  }
  process.stdout.write(lines.join('\n') + '\n');
}

await main();
