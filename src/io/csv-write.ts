/**
 * RFC 4180 CSV writing: CRLF record ends, fields quoted only when they hold a delimiter, a quote
 * or a line break, quotes doubled. UTF-8 without BOM by default; `withBom` helps spreadsheets that
 * otherwise guess a legacy code page.
 */

export function csvField(value: string, delimiter = ','): string {
  if (value.includes('"') || value.includes(delimiter) || value.includes('\n') || value.includes('\r')) {
    return `"${value.replaceAll('"', '""')}"`;
  }
  return value;
}

const FORMULA_START = /^[=+\-@\t\r]/;
const PLAIN_NUMBER = /^[+-]?(\d+([.,]\d*)?|[.,]\d+)([eE][+-]?\d+)?$/;

/**
 * A text cell a spreadsheet would run as a formula (starting with =, +, -, @, tab or carriage
 * return; OWASP "CSV Injection") gets a leading apostrophe, which spreadsheets show as text.
 * Plain numbers such as `-1.5` or `+3e-2` are left as they are.
 */
export function safeTextCell(value: string): string {
  return FORMULA_START.test(value) && !PLAIN_NUMBER.test(value) ? `'${value}` : value;
}

export function csvRecord(fields: readonly string[], delimiter = ','): string {
  return fields.map((f) => csvField(f, delimiter)).join(delimiter);
}

export function writeCsv(
  header: readonly string[],
  rows: Iterable<readonly string[]>,
  options: { delimiter?: string; withBom?: boolean } = {},
): string {
  const d = options.delimiter ?? ',';
  const out: string[] = [csvRecord(header, d)];
  for (const r of rows) out.push(csvRecord(r, d));
  return `${options.withBom ? '\uFEFF' : ''}${out.join('\r\n')}\r\n`;
}
