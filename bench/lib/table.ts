/** Prints rows as left-aligned columns two spaces apart; the first row is the header. */
export function printTable(rows: string[][]): void {
  const widths = rows[0].map((_, i) => Math.max(...rows.map((row) => row[i].length)));
  for (const row of rows) process.stdout.write(row.map((c, i) => c.padEnd(widths[i])).join('  ') + '\n');
}
