import type { PoolContext, PoolJob } from '../../src/sweep/pool.js';

export declare const lateCrashJob: PoolJob<PoolContext>;
