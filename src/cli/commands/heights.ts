// `reflap heights`: a track's height profile from a log's GPS altitudes (GPX ele, NMEA GGA), smoothed, written as a
// centreline CSV with a z_m column that every command reads, with a note on its accuracy.

import type { Command } from 'commander';
import { InputError } from '../../errors.js';
import { addTrackOptions, inputFilesOf, loadTrack, numberOption, type TrackOptionValues } from '../options.js';
import { loadSession } from '../telemetry-options.js';
import { outputBatch } from '../output.js';
import { placeSession, MATCH_LIMIT_M } from '../../compare/place-session.js';
import { DEFAULT_HEIGHT_SMOOTHING_M, heightProfile } from '../../track/height-profile.js';
import type { TrackGrid } from '../../track/types.js';
import { heightsText } from '../../report/heights-text.js';
import { addUnitsOption, unitsOf, type UnitsOptionValues } from '../units-option.js';

interface HeightsValues extends TrackOptionValues, UnitsOptionValues {
  telemetry: string;
  telemetryColumns?: string;
  out: string;
  heightSmoothingM?: string;
}

export function register(program: Command): void {
  const command = program
    .command('heights')
    .description("build a track's height profile from a log's GPS altitudes and write the track with it (z_m)");
  addTrackOptions(command);
  command
    .requiredOption('--telemetry <file>', 'log with altitudes: GPX 1.1 with <ele>, or NMEA 0183 with GGA sentences')
    .option('--telemetry-columns <map>', 'read other column names in the log, e.g. speed_kph=GPS Speed,time_s=Time')
    .requiredOption('--out <file>', 'centreline CSV to write: x_m, y_m, the widths where the track has them, z_m')
    .option(
      '--height-smoothing-m <m>',
      `shortest wavelength of the height profile that is kept at half its size, m (default ${DEFAULT_HEIGHT_SMOOTHING_M})`,
    );
  addUnitsOption(command);
  command.action((values: HeightsValues) => runHeights(values));
}

export async function runHeights(values: HeightsValues): Promise<void> {
  const units = unitsOf(values);
  const smoothingM = numberOption(values.heightSmoothingM, '--height-smoothing-m', DEFAULT_HEIGHT_SMOOTHING_M);
  if (!(smoothingM >= 10 && smoothingM <= 2000))
    throw new InputError(`option --height-smoothing-m: ${smoothingM} is outside 10 to 2000 m`);
  const track = loadTrack(values);
  const session = await loadSession(values);
  const altitudeM = session.altitudeM;
  if (!altitudeM)
    throw new InputError(
      `${values.telemetry}: the log has no altitudes (GPX <ele> or NMEA GGA altitude); nothing written`,
    );
  const placed = placeSession(session, track);
  if (!placed)
    throw new InputError(`${values.telemetry}: the log's positions do not lie on track ${track.name}; nothing written`);
  const n = track.distanceM.length;
  const lengthM = track.closed ? track.lengthM : track.distanceM[n - 1]!;
  const along = new Float64Array(session.count);
  const lapOf = new Int32Array(session.count);
  const height = new Float64Array(session.count);
  for (let i = 0; i < session.count; i++) {
    const progress = placed.progressM[i]!;
    // Fixes away from the track (pit lane, paddock) say nothing about its height.
    const onTrack = placed.gapM[i]! <= MATCH_LIMIT_M && Number.isFinite(progress);
    height[i] = onTrack ? altitudeM[i]! : NaN;
    along[i] = track.closed ? progress - lengthM * Math.floor(progress / lengthM) : progress;
    lapOf[i] = track.closed ? Math.floor(progress / lengthM) : 0;
  }
  const profile = heightProfile(track, along, height, lapOf, smoothingM);
  if (profile.fixes < 10)
    throw new InputError(
      `${values.telemetry}: only ${profile.fixes} fixes with an altitude on the track; nothing written`,
    );
  const outputs = outputBatch(inputFilesOf(values));
  outputs.add(values.out, trackCsv(track, profile.zM));
  outputs.commit();
  process.stdout.write(heightsText(track, profile, values.out, units));
}

function trackCsv(track: TrackGrid, zM: Float64Array): string {
  const widths = track.widthLeftM && track.widthRightM;
  const lines = [widths ? 'x_m,y_m,width_left_m,width_right_m,z_m' : 'x_m,y_m,z_m'];
  for (let j = 0; j < track.distanceM.length; j++) {
    const cells = [track.xM[j]!.toFixed(3), track.yM[j]!.toFixed(3)];
    if (widths) cells.push(track.widthLeftM![j]!.toFixed(3), track.widthRightM![j]!.toFixed(3));
    cells.push(zM[j]!.toFixed(3));
    lines.push(cells.join(','));
  }
  return lines.join('\n') + '\n';
}
