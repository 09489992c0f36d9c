// The streamed telemetry reader: a CSV log of any size read in chunks of at most CHUNK_ROWS rows, in SI units,
// through the same row pipeline as the session reader, with memory that does not grow with the file. Units
// that only the whole log can decide (no unit in the header, the GPS plane's origin) take one pass more; a
// column with a gap longer than the chunks held takes a scan that notes where its long gaps close.

import { InputError } from '../../errors.js';
import type { TelemetryChunk, TelemetryStreamSummary } from './chunk.js';
import { feedCsvFile, sniffDialect, type CsvDialect } from './csv.js';
import { readTelemetryHead, sniffTelemetryFormat } from './format.js';
import type { ChunkSink } from './chunk-delivery.js';
import type { ColumnScan } from './gap-fill.js';
import { HeldTooLong, RowPipeline, type PipelineResult } from './pipeline.js';
import { composeNotes } from './read-notes.js';
import { UnitEvidence, type DecidedUnits } from './units-from-data.js';

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
  let evidence: UnitEvidence | null = null;
  let result = await reader.read(null, (chunk, layout) => {
    if (layout.pending.length === 0) onChunk(chunk);
    else (evidence ??= new UnitEvidence(layout)).add(chunk);
  });
  let decided: DecidedUnits | null = null;
  if (evidence !== null) {
    // Some unit had to come from the whole log: read it again with the units decided.
    decided = (evidence as UnitEvidence).decide();
    result = await reader.read(decided, (chunk) => onChunk(chunk));
  }
  return {
    source: file,
    rows: result.rows,
    channels: result.layout.channels,
    startTimeS: result.startTimeS,
    endTimeS: result.endTimeS,
    geoOrigin: decided?.geoOrigin ?? null,
    notes: composeNotes(result, decided),
  };
}
