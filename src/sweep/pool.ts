// Runs parameter sets across worker threads (node:worker_threads): each worker gets the context (track, base car)
// once per job, then small tasks of a few parameter sets, and answers with packed Float64Array outcomes. What a run
// is comes from its caller as a job (a sweep's setup change, a draw of an uncertain reference), so the pool knows
// none of them and the same threads, kept by ./threads.ts between jobs, serve all.

import type { Worker } from 'node:worker_threads';
import { availableParallelism } from 'node:os';
import { InputError } from '../errors.js';
import { solveRun } from './solve-run.js';
import { endThreads, keepThreads, lendThreads, solvedThreadCount, startThreads, type JobModule } from './threads.js';

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

/** A job's context, sent to each of its threads before the job's tasks. */
export interface ContextMessage {
  kind: 'context';
  moduleUrl: string;
  exportName: string;
  context: PoolContext;
}

export interface TaskMessage {
  kind: 'task';
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
  /** Worker threads; 0 runs in the calling thread. Default: runs here for 0.2 s, then, only where the rest take long
   * enough to pay for starting them, this thread goes on beside one worker per other core (os.availableParallelism()
   * less one); threads kept from an earlier job, having solved runs, cost nothing to start. */
  workers?: number;
  /** Called after each finished task with the number of runs done so far. */
  onProgress?: (doneRuns: number, totalRuns: number) => void;
}

export function defaultWorkerCount(): number {
  return availableParallelism();
}

/** What a fresh worker thread costs before it solves at full pace, counted in time this thread solves: Node's start,
 * the job's modules, and V8 compiling the solver again in it, whose compiler and slow first runs take their share of
 * the cores this thread solves on. Measured on two cores beside this thread solving: a worker started for about
 * 0.95 s of runs of a 5 km circuit just broke even, one for 1 s of Monza's centreline saved about 0.2 s. Workers
 * start side by side, so k of them cost this once; threads kept from an earlier job cost nothing to start. */
export const WORKER_START_S = 0.8;

/** Time the pool spends solving runs in the calling thread before it judges whether workers would pay. Timed by the
 * clock, not by the process's CPU time: that also counts V8's compiler and collector threads, which in a fresh
 * process would make the first runs look several times their cost here. */
const SOLVE_HERE_FIRST_S = 0.2;

/**
 * How many workers to start beside this thread for runs that would take `remainingS` here. This thread goes on
 * solving while they start, so with one per other core (c - 1 of them, each joining after the start S) the runs end
 * after about (remainingS + (c - 1) S) / c: sooner than here alone only when remainingS is more than S. Otherwise
 * none (0: solve them here).
 */
export function workersWorthStarting(remainingS: number, cores: number, startS = WORKER_START_S): number {
  return cores >= 2 && remainingS > startS ? cores - 1 : 0;
}

/**
 * Starts the threads a job asked for in `options.workers` now, before the caller's own preparation (a baseline lap,
 * draws), so that their start overlaps it; left to the pool or 0, nothing starts here.
 */
export function startWorkersEarly(job: JobModule, options: RunOptions): void {
  if (options.workers !== undefined && options.workers > 0) startThreads(options.workers, job);
}

/** Solves the runs in this thread; `values` holds fields.length numbers per run. Returns job.width numbers per run. */
export function runSetupsInProcess<C extends PoolContext>(
  job: PoolJob<C>,
  context: C,
  values: Float64Array,
  firstRun = 0,
  onProgress?: RunOptions['onProgress'],
): Float64Array {
  return solveHere(job, context, values, firstRun, onProgress, Infinity).out;
}

const nowSeconds = () => performance.now() / 1000;

/**
 * Solves runs in this thread in order until all are done or `budgetS` is spent, into an array for them all; with a
 * budget, also the time a run took over the budget's second half (the first runs are slow while V8
 * compiles the solver, here as in a worker).
 */
function solveHere<C extends PoolContext>(
  job: PoolJob<C>,
  context: C,
  values: Float64Array,
  firstRun: number,
  onProgress: RunOptions['onProgress'],
  budgetS: number,
): { out: Float64Array; done: number; paceS: number } {
  const width = context.fields.length;
  const runs = width === 0 ? 0 : values.length / width;
  const resultWidth = job.width(context);
  const out = new Float64Array(runs * resultWidth);
  const timed = budgetS < Infinity;
  const startS = timed ? nowSeconds() : 0;
  let nowS = startS;
  let halfway: { done: number; atS: number } | null = null;
  let done = 0;
  while (done < runs && nowS - startS < budgetS) {
    solveRun(job, context, values, firstRun, done, out);
    done++;
    onProgress?.(done, runs);
    if (!timed) continue;
    nowS = nowSeconds();
    if (!halfway && nowS - startS >= budgetS / 2) halfway = { done, atS: nowS };
  }
  const paceS =
    halfway && done > halfway.done ? (nowS - halfway.atS) / (done - halfway.done) : (nowS - startS) / Math.max(done, 1);
  return { out, done, paceS };
}

/**
 * Solves the runs across worker threads, or in this thread where workers would not pay for their start (when
 * `options.workers` is left out: runs are solved here for 0.2 s, and the rest go where they end sooner; with
 * workers, this thread solves beside them, since it has compiled the solver already and a fresh worker has not).
 * The outcome of run r lands at r * job.width whatever thread solved it, so the result does not depend on the
 * number of workers or on their timing. The worker is the compiled module beside this one: run from the built
 * package (dist/), as the command line and benchmarks do.
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
  const { onProgress } = options;
  if (requested <= 0 || runs === 0) return runSetupsInProcess(job, context, values, firstRun, onProgress);
  if (options.workers !== undefined) return runInWorkers(job, context, values, firstRun, requested, onProgress);
  // Left to the pool: solve here for a while, then judge from the later runs' pace whether the rest end sooner on
  // workers.
  const { out, done, paceS } = solveHere(job, context, values, firstRun, onProgress, SOLVE_HERE_FIRST_S);
  if (done === runs) return out;
  const startS = solvedThreadCount() >= requested - 1 ? 0 : WORKER_START_S;
  const workers = workersWorthStarting((runs - done) * paceS, requested, startS);
  const restValues = values.subarray(done * width);
  const restProgress = onProgress && ((doneRest: number, total: number) => onProgress(doneRest + done, total + done));
  const rest =
    workers === 0
      ? runSetupsInProcess(job, context, restValues, firstRun + done, restProgress)
      : await runInWorkers(job, context, restValues, firstRun + done, workers, restProgress, true);
  out.set(rest, done * job.width(context));
  return out;
}

async function runInWorkers<C extends PoolContext>(
  job: PoolJob<C>,
  context: C,
  values: Float64Array,
  firstRun: number,
  requested: number,
  onProgress: RunOptions['onProgress'],
  solveHereToo = false,
): Promise<Float64Array> {
  const width = context.fields.length;
  const runs = values.length / width;
  const resultWidth = job.width(context);
  const out = new Float64Array(runs * resultWidth);
  // Small tasks keep the threads evenly loaded to the end; two in flight per worker hide the message latency (and
  // a task solved here, which holds this thread's replies back for its length).
  const threads = requested + (solveHereToo ? 1 : 0);
  const chunk = Math.max(1, Math.min(16, Math.ceil(runs / (threads * 8))));
  const taskCount = Math.ceil(runs / chunk);
  const workers = lendThreads(Math.min(requested, taskCount), job);
  const contextMessage: ContextMessage = {
    kind: 'context',
    moduleUrl: job.moduleUrl,
    exportName: job.exportName,
    context,
  };
  let nextTask = 0;
  let doneRuns = 0;
  let finishedTasks = 0;

  return await new Promise<Float64Array>((resolve, reject) => {
    let settled = false;
    const listeners = new Map<Worker, (reply: WorkerReply) => void>();
    const onError = (error: Error) => finish(error);
    const onExit = (code: number) => finish(new Error(`sweep worker stopped with exit code ${code}`));
    const finish = (error?: Error) => {
      if (settled) return;
      settled = true;
      for (const [worker, onMessage] of listeners) {
        worker.off('message', onMessage).off('error', onError).off('exit', onExit);
      }
      if (error) {
        endThreads(workers);
        reject(error);
      } else {
        keepThreads(workers);
        resolve(out);
      }
    };
    const taskDone = (runsDone: number) => {
      doneRuns += runsDone;
      finishedTasks++;
      onProgress?.(doneRuns, runs);
      if (finishedTasks === taskCount) finish();
    };
    // This thread takes the next task between the workers' replies, one at a time, until none is left.
    const solveNextHere = () => {
      if (settled || nextTask >= taskCount) return;
      const id = nextTask++;
      const start = id * chunk;
      const count = Math.min(chunk, runs - start);
      try {
        for (let r = start; r < start + count; r++) solveRun(job, context, values, firstRun, r, out);
      } catch (error) {
        finish(error instanceof Error ? error : new Error(String(error)));
        return;
      }
      taskDone(count);
      setImmediate(solveNextHere);
    };
    const send = (worker: Worker) => {
      if (nextTask >= taskCount) return;
      const id = nextTask++;
      const start = id * chunk;
      const count = Math.min(chunk, runs - start);
      const task: TaskMessage = {
        kind: 'task',
        id,
        firstRun: firstRun + start,
        runCount: count,
        values: values.slice(start * width, (start + count) * width),
      };
      worker.postMessage(task, [task.values.buffer as ArrayBuffer]);
    };
    for (const worker of workers) {
      const onMessage = (reply: WorkerReply) => {
        if (reply.out === undefined) {
          finish(
            reply.inputError
              ? new InputError(reply.errorMessage ?? 'sweep run failed')
              : new Error(`sweep worker: ${reply.error}`),
          );
          return;
        }
        out.set(reply.out, reply.id * chunk * resultWidth);
        taskDone(reply.out.length / resultWidth);
        if (!settled) send(worker);
      };
      listeners.set(worker, onMessage);
      worker.on('message', onMessage).on('error', onError).on('exit', onExit);
      worker.postMessage(contextMessage);
      send(worker);
      send(worker);
    }
    if (solveHereToo) setImmediate(solveNextHere);
  });
}
