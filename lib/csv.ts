/**
 * One CSV field per RFC 4180 (quotes doubled, the field quoted when it holds a comma, quote or
 * line break). A leading = + - @ or tab is prefixed with ' so a spreadsheet never runs it as a
 * formula (OWASP "CSV injection").
 */
export function csvField(value: unknown): string {
  let s = value === null || value === undefined ? "" : value instanceof Date ? value.toISOString() : String(value);
  if (/^[=+\-@\t\r]/.test(s)) s = `'${s}`;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function toCsv(header: string[], rows: unknown[][]): string {
  return [header, ...rows].map((r) => r.map(csvField).join(",")).join("\r\n") + "\r\n";
}
