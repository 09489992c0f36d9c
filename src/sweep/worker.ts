// Entry of a pool worker thread: loads its job (./pool.ts) and receives the context once (workerData), then
// solves the parameter sets it is sent and returns their outcomes as one transferred Float64Array per task.

import { parentPort, workerData } from 'node:worker_threads';
import { isInputError } from '../errors.js';
import type { PoolContext, PoolJob, TaskMessage, WorkerReply, WorkerSetup } from './pool.js';

const setup = workerData as WorkerSetup;
const context = setup.context;
// Messages sent while the job loads wait in the port: it starts delivering when the listener below is attached.
const job = ((await import(setup.moduleUrl)) as Record<string, PoolJob<PoolContext>>)[setup.exportName]!;
const width = context.fields.length;
const resultWidth = job.width(context);

parentPort!.on('message', (task: TaskMessage) => {
  try {
    const out = new Float64Array(task.runCount * resultWidth);
    for (let r = 0; r < task.runCount; r++) {
      job.run(
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
