// Clean-up on Ctrl-C (SIGINT) and SIGTERM: whatever a command has to undo (temporary files, a hidden terminal
// cursor) registers here, runs once when the signal arrives, and the process then ends by the same signal, as
// POSIX shells expect (exit status 128 + signal number).

type CleanUp = () => void;

const pending = new Set<CleanUp>();
const SIGNALS = ['SIGINT', 'SIGTERM'] as const;
let installed = false;

function onSignal(signal: NodeJS.Signals): void {
  for (const cleanUp of [...pending].reverse()) {
    try {
      cleanUp();
    } catch {
      // One failed clean-up must not stop the others; the process is ending anyway.
    }
  }
  pending.clear();
  uninstall();
  process.kill(process.pid, signal);
}

function uninstall(): void {
  if (!installed) return;
  for (const signal of SIGNALS) process.removeListener(signal, onSignal);
  installed = false;
}

/**
 * Runs `cleanUp` if the process is interrupted before the returned function is called. From the first
 * registration on, the signal is handled by Node's event loop rather than ending the process at once, so
 * synchronous work in progress (writing an output set) finishes or rolls back before the clean-up runs.
 */
export function onInterrupt(cleanUp: CleanUp): () => void {
  pending.add(cleanUp);
  if (!installed) {
    for (const signal of SIGNALS) process.on(signal, onSignal);
    installed = true;
  }
  // The handler stays once installed: with nothing to clean it only ends the process by the signal, and a
  // signal that arrived during synchronous work is still waiting in the event loop when that work is done.
  return () => {
    pending.delete(cleanUp);
  };
}
