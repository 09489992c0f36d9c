// Fixed-width text tables for terminal summaries: first column left-aligned, numbers right-aligned.

export function formatTable(header: string[], rows: string[][]): string {
  const widths = header.map((title, column) =>
    Math.max(title.length, ...rows.map((row) => (row[column] ?? '').length)),
  );
  const render = (cells: string[]) =>
    cells
      .map((cell, column) => (column === 0 ? cell.padEnd(widths[column]!) : cell.padStart(widths[column]!)))
      .join('  ');
  return [render(header), widths.map((width) => '-'.repeat(width)).join('  '), ...rows.map(render)].join('\n');
}
