// The CSV parser, loaded on first use through its CommonJS build: a command that reads no CSV never loads it, and
// on Node 20 the CommonJS build loads in about half the time of its ES module entry (about 10 against 20 ms here).
// ml-matrix is loaded the same way by numeric/matrix-library.ts.

import { createRequire } from 'node:module';
import type * as CsvParseStream from 'csv-parse';
import type * as CsvParseSync from 'csv-parse/sync';

const require = createRequire(import.meta.url);

let csvSync: typeof CsvParseSync | undefined;
let csvStream: typeof CsvParseStream | undefined;

/** csv-parse's whole-text parser. */
export function csvParseSync(): typeof CsvParseSync {
  return (csvSync ??= require('csv-parse/sync') as typeof CsvParseSync);
}

/** csv-parse's streaming parser. */
export function csvParseStream(): typeof CsvParseStream {
  return (csvStream ??= require('csv-parse') as typeof CsvParseStream);
}
