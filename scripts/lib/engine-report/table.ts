/** Plain-text tables for a terminal: the first column left-aligned (ids), the others right-aligned (numbers). */
export function formatTable(header: ReadonlyArray<string>, rows: ReadonlyArray<ReadonlyArray<string>>, indent = "  "): string[] {
  const widths = header.map((h, c) => Math.max(h.length, ...rows.map((r) => r[c].length)));
  const line = (cells: ReadonlyArray<string>) =>
    indent +
    cells
      .map((cell, c) => (c === 0 ? cell.padEnd(widths[c]) : cell.padStart(widths[c])))
      .join("   ")
      .trimEnd();
  return [line(header), ...rows.map(line)];
}
