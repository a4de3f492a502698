/**
 * Live cross-check against libaec: fields invented here are encoded at test time with the `aec`
 * tool (Debian libaec-tools) and decoded by our decoder; the expected samples are the input.
 * Skipped locally when `aec` is absent, a failure in CI (test/support/tools.ts).
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { AEC_DATA_3BYTE, AEC_DATA_MSB, AEC_DATA_PREPROCESS, aecDecode } from '../../lib/codecs/index.js';
import { toolAvailable } from '../support/tools.js';

const dir = mkdtempSync(join(tmpdir(), 'frostgrid-aec-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** A smooth field with noise and flat patches, n-bit, from a seeded generator. */
function field(count: number, n: number, seed: number): Uint32Array {
  let s = seed >>> 0;
  const rand = () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32);
  const top = 2 ** n - 1;
  const out = new Uint32Array(count);
  for (let i = 0; i < count; i++) {
    const flat = Math.floor(i / 700) % 3 === 0;
    const f = flat ? 0.25 : 0.5 + 0.3 * Math.sin(i / 61) + 0.05 * (rand() - 0.5);
    out[i] = Math.min(top, Math.max(0, Math.round(f * top)));
  }
  return out;
}

function bytesOf(values: Uint32Array, n: number, flags: number): Buffer {
  const size = n <= 8 ? 1 : n <= 16 ? 2 : n <= 24 && (flags & AEC_DATA_3BYTE) !== 0 ? 3 : 4;
  const msb = (flags & AEC_DATA_MSB) !== 0;
  const b = Buffer.alloc(values.length * size);
  values.forEach((v, i) => (msb ? b.writeUIntBE(v, i * size, size) : b.writeUIntLE(v, i * size, size)));
  return b;
}

const cases: [number, number, number, number][] = [];
for (const n of [1, 6, 8, 11, 16, 19, 24, 29, 32]) cases.push([n, 32, 128, AEC_DATA_PREPROCESS | AEC_DATA_MSB | AEC_DATA_3BYTE]);
for (const j of [8, 16, 64]) for (const r of [1, 7, 4096]) cases.push([14, j, r, AEC_DATA_PREPROCESS | AEC_DATA_MSB]);
cases.push([16, 32, 128, 0], [20, 16, 32, AEC_DATA_PREPROCESS]);

describe('CCSDS decoder against libaec `aec` run now', () => {
  it.each(cases)('n = %i, J = %i, RSI = %i, flags = %i', (n, j, r, flags) => {
    if (!toolAvailable('command', 'aec')) return;
    const count = 50_000 + n * 37;
    const input = field(count, n, n * 1000 + j + r);
    const raw = join(dir, `in-${n}-${j}-${r}-${flags}.raw`);
    const enc = raw.replace('.raw', '.aec');
    writeFileSync(raw, bytesOf(input, n, flags));
    const args = ['-n', String(n), '-j', String(j), '-r', String(r)];
    if (flags & AEC_DATA_MSB) args.push('-m');
    if (flags & AEC_DATA_3BYTE) args.push('-3');
    if (!(flags & AEC_DATA_PREPROCESS)) args.push('-N');
    execFileSync('aec', [...args, raw, enc]);
    const got = aecDecode(new Uint8Array(readFileSync(enc)), { bitsPerSample: n, blockSize: j, rsi: r, flags }, count);
    let firstBad = -1;
    for (let i = 0; i < count && firstBad < 0; i++) if (got[i] !== input[i]) firstBad = i;
    expect(firstBad).toBe(-1);
  });
});
