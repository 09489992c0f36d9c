import type { PoolContext, PoolJob } from '../../src/sweep/pool.js';

export declare const spinningJob: PoolJob<PoolContext & { spinMs: number }>;
