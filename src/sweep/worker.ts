// Entry of a sweep worker thread: receives the sweep context once (workerData), then solves the parameter
// sets it is sent and returns their outcomes as one transferred Float64Array per task.

import { parentPort, workerData } from 'node:worker_threads';
import { isInputError } from '../errors.js';
import type { SweepContext } from './evaluate.js';
import { runOne, runWidth } from './run-kind.js';
import type { TaskMessage, WorkerReply } from './pool.js';

const context = workerData as SweepContext;
const width = context.fields.length;
const resultWidth = runWidth(context);

parentPort!.on('message', (task: TaskMessage) => {
  try {
    const out = new Float64Array(task.runCount * resultWidth);
    for (let r = 0; r < task.runCount; r++) {
      runOne(
        context,
        task.values.subarray(r * width, (r + 1) * width),
        out,
        r * resultWidth,
        `sweep run ${task.firstRun + r}`,
      );
    }
    const reply: WorkerReply = { id: task.id, out };
    parentPort!.postMessage(reply, [out.buffer as ArrayBuffer]);
  } catch (error) {
    const reply: WorkerReply = {
      id: task.id,
      error: error instanceof Error ? (error.stack ?? error.message) : String(error),
      errorMessage: error instanceof Error ? error.message : String(error),
      inputError: isInputError(error),
    };
    parentPort!.postMessage(reply);
  }
});
