// The check report for people: per file, ok with what it is, or the number of problems, each problem and note
// on its own line.

import type { CheckReport } from '../check/check-files.js';
import { KIND_LABELS } from '../check/detect-kind.js';

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
