/**
 * CSV text after RFC 4180, but with '\n' line ends (which line controllers and spreadsheets read as well as CRLF): a
 * header line, then one line per row, fields joined by ','. Fields are written as given (numbers already
 * formatted); a field holding ',', '"' or a line break is quoted with doubled quotes.
 */
export function writeCsv(header: readonly string[], rows: readonly (readonly string[])[]): string {
  const line = (fields: readonly string[]) => fields.map(quote).join(',');
  return `${[line(header), ...rows.map(line)].join('\n')}\n`;
}

function quote(field: string): string {
  return /[",\r\n]/.test(field) ? `"${field.replaceAll('"', '""')}"` : field;
}
