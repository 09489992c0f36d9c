// `reflap corners`: the track's corners (number, name, entry, apex, exit, radius, direction) and sectors, and
// a corners file to edit and pass back to any command with --corners.

import type { Command } from 'commander';
import { addTrackOptions, inputFilesOf, loadTrack, type TrackOptionValues } from '../options.js';
import { cornerLayoutOf } from '../../track/corner-layout.js';
import { cornersFileJson, cornersText } from '../../report/corners-file.js';
import { outputBatch } from '../output.js';
import { addUnitsOption, unitsOf, type UnitsOptionValues } from '../units-option.js';

interface CornersValues extends TrackOptionValues, UnitsOptionValues {
  out?: string;
  json?: boolean;
}

export function register(program: Command): void {
  const command = program
    .command('corners')
    .description("list a track's corners and sectors, and write a corners file to edit (--corners on any command)");
  addTrackOptions(command);
  command
    .option('--out <file>', 'write the corners file (JSON) to edit: rename, merge, split, add markers and sectors')
    .option('--json', 'print the corners file instead of the table');
  addUnitsOption(command).action((values: CornersValues) => runCorners(values));
}

export function runCorners(values: CornersValues): void {
  const units = unitsOf(values);
  const track = loadTrack(values);
  const layout = cornerLayoutOf(track);
  const file = JSON.stringify(cornersFileJson(track, layout), null, 2) + '\n';
  const outputs = outputBatch(inputFilesOf(values));
  if (values.out) outputs.add(values.out, file);
  outputs.commit();
  if (values.json) process.stdout.write(file);
  else {
    process.stdout.write(cornersText(track, layout, units));
    if (values.out) process.stdout.write(`Corners file written to ${values.out}\n`);
  }
}
