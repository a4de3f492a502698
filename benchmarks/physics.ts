/**
 * Physics benchmark: RHi plus the ice-supersaturation, formation and persistence masks for one
 * pressure level with Murphy–Koop (the default), on a 0.25° global grid (1440 × 721) and on a
 * larger synthetic array, with and without the optional formation-margin layer; also the other
 * formulations and the array saturation functions. Prints cells per second (best of several runs).
 *
 * Run:  node --import tsx benchmarks/physics.ts
 * Target: ≥ 20 million cells/s on one core for RHi + masks with Murphy–Koop (issue 2).
 */
import {
  DEFAULT_CRITERION,
  SATURATION_FORMULATIONS,
  evaluateLevel,
  prepareLevel,
  saturationPressureIce,
  saturationPressureIceArray,
  saturationPressureWaterArray,
  type CriterionParameters,
  type LevelOutputs,
} from '../lib/physics/index.js';

function best(runs: number, f: () => void): number {
  let t = Infinity;
  for (let r = 0; r < runs; r++) {
    const t0 = performance.now();
    f();
    t = Math.min(t, performance.now() - t0);
  }
  return t;
}

/** Invented scenario: a smooth temperature field 205–245 K and humidity 20–130 % RHi, seeded, no real data. */
function field(n: number): { T: Float32Array; e: Float32Array } {
  const T = new Float32Array(n);
  const e = new Float32Array(n);
  let s = 12345;
  for (let i = 0; i < n; i++) {
    s = (s * 1103515245 + 12345) >>> 0;
    const r = s / 4294967296;
    const t = 225 + 20 * Math.sin(i * 1e-4) + 2 * (r - 0.5);
    T[i] = t;
    e[i] = (0.2 + 1.1 * ((i * 7919) % 1000) / 1000) * saturationPressureIce(t);
  }
  // a few missing cells, as in real files
  for (let i = 0; i < n; i += 10007) T[i] = NaN;
  return { T, e };
}

function outputs(n: number, margin: boolean): LevelOutputs {
  return {
    rhiPercent: new Float32Array(n),
    iceSupersaturated: new Uint8Array(n),
    contrailForming: new Uint8Array(n),
    persistentContrail: new Uint8Array(n),
    ...(margin ? { formationMarginK: new Float32Array(n) } : {}),
  };
}

function rate(n: number, ms: number): string {
  return `${((n / ms) * 1e-3).toFixed(1)} M cells/s`;
}

const line = (label: string, n: number, ms: number): void => {
  process.stdout.write(`${label.padEnd(58)} ${ms.toFixed(2).padStart(8)} ms  ${rate(n, ms)}\n`);
};

const grids: [string, number][] = [
  ['1440 x 721', 1440 * 721],
  ['synthetic 8 M cells', 8_000_000],
];

process.stdout.write(`node ${process.version}\n`);
for (const [name, n] of grids) {
  const { T, e } = field(n);
  const params: CriterionParameters = DEFAULT_CRITERION;
  const level = prepareLevel(25000, params);
  const out = outputs(n, false);
  const outM = outputs(n, true);
  for (let w = 0; w < 5; w++) evaluateLevel(T, e, level, params, out);
  line(`${name}: RHi + masks, murphy-koop`, n, best(10, () => evaluateLevel(T, e, level, params, out)));
  for (let w = 0; w < 3; w++) evaluateLevel(T, e, level, params, outM);
  line(`${name}: RHi + masks + margin, murphy-koop`, n, best(10, () => evaluateLevel(T, e, level, params, outM)));
  const scaled = { ...params, humidityScale: 1.1 };
  line(`${name}: RHi + masks, F = 1.1 (capped), murphy-koop`, n, best(10, () => evaluateLevel(T, e, level, scaled, out)));
}

const n = 1440 * 721;
const { T, e } = field(n);
const out = outputs(n, false);
for (const f of SATURATION_FORMULATIONS) {
  const params = { ...DEFAULT_CRITERION, saturation: f };
  const level = prepareLevel(25000, params);
  for (let w = 0; w < 3; w++) evaluateLevel(T, e, level, params, out);
  line(`1440 x 721: RHi + masks, ${f}`, n, best(5, () => evaluateLevel(T, e, level, params, out)));
}
const sat = new Float32Array(n);
line('1440 x 721: saturationPressureIceArray, murphy-koop', n, best(5, () => saturationPressureIceArray(sat, T)));
line('1440 x 721: saturationPressureWaterArray, murphy-koop', n, best(5, () => saturationPressureWaterArray(sat, T)));
line('prepareLevel (T_LM + 513-node T_LC table)', 1, best(20, () => prepareLevel(25000, DEFAULT_CRITERION)));
