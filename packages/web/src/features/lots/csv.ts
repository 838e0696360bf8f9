/**
 * CSV as RFC 4180 describes it (CRLF line ends, fields with comma, quote or line break quoted,
 * quotes doubled). A cell that starts with = + - @ (or a tab or carriage return) gets a leading
 * apostrophe, so a spreadsheet shows it as text and never runs it as a formula (the OWASP
 * advice on CSV injection).
 */
export function csvCell(value: unknown): string {
  let s = value === null || value === undefined ? '' : String(value);
  if (/^[=+\-@\t\r]/.test(s)) s = `'${s}`;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** A whole CSV document: a header row, then one row per record. */
export function toCsv(header: readonly string[], rows: ReadonlyArray<readonly unknown[]>): string {
  return [header, ...rows].map((r) => r.map(csvCell).join(',')).join('\r\n') + '\r\n';
}
