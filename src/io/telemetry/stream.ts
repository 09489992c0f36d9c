// The streamed telemetry reader: a CSV log of any size read in chunks of at most CHUNK_ROWS rows, in SI units,
// through the same row pipeline as the session reader, with memory that does not grow with the file. Units
// that only the whole log can decide (no unit in the header, the GPS plane's origin) take one pass more; a
// column with a gap longer than the chunks held takes a scan that notes where its long gaps close.

import { InputError } from '../../errors.js';
import { CHUNK_ROWS, type TelemetryChunk, type TelemetryStreamSummary } from './chunk.js';
import {
  addPressures,
  brakePressureNote,
  FULL_BRAKING_QUANTILE,
  histogramQuantilePa,
  pressureHistogram,
  shareOfPressure,
  type PressureHistogram,
} from './brake-pressure.js';
import { feedCsvFile, sniffDialect, type CsvDialect } from './csv.js';
import { readTelemetryHead, sniffTelemetryFormat } from './format.js';
import type { ChunkSink } from './chunk-delivery.js';
import type { ColumnScan } from './gap-fill.js';
import { HeldTooLong, RowPipeline, type PipelineResult } from './pipeline.js';
import { composeNotes } from './read-notes.js';
import { UnitEvidence, type ChannelLayout, type DecidedUnits } from './units-from-data.js';

/** Chunks held back for an open gap before the reader scans the file for its long gaps (16 x 8,192 rows). */
const MAX_HELD_CHUNKS = 16;

export interface TelemetryStreamOptions {
  /** Canonical channel name (time_s, speed_kph, ...) -> the file's header. */
  columns: Record<string, string>;
}

class Reader {
  private scan: ColumnScan | null = null;

  constructor(
    private readonly file: string,
    private readonly dialect: CsvDialect,
    private readonly mapping: Record<string, string>,
  ) {}

  private async pass(
    mode: 'read' | 'scan',
    decided: DecidedUnits | null,
    sink: ChunkSink,
    skipRows: number,
  ): Promise<PipelineResult> {
    const pipeline = new RowPipeline({
      source: this.file,
      headerLine: this.dialect.headerLine,
      logger: this.dialect.logger,
      decimalComma: this.dialect.decimalComma,
      mapping: this.mapping,
      decided,
      scan: this.scan,
      mode,
      maxHeldChunks: MAX_HELD_CHUNKS,
      skipRows,
      sink,
    });
    await feedCsvFile(this.file, this.dialect, pipeline);
    return pipeline.finish();
  }

  /** One reading pass; when a gap holds too many rows, scans the file once and reads on from where it was. */
  async read(decided: DecidedUnits | null, sink: ChunkSink): Promise<PipelineResult> {
    let delivered = 0;
    const counting: ChunkSink = (chunk, layout) => {
      sink(chunk, layout);
      delivered = chunk.firstRow + chunk.rows;
    };
    for (;;) {
      try {
        return await this.pass('read', decided, counting, delivered);
      } catch (error) {
        if (!(error instanceof HeldTooLong) || this.scan !== null) throw error;
        this.scan = (await this.pass('scan', null, () => {}, 0)).scan;
      }
    }
  }
}

/**
 * Reads a telemetry CSV in chunks: `onChunk` gets every row once, in order, in SI units (arrays reused after it
 * returns). Column detection, units, gap filling and every check are the session reader's (readTelemetryFile);
 * on a bad row the promise rejects with the same one-line message, after the chunks before it have gone out.
 */
export async function streamTelemetryCsv(
  file: string,
  options: TelemetryStreamOptions,
  onChunk: (chunk: TelemetryChunk) => void,
): Promise<TelemetryStreamSummary> {
  const head = await readTelemetryHead(file);
  const format = sniffTelemetryFormat(head, file);
  if (format !== 'csv')
    throw new InputError(`${file}: a ${format === 'gpx' ? 'GPX' : 'NMEA 0183'} log; only CSV logs are read in chunks`);
  const reader = new Reader(file, sniffDialect(head, file), options.columns);
  let pressureNote: string | null = null;
  let evidence: UnitEvidence | null = null;
  // A pressure column without a pedal gives the pedal share of the session's high quantile, which only the whole
  // log decides: it is gathered in one pass more, as units are.
  let pressure: PressureHistogram | null = null;
  const pressureOnly = (layout: ChannelLayout) =>
    layout.channels.includes('brakePressurePa') && !layout.channels.includes('brake');
  let result = await reader.read(null, (chunk, layout) => {
    if (pressureOnly(layout)) addPressures((pressure ??= pressureHistogram()), chunk.brakePressurePa!);
    if (layout.pending.length > 0) (evidence ??= new UnitEvidence(layout)).add(chunk);
    else if (pressure === null) onChunk(chunk);
  });
  let decided: DecidedUnits | null = null;
  if (evidence !== null || pressure !== null) {
    // Some unit or the full-braking pressure had to come from the whole log: read it again with them decided.
    if (evidence !== null) decided = (evidence as UnitEvidence).decide();
    const fullPa = pressure !== null ? histogramQuantilePa(pressure, FULL_BRAKING_QUANTILE) : 0;
    const share = new Float64Array(CHUNK_ROWS);
    result = await reader.read(decided, (chunk) =>
      onChunk(
        pressure === null
          ? chunk
          : { ...chunk, brake: shareOfPressure(chunk.brakePressurePa!, fullPa, share.subarray(0, chunk.rows)) },
      ),
    );
    if (pressure !== null) {
      result.layout.channels.push('brake');
      pressureNote = brakePressureNote(result.layout.headers.brakePressurePa ?? 'brake pressure', fullPa);
    }
  }
  return {
    source: file,
    rows: result.rows,
    channels: result.layout.channels,
    startTimeS: result.startTimeS,
    endTimeS: result.endTimeS,
    geoOrigin: decided?.geoOrigin ?? null,
    notes: pressureNote === null ? composeNotes(result, decided) : [...composeNotes(result, decided), pressureNote],
  };
}
