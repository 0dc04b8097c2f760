/** CSV as spreadsheets read it (RFC 4180): comma-separated, CRLF rows, quoted where needed. */

export type CsvCell = string | number | boolean | null | undefined;

/**
 * One cell: quoted when it holds a comma, quote, CR or LF (quotes doubled). Cells starting
 * with = + - @ get a leading apostrophe so a spreadsheet never runs them as a formula.
 */
export function csvCell(value: CsvCell): string {
  if (value === null || value === undefined) return '';
  let s = String(value);
  if (typeof value === 'string' && /^[=+\-@\t\r]/.test(s)) s = `'${s}`;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** A whole document: header row then rows, CRLF line ends and a final CRLF. */
export function toCsv(header: readonly string[], rows: readonly (readonly CsvCell[])[]): string {
  return [header, ...rows].map((r) => r.map(csvCell).join(',')).join('\r\n') + '\r\n';
}
