// The CSV parser and the schema library, loaded on first use through their CommonJS builds: a command that reads
// no CSV (no JSON file) never loads them, and on Node 20 the CommonJS build loads in about half the time of its ES
// module entry (csv-parse about 10 against 20 ms here). ml-matrix is loaded the same way by
// numeric/matrix-library.ts.

import { existsSync } from 'node:fs';
import Module, { createRequire } from 'node:module';
import path from 'node:path';
import type * as CsvParseStream from 'csv-parse';
import type * as CsvParseSync from 'csv-parse/sync';
import type * as ZodModule from 'zod';

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

export type Zod = typeof ZodModule.z;
let zod: Zod | undefined;

/**
 * zod's `z`, with English messages only. Every zod entry loads the messages of all its fifty-odd languages (about
 * half of its load time); reflap speaks English, so the list of languages is given zod's English alone before zod
 * asks for it. Where zod's files are laid out otherwise (another version), zod loads as it is.
 */
export function zodLibrary(): Zod {
  if (!zod) {
    const languages = path.join(path.dirname(require.resolve('zod/package.json')), 'v4', 'locales');
    const list = path.join(languages, 'index.cjs');
    const english = path.join(languages, 'en.cjs');
    if (!(list in require.cache) && existsSync(list) && existsSync(english)) {
      const englishOnly = new Module(list);
      englishOnly.filename = list;
      englishOnly.loaded = true;
      englishOnly.exports = { en: (require(english) as { default: unknown }).default };
      require.cache[list] = englishOnly;
    }
    zod = (require('zod') as typeof ZodModule).z;
  }
  return zod;
}
