// A batch of outputs lands whole or not at all: a failure while writing any file leaves none of them.

import { describe, expect, it } from 'vitest';
import { existsSync, mkdtempSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { outputBatch } from '../../src/cli/output.js';

describe('outputBatch', () => {
  it('writes no file when a later one cannot be written', () => {
    const folder = mkdtempSync(join(tmpdir(), 'reflap-output-'));
    const notAFolder = join(folder, 'plain-file');
    writeFileSync(notAFolder, 'x');
    const batch = outputBatch();
    batch.add(join(folder, 'first.csv'), 'a,b\n');
    // Its folder would have to be made inside a plain file: the write fails.
    batch.add(join(notAFolder, 'second.csv'), 'c,d\n');
    expect(() => batch.commit()).toThrow();
    expect(existsSync(join(folder, 'first.csv'))).toBe(false);
    expect(readdirSync(folder)).toEqual(['plain-file']);
  });

  it('writes every file when all can be written', () => {
    const folder = mkdtempSync(join(tmpdir(), 'reflap-output-'));
    const batch = outputBatch();
    batch.add(join(folder, 'a.csv'), '1\n');
    batch.add(join(folder, 'sub', 'b.html'), '<p>2</p>\n');
    batch.commit();
    expect(readdirSync(folder).sort()).toEqual(['a.csv', 'sub']);
    expect(existsSync(join(folder, 'sub', 'b.html'))).toBe(true);
  });
});
