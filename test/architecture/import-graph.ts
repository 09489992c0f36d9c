// The import graph of src/: every relative import, export-from and dynamic import of every .ts file, read with
// the TypeScript compiler's own pre-processor (ts.preProcessFile), so comments and strings are not mistaken for
// imports. Package imports (node:, npm) are not part of the layer order and are left out.

import ts from 'typescript';
import { readdirSync, readFileSync } from 'node:fs';
import { join, posix, relative, sep } from 'node:path';
import type { ImportEdge } from './layer-order.js';

export function sourceFiles(srcDir: string): string[] {
  const out: string[] = [];
  const walk = (dir: string) => {
    for (const entry of readdirSync(dir, { withFileTypes: true })) {
      const path = join(dir, entry.name);
      if (entry.isDirectory()) walk(path);
      else if (entry.name.endsWith('.ts')) out.push(relative(srcDir, path).split(sep).join('/'));
    }
  };
  walk(srcDir);
  return out.sort();
}

/** Relative imports of one file (path relative to src/, forward slashes) given its text. */
export function importsOf(file: string, text: string): ImportEdge[] {
  const info = ts.preProcessFile(text, true, true);
  const edges: ImportEdge[] = [];
  for (const imported of info.importedFiles) {
    const specifier = imported.fileName;
    if (!specifier.startsWith('.')) continue;
    const to = posix.normalize(posix.join(posix.dirname(file), specifier)).replace(/\.js$/, '.ts');
    edges.push({ from: file, to });
  }
  return edges;
}

export function importGraph(srcDir: string): { files: string[]; edges: ImportEdge[] } {
  const files = sourceFiles(srcDir);
  const edges = files.flatMap((file) => importsOf(file, readFileSync(join(srcDir, file), 'utf8')));
  return { files, edges };
}
