// `reflap check FILE...`: tells what each file is, validates it, and lists every problem found in it.
// Exit code 0 when every file is fine, 2 when any has a problem (the list goes to stdout, a summary to stderr).

import type { Command } from 'commander';
import { InputError } from '../../errors.js';
import { checkFiles } from '../../check/check-files.js';
import { formatCheckReport } from '../../report/check-report-text.js';

export function register(program: Command): void {
  program
    .command('check')
    .description('validate car, track and telemetry files and list every problem found')
    .argument('<files...>', 'files to check (kind told from the name and the content)')
    .option('--json', 'print the report as one JSON object')
    .action(async (files: string[], values: { json?: boolean }) => runCheck(files, values));
}

export async function runCheck(files: string[], values: { json?: boolean }): Promise<void> {
  const report = await checkFiles(files);
  process.stdout.write(values.json ? JSON.stringify(report, null, 2) + '\n' : formatCheckReport(report));
  const bad = report.files.filter((check) => check.problems.length > 0).length;
  if (bad > 0)
    throw new InputError(
      `check: ${bad} of ${report.files.length} file${report.files.length > 1 ? 's have' : ' has'} problems`,
    );
}
