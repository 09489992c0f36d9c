// A demonstrated envelope for people: one row per speed band (samples, braking, accelerating, left and right in
// g), the top speed reached and how coasting was found, then the notes.

import type { DemonstratedEnvelopeRecord } from '../car/demonstrated-envelope.js';
import { formatTable } from './text-table.js';
import { mps2ToG } from '../units.js';
import { plainNumber, type DisplayUnits } from './units.js';
import { noteText } from './note-text.js';
import type { Note } from '../note.js';
import { roundedJson } from './json-numbers.js';

export function envelopeText(record: DemonstratedEnvelopeRecord, units: DisplayUnits, notes: Note[] = []): string {
  const rows = record.bands.map((band) => [
    plainNumber(units.speed(band.speedMps), 0),
    String(band.samples),
    plainNumber(mps2ToG(band.brakeMps2), 2),
    plainNumber(mps2ToG(band.accelMps2), 2),
    plainNumber(mps2ToG(band.leftMps2), 2),
    plainNumber(mps2ToG(band.rightMps2), 2),
  ]);
  return (
    [
      `Demonstrated envelope from ${record.source} (${(record.quantile * 100).toFixed(0)}th percentile in bands ${plainNumber(units.speed(record.bandWidthMps), 0)} ${units.speedLabel} apart, each weighing the samples up to the next band's speed)`,
      formatTable([`speed ${units.speedLabel}`, 'samples', 'braking g', 'accelerating g', 'left g', 'right g'], rows),
      `Top speed reached ${plainNumber(units.speed(record.topSpeedMps), 1)} ${units.speedLabel}; coasting ${record.coast.fitted ? 'fitted from the log' : 'assumed (the log has no coasting with pedal channels)'}.`,
      ...[...notes, ...(record.notes ?? [])].map((note) => `Note: ${noteText(note, units)}`),
    ].join('\n') + '\n'
  );
}

/** The envelope file (and `envelope --json`): the record with its numbers rounded and its notes in km/h and metres. */
export function envelopeJson(record: DemonstratedEnvelopeRecord): string {
  return roundedJson(record.notes ? { ...record, notes: record.notes.map((note) => noteText(note)) } : record);
}
