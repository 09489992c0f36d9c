// `reflap check FILE...`: tells what each file is, validates it, and lists every problem found in it.
// Exit code 0 when every file is fine, 2 when any has a problem (the list goes to stdout, a summary to stderr).

import type { Command } from 'commander';
import { InputError } from '../../errors.js';
import { checkFiles, type CheckReport } from '../../check/check-files.js';
import { KIND_LABELS } from '../../check/detect-kind.js';

export function register(program: Command): void {
  program
    .command('check')
    .description('validate car, track and telemetry files and list every problem found')
    .argument('<files...>', 'files to check (kind told from the name and the content)')
    .option('--json', 'print the report as one JSON object')
    .action(async (files: string[], values: { json?: boolean }) => runCheck(files, values));
}

export function formatCheckReport(report: CheckReport): string {
  const lines: string[] = [];
  for (const check of report.files) {
    if (check.problems.length === 0) lines.push(`${check.file}: ok (${check.summary ?? KIND_LABELS[check.kind]})`);
    else
      lines.push(
        `${check.file}: ${check.problems.length} problem${check.problems.length > 1 ? 's' : ''} (${KIND_LABELS[check.kind]})`,
      );
    for (const problem of check.problems) lines.push(`  ${problem}`);
    for (const note of check.notes) lines.push(`  note: ${note}`);
  }
  return lines.join('\n') + '\n';
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
