/**
 * Evaluation of (time, level) slices for the main job, in-process or on worker threads.
 *
 * Both evaluators hand back the level's arrays (RHi, the three masks, the formation margin) and
 * its LevelResult. The in-process evaluator returns views into its one workspace, valid until the
 * next call; the worker pool returns arrays transferred from the workers, and keeps up to one
 * slice per worker in flight so that reading and physics run on both cores while the main thread
 * compresses the outputs.
 */
import { availableParallelism } from 'node:os';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import { FrostgridError } from '../errors.js';
import type { Field, GridDataset, RhConvention, TimeCoordinate } from '../grid/types.js';
import type { CriterionParameters, LevelCriterion } from '../physics/index.js';
import { prepareLevel } from '../physics/index.js';
import {
  LevelWorkspace,
  cellWeights,
  evaluateFieldLevel,
  selectHumidity,
  selectTemperature,
  type BoundingBox,
  type CellWeights,
  type HumiditySelection,
  type LevelResult,
} from '../products/index.js';
import { open } from '../open.js';

export interface LevelArrays {
  readonly rhiPercent: Float32Array;
  readonly iceSupersaturated: Uint8Array;
  readonly contrailForming: Uint8Array;
  readonly persistentContrail: Uint8Array;
  readonly formationMarginK: Float32Array;
}

export interface EvaluatedLevel {
  readonly result: LevelResult;
  readonly arrays: LevelArrays;
}

export interface LevelEvaluator {
  /** Starts evaluating a slice; results must be awaited in the order they were asked for. */
  evaluate(time: TimeCoordinate, pressurePa: number, levelIndex: number): Promise<EvaluatedLevel>;
  /** How many slices may be in flight at once. */
  readonly concurrency: number;
  close(): Promise<void>;
}

/** What a worker needs to reproduce the main thread's choices. */
export interface WorkerSetup {
  readonly path: string;
  readonly temperatureVariable: string;
  readonly humidityVariable: string;
  readonly rhConvention?: RhConvention;
  readonly params: CriterionParameters;
  readonly bbox?: BoundingBox;
  readonly levelsPa: readonly number[];
}

/** One workspace, one slice at a time, on the calling thread. */
export function inProcessEvaluator(
  temperature: Field,
  humidity: HumiditySelection,
  params: CriterionParameters,
  weights: CellWeights,
  criteria: readonly LevelCriterion[],
): LevelEvaluator {
  const ws = new LevelWorkspace(temperature.grid.npoints);
  return {
    concurrency: 1,
    async evaluate(time, pressurePa, levelIndex) {
      const result = await evaluateFieldLevel(ws, temperature, humidity, time, pressurePa, params, weights, criteria[levelIndex]);
      return { result, arrays: ws };
    },
    async close() {},
  };
}

/** The worker count `frostgrid masks` uses by default: both cores for large jobs, none for small. */
export function defaultWorkerCount(cells: number): number {
  return cells >= 4_000_000 ? Math.min(2, availableParallelism()) : 0;
}

/**
 * Starts one level worker. From the built package it runs level-worker.js; from the TypeScript
 * sources (tests, tsx) it runs level-worker.ts through tsx's module API, since a worker does not
 * inherit the parent's loader.
 */
function startWorker(setup: WorkerSetup): Worker {
  if (!import.meta.url.endsWith('.ts')) return new Worker(new URL('./level-worker.js', import.meta.url), { workerData: setup });
  const source = new URL('./level-worker.ts', import.meta.url).href;
  const tsx = tsxModuleApi();
  const boot = `import(${JSON.stringify(tsx)}).then((m) => m.tsImport(${JSON.stringify(source)}, ${JSON.stringify(import.meta.url)}))`;
  return new Worker(boot, { eval: true, workerData: setup });
}

/** URL of tsx's ESM module API (its package exports map names it; require.resolve would pick the CommonJS twin). */
function tsxModuleApi(): string {
  const pkgPath = createRequire(import.meta.url).resolve('tsx/package.json');
  const pkg = JSON.parse(readFileSync(pkgPath, 'utf8')) as { exports: Record<string, { import: { default: string } }> };
  return pathToFileURL(join(dirname(pkgPath), pkg.exports['./esm/api'].import.default)).href;
}

interface Pending {
  resolve(v: EvaluatedLevel): void;
  reject(e: unknown): void;
}

/** A pool of worker threads, each with its own open dataset and workspace. */
export async function workerPoolEvaluator(setup: WorkerSetup, count: number): Promise<LevelEvaluator> {
  const workers: Worker[] = [];
  const pending = new Map<number, Pending>();
  let nextId = 0;
  let turn = 0;
  let failure: unknown;
  const ready: Promise<void>[] = [];
  for (let w = 0; w < count; w++) {
    const worker = startWorker(setup);
    workers.push(worker);
    ready.push(
      new Promise<void>((resolve, reject) => {
        worker.once('message', (m: { type: string; error?: SerializedError }) => (m.type === 'ready' ? resolve() : reject(revive(m.error))));
        worker.once('error', (e) => reject(new FrostgridError(`${setup.path}: a level worker failed to start: ${e.message}`, { file: setup.path })));
      }),
    );
    worker.on('message', (m: { type: string; id?: number; result?: LevelResult; arrays?: LevelArrays; error?: SerializedError }) => {
      if (m.id === undefined) return;
      const p = pending.get(m.id);
      if (!p) return;
      pending.delete(m.id);
      if (m.type === 'level') p.resolve({ result: m.result as LevelResult, arrays: m.arrays as LevelArrays });
      else p.reject(revive(m.error));
    });
    worker.on('error', (e) => {
      failure = new FrostgridError(`${setup.path}: a level worker failed: ${e.message}`, { file: setup.path });
      for (const p of pending.values()) p.reject(failure);
      pending.clear();
    });
  }
  try {
    await Promise.all(ready);
  } catch (e) {
    await Promise.all(workers.map((w) => w.terminate()));
    throw e;
  }
  return {
    concurrency: count,
    evaluate(time, pressurePa, levelIndex) {
      if (failure !== undefined) return Promise.reject(failure);
      const id = nextId++;
      const worker = workers[turn++ % workers.length];
      return new Promise<EvaluatedLevel>((resolve, reject) => {
        pending.set(id, { resolve, reject });
        worker.postMessage({ type: 'level', id, time, pressurePa, levelIndex });
      });
    },
    async close() {
      await Promise.all(workers.map((w) => w.terminate()));
    },
  };
}

export interface SerializedError {
  readonly name: string;
  readonly message: string;
  readonly file?: string;
  readonly stack?: string;
}

export function serializeError(e: unknown): SerializedError {
  if (e instanceof Error) return { name: e.name, message: e.message, file: (e as FrostgridError).file, stack: e.stack };
  return { name: 'Error', message: String(e) };
}

/** Errors from a worker come back as FrostgridErrors with the worker's message. */
function revive(e: SerializedError | undefined): Error {
  const err = new FrostgridError(e?.message ?? 'worker failed', { file: e?.file });
  if (e?.stack) err.stack = `${err.name}: ${e.message}\n(in a level worker)\n${e.stack}`;
  return err;
}

/**
 * Worker side: open the dataset, make the same selections as the main thread and evaluate on an
 * in-process evaluator, copying each level's arrays out of its workspace for transfer.
 */
export async function workerState(setup: WorkerSetup): Promise<{
  ds: GridDataset;
  evaluate(time: TimeCoordinate, pressurePa: number, levelIndex: number): Promise<EvaluatedLevel>;
}> {
  const ds = await open(setup.path, { rhConvention: setup.rhConvention });
  const temperature = selectTemperature(ds, setup.temperatureVariable);
  const humidity = selectHumidity(ds, { variable: setup.humidityVariable, rhConvention: setup.rhConvention, saturation: setup.params.saturation });
  const criteria = setup.levelsPa.map((p) => prepareLevel(p, setup.params));
  const local = inProcessEvaluator(temperature, humidity, setup.params, cellWeights(temperature.grid, setup.bbox), criteria);
  return {
    ds,
    async evaluate(time, pressurePa, levelIndex) {
      const { result, arrays: a } = await local.evaluate(time, pressurePa, levelIndex);
      return {
        result,
        arrays: {
          rhiPercent: a.rhiPercent.slice(),
          iceSupersaturated: a.iceSupersaturated.slice(),
          contrailForming: a.contrailForming.slice(),
          persistentContrail: a.persistentContrail.slice(),
          formationMarginK: a.formationMarginK.slice(),
        },
      };
    },
  };
}
