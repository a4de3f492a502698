/** Worker thread of the main job: evaluates the (time, level) slices it is sent. */
import { parentPort, workerData } from 'node:worker_threads';
import { serializeError, workerState, type WorkerSetup } from './level-evaluator.js';

const port = parentPort;
if (port === null) throw new Error('level-worker.ts runs only as a worker thread');

try {
  const state = await workerState(workerData as WorkerSetup);
  port.on('message', (m: { type: string; id: number; time: Parameters<typeof state.evaluate>[0]; pressurePa: number; levelIndex: number }) => {
    state.evaluate(m.time, m.pressurePa, m.levelIndex).then(
      ({ result, arrays }) => {
        port.postMessage({ type: 'level', id: m.id, result, arrays }, [
          arrays.rhiPercent.buffer,
          arrays.iceSupersaturated.buffer,
          arrays.contrailForming.buffer,
          arrays.persistentContrail.buffer,
          arrays.formationMarginK.buffer,
        ] as ArrayBuffer[]);
      },
      (e: unknown) => port.postMessage({ type: 'error', id: m.id, error: serializeError(e) }),
    );
  });
  port.postMessage({ type: 'ready' });
} catch (e) {
  port.postMessage({ type: 'failed', error: serializeError(e) });
}
