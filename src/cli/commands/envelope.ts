// `reflap envelope`: the g-g-v envelope a driver has already demonstrated in a logged session, as JSON that
// `simulate --envelope` and `compare --envelope` use in place of the car model's.

import type { Command } from 'commander';
import { InputError } from '../../errors.js';
import { inputFilesOf } from '../options.js';
import { writeFileAtomic } from '../output.js';
import { loadSession, type TelemetryOptionValues } from './telemetry-options.js';
import { fitEnvelope, EnvelopeFitError, type DemonstratedEnvelopeRecord } from '../../compare/envelope-fit.js';
import type { TelemetrySession } from '../../compare/types.js';
import { formatTable } from '../../report/text-table.js';
import { mpsToKph, mps2ToG } from '../../units.js';

interface EnvelopeValues extends Pick<TelemetryOptionValues, 'telemetry' | 'telemetryColumns'> {
  out?: string;
  json?: boolean;
}

export function register(program: Command): void {
  program
    .command('envelope')
    .description(
      'fit the g-g-v envelope the driver has demonstrated in a logged session (per speed band, 98th percentile by direction)',
    )
    .requiredOption('--telemetry <file>', 'driver log with speed and both accelerations (CSV), e.g. from a data logger')
    .option('--telemetry-columns <map>', 'read other column names in the log, e.g. ax_g=LongAcc,ay_g=LatAcc')
    .option('--out <file>', 'write the envelope as JSON (default: print it)')
    .option('--json', 'print the envelope JSON even when --out is given')
    .action((values: EnvelopeValues) => runEnvelope(values));
}

/** Samples of the session for the fit; the log must carry speed and both accelerations. */
export function sessionSamples(session: TelemetrySession) {
  const missing = [
    !session.speedMps && 'speed',
    !session.axMps2 && 'longitudinal acceleration',
    !session.ayMps2 && 'lateral acceleration',
  ].filter(Boolean);
  if (missing.length > 0) {
    throw new InputError(
      `${session.source}: fitting an envelope needs ${missing.join(', ')} channels; the log has none (map them with --telemetry-columns)`,
    );
  }
  return {
    speedMps: session.speedMps!,
    axMps2: session.axMps2!,
    ayMps2: session.ayMps2!,
    throttle: session.throttle,
    brake: session.brake,
  };
}

export function envelopeText(record: DemonstratedEnvelopeRecord): string {
  const rows = record.bands.map((band) => [
    mpsToKph(band.speedMps).toFixed(0),
    String(band.samples),
    mps2ToG(band.brakeMps2).toFixed(2),
    mps2ToG(band.accelMps2).toFixed(2),
    mps2ToG(band.leftMps2).toFixed(2),
    mps2ToG(band.rightMps2).toFixed(2),
  ]);
  return (
    [
      `Demonstrated envelope from ${record.source} (${(record.quantile * 100).toFixed(0)}th percentile per ${mpsToKph(record.bandWidthMps).toFixed(0)} km/h band, in g)`,
      formatTable(['km/h', 'samples', 'braking', 'accel', 'left', 'right'], rows),
      `Top speed reached ${mpsToKph(record.topSpeedMps).toFixed(1)} km/h; coasting ${record.coast.fitted ? 'fitted from the log' : 'assumed (the log has no coasting with pedal channels)'}.`,
    ].join('\n') + '\n'
  );
}

export async function runEnvelope(values: EnvelopeValues): Promise<void> {
  const session = await loadSession(values);
  let record: DemonstratedEnvelopeRecord;
  try {
    record = fitEnvelope(sessionSamples(session), session.source);
  } catch (error) {
    if (error instanceof EnvelopeFitError) throw new InputError(`${session.source}: ${error.message}`);
    throw error;
  }
  const json = JSON.stringify(record, null, 2) + '\n';
  if (values.out) writeFileAtomic(values.out, json, inputFilesOf(values));
  if (values.json || !values.out) process.stdout.write(json);
  else process.stdout.write(envelopeText(record) + `Envelope written to ${values.out}\n`);
}
