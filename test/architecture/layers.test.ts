// Imports in src/ run one way, down the layers of ./layer-order.ts, and command files stand alone. The rule is
// the project's own (DEVELOPERS.md, docs/architecture.md); the checks below also show it failing on planted imports.

import { describe, expect, it } from 'vitest';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { projectRoot } from '../helpers/cli.js';
import { importGraph, importsOf } from './import-graph.js';
import { LAYERS, layerViolations, placementOf } from './layer-order.js';

const srcDir = join(projectRoot, 'src');
const graph = importGraph(srcDir);

describe('import direction', () => {
  it('reads the graph: every file has a layer and the library entry imports many of them', () => {
    // The index re-exports every family, so it must show up with many edges (a parser that found none would pass
    // everything below).
    const fromIndex = graph.edges.filter((edge) => edge.from === 'index.ts');
    expect(fromIndex.length).toBeGreaterThan(20);
    expect(graph.files.filter((file) => placementOf(file) === null)).toEqual([]);
  });

  it('has no import running back up the layers, and no command importing another', () => {
    expect(layerViolations(graph.edges)).toEqual([]);
  });

  it('names every layer entry only once and every entry exists in src/', () => {
    const entries = LAYERS.flat();
    expect(new Set(entries).size).toBe(entries.length);
    expect(entries.filter((entry) => !existsSync(join(srcDir, entry)))).toEqual([]);
  });

  it('fails on a planted back-import: the track layer importing the solver', () => {
    const planted = importsOf('track/planted.ts', "import { simulate } from '../solve/simulate.js';\n");
    expect(planted).toEqual([{ from: 'track/planted.ts', to: 'solve/simulate.ts' }]);
    const problems = layerViolations([...graph.edges, ...planted]);
    expect(problems).toHaveLength(1);
    expect(problems[0]).toContain('track/planted.ts imports solve/simulate.ts');
  });

  it('fails on a planted type-only and a dynamic back-import too', () => {
    const text = "import type { Car } from '../car/types.js';\nconst m = await import('../report/units.js');\n";
    const problems = layerViolations(importsOf('numeric/planted.ts', text));
    expect(problems).toHaveLength(2);
  });

  it('fails when a command imports another command, and when siblings on a floor import each other', () => {
    const command = importsOf('cli/commands/planted.ts', "import { register } from './simulate.js';\n");
    expect(layerViolations(command)).toEqual([
      'cli/commands/planted.ts imports cli/commands/simulate.ts: a command imports another command',
    ]);
    const sibling = importsOf('compare/planted.ts', "export { runSweep } from '../sweep/run-sweep.js';\n");
    expect(layerViolations(sibling)[0]).toContain('share floor');
  });

  it('ignores package imports and comments that look like imports', () => {
    const text =
      "import { Command } from 'commander';\n// import { x } from '../cli/main.js';\nimport fs from 'node:fs';\n";
    expect(importsOf('track/planted.ts', text)).toEqual([]);
  });

  it('is listed the same, highest first, in docs/architecture.md', () => {
    const text = readFileSync(join(projectRoot, 'docs', 'architecture.md'), 'utf8');
    const block = /## Layers[\s\S]*?```text\n([\s\S]*?)```/.exec(text);
    expect(block).not.toBeNull();
    const floors = block![1]!
      .trim()
      .split('\n')
      .map((line) => line.split(' · ').map((entry) => entry.trim()));
    expect(floors.reverse()).toEqual(LAYERS.map((floor) => [...floor]));
  });
});
