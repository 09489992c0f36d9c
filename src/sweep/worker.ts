// Entry of a pool worker thread: loads the job it is started with (workerData) at once, then serves job after job:
// a job's context arrives once, then the parameter sets to solve, whose outcomes go back as one transferred
// Float64Array per task. Messages are handled in arrival order, so tasks wait for their job's module to load.

import { parentPort, workerData } from 'node:worker_threads';
import { isInputError } from '../errors.js';
import type { ContextMessage, PoolContext, PoolJob, TaskMessage, WorkerReply } from './pool.js';
import type { JobModule } from './threads.js';
import { solveRun } from './solve-run.js';

interface Loaded {
  job: PoolJob<PoolContext>;
  context: PoolContext;
  resultWidth: number;
}

const loadJob = async ({ moduleUrl, exportName }: JobModule) =>
  ((await import(moduleUrl)) as Record<string, PoolJob<PoolContext>>)[exportName]!;

// Loading the first job's module now overlaps it with the caller's own work until the context arrives; should it
// fail, the context's own load below fails the same way and says so in the task's reply.
let current: Promise<Loaded | null> = loadJob(workerData as JobModule).then(
  () => null,
  () => null,
);

function solveTask(loaded: Loaded, task: TaskMessage): void {
  const { job, context, resultWidth } = loaded;
  const out = new Float64Array(task.runCount * resultWidth);
  for (let r = 0; r < task.runCount; r++) solveRun(job, context, task.values, task.firstRun, r, out);
  const reply: WorkerReply = { id: task.id, out };
  parentPort!.postMessage(reply, [out.buffer as ArrayBuffer]);
}

function replyError(id: number, error: unknown): void {
  const reply: WorkerReply = {
    id,
    error: error instanceof Error ? (error.stack ?? error.message) : String(error),
    errorMessage: error instanceof Error ? error.message : String(error),
    inputError: isInputError(error),
  };
  parentPort!.postMessage(reply);
}

parentPort!.on('message', (message: ContextMessage | TaskMessage) => {
  if (message.kind === 'context') {
    const { context } = message;
    const load = () => loadJob(message);
    current = current.then(load, load).then((job) => ({ job, context, resultWidth: job.width(context) }));
    return;
  }
  current.then(
    (loaded) => {
      try {
        if (!loaded) throw new Error('a task arrived before its context');
        solveTask(loaded, message);
      } catch (error) {
        replyError(message.id, error);
      }
    },
    (error: unknown) => replyError(message.id, error),
  );
});
