/**
 * Codec benchmark: CCSDS/AEC decode rate on a ~1M-sample field (1440 × 721) beside libaec's
 * `aec -d` on the same stream, unpackUnsigned rates, and JPEG 2000 / PNG decode times beside
 * ecCodes (python3-eccodes) decoding the same GRIB2 messages. JPEG 2000 up to 16 bits is the
 * OpenJPEG wasm build, above it our own decoder (lib/codecs/j2k), also timed at 12 and 16 bits.
 *
 * Run:  node --import tsx benchmarks/codecs.ts
 * Needs: aec (libaec-tools), /usr/bin/python3 with eccodes and numpy.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { aecDecode, decodeJ2k, decodeJpeg2000, decodePngSamples, unpackUnsigned } from '../lib/codecs/index.js';

const PYTHON = '/usr/bin/python3';
const NX = 1440;
const NY = 721;
const COUNT = NX * NY;
const dir = mkdtempSync(join(tmpdir(), 'frostgrid-bench-codecs-'));

function best(runs: number, f: () => void): number {
  let t = Infinity;
  for (let r = 0; r < runs; r++) {
    const t0 = performance.now();
    f();
    t = Math.min(t, performance.now() - t0);
  }
  return t;
}

async function bestAsync(runs: number, f: () => Promise<unknown>): Promise<number> {
  let t = Infinity;
  for (let r = 0; r < runs; r++) {
    const t0 = performance.now();
    await f();
    t = Math.min(t, performance.now() - t0);
  }
  return t;
}

/** A smooth global field with weather-like noise, n-bit. */
function field(n: number): Uint32Array {
  const top = 2 ** n - 1;
  const out = new Uint32Array(COUNT);
  let s = 1;
  for (let j = 0, i = 0; j < NY; j++) {
    for (let k = 0; k < NX; k++, i++) {
      s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
      const f = 0.5 + 0.3 * Math.cos((j / NY) * Math.PI) * Math.sin((k / NX) * 6.283 * 3) + 0.01 * (s / 2 ** 32 - 0.5);
      out[i] = Math.round(Math.min(1, Math.max(0, f)) * top);
    }
  }
  return out;
}

function msbBytes(values: Uint32Array, size: number): Buffer {
  const b = Buffer.alloc(values.length * size);
  for (let i = 0; i < values.length; i++) b.writeUIntBE(values[i], i * size, size);
  return b;
}

function benchAec(n: number): void {
  const size = n <= 8 ? 1 : n <= 16 ? 2 : n <= 24 ? 3 : 4;
  const input = field(n);
  const raw = join(dir, `f${n}.raw`);
  const enc = join(dir, `f${n}.aec`);
  const out = join(dir, `f${n}.out`);
  writeFileSync(raw, msbBytes(input, size));
  const args = ['-n', String(n), '-j', '32', '-r', '128', '-m', '-3'];
  execFileSync('aec', [...args, raw, enc]);
  const stream = new Uint8Array(readFileSync(enc));
  const params = { bitsPerSample: n, blockSize: 32, rsi: 128, flags: 14 };
  const got = aecDecode(stream, params, COUNT);
  for (let i = 0; i < COUNT; i++) if (got[i] !== input[i]) throw new Error(`AEC benchmark: sample ${i} differs`);
  const ours = best(15, () => aecDecode(stream, params, COUNT));
  const theirs = best(7, () => {
    const r = spawnSync('aec', ['-d', ...args, enc, out]);
    if (r.status !== 0) throw new Error('aec -d failed');
  });
  const rate = COUNT / ours / 1e3;
  console.log(
    `CCSDS ${String(n).padStart(2)}-bit  ${(stream.length / 1024).toFixed(0).padStart(5)} KiB  ours ${ours.toFixed(1).padStart(6)} ms = ${rate.toFixed(0).padStart(4)} M samples/s` +
      `   aec -d (process, incl. startup and file I/O) ${theirs.toFixed(1).padStart(6)} ms = ${(COUNT / theirs / 1e3).toFixed(0).padStart(4)} M/s   speed ours ÷ aec ${(theirs / ours).toFixed(2)}` +
      `${rate >= 50 ? '' : '   (below the 50 M/s target)'}`,
  );
}

function benchUnpack(): void {
  const bytes = new Uint8Array(COUNT * 4 + 8);
  for (let i = 0; i < bytes.length; i++) bytes[i] = (i * 2654435761) >>> 24;
  const out = new Float64Array(COUNT);
  for (const bpv of [8, 12, 16, 24, 32]) {
    const t = best(15, () => unpackUnsigned(bytes, 0, bpv, COUNT, out));
    console.log(`unpackUnsigned ${String(bpv).padStart(2)}-bit  ${t.toFixed(2).padStart(6)} ms = ${(COUNT / t / 1e3).toFixed(0).padStart(4)} M values/s`);
  }
}

/** ecCodes writes grid_jpeg / grid_png messages of the field and times its own decode. */
function eccodesImages(): { name: string; file: string; bits: number; eccodesMs: number }[] {
  const script = `
import sys, json, time, numpy as np, eccodes
out = []
y, x = np.mgrid[0:${NY}, 0:${NX}]
v = 250 + 40 * np.cos(y / ${NY} * np.pi) * np.sin(x / ${NX} * 6.283 * 3) + 0.3 * np.random.default_rng(1).random((${NY}, ${NX}))
for packing, bits in (('grid_jpeg', 12), ('grid_jpeg', 16), ('grid_jpeg', 20), ('grid_jpeg', 24), ('grid_png', 16), ('grid_png', 24)):
    gid = eccodes.codes_grib_new_from_samples('regular_ll_sfc_grib2')
    for k, val in (('Ni', ${NX}), ('Nj', ${NY}), ('iDirectionIncrementInDegrees', 0.25), ('jDirectionIncrementInDegrees', 0.25),
                   ('latitudeOfFirstGridPointInDegrees', 90), ('longitudeOfFirstGridPointInDegrees', 0),
                   ('latitudeOfLastGridPointInDegrees', -90), ('longitudeOfLastGridPointInDegrees', 359.75)):
        eccodes.codes_set(gid, k, val)
    eccodes.codes_set(gid, 'bitsPerValue', bits)
    eccodes.codes_set_values(gid, v.ravel())
    eccodes.codes_set(gid, 'packingType', packing)
    msg = eccodes.codes_get_message(gid)
    off = eccodes.codes_get(gid, 'offsetSection7'); n = eccodes.codes_get(gid, 'section7Length')
    name = f'{packing}-{bits}'
    path = sys.argv[1] + '/' + name + '.bin'
    open(path, 'wb').write(msg[off + 5:off + n])
    times = []
    for r in range(5):
        g = eccodes.codes_new_from_message(msg)
        t0 = time.perf_counter(); eccodes.codes_get_values(g); times.append(time.perf_counter() - t0)
        eccodes.codes_release(g)
    out.append({'name': name, 'file': path, 'bits': bits, 'eccodesMs': min(times) * 1e3})
print(json.dumps(out))`;
  return JSON.parse(execFileSync(PYTHON, ['-c', script, dir], { encoding: 'utf8', maxBuffer: 1 << 24 }));
}

async function main(): Promise<void> {
  console.log(`field ${NX} × ${NY} = ${COUNT} samples; node ${process.version}`);
  for (const n of [8, 12, 16, 24, 32]) benchAec(n);
  benchUnpack();
  for (const img of eccodesImages()) {
    const bytes = new Uint8Array(readFileSync(img.file));
    let t: number;
    if (img.name.startsWith('grid_jpeg')) {
      await decodeJpeg2000(bytes); // wasm instantiation and warm-up
      t = await bestAsync(5, () => decodeJpeg2000(bytes));
    } else {
      decodePngSamples(bytes);
      t = best(5, () => decodePngSamples(bytes));
    }
    const via = img.name.startsWith('grid_jpeg') ? (img.bits > 16 ? ' (j2k)' : ' (wasm)') : '';
    console.log(
      `${(img.name + via).padEnd(19)} ${(bytes.length / 1024).toFixed(0).padStart(5)} KiB  ours ${t.toFixed(1).padStart(6)} ms` +
        `   ecCodes codes_get_values (whole message) ${img.eccodesMs.toFixed(1).padStart(6)} ms   speed ours ÷ ecCodes ${(img.eccodesMs / t).toFixed(2)}`,
    );
    if (img.name.startsWith('grid_jpeg') && img.bits <= 16) {
      // our own JPEG 2000 decoder on the same stream, for comparison with the wasm build
      const own = best(3, () => decodeJ2k(bytes));
      console.log(`${(img.name + ' (j2k)').padEnd(19)}        ours ${own.toFixed(1).padStart(6)} ms   ÷ ecCodes ${(img.eccodesMs / own).toFixed(2)}`);
    }
  }
}

try {
  await main();
} finally {
  rmSync(dir, { recursive: true, force: true });
}
