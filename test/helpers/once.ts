// A value computed at its first use and kept for the file's run: a fixture several tests read, built inside the test
// that first asks for it, so a failure to build it fails that test.

/** FN's value, computed at the first call. */
export function once<T>(fn: () => T): () => T {
  let done = false;
  let value: T;
  return () => {
    if (!done) {
      value = fn();
      done = true;
    }
    return value;
  };
}
