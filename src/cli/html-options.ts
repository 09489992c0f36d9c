// The report options every command that produces a lap shares: `--html FILE` for the self-contained page and
// `--svg DIR` for each chart as its own SVG file. The commands add the files to their output batch, so a
// failure anywhere leaves no half-written report behind.

import path from 'node:path';
import type { Command } from 'commander';
import type { OutputBatch } from './output.js';
import { chartSvgs, lapReportHtml, type ChartSvg } from '../report/html/page.js';
import type { ReportInput } from '../report/html/model.js';

export interface ReportOptionValues {
  html?: string;
  svg?: string;
}

export function addReportOptions(command: Command, page = 'the lap report: one HTML page with linked charts'): Command {
  return command
    .option('--html <file>', `write ${page} that opens from disk, no network`)
    .option('--svg <dir>', 'write each chart of the report as a standalone SVG file into this folder');
}

/** Adds the lap report's files to the batch and returns their paths, for the command's closing message. */
export function addReportOutputs(outputs: OutputBatch, values: ReportOptionValues, input: ReportInput): string[] {
  return addPageOutputs(outputs, values, { html: () => lapReportHtml(input), charts: () => chartSvgs(input) });
}

/** Adds any report page's files (built only when asked for) to the batch and returns their paths. */
export function addPageOutputs(
  outputs: OutputBatch,
  values: ReportOptionValues,
  page: { html: () => string; charts: () => ChartSvg[] },
): string[] {
  const files: string[] = [];
  if (values.html) {
    outputs.add(values.html, page.html());
    files.push(values.html);
  }
  if (values.svg) {
    for (const chart of page.charts()) {
      const file = path.join(values.svg, chart.name);
      outputs.add(file, chart.svg);
      files.push(file);
    }
  }
  return files;
}

export function reportWrittenText(files: string[]): string {
  if (files.length === 0) return '';
  const html = files.filter((file) => file.endsWith('.html'));
  const svgs = files.length - html.length;
  const parts = [
    ...html.map((file) => `Report written to ${file}`),
    ...(svgs ? [`${svgs} chart SVG files written to ${path.dirname(files[files.length - 1]!)}`] : []),
  ];
  return parts.join('\n') + '\n';
}
