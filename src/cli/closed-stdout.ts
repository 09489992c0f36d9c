// A reader that closes stdout early (`reflap simulate --out - | head -1`) has taken what it wanted: the command
// ends quietly with exit 0, as the usual Unix tools do, instead of a stack trace from the broken pipe.

let installed = false;

/** Ends the process with exit code 0 when stdout's reader goes away (EPIPE); other stream errors are rethrown. */
export function endQuietlyOnClosedStdout(): void {
  if (installed) return;
  installed = true;
  process.stdout.on('error', (error: NodeJS.ErrnoException) => {
    if (error.code === 'EPIPE' || error.code === 'ERR_STREAM_DESTROYED') process.exit(0);
    throw error;
  });
}
