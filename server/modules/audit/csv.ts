/**
 * One CSV field (RFC 4180: quoted when it holds a comma, quote or line break; quotes doubled).
 * A field that begins with = + - @ (or a tab or carriage return) gets a leading apostrophe, so a
 * spreadsheet shows it as text instead of running it as a formula (OWASP, "CSV Injection").
 */
export function csvField(value: unknown): string {
  let s = value === null || value === undefined ? '' : typeof value === 'string' ? value : JSON.stringify(value);
  if (/^[=+\-@\t\r]/.test(s)) s = `'${s}`;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function csvRow(values: unknown[]): string {
  return values.map(csvField).join(',') + '\r\n';
}
