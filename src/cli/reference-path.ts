// The `--line` option every reference-driving command shares: the minimum-time line by default where the track
// gives widths, `centreline`, or a line CSV; and how the choice is shown in the text and the JSON.

import type { Command } from 'commander';
import type { Ambient, Car } from '../car/types.js';
import type { Envelope } from '../car/envelope.js';
import type { TrackGrid } from '../track/types.js';
import { readLineFile } from '../io/read-line.js';
import { referenceLine, type ReferenceLine } from '../line/reference-line.js';

/** What `--line` is for on a command that drives one reference per setup (`shared`) or one reference. */
export function addLineOption(command: Command, shared = false): Command {
  return command.option(
    '--line <auto|centreline|file>',
    shared
      ? "path of the reference, computed once for the baseline car and held for every setup: 'auto' (default) the minimum-time line where the track gives widths, 'centreline', or a line CSV from `reflap line --out`"
      : "path of the reference: 'auto' (default) the minimum-time line where the track gives widths, 'centreline', or a line CSV from `reflap line --out`",
  );
}

/** Resolves `--line` into the reference's path (reading and checking a line CSV against the track). */
export function resolveReferenceLine(
  track: TrackGrid,
  car: Car,
  ambient: Ambient,
  value: string | undefined,
  options: { envelope?: Envelope; startSpeedMps?: number; marginM?: number } = {},
): ReferenceLine {
  const common = { ambient, ...options };
  if (value === undefined || value === 'auto')
    return referenceLine(track, car, { ...common, choice: 'auto', explicit: value === 'auto' });
  if (value === 'centreline') return referenceLine(track, car, { ...common, choice: 'centreline' });
  return referenceLine(track, car, { ...common, choice: { offsetM: readLineFile(value, track) } });
}

const KIND_TEXT = {
  line: 'the minimum-time racing line',
  centreline: 'the centreline',
  file: 'the line file',
} as const;

/** One line for the text output: which path the reference drove, whether every setup shares it, and any note. */
export function referencePathText(reference: ReferenceLine, shared = false): string {
  const held = shared && reference.kind !== 'centreline' ? " (the baseline car's, held for every setup)" : '';
  const lines = [`Reference path: ${KIND_TEXT[reference.kind]}${held}`];
  if (reference.note) lines.push(`Note: ${reference.note}`);
  return lines.join('\n') + '\n';
}

/** A summary with the reference-path line under its title line. */
export function withReferencePath(summary: string, reference: ReferenceLine, shared = false): string {
  const cut = summary.indexOf('\n') + 1;
  return summary.slice(0, cut) + referencePathText(reference, shared) + summary.slice(cut);
}

/** The JSON fields: `referencePath` always; `referencePathShared` on multi-setup commands; `referencePathNote`. */
export function referencePathJson(reference: ReferenceLine, shared?: boolean) {
  return {
    referencePath: reference.kind,
    ...(shared === undefined ? {} : { referencePathShared: shared && reference.kind !== 'centreline' }),
    ...(reference.note ? { referencePathNote: reference.note } : {}),
  };
}
