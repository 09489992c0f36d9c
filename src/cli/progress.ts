// A progress bar for long runs, on stderr only: shown when stderr is a terminal, the run has taken more
// than a second, the output is not --json and the environment is not CI (env CI set). Otherwise silent.

import cliProgress from 'cli-progress';
import { onInterrupt } from './interrupt.js';

export interface Progress {
  update(done: number, total: number): void;
  stop(): void;
}

export interface ProgressOptions {
  label: string;
  json?: boolean;
  /** Delay before the bar appears, ms (default 1000). */
  delayMs?: number;
  stream?: NodeJS.WriteStream;
  env?: NodeJS.ProcessEnv;
}

export function progressWanted(options: Pick<ProgressOptions, 'json' | 'stream' | 'env'>): boolean {
  const stream = options.stream ?? process.stderr;
  const env = options.env ?? process.env;
  return Boolean(stream.isTTY) && !options.json && !env.CI;
}

const SILENT: Progress = { update() {}, stop() {} };

export function createProgress(options: ProgressOptions): Progress {
  if (!progressWanted(options)) return SILENT;
  const stream = options.stream ?? process.stderr;
  const startedAt = Date.now();
  const delayMs = options.delayMs ?? 1000;
  let bar: cliProgress.SingleBar | null = null;
  // The bar hides the cursor while it draws; Ctrl-C must not leave the user's terminal without one.
  let release: (() => void) | null = null;
  return {
    update(done, total) {
      if (!bar) {
        if (Date.now() - startedAt < delayMs || done >= total) return;
        bar = new cliProgress.SingleBar(
          {
            stream,
            format: `${options.label} [{bar}] {value}/{total} runs, {eta_formatted} left`,
            hideCursor: true,
            clearOnComplete: true,
            etaBuffer: 50,
          },
          cliProgress.Presets.shades_classic,
        );
        bar.start(total, done);
        release = onInterrupt(() => stream.write('\u001b[?25h\n'));
        return;
      }
      bar.update(done);
    },
    stop() {
      bar?.stop();
      bar = null;
      release?.();
      release = null;
    },
  };
}
