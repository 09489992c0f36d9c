// The worker threads a process keeps for its pool: each is started once, lent to one job at a time and kept,
// unreferenced, between jobs, so a script that runs many sweeps pays Node's start and V8's compiling of the solver
// once per thread rather than once per sweep. Kept threads never hold the process open.

import { Worker } from 'node:worker_threads';

/** The job a new thread loads while it starts, before its context arrives (a module and its export's name). */
export interface JobModule {
  moduleUrl: string;
  exportName: string;
}

/** Each run allocates its traces afresh, and every page of young generation a thread grows into is a page fault (about
 * 10 us each on this virtual machine). 3,000 uncertainty draws of the real kart lap on two workers: 16 MB took 60k
 * faults and 1.91 s, 64 MB 85k and 2.02 s, V8's default 67k; sweeps of 1,000 and 10,000 setups timed the same. */
const WORKER_YOUNG_GENERATION_MB = 16;

const kept: Worker[] = [];
/** Threads that have solved runs: V8 has compiled the solver in them, so lending them again costs next to nothing. */
const solved = new WeakSet<Worker>();

function startThread(job: JobModule): Worker {
  const thread = new Worker(new URL('./worker.js', import.meta.url), {
    workerData: { moduleUrl: job.moduleUrl, exportName: job.exportName } satisfies JobModule,
    resourceLimits: { maxYoungGenerationSizeMb: WORKER_YOUNG_GENERATION_MB },
  });
  thread.on('exit', () => {
    const at = kept.indexOf(thread);
    if (at >= 0) kept.splice(at, 1);
  });
  // A thread that fails while it waits between jobs only exits (and is dropped above): an 'error' event nobody
  // listens to would be thrown in this thread. While lent, the job's own listener hears of it and fails the job.
  thread.on('error', () => {});
  return thread;
}

/** `count` threads for one job: kept ones first (those that have solved runs before the others), then new ones. */
export function lendThreads(count: number, job: JobModule): Worker[] {
  kept.sort((a, b) => Number(solved.has(b)) - Number(solved.has(a)));
  const lent = kept.splice(0, count);
  while (lent.length < count) lent.push(startThread(job));
  for (const thread of lent) thread.ref();
  return lent;
}

/** Takes threads back after a job that ended well; they wait unreferenced for the next job. */
export function keepThreads(threads: readonly Worker[]): void {
  for (const thread of threads) {
    solved.add(thread);
    thread.unref();
    kept.push(thread);
  }
}

/** Ends threads whose job failed: a thread stopped mid-task is not lent again. */
export function endThreads(threads: readonly Worker[]): void {
  for (const thread of threads) void thread.terminate();
}

/** Starts threads now, up to `count` kept in all, so that their start overlaps the caller's own work. */
export function startThreads(count: number, job: JobModule): void {
  for (let missing = count - kept.length; missing > 0; missing--) {
    const thread = startThread(job);
    thread.unref();
    kept.push(thread);
  }
}

/** How many kept threads have already solved runs. */
export function solvedThreadCount(): number {
  return kept.filter((thread) => solved.has(thread)).length;
}

/** Ends every kept thread (a long-lived script that is done with sweeps frees their memory). */
export async function stopWorkerThreads(): Promise<void> {
  await Promise.all(kept.splice(0).map((thread) => thread.terminate()));
}
