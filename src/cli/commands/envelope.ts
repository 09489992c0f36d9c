// `reflap envelope`: the g-g-v envelope a driver has already demonstrated in a logged session, as JSON that
// `simulate --envelope` and `compare --envelope` use in place of the car model's. A GPS-only log gets its
// accelerations from the same derivation `compare` uses; with --car, the car model fills speed bands or directions
// the log is thin in; without it, a direction with too few samples is an error that says to give the car.

import type { Command } from 'commander';
import { InputError } from '../../errors.js';
import { inputFilesOf, loadCar, type CarOptionValues } from '../options.js';
import { writeFileAtomic } from '../output.js';
import { loadSession, type TelemetryOptionValues } from '../telemetry-options.js';
import { fitEnvelope, EnvelopeFitError, type DemonstratedEnvelopeRecord } from '../../compare/envelope-fit.js';
import { deriveSessionAccelerations, derivationNote } from '../../compare/derive-session.js';
import { buildEnvelope } from '../../car/build-envelope.js';
import { Option } from 'commander';
import { addUnitsOption, unitsOf, type UnitsOptionValues } from '../units-option.js';
import { envelopeJson, envelopeText } from '../../report/envelope-text.js';
import { sessionSamples } from '../../compare/envelope-samples.js';
import type { Note } from '../../note.js';
import { noteText } from '../../report/note-text.js';

interface EnvelopeValues
  extends Pick<TelemetryOptionValues, 'telemetry' | 'telemetryColumns'>, Partial<CarOptionValues>, UnitsOptionValues {
  out?: string;
  json?: boolean;
}

export function register(program: Command): void {
  const command = program
    .command('envelope')
    .description(
      'fit the g-g-v envelope the driver has demonstrated in a logged session (per speed band, 98th percentile by direction)',
    )
    .requiredOption(
      '--telemetry <file>',
      'driver log: speed and both accelerations, or GPS positions (and speed) from which they are derived',
    )
    .option('--telemetry-columns <map>', 'read other column names in the log, e.g. ax_g=LongAcc,ay_g=LatAcc')
    .option('--car <file>', "car file (JSON): its model's limits fill speed bands and directions the log is thin in")
    .option('--air-temp-c <c>', 'air temperature for the car model, °C (default 15, ISA sea level)')
    .option('--pressure-hpa <p>', 'air pressure for the car model, hPa (default 1013.25, ISA sea level)')
    .addOption(
      new Option('--model <kind>', "vehicle model for the car's envelope (default: the car file's)").choices([
        'point-mass',
        'bicycle',
      ]),
    )
    .option('--out <file>', 'write the envelope as JSON for simulate --envelope and compare --envelope')
    .option('--json', 'print the envelope as JSON instead of the table');
  addUnitsOption(command).action((values: EnvelopeValues) => runEnvelope(values));
}

export async function runEnvelope(values: EnvelopeValues): Promise<void> {
  const logged = await loadSession(values);
  const carModel = values.car
    ? (() => {
        const { car, ambient } = loadCar(values as CarOptionValues);
        return buildEnvelope(car, ambient);
      })()
    : null;
  const derivation = deriveSessionAccelerations(logged);
  const session = derivation.session;
  const notes: Note[] = [];
  if (derivation.quality) {
    notes.push(derivationNote(derivation.quality, derivation.derived));
    if (derivation.quality.problems.length > 0)
      throw new InputError(
        `${session.source}: the derived accelerations cannot be trusted: ${derivation.quality.problems.join('; ')}`,
      );
  }
  let record: DemonstratedEnvelopeRecord;
  try {
    record = fitEnvelope(sessionSamples(session), session.source, undefined, carModel);
  } catch (error) {
    if (error instanceof EnvelopeFitError) throw new InputError(`${session.source}: ${error.message}`);
    throw error;
  }
  const units = unitsOf(values);
  const json = envelopeJson(record);
  if (values.out) writeFileAtomic(values.out, json, inputFilesOf(values));
  if (values.json) process.stdout.write(json);
  else
    process.stdout.write(
      envelopeText(record, units, notes) + (values.out ? `Envelope written to ${values.out}\n` : ''),
    );
  if (values.json) for (const note of notes) process.stderr.write(`Note: ${noteText(note)}\n`);
}
