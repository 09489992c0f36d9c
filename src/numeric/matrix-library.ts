// ml-matrix, loaded on first use through its CommonJS build: the commands and checks that never invert a matrix
// never load it, and on Node 20 the CommonJS build loads in about a quarter of the time of its ES module entry
// (about 15 against 65 ms on the project's machine).

import { createRequire } from 'node:module';
import type * as MlMatrix from 'ml-matrix';

const require = createRequire(import.meta.url);
let library: typeof MlMatrix | undefined;

export function mlMatrix(): typeof MlMatrix {
  return (library ??= require('ml-matrix') as typeof MlMatrix);
}
