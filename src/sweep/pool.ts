// Runs parameter sets across worker threads (node:worker_threads): each worker gets the context (track, base car)
// once, then small tasks of a few parameter sets, and answers with packed Float64Array outcomes. What a run is
// comes from its caller as a job (a sweep's setup change, a draw of an uncertain reference), so the pool
// knows none of them and the same workers serve all.

import { Worker } from 'node:worker_threads';
import { availableParallelism } from 'node:os';
import { InputError } from '../errors.js';

/** What every job's context has: the names of the values each run is given, in order. */
export interface PoolContext {
  fields: string[];
}

/**
 * A job: how many numbers a run writes and how to solve one. A worker thread loads the job itself from
 * `moduleUrl` (the module's own import.meta.url) by `exportName`, since functions do not cross threads.
 */
export interface PoolJob<C extends PoolContext> {
  moduleUrl: string;
  exportName: string;
  width(context: C): number;
  run(context: C, values: ArrayLike<number>, out: Float64Array, offset: number, where: string): void;
}

/** What a worker thread is started with. */
export interface WorkerSetup {
  moduleUrl: string;
  exportName: string;
  context: PoolContext;
}

export interface TaskMessage {
  id: number;
  firstRun: number;
  runCount: number;
  values: Float64Array;
}

export interface WorkerReply {
  id: number;
  out?: Float64Array;
  error?: string;
  errorMessage?: string;
  inputError?: boolean;
}

export interface RunOptions {
  /** Worker threads; 0 runs in the calling thread. Default: os.availableParallelism(). */
  workers?: number;
  /** Called after each finished task with the number of runs done so far. */
  onProgress?: (doneRuns: number, totalRuns: number) => void;
}

/** Each run allocates its traces afresh; a roomier young generation means fewer scavenges competing for the cores. */
const WORKER_YOUNG_GENERATION_MB = 64;

export function defaultWorkerCount(): number {
  return availableParallelism();
}

/** Solves the runs in this thread; `values` holds fields.length numbers per run. Returns job.width numbers per run. */
export function runSetupsInProcess<C extends PoolContext>(
  job: PoolJob<C>,
  context: C,
  values: Float64Array,
  firstRun = 0,
  onProgress?: RunOptions['onProgress'],
): Float64Array {
  const width = context.fields.length;
  const runs = width === 0 ? 0 : values.length / width;
  const resultWidth = job.width(context);
  const out = new Float64Array(runs * resultWidth);
  for (let r = 0; r < runs; r++) {
    job.run(context, values.subarray(r * width, (r + 1) * width), out, r * resultWidth, `sweep run ${firstRun + r}`);
    onProgress?.(r + 1, runs);
  }
  return out;
}

/**
 * Solves the runs across worker threads. The outcome of run r lands at r * job.width whatever worker
 * solved it, so the result does not depend on the number of workers or on their timing. The worker is the
 * compiled module beside this one: run from the built package (dist/), as the command line and benchmarks do.
 */
export async function runSetups<C extends PoolContext>(
  job: PoolJob<C>,
  context: C,
  values: Float64Array,
  firstRun = 0,
  options: RunOptions = {},
): Promise<Float64Array> {
  const width = context.fields.length;
  const runs = width === 0 ? 0 : values.length / width;
  const requested = options.workers ?? defaultWorkerCount();
  if (requested <= 0 || runs === 0) return runSetupsInProcess(job, context, values, firstRun, options.onProgress);
  const resultWidth = job.width(context);
  const out = new Float64Array(runs * resultWidth);
  // Small tasks keep the workers evenly loaded to the end; two in flight per worker hide the message latency.
  const chunk = Math.max(1, Math.min(16, Math.ceil(runs / (requested * 8))));
  const taskCount = Math.ceil(runs / chunk);
  const workerCount = Math.min(requested, taskCount);
  const url = new URL('./worker.js', import.meta.url);
  const setup: WorkerSetup = { moduleUrl: job.moduleUrl, exportName: job.exportName, context };
  const workers: Worker[] = [];
  let nextTask = 0;
  let doneRuns = 0;
  let finishedTasks = 0;

  return await new Promise<Float64Array>((resolve, reject) => {
    let settled = false;
    const finish = (error?: Error) => {
      if (settled) return;
      settled = true;
      for (const worker of workers) void worker.terminate();
      if (error) reject(error);
      else resolve(out);
    };
    const send = (worker: Worker) => {
      if (nextTask >= taskCount) return;
      const id = nextTask++;
      const start = id * chunk;
      const count = Math.min(chunk, runs - start);
      const task: TaskMessage = {
        id,
        firstRun: firstRun + start,
        runCount: count,
        values: values.slice(start * width, (start + count) * width),
      };
      worker.postMessage(task, [task.values.buffer as ArrayBuffer]);
    };
    for (let w = 0; w < workerCount; w++) {
      const worker = new Worker(url, {
        workerData: setup,
        resourceLimits: { maxYoungGenerationSizeMb: WORKER_YOUNG_GENERATION_MB },
      });
      workers.push(worker);
      worker.on('message', (reply: WorkerReply) => {
        if (reply.out === undefined) {
          finish(
            reply.inputError
              ? new InputError(reply.errorMessage ?? 'sweep run failed')
              : new Error(`sweep worker: ${reply.error}`),
          );
          return;
        }
        const start = reply.id * chunk;
        out.set(reply.out, start * resultWidth);
        doneRuns += reply.out.length / resultWidth;
        finishedTasks++;
        options.onProgress?.(doneRuns, runs);
        if (finishedTasks === taskCount) finish();
        else send(worker);
      });
      worker.on('error', (error) => finish(error));
      worker.on('exit', (code) => {
        if (!settled && code !== 0) finish(new Error(`sweep worker stopped with exit code ${code}`));
      });
      send(worker);
      send(worker);
    }
  });
}
