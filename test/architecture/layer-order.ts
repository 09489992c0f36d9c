// The layer order of src/, lowest first: the one place it is written (docs/architecture.md points here).
// A module may import from its own entry or from any entry on a lower floor; entries sharing a floor are
// independent of each other. An entry is a folder or a file under src/; the longest matching entry wins.

export const LAYERS: readonly (readonly string[])[] = [
  ['errors.ts', 'units.ts', 'bidi.ts', 'is-record.ts', 'note.ts'],
  ['numeric'],
  ['telemetry', 'track'],
  ['car'],
  ['solve'],
  ['line'],
  ['compare', 'sweep', 'demo'],
  ['calibrate'],
  ['uncertainty'],
  // The edges: readers below the checks that use them, then writers, then the command line.
  ['io'],
  ['check'],
  ['report'],
  ['cli'],
  ['cli/commands'],
  ['cli/main.ts'],
  ['index.ts'],
];

/** Commands stand alone: a file here imports no other file here. */
export const COMMAND_FOLDER = 'cli/commands';

export interface ImportEdge {
  /** Importing file, relative to src/ with forward slashes. */
  from: string;
  /** Imported file, relative to src/ with forward slashes. */
  to: string;
}

export interface Placement {
  entry: string;
  floor: number;
}

export function placementOf(file: string, layers: readonly (readonly string[])[] = LAYERS): Placement | null {
  let best: Placement | null = null;
  layers.forEach((entries, floor) => {
    for (const entry of entries) {
      const matches = file === entry || file.startsWith(`${entry}/`);
      if (matches && (best === null || entry.length > best.entry.length)) best = { entry, floor };
    }
  });
  return best;
}

/** One line per import that breaks the order, in the order of the edges. */
export function layerViolations(edges: readonly ImportEdge[], layers = LAYERS): string[] {
  const problems: string[] = [];
  for (const { from, to } of edges) {
    const a = placementOf(from, layers);
    const b = placementOf(to, layers);
    if (!a || !b) {
      problems.push(`${!a ? from : to} is in no layer (add it to test/architecture/layer-order.ts)`);
      continue;
    }
    if (a.entry === b.entry) {
      const inCommands = a.entry === COMMAND_FOLDER && from !== to;
      if (inCommands) problems.push(`${from} imports ${to}: a command imports another command`);
      continue;
    }
    if (b.floor > a.floor)
      problems.push(
        `${from} imports ${to}: ${a.entry} (floor ${a.floor}) imports up from ${b.entry} (floor ${b.floor})`,
      );
    else if (b.floor === a.floor)
      problems.push(`${from} imports ${to}: ${a.entry} and ${b.entry} share floor ${a.floor}`);
  }
  return problems;
}
