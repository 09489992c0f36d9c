// The option groups shared by every command that reads a track or a car, declared once so every command
// takes the same names, and the loaders that turn them into validated records.

import type { Command } from 'commander';
import { Option } from 'commander';
import { InputError } from '../errors.js';
import { readTrackFile } from '../io/read-track.js';
import type { TrackReadOptions } from '../io/track-read-options.js';
import { parseColumnMapping } from '../io/columns.js';
import { readCarFile } from '../io/read-car.js';
import { readCornersFile } from '../io/read-corners.js';
import { withCornerLayout } from '../track/corner-layout.js';
import { ambientFrom } from '../car/ambient.js';
import type { Ambient, Car, CarModelKind } from '../car/types.js';
import type { TrackGrid } from '../track/types.js';
import { kphToMps } from '../units.js';

export interface TrackOptionValues {
  track: string;
  columns?: string;
  stepM?: string;
  widthM?: string;
  startSpeedKph?: string;
  layout?: string;
  smoothingM?: string;
  corners?: string;
}

export interface CarOptionValues {
  car: string;
  airTempC?: string;
  pressureHpa?: string;
  model?: string;
}

/** Parses a number given on the command line; names the option when it is not one. */
export function numberOption(value: string | undefined, optionName: string, fallback: number): number;
export function numberOption(value: string | undefined, optionName: string, fallback: null): number | null;
export function numberOption(value: string | undefined, optionName: string, fallback: number | null): number | null {
  if (value === undefined) return fallback;
  const parsed = Number(value);
  if (value.trim() === '' || !Number.isFinite(parsed)) {
    throw new InputError(`option ${optionName}: '${value}' is not a number`);
  }
  return parsed;
}

export function addTrackOptions(command: Command): Command {
  return command
    .requiredOption('--track <file>', 'track file: centreline CSV or segment JSON')
    .option('--columns <map>', 'read other column names, e.g. width_left_m=w_tr_left_m,width_right_m=w_tr_right_m')
    .option('--step-m <m>', 'grid step along the track, m (default 1)')
    .option('--width-m <m>', 'track width where the file gives none, m (split evenly left and right)')
    .option('--start-speed-kph <v>', 'speed at the start of an open track, km/h (default 0)')
    .addOption(
      new Option('--layout <kind>', 'closed circuit or open stage (default: closed when the ends meet)').choices([
        'auto',
        'closed',
        'open',
      ]),
    )
    .option('--smoothing-m <m>', 'shortest wavelength kept by the centreline smoothing, m (default 30)')
    .option('--corners <file>', 'corners and sectors from this file (from `reflap corners --out`, edited)');
}

export function addCarOptions(command: Command): Command {
  return command
    .requiredOption('--car <file>', 'car file (JSON)')
    .option('--air-temp-c <c>', 'air temperature, °C (default 15, ISA sea level)')
    .option('--pressure-hpa <p>', 'air pressure, hPa (default 1013.25, ISA sea level)')
    .addOption(
      new Option('--model <kind>', "vehicle model for the envelope (default: the car file's, else point-mass)").choices(
        ['point-mass', 'bicycle'],
      ),
    );
}

export function trackReadOptions(values: TrackOptionValues): TrackReadOptions {
  const stepM = numberOption(values.stepM, '--step-m', 1);
  if (!(stepM > 0) || stepM > 50) throw new InputError(`option --step-m: ${stepM} is out of range (0 < step <= 50 m)`);
  const widthM = numberOption(values.widthM, '--width-m', null);
  if (widthM !== null && !(widthM > 0)) throw new InputError(`option --width-m: ${widthM} must be positive`);
  const smoothingM = numberOption(values.smoothingM, '--smoothing-m', null);
  if (smoothingM !== null && !(smoothingM >= 0))
    throw new InputError(`option --smoothing-m: ${smoothingM} must not be negative`);
  const layout = (values.layout ?? 'auto') as TrackReadOptions['layout'];
  return {
    stepM,
    columns: values.columns ? parseColumnMapping(values.columns, '--columns') : {},
    widthM,
    layout,
    smoothingM,
  };
}

export function loadTrack(values: TrackOptionValues): TrackGrid {
  const track = readTrackFile(values.track, trackReadOptions(values));
  return values.corners ? withCornerLayout(track, readCornersFile(values.corners, track)) : track;
}

export function startSpeedMps(values: TrackOptionValues): number {
  const startKph = numberOption(values.startSpeedKph, '--start-speed-kph', 0);
  if (!(startKph >= 0)) throw new InputError(`option --start-speed-kph: ${startKph} must not be negative`);
  return kphToMps(startKph);
}

export function ambientOptions(values: CarOptionValues): Ambient {
  const airTempC = numberOption(values.airTempC, '--air-temp-c', 15);
  const pressureHpa = numberOption(values.pressureHpa, '--pressure-hpa', 1013.25);
  if (!(airTempC > -60 && airTempC < 70))
    throw new InputError(`option --air-temp-c: ${airTempC} °C is outside -60 to 70 °C`);
  if (!(pressureHpa > 300 && pressureHpa < 1200))
    throw new InputError(`option --pressure-hpa: ${pressureHpa} hPa is outside 300 to 1200 hPa`);
  return ambientFrom({ airTempC, pressureHpa });
}

export function loadCar(values: CarOptionValues): { car: Car; ambient: Ambient } {
  const car = readCarFile(values.car);
  const model = values.model as CarModelKind | undefined;
  return { car: model ? { ...car, model } : car, ambient: ambientOptions(values) };
}

/** Input files a command reads, so an --out that names one of them can be refused. */
export function inputFilesOf(values: object): string[] {
  const files: string[] = [];
  const record = values as Record<string, unknown>;
  for (const key of ['track', 'car', 'telemetry', 'line', 'envelope', 'corners']) {
    const value = record[key];
    if (typeof value === 'string' && value !== 'auto') files.push(value);
  }
  return files;
}
