// CSV for spreadsheets, safe against formula injection (OWASP "CSV injection"): a cell that a
// spreadsheet would read as a formula (= + - @, tab, carriage return) is prefixed with a quote.
const formulaStart = /^[=+\-@\t\r]/;

export function csvCell(value: unknown): string {
  let s = value === null || value === undefined ? "" : value instanceof Date ? value.toISOString() : typeof value === "object" ? JSON.stringify(value) : String(value);
  if (formulaStart.test(s)) s = `'${s}`;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function csvLine(cells: unknown[]): string {
  return cells.map(csvCell).join(",");
}

/** A whole CSV document: UTF-8 with a byte-order mark (so names in every script open correctly), CRLF lines. */
export function toCsv(header: string[], rows: unknown[][]): string {
  return `\uFEFF${[csvLine(header), ...rows.map(csvLine)].join("\r\n")}\r\n`;
}
