// The schema library loads on first use with English messages only, and no module of the program imports it
// any other way (a static import would load zod's ES module build with all its languages on every start).

import { readdirSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { zodLibrary } from '../../src/io/lazy-libraries.js';

const srcRoot = fileURLToPath(new URL('../../src', import.meta.url));

function sourceFiles(folder: string): string[] {
  return readdirSync(folder, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(folder, entry.name);
    return entry.isDirectory() ? sourceFiles(full) : entry.name.endsWith('.ts') ? [full] : [];
  });
}

describe('zod on first use', () => {
  it('validates with English messages and leaves the other languages unloaded', () => {
    const z = zodLibrary();
    const result = z.number().positive().safeParse(-1);
    expect(result.success).toBe(false);
    // zod 4's English wording for a number under its bound (its locales/en.ts, the library's own text).
    expect(result.error?.issues[0]?.message).toBe('Too small: expected number to be >0');
    const require = createRequire(import.meta.url);
    const languages = path.join(path.dirname(require.resolve('zod/package.json')), 'v4', 'locales');
    const loaded = Object.keys(require.cache).filter((file) => file.startsWith(languages + path.sep));
    // The English messages and the one-language list in their place; German, say, never loads.
    expect(loaded).not.toContain(path.join(languages, 'de.cjs'));
    expect(loaded).toContain(path.join(languages, 'en.cjs'));
    expect(zodLibrary()).toBe(z);
  });

  it('is the only way the program reaches zod at run time (type imports aside)', () => {
    const offenders = sourceFiles(srcRoot).filter((file) => {
      if (file.endsWith(path.join('io', 'lazy-libraries.ts'))) return false;
      return /^import\s+(?!type\b)[^;]*from\s+'zod(\/[^']*)?';/m.test(readFileSync(file, 'utf8'));
    });
    expect(offenders).toEqual([]);
  });
});
