/**
 * GRIB edition 1 benchmark: decode rates of simple packing (16 bits per value) and of ECMWF-style
 * second-order packing on 1440 × 721 fields, beside python3-eccodes' codes_get_values on the same
 * messages, as ratios. The file (20 messages of each packing, made by ecCodes from the sample
 * regular_ll_pl_grib1) is written once under benchmarks/.data/.
 *
 * Run:  node --import tsx benchmarks/grib1.ts
 * Needs: /usr/bin/python3 with eccodes and numpy.
 * Target (the GRIB issue's, stated for GRIB2 simple packing): ≥ 200 M values/s for 16-bit simple.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync } from 'node:fs';
import { open } from 'node:fs/promises';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { readGribIndex } from '../lib/formats/grib/index.js';
import { parseGrib1Message } from '../lib/formats/grib/edition1/message.js';
import type { GribFieldInfo } from '../lib/formats/grib/types.js';

const PYTHON = '/usr/bin/python3';
const DATA = join(dirname(fileURLToPath(import.meta.url)), '.data');
const FILE = join(DATA, 'grib1-bench.grib');
const PER_PACKING = 20;

const MAKE = `
import sys, numpy as np, eccodes as ec
out, n = sys.argv[1], int(sys.argv[2])
h = ec.codes_grib_new_from_samples('regular_ll_pl_grib1')
for k, v in [('Ni', 1440), ('Nj', 721),
             ('latitudeOfFirstGridPointInDegrees', 90.0), ('longitudeOfFirstGridPointInDegrees', 0.0),
             ('latitudeOfLastGridPointInDegrees', -90.0), ('longitudeOfLastGridPointInDegrees', 359.75),
             ('iDirectionIncrementInDegrees', 0.25), ('jDirectionIncrementInDegrees', 0.25),
             ('indicatorOfTypeOfLevel', 100), ('level', 500), ('bitsPerValue', 16)]:
    ec.codes_set(h, k, v)
lat = np.repeat(np.linspace(90, -90, 721), 1440); lon = np.tile(np.arange(1440) * 0.25, 721)
vals = 250 + 30 * np.cos(np.radians(lat)) + 5 * np.sin(np.radians(3 * lon)) * np.cos(np.radians(2 * lat))
ec.codes_set_values(h, vals)
with open(out, 'wb') as f:
    for p in ('grid_simple', 'grid_second_order'):
        c = ec.codes_clone(h)
        if p != 'grid_simple':
            ec.codes_set(c, 'packingType', p)
        for k in range(n):
            ec.codes_set(c, 'level', 100 + k)
            f.write(ec.codes_get_message(c))
`;

const ECCODES = `
import sys, time, eccodes as ec
with open(sys.argv[1], 'rb') as f:
    while True:
        h = ec.codes_grib_new_from_file(f)
        if h is None: break
        p = ec.codes_get(h, 'packingType')
        dt = float('inf')
        for _ in range(5):
            # a fresh clone each time: ecCodes keeps the unpacked values of a handle it has decoded
            c = ec.codes_clone(h)
            t = time.perf_counter(); v = ec.codes_get_values(c); dt = min(dt, time.perf_counter() - t)
            ec.codes_release(c)
        print(p, dt, len(v))
        ec.codes_release(h)
`;

async function main(): Promise<void> {
  if (!existsSync(FILE)) {
    mkdirSync(DATA, { recursive: true });
    process.stdout.write(`making ${FILE} with ecCodes …\n`);
    execFileSync(PYTHON, ['-c', MAKE, FILE, String(PER_PACKING)], { stdio: 'inherit' });
  }
  const index = await readGribIndex(FILE);
  const fh = await open(FILE, 'r');
  const byPacking = new Map<string, GribFieldInfo[]>();
  for (const info of index.fields) {
    // Messages read into memory first: the rate is unpacking only.
    const bytes = new Uint8Array(info.location.length);
    await fh.read(bytes, 0, bytes.length, info.location.offset);
    const parsed = parseGrib1Message(FILE, bytes, info.location);
    byPacking.set(parsed.packing, [...(byPacking.get(parsed.packing) ?? []), parsed]);
  }
  await fh.close();

  const ours: Record<string, number> = {};
  for (const [packing, parsed] of byPacking) {
    parsed[0].decode(); // warm up
    // Best of 5 per message, summed: the same measure as the ecCodes side below.
    let ms = 0;
    let values = 0;
    for (const p of parsed) {
      let best = Infinity;
      for (let run = 0; run < 5; run++) {
        const t0 = performance.now();
        p.decode();
        best = Math.min(best, performance.now() - t0);
      }
      ms += best;
      values += p.numberOfPoints;
    }
    ours[packing] = values / (ms / 1000);
  }

  const theirs: Record<string, { s: number; n: number }> = {};
  for (const line of execFileSync(PYTHON, ['-c', ECCODES, FILE], { encoding: 'utf8' }).trim().split('\n')) {
    const [p, dt, n] = line.split(' ');
    const key = p === 'grid_simple' ? 'grib1-simple' : 'grib1-second-order';
    const acc = (theirs[key] ??= { s: 0, n: 0 });
    acc.s += Number(dt);
    acc.n += Number(n);
  }
  const lines = [`GRIB1 decode, ${PER_PACKING} messages of 1440 × 721 per packing (each message's best of 5 decodes, summed; messages in memory; each decode allocates its output)`];
  lines.push('packing               frostgrid (M values/s)   python3-eccodes (M values/s)   ratio');
  for (const key of ['grib1-simple', 'grib1-second-order']) {
    const mine = ours[key] / 1e6;
    const ec = theirs[key].n / theirs[key].s / 1e6;
    lines.push(`${key.padEnd(20)}  ${mine.toFixed(1).padStart(10)}               ${ec.toFixed(1).padStart(10)}                 ${(mine / ec).toFixed(2)}×`);
  }
  process.stdout.write(lines.join('\n') + '\n');
}

await main();
