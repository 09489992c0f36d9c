import { describe, expect, it } from 'vitest';
import { createProgress, progressWanted } from '../../src/cli/progress.js';

/** A stand-in for stderr that records what is written; isTTY as asked. */
function fakeStream(isTTY: boolean) {
  const written: string[] = [];
  const stream = {
    isTTY,
    columns: 80,
    write(chunk: string) {
      written.push(String(chunk));
      return true;
    },
    cursorTo() {
      return true;
    },
    clearLine() {
      return true;
    },
    moveCursor() {
      return true;
    },
    on() {
      return stream;
    },
    removeListener() {
      return stream;
    },
  };
  return { stream: stream as unknown as NodeJS.WriteStream, written };
}

describe('progress bar', () => {
  it('shows only on a terminal, without --json and outside CI', () => {
    expect(progressWanted({ stream: fakeStream(true).stream, env: {} })).toBe(true);
    expect(progressWanted({ stream: fakeStream(false).stream, env: {} })).toBe(false);
    expect(progressWanted({ stream: fakeStream(true).stream, env: {}, json: true })).toBe(false);
    expect(progressWanted({ stream: fakeStream(true).stream, env: { CI: 'true' } })).toBe(false);
  });

  it('stays silent for runs shorter than the delay, and draws after it', async () => {
    const quick = fakeStream(true);
    const early = createProgress({ label: 'sweep', stream: quick.stream, env: {}, delayMs: 10_000 });
    early.update(5, 10);
    early.stop();
    expect(quick.written.join('')).toBe('');

    const slow = fakeStream(true);
    const late = createProgress({ label: 'sweep', stream: slow.stream, env: {}, delayMs: 20 });
    await new Promise((resolve) => setTimeout(resolve, 40));
    late.update(5, 10);
    late.update(6, 10);
    late.stop();
    expect(slow.written.join('')).toMatch(/sweep/);
  });
});
