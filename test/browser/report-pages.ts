// The report pages the browser checks open, written into one folder for the run and each at most once: a page that
// two checks read (the demo's report, the reference lap, the lap against lap) is written by the first of them. A
// page is written when a check first asks for it, inside that check, so a failure to write it fails that check.

import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { expect } from 'vitest';
import { lapReportHtml } from '../../src/report/html/page.js';
import { againstInput, comparisonInput, referenceInput } from '../report/report-fixtures.js';
import { writeTestLoop } from '../report/sweep-fixtures.js';
import { runCli } from '../helpers/cli.js';
import { once } from '../helpers/once.js';

export interface ReportPages {
  folder: string;
  /** `reflap demo` run in the folder, as a user runs it: the report and the log it writes into out/. */
  demo: () => { report: string; log: string };
  /** The library's lap report of a reference lap alone, of a driver's lap against it, and of two laps against it. */
  referenceLap: () => string;
  driverLap: () => string;
  lapAgainstLap: () => string;
  /** The invented loop the sweep and what-if pages drive (a track file). */
  testLoop: () => string;
  /** Writes FILE.html with `reflap ARGS --html`, run from the project's root; the run must succeed. */
  cli: (name: string, args: string[]) => string;
  /** Writes HTML as NAME.html. */
  write: (name: string, html: string) => string;
  remove: () => void;
}

export function reportPages(): ReportPages {
  const folder = mkdtempSync(path.join(tmpdir(), 'reflap-pages-'));
  const write = (name: string, html: string) => {
    const file = path.join(folder, `${name}.html`);
    writeFileSync(file, html);
    return file;
  };
  const cli = (name: string, args: string[]) => {
    const file = path.join(folder, `${name}.html`);
    const run = runCli([...args, '--html', file]);
    expect(run.code, `reflap ${args[0]}: ${run.stderr}`).toBe(0);
    return file;
  };
  return {
    folder,
    demo: once(() => {
      const run = runCli(['demo'], { cwd: folder });
      expect(run.code, run.stderr).toBe(0);
      return { report: path.join(folder, 'out', 'report.html'), log: path.join(folder, 'out', 'demo-lap.csv') };
    }),
    referenceLap: once(() => write('reference-lap', lapReportHtml(referenceInput()))),
    driverLap: once(() => write('driver-lap', lapReportHtml(comparisonInput()))),
    lapAgainstLap: once(() => write('lap-against-lap', lapReportHtml(againstInput()))),
    testLoop: once(() => writeTestLoop(folder)),
    cli,
    write,
    remove: () => rmSync(folder, { recursive: true, force: true }),
  };
}
