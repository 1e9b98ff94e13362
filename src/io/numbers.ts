/**
 * Reading numbers typed by people or written by loggers: decimal point or comma, an optional
 * exponent, spaces or apostrophes as thousands groups (never `.` or `,`, which would be ambiguous).
 * Returns `undefined` for anything else, so a bad field becomes a reported error and never NaN.
 */

const PLAIN = /^[-+]?(\d+(\.\d*)?|\.\d+)([eE][-+]?\d+)?$/;

export function parseNumber(raw: string, decimalComma: boolean): number | undefined {
  let t = raw.trim().replace(/[\s\u00a0\u202f']/g, '');
  if (t === '') return undefined;
  if (t.startsWith('\u2212')) t = `-${t.slice(1)}`; // typographic minus from word processors
  if (decimalComma) {
    if (t.includes('.')) return undefined;
    t = t.replace(',', '.');
  }
  if (!PLAIN.test(t)) return undefined;
  const v = Number(t);
  return Number.isFinite(v) ? v : undefined;
}

/**
 * Writes a number for CSV with a point decimal, never `NaN`: 12 significant digits, more than any
 * measurement or result has, so exact unit conversions print as 9 and not 9.000000000000002.
 */
export function formatNumber(v: number | undefined): string {
  return v === undefined || !Number.isFinite(v) ? '' : String(Number(v.toPrecision(12)));
}
